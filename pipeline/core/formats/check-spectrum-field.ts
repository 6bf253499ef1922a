import type { ProblemLog } from './problem-log.js';

/**
 * The cold path of `parseSpectrumCsv`: what runs only when a field is not a plain
 * non-negative integer, and the byte helpers its diagnostics need. Kept apart so the hot
 * loop stays small.
 */

/** Largest count accepted: 2^53; every integer up to it is exact in a double (ECMA-262: Number.MAX_SAFE_INTEGER + 1). */
export const MAX_COUNT = 9007199254740992;
const MAX_COUNT_TEXT = '9007199254740992';

/** 1-based character column of byte `pos` in the line starting at byte `lineStart` (UTF-8: continuation bytes do not count). */
export function charColumn(bytes: Uint8Array, lineStart: number, pos: number): number {
  let column = 1;
  for (let i = lineStart; i < pos; i++) if ((bytes[i] & 0xc0) !== 0x80) column++;
  return column;
}

/** Byte offset of the delimiter or line break ending the field that starts at `pos`. */
export function fieldEnd(bytes: Uint8Array, pos: number, delim: number): number {
  let p = pos;
  while (p < bytes.length) {
    const c = bytes[p];
    if (c === delim || c === 10 || c === 13) break;
    p++;
  }
  return p;
}

const utf8 = new TextDecoder('utf-8');

/** The field's text, decoded and trimmed of spaces and tabs. */
export function fieldText(bytes: Uint8Array, start: number, end: number): string {
  return utf8
    .decode(bytes.subarray(start, end))
    .replace(/^[ \t]+|[ \t]+$/g, '');
}

/** Outcome of `checkSpectrumField` (one object reused, so the cold path allocates no result per call). */
export interface FieldCheck {
  end: number;
  value: number;
  ok: boolean;
  decimal: boolean;
}

function delimiterName(delim: number): string {
  return delim === 9 ? 'tab' : JSON.stringify(String.fromCharCode(delim));
}

/**
 * Looks at a field the fast path could not take (empty, signed, non-numeric, a fraction,
 * more than 2^53, or digits followed by something else). Accepts integral values up to
 * 2^53 exactly (also with a decimal point or, when `,` is not the delimiter, a decimal
 * comma followed by zeros); logs one diagnostic for anything else.
 */
export function checkSpectrumField(
  bytes: Uint8Array,
  start: number,
  delim: number,
  lineStart: number,
  line: number,
  log: ProblemLog,
  out: FieldCheck,
  what: 'channel number' | 'count',
): void {
  const end = fieldEnd(bytes, start, delim);
  const text = fieldText(bytes, start, end);
  out.end = end;
  out.ok = false;
  out.value = 0;
  out.decimal = false;
  const at = { file: log.file, line, column: charColumn(bytes, lineStart, start) };
  const integral = delim === 44 ? /^(\d+)(\.0*)?$/.exec(text) : /^(\d+)([.,]0*)?$/.exec(text);
  if (integral !== null) {
    const digits = integral[1].replace(/^0+(?=\d)/, '');
    if (digits.length < MAX_COUNT_TEXT.length || (digits.length === MAX_COUNT_TEXT.length && digits <= MAX_COUNT_TEXT)) {
      out.ok = true;
      out.value = Number(digits);
      out.decimal = integral[2] !== undefined;
      return;
    }
    log.add({
      severity: 'error',
      message: `${what} ${JSON.stringify(text)} is above 2^53 = ${MAX_COUNT_TEXT}, the largest count held exactly`,
      ...at,
      rule: 'spectrum-count-too-large',
      expected: `an integer from 0 to ${MAX_COUNT_TEXT}`,
      actual: JSON.stringify(text),
      hint: 'a count this large is a corrupted value or an overflowed scaler: check the acquisition',
    });
    return;
  }
  if (text === '') {
    log.add({
      severity: 'error',
      message: `empty field where a ${what} is expected`,
      ...at,
      rule: 'spectrum-empty-field',
      expected: what === 'count' ? 'a non-negative integer count (0 when the channel is empty)' : 'the channel number',
      actual: '""',
      hint: what === 'count' ? 'write 0 for a channel with no counts' : 'every row starts with its channel number 0…N−1',
    });
    return;
  }
  if (/^-\s*[0-9.]/.test(text)) {
    log.add({
      severity: 'error',
      message: `${what} ${JSON.stringify(text)} is negative`,
      ...at,
      rule: 'spectrum-negative-count',
      expected: 'a non-negative integer count',
      actual: JSON.stringify(text),
      hint: 'raw spectra hold event counts, never below 0; background-subtracted data cannot be read as a spectrum',
    });
    return;
  }
  const otherDelimiter = [44, 59, 9].find((d) => d !== delim && text.includes(String.fromCharCode(d)));
  const numeric = Number.isFinite(Number(delim === 44 ? text : text.replace(',', '.')));
  let hint: string;
  if (numeric) {
    hint = 'counts are whole numbers of events: write 12 (or 12.0), not fractions or exponents';
  } else if (otherDelimiter !== undefined) {
    hint = `the header uses ${delimiterName(delim)} as delimiter but this field holds ${delimiterName(otherDelimiter)}: write every line with the same delimiter`;
  } else if (text.startsWith('"')) {
    hint = 'write counts unquoted; only header names may be quoted';
  } else {
    hint = 'every field after the channel number must be a count such as 0 or 1523';
  }
  log.add({
    severity: 'error',
    message: `${what} ${JSON.stringify(text)} is not a non-negative integer`,
    ...at,
    rule: 'spectrum-not-integer',
    expected: 'a non-negative integer count',
    actual: JSON.stringify(text),
    hint,
  });
}
