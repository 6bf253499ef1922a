import { describe, expect, it } from 'vitest';
import { ingest, ingestSpectrum, type IngestInput, type IngestOutput } from '../../stages/ingest/index.js';
import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { IngestedSeries, RunRecord } from '../../pipeline/core/model/series-model.js';

// The input contract checked here is this project's own (README, "Input layout" and "What lab
// computers write"); the ISO 8601 forms are those of RFC 3339 §5.6. No physics is computed.

const SERIES_YAML = `series: ingest-test
title: ingest test series
beam: { projectile: 4He, charge_state: 1 }
detectors:
  - { id: d01, angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 }
  - { id: d02, angle_deg: 165, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 }
targets:
  - id: au-ref
    layers:
      - { composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }
  - id: c-foil
    layers:
      - { composition: { C: 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }
peaks:
  - { label: "12C elastic", target_nuclide: 12C }
normalization: { method: reference-run, reference_target: au-ref }
`;

const RUNLOG_HEADER = 'run,started_at,kind,target,beam_energy_keV,beam_energy_unc_keV,charge_uC,real_time_s,note';
/** Cells of the runlog rows, in header order; r003 is the row the defect cases spoil. */
const RUNLOG_ROWS: string[][] = [
  ['r001', '2026-03-02T08:30:00Z', 'reference', 'au-ref', '2000', '2', '4', '500', 'gold film'],
  ['r002', '2026-03-02T08:45:00Z', 'sample', 'c-foil', '2000', '2', '30', '1000', ''],
  ['r003', '2026-03-02T09:05:00Z', 'sample', 'c-foil', '2100', '2', '30', '1000', ''],
  ['r004', '2026-03-02T09:25:00Z', 'reference', 'au-ref', '2100', '2', '4', '500', ''],
  ['r005', '2026-03-02T09:40:00Z', 'calibration', '', '', '', '', '', 'alpha source'],
];
const COL = { run: 0, started_at: 1, kind: 2, target: 3, beam_energy_keV: 4, beam_energy_unc_keV: 5, charge_uC: 6, real_time_s: 7, note: 8 } as const;

const SCALERS_HEADER = 'run,detector,live_time_s,pulser_sent,pulser_counted';
const SCALER_ROWS: string[][] = [
  ['r001', 'd01', '475', '', ''],
  ['r001', 'd02', '480', '', ''],
  ['r002', 'd01', '', '10000', '9000'],
  ['r002', 'd02', '', '10000', '9100'],
  ['r003', 'd01', '950', '', ''],
  ['r003', 'd02', '960', '', ''],
  ['r004', 'd01', '470', '', ''],
  ['r004', 'd02', '478', '', ''],
];

const CALIBRATION = `version: cal-a
valid_from_run: r001
detectors:
  - { id: d01, offset_keV: 20, gain_keV_per_channel: 3.6 }
  - { id: d02, offset_keV: 21, gain_keV_per_channel: 3.6 }
`;

const SPECTRA = ['r001.csv', 'r002.csv', 'r003.csv', 'r004.csv'];

const csv = (header: string, rows: string[][], delimiter = ',', eol = '\n') => [header.split(',').join(delimiter), ...rows.map((r) => r.join(delimiter))].join(eol) + eol;

interface Variant {
  yaml?: string;
  runlogRows?: string[][];
  runlogText?: string;
  scalerRows?: string[][];
  scalersText?: string | null;
  spectra?: string[];
  calibrations?: string[];
}

function input(v: Variant = {}): IngestInput {
  const scalersText = v.scalersText === undefined ? csv(SCALERS_HEADER, v.scalerRows ?? SCALER_ROWS) : v.scalersText;
  return {
    seriesDir: '/series/ingest-test',
    seriesYaml: { file: 'series.yaml', text: v.yaml ?? SERIES_YAML },
    runlog: { file: 'runlog.csv', text: v.runlogText ?? csv(RUNLOG_HEADER, v.runlogRows ?? RUNLOG_ROWS) },
    scalers: scalersText === null ? null : { file: 'scalers.csv', text: scalersText },
    calibrations: (v.calibrations ?? [CALIBRATION]).map((text, i) => ({ file: `calibrations/cal-${i}.yaml`, text })),
    spectra: v.spectra ?? SPECTRA,
    readFile: () => null,
  };
}

function okSeries(out: IngestOutput): IngestedSeries {
  if (!out.ok) throw new Error(`ingest failed: ${JSON.stringify(out.diagnostics, null, 1)}`);
  return out.series;
}

/** r003's row with one cell replaced. */
function spoil(column: keyof typeof COL, text: string): string[][] {
  return RUNLOG_ROWS.map((r) => (r[0] === 'r003' ? r.map((c, i) => (i === COL[column] ? text : c)) : r));
}

/** 1-based character column where cell `index` of a comma-joined row starts. */
const cellColumn = (cells: string[], index: number) => cells.slice(0, index).reduce((n, c) => n + c.length + 1, 1);

const clean = okSeries(ingest(input()));
const byRun = (s: IngestedSeries) => new Map(s.runs.map((r) => [r.run, r]));
const errors = (ds: readonly Diagnostic[]) => ds.filter((d) => d.severity === 'error');

const withoutLines = (m: ReadonlyMap<string, { line: number }> | undefined) => (m === undefined ? undefined : [...m].map(([k, { line: _line, ...v }]) => [k, v]));

/** The set-aside reasons of r003 must be exactly one diagnostic; every other run is read as in the clean series. */
function onlyR003(out: IngestOutput): Diagnostic {
  const s = okSeries(out);
  expect([...s.setAside.keys()]).toEqual(['r003']);
  const reasons = s.setAside.get('r003')!;
  expect(reasons).toHaveLength(1);
  const others = (x: IngestedSeries) => x.runs.filter((r) => r.run !== 'r003');
  expect(others(s)).toEqual(others(clean));
  for (const run of ['r001', 'r002', 'r004']) {
    expect(s.spectrumFiles.get(run)).toBe(`spectra/${run}.csv`);
    // scaler values as in the clean series (their line numbers move when a scalers row is removed)
    if (s.scalers !== null) expect(withoutLines(s.scalers.get(run))).toEqual(withoutLines(clean.scalers!.get(run)));
  }
  const d = reasons[0]!;
  expect(d.severity).toBe('error');
  expect(d.run).toBe('r003');
  expect(d.stage).toBe('ingest');
  return d;
}

describe('ingest: a clean series (README, "Input layout")', () => {
  it('accepts every run, reads every field, and sets nothing aside', () => {
    expect(clean.setAside.size).toBe(0);
    expect(errors(clean.diagnostics)).toEqual([]);
    expect(clean.runs.map((r) => r.run)).toEqual(['r001', 'r002', 'r003', 'r004', 'r005']);
    expect(clean.runs.map((r) => r.index)).toEqual([0, 1, 2, 3, 4]);
    expect(clean.runs.map((r) => r.line)).toEqual([2, 3, 4, 5, 6]);
    const r001 = byRun(clean).get('r001')!;
    expect(r001).toEqual<RunRecord>({
      run: 'r001',
      index: 0,
      line: 2,
      startedAt: '2026-03-02T08:30:00Z',
      startedAtMs: Date.UTC(2026, 2, 2, 8, 30, 0),
      kind: 'reference',
      target: 'au-ref',
      targetColumn: cellColumn(RUNLOG_ROWS[0]!, COL.target),
      beamEnergyKeV: 2000,
      beamEnergyUncKeV: 2,
      chargeUC: 4,
      realTimeS: 500,
      note: 'gold film',
    });
    expect(byRun(clean).get('r005')!.kind).toBe('calibration');
    expect([...clean.spectrumFiles]).toEqual(SPECTRA.map((f) => [f.replace('.csv', ''), `spectra/${f}`]));
    expect(clean.scalers!.get('r001')!.get('d01')).toEqual({ mode: 'live-time', liveTimeS: 475, line: 2 });
    expect(clean.scalers!.get('r002')!.get('d02')).toEqual({ mode: 'pulser', pulserSent: 10000, pulserCounted: 9100, line: 5 });
    expect(clean.calibrations.map((c) => [c.version, c.fromIndex, c.toIndex])).toEqual([['cal-a', 0, undefined]]);
    expect(clean.config.series).toBe('ingest-test');
    // defaults from the schema (README, "Settings")
    expect(clean.config.normalization.screening).toBe('lecuyer');
    expect(clean.config.extract.peak_half_width_fwhm).toBe(1.5);
  });

  it('without scalers.csv: a warning, no run set aside (README, "scalers.csv")', () => {
    const s = okSeries(ingest(input({ scalersText: null })));
    expect(s.scalers).toBeNull();
    expect(s.setAside.size).toBe(0);
    expect(s.diagnostics.find((d) => d.rule === 'series-no-scalers')?.severity).toBe('warning');
  });

  it('a spectrum file that belongs to no run is noted and ignored', () => {
    const s = okSeries(ingest(input({ spectra: [...SPECTRA, 'r999.csv'] })));
    expect(s.setAside.size).toBe(0);
    expect(s.diagnostics.find((d) => d.rule === 'spectrum-unlisted')).toMatchObject({ severity: 'info', file: 'spectra/r999.csv' });
  });
});

describe('ingest: a run-level defect sets that run aside, with its position; the other runs are untouched (README, "Refused")', () => {
  const r003 = RUNLOG_ROWS[2]!;

  it('bad kind', () => {
    const d = onlyR003(ingest(input({ runlogRows: spoil('kind', 'sampel') })));
    expect(d).toMatchObject({ rule: 'runlog-bad-kind', file: 'runlog.csv', line: 4, column: cellColumn(r003, COL.kind), actual: '"sampel"' });
    expect(d.expected).toContain('reference | sample | calibration | background');
  });

  it('unparsable started_at (hour 25)', () => {
    const d = onlyR003(ingest(input({ runlogRows: spoil('started_at', '2026-03-02 25:00') })));
    expect(d).toMatchObject({ rule: 'runlog-bad-time', file: 'runlog.csv', line: 4, column: cellColumn(r003, COL.started_at) });
    expect(d.message).toContain('2026-03-02 25:00');
  });

  it('a non-existent calendar date (February 30) is refused too', () => {
    const d = onlyR003(ingest(input({ runlogRows: spoil('started_at', '2026-02-30T10:00:00Z') })));
    expect(d.rule).toBe('runlog-bad-time');
  });

  it('charge_uC "3,5" is not a number, with the decimal-comma hint', () => {
    // The cell is quoted so that the comma stays inside it (RFC 4180); the column is the opening quote's.
    const d = onlyR003(ingest(input({ runlogRows: spoil('charge_uC', '"3,5"') })));
    expect(d).toMatchObject({ rule: 'runlog-not-a-number', file: 'runlog.csv', line: 4, column: cellColumn(r003, COL.charge_uC), actual: '"3,5"' });
    expect(d.message).toContain('charge_uC');
    expect(d.hint).toMatch(/decimal point, not a comma/);
  });

  it('charge_uC "abc": not a number, no decimal-comma hint', () => {
    const d = onlyR003(ingest(input({ runlogRows: spoil('charge_uC', 'abc') })));
    expect(d.rule).toBe('runlog-not-a-number');
    expect(d.hint).toBeUndefined();
  });

  it('negative real_time_s is out of range', () => {
    const d = onlyR003(ingest(input({ runlogRows: spoil('real_time_s', '-1000') })));
    expect(d).toMatchObject({ rule: 'runlog-out-of-range', file: 'runlog.csv', line: 4, column: cellColumn(r003, COL.real_time_s), actual: '-1000' });
    expect(d.expected).toContain('> 0');
  });

  it('unknown target, at the target cell', () => {
    const d = onlyR003(ingest(input({ runlogRows: spoil('target', 'c-fiol') })));
    expect(d).toMatchObject({ rule: 'run-unknown-target', file: 'runlog.csv', line: 4, actual: 'c-fiol' });
    expect(d.expected).toContain('c-foil');
    // README, "Refused, each with file, line and column: … unknown targets".
    expect(d.column).toBe(cellColumn(r003, COL.target));
  });

  it('a reference run on a target that is not the reference target, at the target cell', () => {
    const rows = spoil('kind', 'reference');
    const d = onlyR003(ingest(input({ runlogRows: rows })));
    expect(d).toMatchObject({ rule: 'run-reference-target', file: 'runlog.csv', line: 4 });
    expect(d.message).toContain('au-ref');
    expect(d.column).toBe(cellColumn(rows[2]!, COL.target));
  });

  it('missing spectrum file', () => {
    const d = onlyR003(ingest(input({ spectra: SPECTRA.filter((f) => f !== 'r003.csv') })));
    expect(d).toMatchObject({ rule: 'run-missing-spectrum', file: 'runlog.csv', line: 4 });
    expect(d.message).toContain('spectra/r003.csv');
  });

  it('missing scaler row for one detector', () => {
    const d = onlyR003(ingest(input({ scalerRows: SCALER_ROWS.filter((r) => !(r[0] === 'r003' && r[1] === 'd02')) })));
    expect(d).toMatchObject({ rule: 'run-missing-scalers', file: 'scalers.csv' });
    expect(d.message).toContain('d02');
    expect(d.message).not.toContain('d01');
  });

  it('live_time_s greater than real_time_s, at the live-time cell', () => {
    const rows = SCALER_ROWS.map((r) => (r[0] === 'r003' && r[1] === 'd01' ? ['r003', 'd01', '1200', '', ''] : r));
    const d = onlyR003(ingest(input({ scalerRows: rows })));
    const line = rows.findIndex((r) => r[0] === 'r003' && r[1] === 'd01') + 2;
    expect(d).toMatchObject({ rule: 'scalers-live-exceeds-real', file: 'scalers.csv', line, column: cellColumn(rows[line - 2]!, 2), detector: 'd01', actual: '1200' });
  });

  it('pulser_counted greater than pulser_sent, at the counted cell', () => {
    const rows = SCALER_ROWS.map((r) => (r[0] === 'r003' && r[1] === 'd02' ? ['r003', 'd02', '', '1000', '1001'] : r));
    const d = onlyR003(ingest(input({ scalerRows: rows })));
    const line = rows.findIndex((r) => r[0] === 'r003' && r[1] === 'd02') + 2;
    expect(d).toMatchObject({ rule: 'scalers-pulser-range', file: 'scalers.csv', line, column: cellColumn(rows[line - 2]!, 4), detector: 'd02' });
  });

  it('a non-number live_time_s is refused at its cell', () => {
    const rows = SCALER_ROWS.map((r) => (r[0] === 'r003' && r[1] === 'd01' ? ['r003', 'd01', '9.5e', '', ''] : r));
    const d = onlyR003(ingest(input({ scalerRows: rows })));
    expect(d).toMatchObject({ rule: 'scalers-bad-value', file: 'scalers.csv', line: 6, column: cellColumn(rows[4]!, 2), detector: 'd01' });
  });

  it('duplicate run id: an error at the repeated row', () => {
    const dup = ['r003', '2026-03-02T09:15:00Z', 'sample', 'c-foil', '2200', '2', '30', '1000', ''];
    const rows = [...RUNLOG_ROWS.slice(0, 3), dup, ...RUNLOG_ROWS.slice(3)];
    const out = ingest(input({ runlogRows: rows }));
    const s = okSeries(out);
    const all = [...s.diagnostics, ...[...s.setAside.values()].flat()];
    const d = all.find((x) => x.rule === 'runlog-duplicate-run')!;
    expect(d).toMatchObject({ severity: 'error', file: 'runlog.csv', line: 5, column: 1, run: 'r003' });
    expect(d.message).toContain('line 4');
  });

  it('duplicate run id: the run is set aside (README, "Refused … duplicate runs")', () => {
    // Two rows claim the same spectra/r003.csv with different energies: which one is right cannot be told.
    const dup = ['r003', '2026-03-02T09:15:00Z', 'sample', 'c-foil', '2200', '2', '30', '1000', ''];
    const rows = [...RUNLOG_ROWS.slice(0, 3), dup, ...RUNLOG_ROWS.slice(3)];
    const s = okSeries(ingest(input({ runlogRows: rows })));
    expect([...s.setAside.keys()]).toEqual(['r003']);
    expect(s.setAside.get('r003')!.map((d) => d.rule)).toContain('runlog-duplicate-run');
  });

  it('two defects in one run are both reported; still only that run is set aside', () => {
    const rows = spoil('charge_uC', 'x').map((r) => (r[0] === 'r003' ? r.map((c, i) => (i === COL.kind ? 'smaple' : c)) : r));
    const s = okSeries(ingest(input({ runlogRows: rows })));
    expect([...s.setAside.keys()]).toEqual(['r003']);
    expect(s.setAside.get('r003')!.map((d) => d.rule).sort()).toEqual(['runlog-bad-kind', 'runlog-not-a-number']);
  });

  it('a bad number in a calibration run is only a warning (not reduced, README "runlog.csv")', () => {
    const rows = RUNLOG_ROWS.map((r) => (r[0] === 'r005' ? r.map((c, i) => (i === COL.charge_uC ? 'n/a' : c)) : r));
    const s = okSeries(ingest(input({ runlogRows: rows })));
    expect(s.setAside.size).toBe(0);
    expect(s.diagnostics.find((d) => d.rule === 'runlog-not-a-number')?.severity).toBe('warning');
  });
});

describe('ingest: series-level failures return ok: false (README, "Exit codes": 2)', () => {
  const failed = (out: IngestOutput): Diagnostic[] => {
    expect(out.ok).toBe(false);
    return out.ok ? [] : out.diagnostics;
  };

  it('missing series.yaml', () => {
    const ds = failed(ingest({ ...input(), seriesYaml: null }));
    expect(ds).toHaveLength(1);
    expect(ds[0]).toMatchObject({ severity: 'error', rule: 'series-missing-file', file: 'series.yaml' });
  });

  it('missing runlog.csv', () => {
    const ds = failed(ingest({ ...input(), runlog: null }));
    expect(ds.find((d) => d.rule === 'series-missing-file')).toMatchObject({ file: 'runlog.csv' });
  });

  it('YAML syntax error: a flow mapping closed with "]" is located at that character', () => {
    const yaml = SERIES_YAML.replace('solid_angle_msr: 2.5 }\n  - { id: d02', 'solid_angle_msr: 2.5 ]\n  - { id: d02');
    const ds = failed(ingest(input({ yaml })));
    const lines = yaml.split('\n');
    const line = lines.findIndex((l) => l.endsWith('2.5 ]')) + 1;
    const e = errors(ds);
    expect(e).toHaveLength(1);
    expect(e[0]).toMatchObject({ file: 'series.yaml', line, column: lines[line - 1]!.indexOf(']') + 1, actual: '"]"' });
    expect(e[0]!.rule).toMatch(/^yaml-/);
    expect(e[0]!.hint).toContain('close every [ and {');
  });

  it('YAML syntax error: a tab used as indentation is located at its line and column', () => {
    const yaml = SERIES_YAML.replace('  - id: c-foil', '\t- id: c-foil');
    const ds = failed(ingest(input({ yaml })));
    const line = yaml.split('\n').findIndex((l) => l.startsWith('\t- id: c-foil')) + 1;
    expect(errors(ds).some((d) => d.file === 'series.yaml' && d.line === line && d.column === 1)).toBe(true);
  });

  it('schema error: angle_deg "150 deg" names the path, the line and the value', () => {
    const yaml = SERIES_YAML.replace('angle_deg: 150,', 'angle_deg: "150 deg",');
    const ds = failed(ingest(input({ yaml })));
    const d = ds.find((x) => x.message.startsWith('detectors[0].angle_deg'))!;
    expect(d).toBeDefined();
    const lines = yaml.split('\n');
    const line = lines.findIndex((l) => l.includes('"150 deg"')) + 1;
    expect(d).toMatchObject({ severity: 'error', file: 'series.yaml', line, column: lines[line - 1]!.indexOf('"150 deg"') + 1, rule: 'series-invalid-type' });
    expect(d.message).toContain('"150 deg"');
    expect(d.hint).toMatch(/bare number/);
  });

  it('schema error: an unknown key is refused at the key', () => {
    const yaml = SERIES_YAML.replace('resolution_fwhm_keV: 15, solid_angle_msr: 2.5 }\n  - { id: d02', 'resolution_fwhm_keV: 15, solid_angle_msr: 2.5, solid_angel: 3 }\n  - { id: d02');
    const ds = failed(ingest(input({ yaml })));
    const d = ds.find((x) => x.rule === 'series-unrecognized-keys')!;
    const lines = yaml.split('\n');
    const line = lines.findIndex((l) => l.includes('solid_angel')) + 1;
    expect(d).toMatchObject({ file: 'series.yaml', line, column: lines[line - 1]!.indexOf('solid_angel') + 1, actual: '"solid_angel"' });
  });

  it('unknown element in a composition', () => {
    const yaml = SERIES_YAML.replace('composition: { C: 1 }', 'composition: { Xx: 1 }');
    const ds = failed(ingest(input({ yaml })));
    const d = ds.find((x) => x.rule === 'series-unknown-element')!;
    const line = yaml.split('\n').findIndex((l) => l.includes('Xx')) + 1;
    expect(d).toMatchObject({ severity: 'error', file: 'series.yaml', line });
    expect(d.message).toContain('"Xx"');
  });

  it('reference_target that is not a target', () => {
    const yaml = SERIES_YAML.replace('reference_target: au-ref', 'reference_target: au-film');
    const ds = failed(ingest(input({ yaml })));
    const d = ds.find((x) => x.rule === 'series-unknown-target')!;
    const lines = yaml.split('\n');
    const line = lines.findIndex((l) => l.includes('au-film')) + 1;
    expect(d).toMatchObject({ severity: 'error', file: 'series.yaml', line, column: lines[line - 1]!.indexOf('au-film') + 1 });
    expect(d.expected).toBe('au-ref, c-foil');
  });

  it('no usable reference run: both reference runs are spoiled; their reasons are returned too', () => {
    const rows = RUNLOG_ROWS.map((r) => (r[2] === 'reference' ? r.map((c, i) => (i === COL.charge_uC ? '0' : c)) : r));
    const ds = failed(ingest(input({ runlogRows: rows })));
    expect(ds.find((d) => d.rule === 'series-no-reference-run')).toMatchObject({ severity: 'error', file: 'runlog.csv' });
    expect(ds.filter((d) => d.rule === 'runlog-out-of-range').map((d) => d.run)).toEqual(['r001', 'r004']);
  });

  it('no reference run at all', () => {
    const rows = RUNLOG_ROWS.filter((r) => r[2] !== 'reference');
    const ds = failed(ingest(input({ runlogRows: rows })));
    expect(ds.some((d) => d.rule === 'series-no-reference-run')).toBe(true);
  });

  it('runlog.csv without a required column', () => {
    const text = csv(RUNLOG_HEADER.replace('charge_uC', 'charge'), RUNLOG_ROWS);
    const ds = failed(ingest(input({ runlogText: text })));
    expect(ds.find((d) => d.rule === 'runlog-missing-column')).toMatchObject({ file: 'runlog.csv', line: 1 });
  });

  it('an empty runlog.csv', () => {
    const ds = failed(ingest(input({ runlogText: '' })));
    expect(ds.some((d) => d.file === 'runlog.csv' && d.severity === 'error')).toBe(true);
  });
});

describe('ingest: what lab computers write is accepted and read the same (README, "Accepted")', () => {
  const sameAsClean = (out: IngestOutput) => {
    const s = okSeries(out);
    expect(s.setAside.size).toBe(0);
    expect(errors(s.diagnostics)).toEqual([]);
    expect(s.runs).toEqual(clean.runs);
    expect(s.scalers).toEqual(clean.scalers);
  };

  it('UTF-8 byte-order mark on every file', () => {
    const base = input();
    sameAsClean(
      ingest({
        ...base,
        seriesYaml: { file: 'series.yaml', text: `\uFEFF${SERIES_YAML}` },
        runlog: { file: 'runlog.csv', text: `\uFEFF${base.runlog!.text}` },
        scalers: { file: 'scalers.csv', text: `\uFEFF${base.scalers!.text}` },
        calibrations: [{ file: 'calibrations/cal-0.yaml', text: `\uFEFF${CALIBRATION}` }],
      }),
    );
  });

  it('CRLF line ends on every file', () => {
    const crlf = (t: string) => t.replace(/\n/g, '\r\n');
    sameAsClean(
      ingest(
        input({
          yaml: crlf(SERIES_YAML),
          runlogText: csv(RUNLOG_HEADER, RUNLOG_ROWS, ',', '\r\n'),
          scalersText: csv(SCALERS_HEADER, SCALER_ROWS, ',', '\r\n'),
          calibrations: [crlf(CALIBRATION)],
        }),
      ),
    );
  });

  it('";" delimiter in runlog.csv and scalers.csv', () => {
    sameAsClean(ingest(input({ runlogText: csv(RUNLOG_HEADER, RUNLOG_ROWS, ';'), scalersText: csv(SCALERS_HEADER, SCALER_ROWS, ';') })));
  });

  it('header names in other letter case', () => {
    const header = 'Run,Started_At,KIND,Target,Beam_Energy_keV,BEAM_ENERGY_UNC_KEV,Charge_uC,Real_Time_s,Note';
    const scalersHeader = 'RUN,Detector,Live_Time_s,Pulser_Sent,PULSER_COUNTED';
    sameAsClean(ingest(input({ runlogText: csv(header, RUNLOG_ROWS), scalersText: csv(scalersHeader, SCALER_ROWS) })));
  });

  it('no note column at all, and no final newline', () => {
    const header = RUNLOG_HEADER.replace(',note', '');
    const text = [header, ...RUNLOG_ROWS.map((r) => r.slice(0, 8).join(','))].join('\n');
    const s = okSeries(ingest(input({ runlogText: text })));
    expect(s.setAside.size).toBe(0);
    expect(s.runs.map((r) => ({ ...r, note: '' }))).toEqual(clean.runs.map((r) => ({ ...r, note: '' })));
  });

  it('a spectrum file named with an upper-case extension (r003.CSV, as Windows tools write) is that run\'s spectrum', () => {
    // The engine lists spectra/*.csv without regard to case; ingest must then find the file under the name it has.
    const s = okSeries(ingest(input({ spectra: ['r001.csv', 'r002.csv', 'r003.CSV', 'r004.csv'] })));
    expect(s.setAside.size).toBe(0);
    expect(s.spectrumFiles.get('r003')).toBe('spectra/r003.CSV');
  });

  it('spaces around fields, a space instead of T, an offset and fractional seconds in started_at', () => {
    const rows = RUNLOG_ROWS.map((r) => (r[0] === 'r002' ? r.map((c, i) => (i === COL.started_at ? '2026-03-02 09:45:00.000+01:00' : ` ${c} `)) : r));
    const s = okSeries(ingest(input({ runlogRows: rows })));
    expect(s.setAside.size).toBe(0);
    const r002 = byRun(s).get('r002')!;
    // 09:45 at +01:00 is 08:45 UTC (RFC 3339 §5.6)
    expect(r002.startedAtMs).toBe(Date.UTC(2026, 2, 2, 8, 45, 0));
    expect(r002.chargeUC).toBe(30);
    expect(r002.target).toBe('c-foil');
  });
});

describe('ingestSpectrum: the header must name exactly the series\' detectors (README, "spectra/<run>.csv")', () => {
  const bytes = (text: string) => new TextEncoder().encode(text);

  it('columns in any order are returned in the order asked for', () => {
    const out = ingestSpectrum(bytes('channel,d02,d01\n0,5,1\n1,6,2\n2,7,3\n'), 'spectra/r001.csv', 'r001', ['d01', 'd02']);
    expect(out.diagnostics).toEqual([]);
    expect(out.spectrum!.channelCount).toBe(3);
    expect([...out.spectrum!.counts[0]!]).toEqual([1, 2, 3]);
    expect([...out.spectrum!.counts[1]!]).toEqual([5, 6, 7]);
  });

  it('an unknown and a missing detector column: error with expected and actual headers', () => {
    const out = ingestSpectrum(bytes('channel,d01,d03\n0,1,2\n1,3,4\n'), 'spectra/r001.csv', 'r001', ['d01', 'd02']);
    expect(out.spectrum).toBeNull();
    const d = out.diagnostics.find((x) => x.rule === 'spectrum-detector-columns')!;
    expect(d).toMatchObject({ severity: 'error', file: 'spectra/r001.csv', line: 1, run: 'r001', stage: 'ingest', expected: 'channel,d01,d02', actual: 'channel,d01,d03' });
    expect(d.message).toContain('unknown detector column(s) d03');
    expect(d.message).toContain('no column for detector(s) d02');
    expect(d.column).toBe('channel,d01,'.length + 1);
  });

  it('BOM, ";" and a quoted unknown name: the column is that of the name itself', () => {
    const out = ingestSpectrum(bytes('\uFEFFchannel;d01;"d03"\r\n0;1;2\r\n'), 'spectra/r001.csv', 'r001', ['d01', 'd02']);
    const d = out.diagnostics.find((x) => x.rule === 'spectrum-detector-columns')!;
    expect(d).toMatchObject({ line: 1, column: 'channel;d01;"'.length + 1, actual: 'channel,d01,d03' });
  });

  it('a missing detector column alone', () => {
    const out = ingestSpectrum(bytes('channel,d01\n0,1\n'), 'spectra/r002.csv', 'r002', ['d01', 'd02']);
    expect(out.spectrum).toBeNull();
    const d = out.diagnostics.find((x) => x.rule === 'spectrum-detector-columns')!;
    expect(d.message).toContain('no column for detector(s) d02');
    expect(d.message).not.toContain('unknown');
    expect(d.actual).toBe('channel,d01');
  });

  it('a file that ends inside its last row (no final line end) is diagnosed as truncated', () => {
    const out = ingestSpectrum(bytes('channel,d01,d02\n0,1,2\n1,3'), 'spectra/r002.csv', 'r002', ['d01', 'd02']);
    expect(out.spectrum).toBeNull();
    expect(out.diagnostics.map((d) => d.rule)).toEqual(['spectrum-ragged-row', 'spectrum-truncated']);
    expect(out.diagnostics[1]).toMatchObject({ severity: 'error', file: 'spectra/r002.csv', line: 3, run: 'r002' });
  });

  it('the same short row followed by a line end is ragged, not truncated', () => {
    const out = ingestSpectrum(bytes('channel,d01,d02\n0,1,2\n1,3\n'), 'spectra/r002.csv', 'r002', ['d01', 'd02']);
    expect(out.diagnostics.map((d) => d.rule)).toEqual(['spectrum-ragged-row']);
  });

  it('a parse error of the bytes carries the run and the ingest stage', () => {
    const out = ingestSpectrum(bytes('channel,d01,d02\n0,1,2\n1,-3,4\n'), 'spectra/r002.csv', 'r002', ['d01', 'd02']);
    const e = errors(out.diagnostics);
    expect(e.length).toBeGreaterThan(0);
    expect(e[0]).toMatchObject({ file: 'spectra/r002.csv', line: 3, run: 'r002', stage: 'ingest' });
  });
});

describe('ingest: user stopping tables and stopping materials (README, "Thick targets, foils and reactions")', () => {
  const TABLE = 'material,projectile,energy_keV,stopping_eV_per_1e15_atoms_per_cm2\nNi,4He,500,60\nNi,4He,1000,70\nNi,4He,2000,65\n';
  const withPhysics = (physics: string, layerExtra = '') =>
    SERIES_YAML.replace('areal_density_unc_rel: 0.05 }', `areal_density_unc_rel: 0.05${layerExtra} }`) + `physics: ${physics}\n`;
  const run = (yaml: string, files: Record<string, string>) =>
    ingest({ ...input({ yaml }), readFile: (rel) => (rel in files ? { file: rel, text: files[rel]! } : null) });

  it('reads the listed table into the series (material → tables)', () => {
    const out = run(withPhysics('{ stopping_tables: [stopping/ni.csv] }'), { 'stopping/ni.csv': TABLE });
    expect(out.ok).toBe(true);
    if (out.ok) expect([...(out.series.stoppingTables?.keys() ?? [])]).toEqual(['Ni']);
  });
  it('a missing table file stops the series (series-missing-file, on series.yaml)', () => {
    const out = run(withPhysics('{ stopping_tables: [stopping/none.csv] }'), {});
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.diagnostics.map((d) => [d.rule, d.file])).toContainEqual(['series-missing-file', 'series.yaml']);
  });
  it('a bad row stops the series with its file and line (a dropped row would change the physics silently)', () => {
    const out = run(withPhysics('{ stopping_tables: [stopping/ni.csv] }'), { 'stopping/ni.csv': `${TABLE}Ni,4He,abc,70\n` });
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.diagnostics.some((d) => d.file === 'stopping/ni.csv' && d.line === 5 && d.severity === 'error')).toBe(true);
  });
  it('a stopping_material that is neither a table nor a NIST material is one series error', () => {
    const out = run(withPhysics('{ energy_loss: layers }', ', stopping_material: mylr'), {});
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.diagnostics.map((d) => d.rule)).toContain('series-unknown-stopping-material');
    const good = run(withPhysics('{ energy_loss: layers }', ', stopping_material: mylar'), {});
    expect(good.ok).toBe(true);
  });
});
