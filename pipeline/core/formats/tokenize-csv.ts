import type { Diagnostic } from '../diagnostics/diagnostic.js';

/**
 * The record splitter under `readCsv` and the spectrum header: RFC 4180 fields
 * (quoted fields, `""` escapes, line breaks inside quotes) with 1-based line and column
 * positions counted in characters (code points). Unquoted fields are trimmed of spaces
 * (and tabs, unless the tab is the delimiter); quoted text is kept as written.
 * Lines that are entirely blank are skipped. CRLF, LF and a lone CR all end a line.
 */

/** One field: its text (unquoted, trimmed) and where it starts (1-based). */
export interface CsvCell {
  text: string;
  line: number;
  column: number;
}

/** One record: the cells, where it starts, and where its line ends (for "missing field" positions). */
export interface CsvRecord {
  line: number;
  cells: CsvCell[];
  endLine: number;
  endColumn: number;
}

export interface CsvTokens {
  records: CsvRecord[];
  diagnostics: Diagnostic[];
  /** True when the text cannot be split into records (an unterminated quote). */
  fatal: boolean;
}

const QUOTE = 34;
const LF = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;
const HASH = 35;

/** Code units of a line break starting at `i` (2 for CRLF, 1 for LF or CR, 0 for none). */
function breakLength(text: string, i: number): number {
  const c = text.charCodeAt(i);
  if (c === LF) return 1;
  if (c === CR) return text.charCodeAt(i + 1) === LF ? 2 : 1;
  return 0;
}

/** Whether code unit `c` starts a new code point (is not the low half of a surrogate pair). */
function startsCodePoint(c: number): boolean {
  return (c & 0xfc00) !== 0xdc00;
}

function quoteForMessage(s: string): string {
  const short = s.length > 40 ? `${s.slice(0, 40)}…` : s;
  return JSON.stringify(short);
}

/**
 * The first line that is neither blank nor a `#` comment, from `offset` (line `line`).
 * Returns null when there is none.
 */
export function findFirstContentLine(text: string, offset: number, line = 1): { offset: number; line: number } | null {
  let i = offset;
  let ln = line;
  while (i < text.length) {
    let j = i;
    while (j < text.length && (text.charCodeAt(j) === SPACE || text.charCodeAt(j) === TAB)) j++;
    if (j >= text.length) return null;
    const c = text.charCodeAt(j);
    if (c !== LF && c !== CR && c !== HASH) return { offset: i, line: ln };
    while (j < text.length && breakLength(text, j) === 0) j++;
    i = j + breakLength(text, j);
    ln++;
  }
  return null;
}

/**
 * Picks the delimiter of the record starting at `offset`: whichever of `,` `;` tab occurs
 * most often outside quotes (ties in that order); `,` when none occurs.
 */
export function detectDelimiter(text: string, offset = 0): ',' | ';' | '\t' {
  let comma = 0;
  let semicolon = 0;
  let tab = 0;
  let inQuote = false;
  for (let i = offset; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === QUOTE) inQuote = !inQuote;
    else if (inQuote) continue;
    else if (c === LF || c === CR) break;
    else if (c === 44) comma++;
    else if (c === 59) semicolon++;
    else if (c === TAB) tab++;
  }
  if (comma >= semicolon && comma >= tab) return ',';
  return semicolon >= tab ? ';' : '\t';
}

/**
 * Splits `text` from `offset` (at line `line`, column 1) into records separated by
 * `delimiter`, stopping after `maxRecords`.
 */
export function tokenizeCsv(
  text: string,
  file: string,
  delimiter: string,
  offset = 0,
  line = 1,
  maxRecords = Number.POSITIVE_INFINITY,
): CsvTokens {
  const delim = delimiter.charCodeAt(0);
  const trimTab = delim !== TAB;
  const isPad = (c: number): boolean => c === SPACE || (trimTab && c === TAB);
  const records: CsvRecord[] = [];
  const diagnostics: Diagnostic[] = [];
  const n = text.length;
  let i = offset;
  let ln = line;
  let col = 1;

  while (i < n && records.length < maxRecords) {
    let j = i;
    while (j < n && (text.charCodeAt(j) === SPACE || text.charCodeAt(j) === TAB)) j++;
    if (j >= n) break;
    const blank = breakLength(text, j);
    if (blank > 0) {
      i = j + blank;
      ln++;
      col = 1;
      continue;
    }
    const record: CsvRecord = { line: ln, cells: [], endLine: ln, endColumn: col };
    for (;;) {
      while (i < n && isPad(text.charCodeAt(i))) {
        i++;
        col++;
      }
      const cellLine = ln;
      const cellColumn = col;
      let value: string;
      if (text.charCodeAt(i) === QUOTE) {
        i++;
        col++;
        let parts = '';
        let segment = i;
        for (;;) {
          if (i >= n) {
            diagnostics.push({
              severity: 'error',
              message: `quoted field opened here is never closed: ${quoteForMessage(text.slice(segment - 1))}`,
              file,
              line: cellLine,
              column: cellColumn,
              rule: 'csv-unterminated-quote',
              expected: 'a closing " before the end of the file',
              actual: 'end of file inside quotes',
              hint: 'close the quote, or write a literal " inside a quoted field as ""',
            });
            return { records, diagnostics, fatal: true };
          }
          const c = text.charCodeAt(i);
          if (c === QUOTE) {
            if (text.charCodeAt(i + 1) === QUOTE) {
              parts += text.slice(segment, i + 1);
              i += 2;
              col += 2;
              segment = i;
              continue;
            }
            parts += text.slice(segment, i);
            i++;
            col++;
            break;
          }
          const br = breakLength(text, i);
          if (br > 0) {
            i += br;
            ln++;
            col = 1;
            continue;
          }
          if (startsCodePoint(c)) col++;
          i++;
        }
        while (i < n && isPad(text.charCodeAt(i))) {
          i++;
          col++;
        }
        if (i < n && text.charCodeAt(i) !== delim && breakLength(text, i) === 0) {
          const strayStart = i;
          const strayColumn = col;
          while (i < n && text.charCodeAt(i) !== delim && breakLength(text, i) === 0) {
            if (startsCodePoint(text.charCodeAt(i))) col++;
            i++;
          }
          const stray = text.slice(strayStart, i);
          diagnostics.push({
            severity: 'error',
            message: `text ${quoteForMessage(stray)} follows the closing quote of a quoted field`,
            file,
            line: ln,
            column: strayColumn,
            rule: 'csv-text-after-quote',
            expected: `a delimiter ${JSON.stringify(delimiter)} or the end of the line after the closing quote`,
            actual: quoteForMessage(stray),
            hint: 'put the whole field inside the quotes, and write a literal " as ""',
          });
          parts += stray.trimEnd();
        }
        value = parts;
      } else {
        const start = i;
        let bareQuoteColumn = 0;
        while (i < n) {
          const c = text.charCodeAt(i);
          if (c === delim || c === LF || c === CR) break;
          if (c === QUOTE && bareQuoteColumn === 0) bareQuoteColumn = col;
          if (startsCodePoint(c)) col++;
          i++;
        }
        let end = i;
        while (end > start && isPad(text.charCodeAt(end - 1))) end--;
        value = text.slice(start, end);
        if (bareQuoteColumn > 0) {
          diagnostics.push({
            severity: 'error',
            message: `field ${quoteForMessage(value)} holds a " but is not quoted`,
            file,
            line: ln,
            column: bareQuoteColumn,
            rule: 'csv-bare-quote',
            expected: 'a " only inside a quoted field (RFC 4180 §2 rule 5)',
            actual: quoteForMessage(value),
            hint: 'quote the field and double the quote: "12"" wafer" stands for 12" wafer',
          });
        }
      }
      record.cells.push({ text: value, line: cellLine, column: cellColumn });
      if (i < n && text.charCodeAt(i) === delim) {
        i++;
        col++;
        continue;
      }
      record.endLine = ln;
      record.endColumn = col;
      const br = breakLength(text, i);
      if (br > 0) {
        i += br;
        ln++;
        col = 1;
      }
      break;
    }
    records.push(record);
  }
  return { records, diagnostics, fatal: false };
}
