import type { Diagnostic } from '../diagnostics/diagnostic.js';
import { readSpectrumHeader } from './spectrum-header.js';
import { MAX_COUNT, ProblemLog, charColumn, checkOddField, fieldEnd, fieldText, type OddField } from './spectrum-problems.js';

/** One run's histograms: one Float64Array of counts per detector column, in header order. */
export interface ParsedSpectrum {
  detectorIds: string[];
  channelCount: number;
  /** counts[k][ch] = counts of detector detectorIds[k] in channel ch; each array has length channelCount. */
  counts: Float64Array[];
}

const LF = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;

/** Upper bound on the data rows from `offset`: line breaks counted with indexOf (LF, or CR for CR-only files). */
function estimateRows(bytes: Uint8Array, offset: number): number {
  let lf = 0;
  for (let p = bytes.indexOf(LF, offset); p !== -1; p = bytes.indexOf(LF, p + 1)) lf++;
  if (lf > 0) return lf;
  let cr = 0;
  for (let p = bytes.indexOf(CR, offset); p !== -1; p = bytes.indexOf(CR, p + 1)) cr++;
  return Math.max(cr, 1);
}

function rowProblem(log: ProblemLog, bytes: Uint8Array, lineStart: number, pos: number, line: number, d: Omit<Diagnostic, 'severity' | 'file' | 'line' | 'column'>): void {
  log.add({ severity: 'error', file: log.file, line, column: charColumn(bytes, lineStart, pos), ...d });
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
export function parseSpectrumCsv(input: Uint8Array, file: string): { spectrum: ParsedSpectrum | null; diagnostics: Diagnostic[] } {
  const head = readSpectrumHeader(input, file);
  if (head.header === null) return { spectrum: null, diagnostics: head.diagnostics };
  const { detectorIds, delimiterByte: delim, dataOffset, dataLine, headerLine } = head.header;
  const detectorCount = detectorIds.length;

  // Every scan below stops at a line break, so a final one keeps all reads in bounds.
  let b = input;
  if (b.length > 0 && b[b.length - 1] !== LF && b[b.length - 1] !== CR) {
    b = new Uint8Array(input.length + 1);
    b.set(input);
    b[input.length] = LF;
  }
  const n = b.length;
  const pad = delim === TAB ? SPACE : TAB;

  let capacity = estimateRows(b, dataOffset);
  const counts: Float64Array[] = [];
  for (let k = 0; k < detectorCount; k++) counts.push(new Float64Array(capacity));

  const log = new ProblemLog(file);
  const odd: OddField = { end: 0, value: 0, ok: false, decimal: false };
  let firstDecimalPos = -1;
  let firstDecimalLine = 0;
  let firstDecimalLineStart = 0;

  let pos = dataOffset;
  let line = dataLine;
  let row = 0;
  let expectedChannel = 0;
  while (pos < n) {
    const lineStart = pos;
    let c = b[pos];
    if (c === LF || c === CR || c === SPACE || c === TAB) {
      let p = pos;
      while (c === SPACE || c === TAB) c = b[++p];
      if (c === LF || c === CR) {
        pos = p + 1;
        if (c === CR && pos < n && b[pos] === LF) pos++;
        line++;
        continue;
      }
      c = b[pos];
    }
    if (row === capacity) {
      capacity *= 2;
      for (let k = 0; k < detectorCount; k++) {
        const grown = new Float64Array(capacity);
        grown.set(counts[k]);
        counts[k] = grown;
      }
    }

    let field = 0;
    for (;;) {
      while (c === SPACE || c === pad) c = b[++pos];
      const fieldStart = pos;
      let value = 0;
      let digit = c - 48;
      let plain = false;
      let decimal = false;
      if (digit >>> 0 < 10) {
        do {
          value = value * 10 + digit;
          c = b[++pos];
          digit = c - 48;
        } while (digit >>> 0 < 10);
        if (c === 46 || (c === 44 && delim !== 44)) {
          decimal = true;
          c = b[++pos];
          while (c === 48) c = b[++pos];
        }
        while (c === SPACE || c === pad) c = b[++pos];
        plain = (c === delim || c === LF || c === CR) && value < MAX_COUNT;
      }
      if (!plain) {
        checkOddField(b, fieldStart, delim, lineStart, line, log, odd);
        pos = odd.end;
        c = b[pos];
        value = odd.value;
        decimal = odd.decimal;
        plain = odd.ok;
      }
      if (decimal && plain && firstDecimalPos < 0) {
        firstDecimalPos = fieldStart;
        firstDecimalLine = line;
        firstDecimalLineStart = lineStart;
      }
      if (field === 0) {
        if (plain && value !== expectedChannel) {
          rowProblem(log, b, lineStart, fieldStart, line, {
            message: `channel ${JSON.stringify(fieldText(b, fieldStart, pos))} where channel ${expectedChannel} is expected`,
            rule: 'spectrum-channel-order',
            expected: `channel ${expectedChannel} (channels run 0…N−1 in order, one row each)`,
            actual: fieldText(b, fieldStart, pos),
            hint: value < expectedChannel ? 'a channel is repeated or the rows are out of order' : `channels ${expectedChannel}…${value - 1} are missing`,
          });
        }
        expectedChannel = plain ? value + 1 : expectedChannel + 1;
      } else {
        counts[field - 1][row] = value;
      }
      field++;
      if (field > detectorCount) break;
      if (c !== delim) {
        rowProblem(log, b, lineStart, pos, line, {
          message: `row has ${field} fields but the header has ${detectorCount + 1}; no count for ${JSON.stringify(detectorIds[field - 1])}${
            field < detectorCount ? ` and ${detectorCount - field} more detector${detectorCount - field === 1 ? '' : 's'}` : ''
          }`,
          rule: 'spectrum-ragged-row',
          expected: `${detectorCount + 1} fields: channel and ${detectorCount} counts`,
          actual: `${field} fields`,
          hint: 'a row was cut short: check whether the file was copied while still being written',
        });
        break;
      }
      c = b[++pos];
    }
    if (c === delim) {
      let fields = detectorCount + 1;
      let p = pos;
      while (b[p] === delim) {
        fields++;
        p = fieldEnd(b, p + 1, delim);
      }
      rowProblem(log, b, lineStart, pos + 1, line, {
        message: `row has ${fields} fields but the header has ${detectorCount + 1}; first extra field ${JSON.stringify(fieldText(b, pos + 1, fieldEnd(b, pos + 1, delim)))}`,
        rule: 'spectrum-ragged-row',
        expected: `${detectorCount + 1} fields: channel and ${detectorCount} counts`,
        actual: `${fields} fields`,
        hint: 'every row holds the channel and one count per detector column of the header; remove a trailing delimiter',
      });
      pos = p;
      c = b[pos];
    }
    pos++;
    if (c === CR && pos < n && b[pos] === LF) pos++;
    line++;
    row++;
  }

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
  if (firstDecimalPos >= 0) {
    const text = fieldText(b, firstDecimalPos, fieldEnd(b, firstDecimalPos, delim));
    diagnostics.push({
      severity: 'info',
      message: `counts are written as decimals (first ${JSON.stringify(text)}); read as the integers they equal`,
      file,
      line: firstDecimalLine,
      column: charColumn(b, firstDecimalLineStart, firstDecimalPos),
      rule: 'spectrum-decimal-counts',
      actual: JSON.stringify(text),
      hint: 'writing counts as integers makes the files smaller and faster to read',
    });
  }
  if (log.errors > 0) return { spectrum: null, diagnostics };
  if (row < capacity) for (let k = 0; k < detectorCount; k++) counts[k] = counts[k].slice(0, row);
  return { spectrum: { detectorIds, channelCount: row, counts }, diagnostics };
}
