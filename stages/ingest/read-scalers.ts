import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import { readCsv, requireColumns, type CsvCell } from '../../pipeline/core/formats/csv-reader.js';
import type { LiveScaler, RunRecord } from '../../pipeline/core/model/series-model.js';
import { parseNumberCell } from './parse-number.js';

export interface ScalersResult {
  scalers: Map<string, Map<string, LiveScaler>>;
  rowErrors: Map<string, Diagnostic[]>;
  diagnostics: Diagnostic[];
}

/**
 * scalers.csv: `run, detector` and per row either `live_time_s` or `pulser_sent, pulser_counted`
 * (a file may hold both kinds of column; each row fills one kind).
 */
export function readScalers(text: string, file: string, runs: ReadonlyMap<string, RunRecord>, detectorIds: ReadonlySet<string>): ScalersResult {
  const scalers = new Map<string, Map<string, LiveScaler>>();
  const rowErrors = new Map<string, Diagnostic[]>();
  const diagnostics: Diagnostic[] = [];
  const parsed = readCsv(text, file);
  diagnostics.push(...parsed.diagnostics.filter((d) => d.rule !== 'csv-ragged-row'));
  const table = parsed.table;
  if (table === null) return { scalers, rowErrors, diagnostics };
  const names = table.header.map((h) => h.text.toLowerCase());
  const lower = { ...table, header: table.header.map((h, i) => ({ ...h, text: names[i]! })) };
  const missing = requireColumns(lower, ['run', 'detector'], 'scalers-missing-column');
  const hasLive = names.includes('live_time_s');
  const hasPulser = names.includes('pulser_sent') && names.includes('pulser_counted');
  if (!hasLive && !hasPulser) {
    missing.push({ severity: 'error', rule: 'scalers-missing-column', file, line: table.header[0]?.line ?? 1, stage: 'ingest', message: 'scalers.csv has neither live_time_s nor pulser_sent + pulser_counted', expected: 'run,detector,live_time_s  or  run,detector,pulser_sent,pulser_counted', actual: names.join(',') });
  }
  if (missing.length > 0) return { scalers, rowErrors, diagnostics: [...diagnostics, ...missing] };
  const idx = (n: string) => names.indexOf(n);
  const get = (cells: CsvCell[], n: string) => (idx(n) >= 0 ? cells[idx(n)] : undefined);
  const fail = (run: string, d: Diagnostic) => {
    const list = rowErrors.get(run) ?? [];
    list.push(d);
    rowErrors.set(run, list);
  };
  for (const row of table.rows) {
    const runText = get(row.cells, 'run')?.text ?? '';
    const det = get(row.cells, 'detector')?.text ?? '';
    const where = { file, line: row.line, stage: 'ingest' as const, run: runText, detector: det };
    const rec = runs.get(runText);
    if (rec === undefined) {
      diagnostics.push({ severity: 'warning', rule: 'scalers-unknown-run', message: `scalers for run "${runText}", which runlog.csv does not list; ignored`, ...where });
      continue;
    }
    if (!detectorIds.has(det)) {
      diagnostics.push({ severity: 'warning', rule: 'scalers-unknown-detector', message: `scalers for detector "${det}", which series.yaml does not define; ignored`, expected: [...detectorIds].join(', '), ...where });
      continue;
    }
    if (row.cells.length !== table.header.length) {
      fail(runText, { severity: 'error', rule: 'scalers-ragged-row', message: `row has ${row.cells.length} fields, the header has ${table.header.length}`, ...where });
      continue;
    }
    const perRun = scalers.get(runText) ?? new Map<string, LiveScaler>();
    if (perRun.has(det)) {
      fail(runText, { severity: 'error', rule: 'scalers-duplicate', message: `a second scaler row for run ${runText}, detector ${det} (first on line ${perRun.get(det)!.line})`, ...where });
      continue;
    }
    const live = get(row.cells, 'live_time_s');
    const sent = get(row.cells, 'pulser_sent');
    const counted = get(row.cells, 'pulser_counted');
    let scaler: LiveScaler | null = null;
    if (live !== undefined && live.text !== '') {
      const r = parseNumberCell(live, { column: 'live_time_s', gt: 0, unit: 's', decimalComma: table.delimiter !== ',' }, file, runText);
      if ('error' in r) fail(runText, { ...r.error, rule: 'scalers-bad-value', detector: det });
      else if (Number.isFinite(rec.realTimeS) && r.value > rec.realTimeS * (1 + 1e-6)) {
        fail(runText, { severity: 'error', rule: 'scalers-live-exceeds-real', message: `live_time_s ${live.text} exceeds the run's real_time_s ${rec.realTimeS}`, expected: `≤ ${rec.realTimeS} s`, actual: live.text, ...where, column: live.column });
      } else scaler = { mode: 'live-time', liveTimeS: r.value, line: row.line };
    } else if (sent !== undefined && counted !== undefined && sent.text !== '' && counted.text !== '') {
      const s = parseNumberCell(sent, { column: 'pulser_sent', gt: 0, integer: true }, file, runText);
      const c = parseNumberCell(counted, { column: 'pulser_counted', min: 0, integer: true }, file, runText);
      if ('error' in s) fail(runText, { ...s.error, rule: 'scalers-bad-value', detector: det });
      else if ('error' in c) fail(runText, { ...c.error, rule: 'scalers-bad-value', detector: det });
      else if (c.value > s.value || c.value === 0) {
        fail(runText, { severity: 'error', rule: 'scalers-pulser-range', message: `pulser_counted ${counted.text} must be between 1 and pulser_sent ${sent.text}`, ...where, column: counted.column });
      } else scaler = { mode: 'pulser', pulserSent: s.value, pulserCounted: c.value, line: row.line };
    } else {
      fail(runText, { severity: 'error', rule: 'scalers-empty', message: 'neither live_time_s nor both pulser columns are filled', expected: 'live_time_s, or pulser_sent and pulser_counted', ...where });
    }
    if (scaler !== null) {
      perRun.set(det, scaler);
      scalers.set(runText, perRun);
    }
  }
  return { scalers, rowErrors, diagnostics };
}
