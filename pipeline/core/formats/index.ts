export { readCsv, columnIndex, requireColumns, type CsvCell, type CsvRow, type CsvTable } from './csv-reader.js';
export { tokenizeCsv, detectDelimiter, findFirstContentLine, type CsvRecord, type CsvTokens } from './tokenize-csv.js';
export { parseSpectrumCsv, type ParsedSpectrum } from './spectrum-csv.js';
export { loadYaml, type YamlSource } from './yaml-source.js';
export { zodIssuesToDiagnostics, formatIssuePath, describeFound, type SchemaIssue } from './zod-issues-to-diagnostics.js';
