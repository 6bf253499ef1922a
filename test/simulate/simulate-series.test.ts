import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { calibrationSchema } from '../../pipeline/core/config/calibration-schema.js';
import { seriesSchema } from '../../pipeline/core/config/series-schema.js';
import {
  lecuyerScreeningFactor, microCoulombToParticles, nuclide, rutherfordLabMbPerSr,
} from '../../pipeline/core/physics/index.js';
import { simulateSeries } from '../../pipeline/simulate/simulate-series.js';
import { DEFECT_KINDS } from '../../pipeline/simulate/simulation-spec.js';
import { TRUTH_COLUMNS } from '../../pipeline/simulate/truth-table.js';
import { energyCurveValue } from '../../pipeline/simulate/truth-model.js';
import { smallSpec } from './small-spec.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-simulate-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

const csvRows = (text: string) => text.trimEnd().split('\n').map((l) => l.split(','));

function filesOf(dir: string, prefix = ''): Map<string, string> {
  const out = new Map<string, string>();
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    if (e.isDirectory()) for (const [k, v] of filesOf(join(dir, e.name), `${prefix}${e.name}/`)) out.set(k, v);
    else out.set(`${prefix}${e.name}`, createHash('sha256').update(readFileSync(join(dir, e.name))).digest('hex'));
  }
  return out;
}

describe('simulateSeries: the DESIGN.md run-series layout', () => {
  const { seriesDir, truth } = simulateSeries(smallSpec(), join(root, 'layout'));
  const read = (f: string) => readFileSync(join(seriesDir, f), 'utf8');

  it('writes series.yaml that the series.yaml schema accepts, with nominal solid angles and no simulation-only keys', () => {
    const text = read('series.yaml');
    const parsed = seriesSchema.safeParse(parse(text));
    expect(parsed.success).toBe(true);
    expect(text).not.toMatch(/true_solid_angle_msr|truth:|ratio_to_rutherford|cm_mb_per_sr|charge_reading_factor/);
    expect(parsed.data!.detectors.map((d) => d.solid_angle_msr)).toEqual([2.5, 3]);
    expect(parsed.data!.normalization.reference_target).toBe('au-ref');
  });

  it('writes one calibration file per version, valid by run id back to back, with a symmetric positive-definite covariance', () => {
    const a = calibrationSchema.parse(parse(read('calibrations/cal-a.yaml')));
    const b = calibrationSchema.parse(parse(read('calibrations/cal-b.yaml')));
    expect([a.valid_from_run, a.valid_to_run, b.valid_from_run, b.valid_to_run]).toEqual(['r001', 'r005', 'r006', undefined]);
    expect(b.detectors[1]).toMatchObject({ id: 'd02', offset_keV: 27, gain_keV_per_channel: 14.05 });
    for (const d of [...a.detectors, ...b.detectors]) {
      const [[oo, og], [go, gg]] = d.covariance as [[number, number], [number, number]];
      expect(og).toBe(go);
      expect(oo).toBeGreaterThan(0);
      expect(oo * gg - og * go).toBeGreaterThan(0);
    }
  });

  it('writes runlog.csv with the DESIGN.md columns, the integrator reading (true charge × 1.03) and ISO 8601 start times', () => {
    const rows = csvRows(read('runlog.csv'));
    expect(rows[0]!.join(',')).toBe('run,started_at,kind,target,beam_energy_keV,beam_energy_unc_keV,charge_uC,real_time_s,note');
    expect(rows).toHaveLength(10);
    expect(rows[1]).toEqual(['r001', '2026-03-02T08:30:00Z', 'reference', 'au-ref', '2000', '2', '4.12', '500', '']);
    expect(rows[2]).toEqual(['r002', '2026-03-02T08:39:20Z', 'sample', 'c12-foil', '2000', '2', '20.6', '1000', '']);
    expect(rows[9]![2]).toBe('reference');
  });

  it('writes scalers.csv per run and detector: live time for the first runs, pulser counts after the mode change', () => {
    const rows = csvRows(read('scalers.csv'));
    expect(rows[0]!.join(',')).toBe('run,detector,live_time_s,pulser_sent,pulser_counted');
    expect(rows).toHaveLength(1 + 9 * 2);
    const r002 = rows.find((r) => r[0] === 'r002' && r[1] === 'd01')!;
    expect(Number(r002[2]) / 1000).toBeGreaterThanOrEqual(0.85);
    expect(Number(r002[2]) / 1000).toBeLessThanOrEqual(0.99);
    const r006 = rows.find((r) => r[0] === 'r006' && r[1] === 'd02')!;
    expect(r006[2]).toBe('');
    expect(Number(r006[3])).toBe(50 * 1000);
    expect(Number(r006[4])).toBeLessThanOrEqual(Number(r006[3]));
  });

  it('writes spectra/<run>.csv: header channel,<ids>, channels 0…N−1 in order, non-negative integer counts', () => {
    const files = readdirSync(join(seriesDir, 'spectra')).sort();
    expect(files).toEqual(Array.from({ length: 9 }, (_, i) => `r00${i + 1}.csv`));
    for (const f of files) {
      const text = read(`spectra/${f}`);
      expect(text.endsWith('\n')).toBe(true);
      const rows = csvRows(text);
      expect(rows[0]!.join(',')).toBe('channel,d01,d02');
      expect(rows).toHaveLength(257);
      rows.slice(1).forEach((r, ch) => {
        expect(r[0]).toBe(String(ch));
        expect(r.length).toBe(3);
        expect(r.every((c) => /^(0|[1-9]\d*)$/.test(c))).toBe(true);
      });
    }
  });

  it('writes truth.csv: one row per sample run × detector × peak, with the live fraction and true solid angle used', () => {
    const rows = csvRows(read('truth.csv'));
    expect(rows[0]).toEqual([...TRUTH_COLUMNS]);
    expect(rows).toHaveLength(1 + 6 * 2);
    expect(truth).toHaveLength(12);
    expect(new Set(truth.map((t) => t.run))).toEqual(new Set(['r002', 'r003', 'r004', 'r006', 'r007', 'r008']));
    expect(truth.filter((t) => t.detector === 'd02').every((t) => t.trueSolidAngleMsr === 2.9)).toBe(true);
  });

  it('expects N_beam · n · σ_lab · ΔΩ · f counts, σ_lab = r · σ_R,lab · F (recomputed here from the physics core)', () => {
    const he4 = nuclide('4He');
    const c12 = nuclide('12C');
    const spec = smallSpec();
    for (const t of truth) {
      const det = spec.detectors.find((d) => d.id === t.detector)!;
      const ratio = energyCurveValue({ base: 1.2, resonances: [{ energy_keV: 2500, fwhm_keV: 150, height: 0.8 }] }, t.beamEnergyKeV);
      const sigma = ratio * rutherfordLabMbPerSr(2, 6, he4.massU, c12.massU, t.beamEnergyKeV, det.angle_deg)
        * lecuyerScreeningFactor(2, 6, (t.beamEnergyKeV * c12.massU) / (he4.massU + c12.massU));
      const expected = microCoulombToParticles(20, 1) * 150e15 * sigma * 1e-27 * det.true_solid_angle_msr * 1e-3 * t.liveFraction;
      expect(t.dsigmaLabMbPerSr / sigma).toBeCloseTo(1, 12);
      expect(t.expectedCounts / expected).toBeCloseTo(1, 12);
    }
  });

  it('samples each spectrum around its expectation: |counts − expected| < 5 √expected per run and detector (Poisson, no background)', () => {
    for (const t of truth) {
      const rows = csvRows(read(`spectra/${t.run}.csv`));
      const col = rows[0]!.indexOf(t.detector);
      const total = rows.slice(1).reduce((s, r) => s + Number(r[col]), 0);
      expect(Math.abs(total - t.expectedCounts)).toBeLessThan(5 * Math.sqrt(t.expectedCounts));
    }
  });
});

describe('simulateSeries: determinism', () => {
  it('gives byte-identical files for the same spec and seed, and different spectra (same series.yaml) for another seed', () => {
    const a = filesOf(simulateSeries(smallSpec(), join(root, 'det-a')).seriesDir);
    const b = filesOf(simulateSeries(smallSpec(), join(root, 'det-b')).seriesDir);
    const c = filesOf(simulateSeries(smallSpec({ seed: 43 }), join(root, 'det-c')).seriesDir);
    expect([...b.entries()]).toEqual([...a.entries()]);
    expect(c.get('spectra/r002.csv')).not.toBe(a.get('spectra/r002.csv'));
    expect(c.get('runlog.csv')).toBe(a.get('runlog.csv'));
  });

  it('replaces an earlier simulated series in place but refuses to overwrite a folder that is not one', () => {
    const out = join(root, 'overwrite');
    simulateSeries(smallSpec(), out);
    expect(() => simulateSeries(smallSpec(), out)).not.toThrow();
    const foreign = join(root, 'foreign');
    mkdirSync(join(foreign, 'test-small'), { recursive: true });
    writeFileSync(join(foreign, 'test-small', 'notes.txt'), 'keep me');
    expect(() => simulateSeries(smallSpec(), foreign)).toThrow(/not a simulated series/);
    expect(readFileSync(join(foreign, 'test-small', 'notes.txt'), 'utf8')).toBe('keep me');
    expect(readdirSync(foreign)).toEqual(['test-small']);
  });
});

describe('simulateSeries: defects for ingest tests', () => {
  // One defect per run, runs 2..9 (run 1 stays clean), on detector d02 where a column is named.
  const defects = DEFECT_KINDS.map((kind, i) => ({ run_index: i + 2, kind, detector: 'd02' }));
  const { seriesDir, truth } = simulateSeries(smallSpec({ series: 'test-defects', defects }), join(root, 'defects'));
  const read = (f: string) => readFileSync(join(seriesDir, f), 'utf8');
  const runOf = (kind: string) => `r00${defects.find((d) => d.kind === kind)!.run_index}`;

  it('covers every defect kind', () => {
    expect(defects.map((d) => d.kind)).toEqual(['truncated-spectrum', 'negative-count', 'non-integer-count', 'ragged-row', 'missing-spectrum', 'unknown-target', 'unknown-detector-column', 'missing-scalers']);
  });

  it('truncated-spectrum: the file ends part-way through a row, well short of 256 channels', () => {
    const text = read(`spectra/${runOf('truncated-spectrum')}.csv`);
    expect(text.endsWith('\n')).toBe(false);
    const lines = text.split('\n');
    expect(lines.length - 1).toBeLessThan(256);
    expect(lines[lines.length - 1]!.split(',').length).toBeLessThan(3);
  });

  it('negative-count and non-integer-count: one d02 cell reads -N and one reads N.5', () => {
    const neg = csvRows(read(`spectra/${runOf('negative-count')}.csv`)).flatMap((r) => r.slice(1));
    expect(neg.filter((c) => /^-\d+$/.test(c))).toHaveLength(1);
    const frac = csvRows(read(`spectra/${runOf('non-integer-count')}.csv`));
    const cells = frac.flatMap((r) => r.slice(1));
    expect(cells.filter((c) => /^\d+\.5$/.test(c))).toHaveLength(1);
    expect(frac.find((r) => r.some((c) => c.endsWith('.5')))!.findIndex((c) => c.endsWith('.5'))).toBe(2);
  });

  it('ragged-row: exactly one row has a field fewer than the header', () => {
    const rows = csvRows(read(`spectra/${runOf('ragged-row')}.csv`));
    expect(rows.filter((r) => r.length !== 3)).toHaveLength(1);
  });

  it('missing-spectrum: no spectrum file for the run; unknown-target: a target id series.yaml does not define', () => {
    expect(existsSync(join(seriesDir, 'spectra', `${runOf('missing-spectrum')}.csv`))).toBe(false);
    const series = seriesSchema.parse(parse(read('series.yaml')));
    const row = csvRows(read('runlog.csv')).find((r) => r[0] === runOf('unknown-target'))!;
    expect(series.targets.map((t) => t.id)).not.toContain(row[3]);
  });

  it('unknown-detector-column: the header holds a column that is not a detector id', () => {
    const header = csvRows(read(`spectra/${runOf('unknown-detector-column')}.csv`))[0]!;
    expect(header.slice(0, 3)).toEqual(['channel', 'd01', 'd02']);
    expect(header).toHaveLength(4);
    expect(['d01', 'd02']).not.toContain(header[3]);
  });

  it('missing-scalers: no scaler rows for the run, while every other run keeps its two', () => {
    const rows = csvRows(read('scalers.csv')).slice(1);
    expect(rows.filter((r) => r[0] === runOf('missing-scalers'))).toHaveLength(0);
    expect(rows).toHaveLength(8 * 2);
  });

  it('names the defects of a sample run in its truth rows', () => {
    expect(truth.find((t) => t.run === runOf('negative-count'))!.defects).toBe('negative-count');
    expect(truth.find((t) => t.run === 'r004')!.defects).toBe('non-integer-count');
  });
});
