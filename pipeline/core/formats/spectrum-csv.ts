import type { Diagnostic } from '../diagnostics/diagnostic.js';
import { readSpectrumHeader } from './read-spectrum-header.js';
import { charColumn, fieldEnd, fieldText } from './check-spectrum-field.js';
import { ProblemLog } from './problem-log.js';
import { lastLineNumber, stripTrailingDelimiters, trailingDelimiter, utf16Encoding } from './lab-file-quirks.js';
import { readSpectrumRow, type RowContext, type RowCursor } from './read-spectrum-row.js';

/**
 * Reusable count storage for a stream of spectra (one per worker): the arrays a parse returns
 * are views into it, valid until the next parse that uses the same scratch. Saves allocating
 * and zero-filling ~0.5 MB per run and the garbage collection that follows.
 */
export class SpectrumScratch {
  private buffers: Float64Array[] = [];
  take(column: number, length: number): Float64Array {
    const b = this.buffers[column];
    if (b !== undefined && b.length >= length) return b.subarray(0, length);
    const fresh = new Float64Array(Math.max(length, 4096));
    this.buffers[column] = fresh;
    return fresh.subarray(0, length);
  }
}

/** One run's histograms: one Float64Array of counts per detector column, in header order. */
export interface ParsedSpectrum {
  detectorIds: string[];
  /** 1-based column of each detector id in the header line (for diagnostics). */
  detectorColumns: number[];
  channelCount: number;
  /** counts[k][ch] = counts of detector detectorIds[k] in channel ch; each array has length channelCount. */
  counts: Float64Array[];
}

const LF = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;

/**
 * Rows to allocate: the channel number on the last line + 1 (exact for a well-formed file),
 * capped by the most rows the bytes could hold (a row takes at least 2 bytes per field).
 * A wrong guess costs only a doubling or a final trim.
 */
function estimateRows(bytes: Uint8Array, offset: number, detectorCount: number): number {
  const most = Math.max(1, Math.ceil((bytes.length - offset) / (2 * (detectorCount + 1))));
  let end = bytes.length;
  while (end > offset && (bytes[end - 1] === LF || bytes[end - 1] === CR || bytes[end - 1] === SPACE || bytes[end - 1] === TAB)) end--;
  let start = end;
  while (start > offset && bytes[start - 1] !== LF && bytes[start - 1] !== CR) start--;
  while (start < end && (bytes[start] === SPACE || bytes[start] === TAB)) start++;
  let channel = 0;
  let digits = 0;
  for (let p = start; p < end && bytes[p] >= 48 && bytes[p] <= 57 && digits < 10; p++, digits++) channel = channel * 10 + bytes[p] - 48;
  return digits > 0 && channel < most ? channel + 1 : Math.min(most, 4096);
}

/**
 * The hot loop: reads lines of plain digits and delimiters (counts below 10^9, channel in
 * order) straight into `ctx.counts`, growing them by doubling when full. Any other line
 * rewinds to its start and goes to `readSpectrumRow`. Kept apart from the cold code around
 * it so the optimizing compiler sees only this loop.
 */
function readPlainRows(ctx: RowContext, cursor: RowCursor): void {
  const b = ctx.bytes;
  const n = b.length;
  const delim = ctx.delim;
  const counts = ctx.counts;
  const detectorCount = counts.length;
  const last = detectorCount - 1;
  let capacity = counts[0].length;
  let pos = cursor.pos;
  let line = cursor.line;
  let row = cursor.row;
  let channel = cursor.expectedChannel;
  while (pos < n) {
    if (row === capacity) {
      capacity *= 2;
      for (let k = 0; k < detectorCount; k++) {
        const grown = new Float64Array(capacity);
        grown.set(counts[k]);
        counts[k] = grown;
      }
    }
    const lineStart = pos;
    plain: {
      let c = b[pos];
      let start = pos;
      let v = 0;
      let d = c - 48;
      while (d >>> 0 < 10) {
        v = (v * 10 + d) | 0;
        c = b[++pos];
        d = c - 48;
      }
      if (c !== delim || pos === start || pos - start > 9 || v !== channel) break plain;
      for (let k = 0; k < last; k++) {
        d = b[++pos] - 48;
        if (d >>> 0 >= 10) break plain;
        start = pos;
        v = d;
        c = b[++pos];
        d = c - 48;
        while (d >>> 0 < 10) {
          v = (v * 10 + d) | 0;
          c = b[++pos];
          d = c - 48;
        }
        if (c !== delim || pos - start > 9) break plain;
        counts[k][row] = v;
      }
      d = b[++pos] - 48;
      if (d >>> 0 >= 10) break plain;
      start = pos;
      v = d;
      c = b[++pos];
      d = c - 48;
      while (d >>> 0 < 10) {
        v = (v * 10 + d) | 0;
        c = b[++pos];
        d = c - 48;
      }
      if ((c !== LF && c !== CR) || pos - start > 9) break plain;
      counts[last][row] = v;
      pos++;
      if (c === CR && pos < n && b[pos] === LF) pos++;
      line++;
      row++;
      channel++;
      // Synced every row, not after the loop: code after a long loop has no type feedback
      // when the loop is compiled on the fly, and would send each call back to the interpreter.
      cursor.pos = pos;
      cursor.line = line;
      cursor.row = row;
      cursor.expectedChannel = channel;
      continue;
    }
    cursor.pos = lineStart;
    cursor.line = line;
    cursor.row = row;
    cursor.expectedChannel = channel;
    readSpectrumRow(ctx, cursor);
    pos = cursor.pos;
    line = cursor.line;
    row = cursor.row;
    channel = cursor.expectedChannel;
  }
}

/**
 * Parses a spectrum file `channel,<detector ids…>` (DESIGN.md, run-series layout) from
 * its raw bytes in one pass, straight into one Float64Array per detector: no decoding of
 * the data rows, no per-line strings. Accepts a BOM, CRLF/LF/CR, blank lines, `#` comment
 * lines before the header, spaces or tabs around values, `,` `;` or tab delimiters, quoted
 * header names, no final newline, and integral counts written as decimals (`12.0`, `12.`,
 * `12,0` where `,` is not the delimiter; one info diagnostic per file). Counts are exact
 * integers from 0 to 2^53.
 *
 * Any error (at most 10 reported, then a summary) makes `spectrum` null.
 */
export function parseSpectrumCsv(raw: Uint8Array, file: string, scratch?: SpectrumScratch): { spectrum: ParsedSpectrum | null; diagnostics: Diagnostic[] } {
  const quirks: Diagnostic[] = [];
  const utf16 = utf16Encoding(raw);
  let input = raw;
  if (utf16 !== null) {
    // Rare (spreadsheet "Unicode text"): re-encoded, since the row reader works on UTF-8 bytes.
    input = new TextEncoder().encode(new TextDecoder(utf16).decode(raw));
    quirks.push({ severity: 'info', rule: 'text-utf16', file, line: 1, message: `${file} is UTF-16; read as such`, hint: 'export spectra as UTF-8 or ASCII CSV' });
  }
  const trailing = trailingDelimiter(input);
  if (trailing !== null) {
    input = stripTrailingDelimiters(input, trailing);
    quirks.push({ severity: 'info', rule: 'spectrum-trailing-delimiter', file, line: 1, message: 'lines end with a delimiter; the empty last field is ignored' });
  }
  const result = parseSpectrumBytes(input, file, scratch);
  return { spectrum: result.spectrum, diagnostics: [...quirks, ...result.diagnostics] };
}

function parseSpectrumBytes(input: Uint8Array, file: string, scratch?: SpectrumScratch): { spectrum: ParsedSpectrum | null; diagnostics: Diagnostic[] } {
  const head = readSpectrumHeader(input, file);
  if (head.header === null) return { spectrum: null, diagnostics: head.diagnostics };
  const { detectorIds, detectorColumns, delimiterByte: delim, dataOffset, dataLine } = head.header;
  const detectorCount = detectorIds.length;

  // Every scan below stops at a line break, so a final one keeps all reads in bounds. A plain
  // Uint8Array view (not a Node Buffer subclass) keeps the hot loop's element access monomorphic.
  let b = new Uint8Array(input.buffer, input.byteOffset, input.byteLength);
  if (b.length > 0 && b[b.length - 1] !== LF && b[b.length - 1] !== CR) {
    b = new Uint8Array(input.length + 1);
    b.set(input);
    b[input.length] = LF;
  }
  const pad = delim === TAB ? SPACE : TAB;

  const estimate = estimateRows(b, dataOffset, detectorCount);
  const counts: Float64Array[] = [];
  for (let k = 0; k < detectorCount; k++) counts.push(scratch ? scratch.take(k, estimate) : new Float64Array(estimate));

  const log = new ProblemLog(file);
  const ctx: RowContext = { bytes: b, delim, pad, detectorIds, counts, log, odd: { end: 0, value: 0, ok: false, decimal: false } };
  const cursor: RowCursor = { pos: dataOffset, line: dataLine, row: 0, expectedChannel: 0, firstDecimalPos: -1, firstDecimalLine: 0, firstDecimalLineStart: 0 };
  readPlainRows(ctx, cursor);
  const row = cursor.row;

  const headerLine = head.header.headerLine;
  if (row === 0 && log.errors === 0) {
    log.add({
      severity: 'error',
      message: `the header names ${detectorCount} detector${detectorCount === 1 ? '' : 's'} but no channel rows follow`,
      file,
      line: headerLine,
      column: 1,
      rule: 'spectrum-empty',
      expected: 'one row per channel after the header',
      actual: 'no data rows',
      hint: 'check that the acquisition finished writing this file',
    });
  }
  const diagnostics = [...head.diagnostics, ...log.finish()];
  const firstDecimalPos = cursor.firstDecimalPos;
  if (firstDecimalPos >= 0) {
    const text = fieldText(b, firstDecimalPos, fieldEnd(b, firstDecimalPos, delim));
    diagnostics.push({
      severity: 'info',
      message: `counts are written as decimals (first ${JSON.stringify(text)}); read as the integers they equal`,
      file,
      line: cursor.firstDecimalLine,
      column: charColumn(b, cursor.firstDecimalLineStart, firstDecimalPos),
      rule: 'spectrum-decimal-counts',
      actual: JSON.stringify(text),
      hint: 'writing counts as integers makes the files smaller and faster to read',
    });
  }
  if (log.errors > 0) {
    const last = input[input.length - 1];
    const cut = diagnostics.find((d) => d.rule === 'spectrum-ragged-row' || d.rule === 'spectrum-empty-field');
    if (last !== LF && last !== CR && cut?.line !== undefined && cut.line === lastLineNumber(input)) {
      diagnostics.push({ severity: 'error', rule: 'spectrum-truncated', file, line: cut.line, message: `the file ends inside the row on line ${cut.line}: it looks truncated`, hint: 'was it copied while the acquisition was still writing it? copy it again once the run has ended' });
    }
    return { spectrum: null, diagnostics };
  }
  if (row < counts[0].length) for (let k = 0; k < detectorCount; k++) counts[k] = scratch ? counts[k].subarray(0, row) : counts[k].slice(0, row);
  return { spectrum: { detectorIds, detectorColumns, channelCount: row, counts }, diagnostics };
}
