import type { Diagnostic } from '../diagnostics/diagnostic.js';
import { detectDelimiter, findFirstContentLine, tokenizeCsv, type CsvCell } from './tokenize-csv.js';

export type { CsvCell } from './tokenize-csv.js';

/** One data row: the line it starts on and its cells (as many as written, even when ragged). */
export interface CsvRow {
  line: number;
  cells: CsvCell[];
}

export interface CsvTable {
  file: string;
  /** `,` `;` or a tab, detected from the header line. */
  delimiter: string;
  header: CsvCell[];
  rows: CsvRow[];
}

function describeDelimiter(d: string): string {
  return d === '\t' ? 'tab' : JSON.stringify(d);
}

/**
 * Reads a small CSV table (runlog, scalers) with positions. RFC 4180 fields, plus what lab
 * computers write: a UTF-8 BOM, CRLF/LF/CR line ends, no final newline, blank lines
 * (skipped), `#` comment lines before the header (skipped), spaces around unquoted
 * fields (trimmed), and `;` or tab delimiters (detected from the header line).
 *
 * `table` is null only when the text cannot be split (no header, an unterminated quote).
 * Otherwise it is returned even with errors (duplicate or empty column names, ragged
 * rows, stray quotes): check the diagnostics before trusting it.
 */
export function readCsv(text: string, file: string): { table: CsvTable | null; diagnostics: Diagnostic[] } {
  const start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const first = findFirstContentLine(text, start);
  if (first === null) {
    return {
      table: null,
      diagnostics: [
        {
          severity: 'error',
          message: text.length - start === 0 ? 'the file is empty' : 'the file holds no header line, only blank or # comment lines',
          file,
          line: 1,
          column: 1,
          rule: 'csv-empty',
          expected: 'a header line naming the columns',
          actual: text.length - start === 0 ? 'an empty file' : 'only blank or comment lines',
          hint: 'write the header line first, e.g. run,started_at,kind,…',
        },
      ],
    };
  }
  const delimiter = detectDelimiter(text, first.offset);
  const tokens = tokenizeCsv(text, file, delimiter, first.offset, first.line);
  const diagnostics = tokens.diagnostics;
  if (tokens.fatal) return { table: null, diagnostics };
  const [headerRecord, ...dataRecords] = tokens.records;
  let header = headerRecord.cells;
  // Spreadsheets often end every line with a delimiter: a last header cell without a name whose
  // cells are all empty (or absent) is that trailing delimiter, not a column.
  const lastIndex = header.length - 1;
  if (header.length > 1 && header[lastIndex]!.text === '' && dataRecords.every((r) => r.cells.length <= lastIndex || (r.cells.length === header.length && r.cells[lastIndex]!.text === ''))) {
    header = header.slice(0, lastIndex);
    for (const r of dataRecords) if (r.cells.length > lastIndex) r.cells = r.cells.slice(0, lastIndex);
    diagnostics.push({
      severity: 'info',
      message: `every line ends with a ${describeDelimiter(delimiter)}; the empty last column is ignored`,
      file,
      line: headerRecord.cells[lastIndex]!.line,
      column: headerRecord.cells[lastIndex]!.column,
      rule: 'csv-trailing-delimiter',
    });
  }

  const seen = new Map<string, CsvCell>();
  header.forEach((cell, index) => {
    if (cell.text === '') {
      diagnostics.push({
        severity: 'error',
        message: `column ${index + 1} of the header has no name`,
        file,
        line: cell.line,
        column: cell.column,
        rule: 'csv-empty-column-name',
        expected: 'a column name',
        actual: '""',
        hint:
          index === header.length - 1
            ? `remove the trailing ${describeDelimiter(delimiter)} from the header line`
            : 'name every column in the header line',
      });
      return;
    }
    const earlier = seen.get(cell.text);
    if (earlier !== undefined) {
      diagnostics.push({
        severity: 'error',
        message: `column name ${JSON.stringify(cell.text)} appears twice (columns at ${earlier.line}:${earlier.column} and ${cell.line}:${cell.column})`,
        file,
        line: cell.line,
        column: cell.column,
        rule: 'csv-duplicate-column',
        expected: 'distinct column names',
        actual: JSON.stringify(cell.text),
        hint: 'rename or remove one of the two columns',
      });
      return;
    }
    seen.set(cell.text, cell);
  });

  const rows: CsvRow[] = [];
  for (const record of dataRecords) {
    rows.push({ line: record.line, cells: record.cells });
    const got = record.cells.length;
    if (got === header.length) continue;
    const tooMany = got > header.length;
    const extra = record.cells[header.length];
    const missing = header.slice(got).map((c) => c.text);
    diagnostics.push({
      severity: 'error',
      message: tooMany
        ? `row has ${got} fields but the header has ${header.length}; first extra field ${JSON.stringify(extra.text)}`
        : `row has ${got} fields but the header has ${header.length}; missing ${missing.map((m) => JSON.stringify(m)).join(', ')}`,
      file,
      line: tooMany ? extra.line : record.endLine,
      column: tooMany ? extra.column : record.endColumn,
      rule: 'csv-ragged-row',
      expected: `${header.length} fields`,
      actual: `${got} fields`,
      hint: tooMany
        ? `quote a field that contains the delimiter ${describeDelimiter(delimiter)}, or remove the extra fields`
        : 'write an empty field as two delimiters in a row rather than leaving it out',
    });
  }
  return { table: { file, delimiter, header, rows }, diagnostics };
}

/** Index of the first header cell named exactly `name`, or -1. */
export function columnIndex(table: CsvTable, name: string): number {
  return table.header.findIndex((c) => c.text === name);
}

/**
 * One diagnostic per name in `names` that the header lacks, at the header line, listing
 * the columns that do exist (and a near miss differing only in case, when there is one).
 */
export function requireColumns(table: CsvTable, names: string[], rule = 'csv-missing-column'): Diagnostic[] {
  const present = table.header.map((c) => c.text);
  const first = table.header[0];
  const out: Diagnostic[] = [];
  for (const name of names) {
    if (present.includes(name)) continue;
    const nearMiss = present.find((p) => p.toLowerCase() === name.toLowerCase());
    out.push({
      severity: 'error',
      message: `missing column ${JSON.stringify(name)}; the header has ${present.map((p) => JSON.stringify(p)).join(', ')}`,
      file: table.file,
      line: first.line,
      column: first.column,
      rule,
      expected: `a column named ${JSON.stringify(name)}`,
      actual: present.join(', '),
      hint:
        nearMiss !== undefined
          ? `rename column ${JSON.stringify(nearMiss)} to ${JSON.stringify(name)} (names are case-sensitive)`
          : `add a column named ${JSON.stringify(name)} to the header line`,
    });
  }
  return out;
}
