import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import { readCsv, requireColumns, type CsvRow, type CsvTable } from '../../pipeline/core/formats/csv-reader.js';
import { RUN_KINDS, type RunKind, type RunRecord } from '../../pipeline/core/model/series-model.js';
import { parseNumberCell, type NumberRule } from './parse-number.js';
import { parseTimestampMs } from './parse-timestamp.js';

const RUN_ID = /^[A-Za-z0-9][A-Za-z0-9_.-]*$/;
export const RUNLOG_COLUMNS = ['run', 'started_at', 'kind', 'target', 'beam_energy_keV', 'beam_energy_unc_keV', 'charge_uC', 'real_time_s'] as const;

export interface RunlogResult {
  runs: RunRecord[];
  /** Run → errors that set it aside (the row was readable enough to name its run). */
  rowErrors: Map<string, Diagnostic[]>;
  diagnostics: Diagnostic[];
  fatal: boolean;
}

/** Column lookup that tolerates header case (`Beam_Energy_keV`): lab spreadsheets vary. */
function columnMap(table: CsvTable): Map<string, number> {
  const m = new Map<string, number>();
  table.header.forEach((h, i) => m.set(h.text.toLowerCase(), i));
  return m;
}

export function readRunlog(text: string, file: string): RunlogResult {
  const diagnostics: Diagnostic[] = [];
  const rowErrors = new Map<string, Diagnostic[]>();
  const runs: RunRecord[] = [];
  const parsed = readCsv(text, file);
  diagnostics.push(...parsed.diagnostics.filter((d) => d.rule !== 'csv-ragged-row'));
  const table = parsed.table;
  if (table === null) return { runs, rowErrors, diagnostics, fatal: true };
  const lowerHeader: CsvTable = { ...table, header: table.header.map((h) => ({ ...h, text: h.text.toLowerCase() })) };
  const missing = requireColumns(lowerHeader, RUNLOG_COLUMNS.map((c) => c.toLowerCase()), 'runlog-missing-column');
  if (missing.length > 0) return { runs, rowErrors, diagnostics: [...diagnostics, ...missing], fatal: true };
  const col = columnMap(table);
  const cell = (row: CsvRow, name: string) => {
    const i = col.get(name.toLowerCase());
    return i === undefined ? undefined : row.cells[i];
  };
  const seen = new Map<string, number>();
  for (const row of table.rows) {
    const runCell = cell(row, 'run');
    const runId = runCell?.text ?? '';
    const errors: Diagnostic[] = [];
    const at = (c: { line: number; column: number } | undefined) => ({ file, line: c?.line ?? row.line, column: c?.column, stage: 'ingest' as const });
    if (!RUN_ID.test(runId)) {
      diagnostics.push({ severity: 'error', rule: 'runlog-bad-run-id', message: `run id "${runId}" is not usable; the row is skipped`, expected: 'letters, digits, _ . - (starting with a letter or digit)', actual: JSON.stringify(runId), ...at(runCell) });
      continue;
    }
    if (seen.has(runId)) {
      // Which row is right cannot be known: the run is set aside (its first row stays listed).
      const d: Diagnostic = { severity: 'error', rule: 'runlog-duplicate-run', message: `run "${runId}" appears again (first on line ${seen.get(runId)}); the run is set aside`, run: runId, hint: 'give every run its own id', ...at(runCell) };
      rowErrors.set(runId, [...(rowErrors.get(runId) ?? []), d]);
      continue;
    }
    seen.set(runId, row.line);
    if (row.cells.length !== table.header.length) {
      errors.push({ severity: 'error', rule: 'runlog-ragged-row', message: `row has ${row.cells.length} fields, the header has ${table.header.length}`, run: runId, expected: `${table.header.length} fields`, actual: `${row.cells.length}`, hint: 'quote fields (such as notes) that contain the delimiter', ...at(undefined) });
    }
    const kindCell = cell(row, 'kind');
    const kindText = (kindCell?.text ?? '').toLowerCase();
    let kind: RunKind = 'sample';
    if ((RUN_KINDS as readonly string[]).includes(kindText)) kind = kindText as RunKind;
    else errors.push({ severity: 'error', rule: 'runlog-bad-kind', message: `kind "${kindCell?.text ?? ''}" is not a run kind`, run: runId, expected: RUN_KINDS.join(' | '), actual: JSON.stringify(kindCell?.text ?? ''), ...at(kindCell) });
    const timeCell = cell(row, 'started_at');
    const startedAtMs = timeCell ? parseTimestampMs(timeCell.text) : null;
    if (startedAtMs === null) errors.push({ severity: 'error', rule: 'runlog-bad-time', message: `started_at "${timeCell?.text ?? ''}" is not an ISO 8601 date-time`, run: runId, expected: 'e.g. 2026-03-04T12:30:05Z or 2026-03-04 12:30:05', actual: JSON.stringify(timeCell?.text ?? ''), ...at(timeCell) });
    const reduced = kind === 'reference' || kind === 'sample';
    const num = (name: string, rule: Omit<NumberRule, 'column'>, required: boolean, fallback: number): number => {
      const c = cell(row, name);
      if (c === undefined || (c.text === '' && !required)) return fallback;
      const r = parseNumberCell(c, { column: name, decimalComma: table.delimiter !== ',', ...rule }, file, runId);
      if ('error' in r) {
        if (required) errors.push(r.error);
        else diagnostics.push({ ...r.error, severity: 'warning', message: `${r.error.message} (ignored: not needed for a ${kind} run)` });
        return fallback;
      }
      return r.value;
    };
    const target = cell(row, 'target')?.text ?? '';
    if (reduced && target === '') errors.push({ severity: 'error', rule: 'runlog-missing-target', message: 'target is empty', run: runId, expected: 'a target id from series.yaml', ...at(cell(row, 'target')) });
    const beamEnergyKeV = num('beam_energy_keV', { gt: 0, unit: 'keV' }, reduced, Number.NaN);
    let beamEnergyUncKeV = 0;
    const uncCell = cell(row, 'beam_energy_unc_keV');
    if (uncCell !== undefined && uncCell.text === '' && reduced) {
      diagnostics.push({ severity: 'warning', rule: 'runlog-missing-energy-uncertainty', message: 'beam_energy_unc_keV is empty; taken as 0', run: runId, hint: 'state the beam-energy uncertainty so it enters the systematic uncertainty', ...at(uncCell) });
    } else beamEnergyUncKeV = num('beam_energy_unc_keV', { min: 0, unit: 'keV' }, reduced, 0);
    const chargeUC = num('charge_uC', { gt: 0, unit: 'µC' }, reduced, Number.NaN);
    const realTimeS = num('real_time_s', { gt: 0, unit: 's' }, reduced, Number.NaN);
    runs.push({
      run: runId,
      index: runs.length,
      line: row.line,
      startedAt: timeCell?.text ?? '',
      startedAtMs: startedAtMs ?? Number.NaN,
      kind,
      target,
      beamEnergyKeV,
      beamEnergyUncKeV,
      chargeUC,
      realTimeS,
      note: cell(row, 'note')?.text ?? '',
      targetColumn: cell(row, 'target')?.column,
    });
    if (errors.length > 0) rowErrors.set(runId, errors);
  }
  if (runs.length === 0) diagnostics.push({ severity: 'error', rule: 'runlog-empty', message: 'runlog.csv lists no runs', file, stage: 'ingest' });
  return { runs, rowErrors, diagnostics, fatal: runs.length === 0 };
}
