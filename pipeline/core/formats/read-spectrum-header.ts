import type { Diagnostic } from '../diagnostics/diagnostic.js';
import { detectDelimiter, tokenizeCsv } from './tokenize-csv.js';

/** What the data-row parser needs from a spectrum file's header line. */
export interface SpectrumHeader {
  detectorIds: string[];
  /** 1-based column of each detector id in the header line. */
  detectorColumns: number[];
  /** Byte value of the delimiter: 44 `,`, 59 `;` or 9 tab. */
  delimiterByte: number;
  /** Byte offset of the first line after the header. */
  dataOffset: number;
  /** 1-based line number of the first line after the header. */
  dataLine: number;
  headerLine: number;
}

const LF = 10;
const CR = 13;
const utf8 = new TextDecoder('utf-8');

function afterBreak(bytes: Uint8Array, p: number): number {
  if (p >= bytes.length) return p;
  if (bytes[p] === CR && bytes[p + 1] === LF) return p + 2;
  return p + 1;
}

function headerError(file: string, line: number, column: number, rule: string, message: string, rest: Partial<Diagnostic>): Diagnostic {
  return { severity: 'error', message, file, line, column, rule, ...rest };
}

/**
 * Finds and checks the header line `channel,<detector ids…>` of a spectrum file: skips a
 * UTF-8 BOM and any blank or `#` comment lines before it, detects the delimiter, unquotes
 * names. Only this line is decoded as text; the data rows stay bytes.
 */
export function readSpectrumHeader(bytes: Uint8Array, file: string): { header: SpectrumHeader | null; diagnostics: Diagnostic[] } {
  const n = bytes.length;
  let pos = n >= 3 && bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  let line = 1;
  for (;;) {
    let p = pos;
    while (p < n && (bytes[p] === 32 || bytes[p] === 9)) p++;
    if (p >= n) {
      return {
        header: null,
        diagnostics: [
          headerError(file, 1, 1, 'spectrum-no-header', 'the spectrum file is empty: no header line', {
            expected: 'a header line `channel,<detector ids…>` then one row per channel',
            actual: n === 0 ? 'an empty file' : 'only blank or # comment lines',
            hint: 'check that the acquisition finished writing this file',
          }),
        ],
      };
    }
    const c = bytes[p];
    if (c !== LF && c !== CR && c !== 35) break;
    while (p < n && bytes[p] !== LF && bytes[p] !== CR) p++;
    pos = afterBreak(bytes, p);
    line++;
  }

  let end = pos;
  let inQuote = false;
  let linesInQuotes = 0;
  while (end < n) {
    const c = bytes[end];
    if (c === 34) inQuote = !inQuote;
    else if (c === LF || c === CR) {
      if (!inQuote) break;
      if (c === CR && bytes[end + 1] === LF) end++;
      linesInQuotes++;
    }
    end++;
  }
  const text = utf8.decode(bytes.subarray(pos, end));
  const delimiter = detectDelimiter(text);
  const tokens = tokenizeCsv(text, file, delimiter, 0, line, 1);
  const diagnostics = tokens.diagnostics;
  if (tokens.fatal || tokens.records.length === 0) return { header: null, diagnostics };
  const record = tokens.records[0];
  const cells = record.cells;

  const first = cells[0];
  if (first.text.toLowerCase() !== 'channel') {
    const looksLikeData = /^[0-9]/.test(first.text);
    diagnostics.push(
      headerError(file, first.line, first.column, 'spectrum-first-column', `the first column is named ${JSON.stringify(first.text)}, not "channel"`, {
        expected: '"channel"',
        actual: JSON.stringify(first.text),
        hint: looksLikeData
          ? 'the file seems to start with data: add the header line `channel,<detector ids…>` first'
          : 'the first column holds the channel number 0…N−1 and must be named channel',
      }),
    );
  }
  if (cells.length < 2) {
    diagnostics.push(
      headerError(file, record.endLine, record.endColumn, 'spectrum-no-detectors', `the header ${JSON.stringify(text.trim())} names no detector column`, {
        expected: 'channel followed by one column per detector id',
        actual: `${cells.length} column`,
        hint: 'separate the column names with "," ";" or a tab, e.g. channel,d01,d02',
      }),
    );
  }
  const seen = new Map<string, number>();
  for (let k = 1; k < cells.length; k++) {
    const cell = cells[k];
    if (cell.text === '') {
      diagnostics.push(
        headerError(file, cell.line, cell.column, 'spectrum-empty-detector-id', `detector column ${k} of the header has no id`, {
          expected: 'a detector id from series.yaml',
          actual: '""',
          hint: k === cells.length - 1 ? 'remove the trailing delimiter from the header line' : 'name every detector column',
        }),
      );
      continue;
    }
    const earlier = seen.get(cell.text);
    if (earlier !== undefined) {
      diagnostics.push(
        headerError(file, cell.line, cell.column, 'spectrum-duplicate-detector', `detector id ${JSON.stringify(cell.text)} heads two columns (column ${earlier} and here)`, {
          expected: 'each detector id once',
          actual: JSON.stringify(cell.text),
          hint: 'a spectrum file holds one column per detector; rename or remove the repeated one',
        }),
      );
      continue;
    }
    seen.set(cell.text, cell.column);
  }
  if (diagnostics.some((d) => d.severity === 'error')) return { header: null, diagnostics };

  return {
    header: {
      detectorIds: cells.slice(1).map((c) => c.text),
      // the name itself, past an opening quote
      detectorColumns: cells.slice(1).map((c) => (c.line === line && text[c.column - 1] === '"' ? c.column + 1 : c.column)),
      delimiterByte: delimiter.charCodeAt(0),
      dataOffset: afterBreak(bytes, end),
      dataLine: line + linesInQuotes + 1,
      headerLine: line,
    },
    diagnostics,
  };
}
