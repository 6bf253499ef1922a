/**
 * What lab computers routinely write around a CSV's content, recognised at the byte level so
 * every reader treats it the same way: a UTF-16 byte-order mark (spreadsheet "Unicode text"
 * exports) and a delimiter ending every line (spreadsheet CSV exports).
 */

/** 'utf-16le' / 'utf-16be' when the bytes open with a UTF-16 byte-order mark, else null. */
export function utf16Encoding(bytes: Uint8Array): 'utf-16le' | 'utf-16be' | null {
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return 'utf-16le';
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return 'utf-16be';
  return null;
}

/** The delimiter byte the first line ends with (`,` `;` or tab before its line break, spaces allowed), or null. */
export function trailingDelimiter(bytes: Uint8Array): number | null {
  let end = 0;
  while (end < bytes.length && bytes[end] !== 10 && bytes[end] !== 13) end++;
  let last = end - 1;
  while (last >= 0 && bytes[last] === 32) last--;
  const c = last >= 0 ? bytes[last]! : -1;
  return c === 44 || c === 59 || c === 9 ? c : null;
}

/**
 * A copy of the bytes without one delimiter (and the spaces after it) right before each line
 * break and at the end. Field columns are unchanged: only text after the last field goes.
 */
export function stripTrailingDelimiters(bytes: Uint8Array, delim: number): Uint8Array {
  const out = new Uint8Array(bytes.length);
  let o = 0;
  let pending = -1; // output position of a delimiter that may be trailing
  for (let i = 0; i < bytes.length; i++) {
    const c = bytes[i]!;
    if (c === 10 || c === 13) {
      if (pending >= 0) o = pending;
      pending = -1;
      out[o++] = c;
      continue;
    }
    if (c === delim) pending = o;
    else if (c !== 32) pending = -1;
    out[o++] = c;
  }
  if (pending >= 0) o = pending;
  return out.subarray(0, o);
}

/** 1-based number of the last line (a final line break does not start a new one). */
export function lastLineNumber(bytes: Uint8Array): number {
  let lines = 1;
  for (let i = 0; i < bytes.length - 1; i++) {
    const c = bytes[i];
    if (c === 10 || (c === 13 && bytes[i + 1] !== 10)) lines++;
  }
  return lines;
}
