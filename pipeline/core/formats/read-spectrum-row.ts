import type { Diagnostic } from '../diagnostics/diagnostic.js';
import { MAX_COUNT, charColumn, checkSpectrumField, fieldEnd, fieldText, type FieldCheck } from './check-spectrum-field.js';
import type { ProblemLog } from './problem-log.js';

/** Where `parseSpectrumCsv` stands: shared by its fast loop and `readSpectrumRow`. */
export interface RowCursor {
  /** Byte offset of the start of the current line. */
  pos: number;
  /** 1-based line number of the current line. */
  line: number;
  /** Data rows read so far (the index the next row is stored at). */
  row: number;
  expectedChannel: number;
  /** Byte offset of the first count written as a decimal, -1 while none. */
  firstDecimalPos: number;
  firstDecimalLine: number;
  firstDecimalLineStart: number;
}

/** What stays fixed while one file's rows are read. */
export interface RowContext {
  /** The file's bytes; the last byte is a line break. */
  bytes: Uint8Array;
  /** Delimiter byte (44, 59 or 9) and the other padding byte trimmed besides space (tab, or none when the tab delimits). */
  delim: number;
  pad: number;
  detectorIds: string[];
  counts: Float64Array[];
  log: ProblemLog;
  odd: FieldCheck;
}

const LF = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;

function rowProblem(ctx: RowContext, lineStart: number, pos: number, line: number, d: Omit<Diagnostic, 'severity' | 'file' | 'line' | 'column'>): void {
  ctx.log.add({ severity: 'error', file: ctx.log.file, line, column: charColumn(ctx.bytes, lineStart, pos), ...d });
}

/**
 * Reads the line at `cursor.pos` with every check: skips it when blank, else stores its
 * counts at `cursor.row` and logs each problem (padding, decimals, signs, empty fields,
 * ragged rows, channel order, counts above 2^53). Leaves the cursor on the next line.
 * The fast loop of `parseSpectrumCsv` hands over any line that is not plain digits and
 * delimiters; the caller has made room for one more row.
 */
export function readSpectrumRow(ctx: RowContext, cursor: RowCursor): void {
  const { bytes: b, delim, pad, counts, odd } = ctx;
  const detectorCount = counts.length;
  const n = b.length;
  let pos = cursor.pos;
  const lineStart = pos;
  const line = cursor.line;
  let c = b[pos];
  let p = pos;
  while (c === SPACE || c === TAB) c = b[++p];
  if (c === LF || c === CR) {
    pos = p + 1;
    if (c === CR && pos < n && b[pos] === LF) pos++;
    cursor.pos = pos;
    cursor.line = line + 1;
    return;
  }
  c = b[pos];
  const row = cursor.row;
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
      checkSpectrumField(b, fieldStart, delim, lineStart, line, ctx.log, odd, field === 0 ? 'channel number' : 'count');
      pos = odd.end;
      c = b[pos];
      value = odd.value;
      decimal = odd.decimal;
      plain = odd.ok;
    }
    if (decimal && plain && cursor.firstDecimalPos < 0) {
      cursor.firstDecimalPos = fieldStart;
      cursor.firstDecimalLine = line;
      cursor.firstDecimalLineStart = lineStart;
    }
    if (field === 0) {
      const expected = cursor.expectedChannel;
      if (plain && value !== expected) {
        const text = fieldText(b, fieldStart, pos);
        rowProblem(ctx, lineStart, fieldStart, line, {
          message: `channel ${JSON.stringify(text)} where channel ${expected} is expected`,
          rule: 'spectrum-channel-order',
          expected: `channel ${expected} (channels run 0…N−1 in order, one row each)`,
          actual: JSON.stringify(text),
          hint:
            value < expected
              ? 'a channel is repeated or the rows are out of order'
              : value === expected + 1
                ? `channel ${expected} is missing`
                : `channels ${expected}…${value - 1} are missing`,
        });
      }
      cursor.expectedChannel = plain ? value + 1 : expected + 1;
    } else {
      counts[field - 1][row] = value;
    }
    field++;
    if (field > detectorCount) break;
    if (c !== delim) {
      const left = detectorCount - field;
      rowProblem(ctx, lineStart, pos, line, {
        message: `row has ${field} fields but the header has ${detectorCount + 1}; no count for ${JSON.stringify(ctx.detectorIds[field - 1])}${
          left > 0 ? ` and ${left} more detector${left === 1 ? '' : 's'}` : ''
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
    let q = pos;
    while (b[q] === delim) {
      fields++;
      q = fieldEnd(b, q + 1, delim);
    }
    rowProblem(ctx, lineStart, pos + 1, line, {
      message: `row has ${fields} fields but the header has ${detectorCount + 1}; first extra field ${JSON.stringify(fieldText(b, pos + 1, fieldEnd(b, pos + 1, delim)))}`,
      rule: 'spectrum-ragged-row',
      expected: `${detectorCount + 1} fields: channel and ${detectorCount} counts`,
      actual: `${fields} fields`,
      hint: 'every row holds the channel and one count per detector column of the header; remove a trailing delimiter',
    });
    pos = q;
    c = b[pos];
  }
  pos++;
  if (c === CR && pos < n && b[pos] === LF) pos++;
  cursor.pos = pos;
  cursor.line = line + 1;
  cursor.row = row + 1;
}
