import { describe, expect, it } from 'vitest';
import { checkSeriesReferences } from '../../../pipeline/core/config/check-series-references.js';
import { seriesSchema, type SeriesConfig } from '../../../pipeline/core/config/series-schema.js';
import { liveFraction, type LiveFraction } from '../../../pipeline/core/counting/live-fraction.js';
import { planPeakWindow, type MeasuredPeak } from '../../../pipeline/core/counting/peak-window.js';
import { seriesPeakPlanner } from '../../../pipeline/core/kinematics/series-peak-planner.js';
import type { RunRecord } from '../../../pipeline/core/model/series-model.js';
import { firstOrderEstimate, valueAtEstimates } from '../../../pipeline/core/normalization/measurement-model.js';
import { layerThickness } from '../../../pipeline/core/normalization/shared-inputs.js';
import { crossSectionLabModel } from '../../../stages/extract/row-budget.js';
import { normalizationCountingRel } from '../../../stages/extract/cross-section-row.js';
import { normalize, normalizingElement, planNormalizingWindows } from '../../../stages/normalize/index.js';

// Constants typed in here, independent of the project's tables: e = 1.602176634e-19 C (exact, SI 2019);
// e²/4πε₀ = 1.439964547 MeV fm (CODATA 2018, Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021));
// AME2020 (Wang et al., Chinese Physics C 45, 030003 (2021)): 4He 4.00260325413 u, 197Au 196.966570103 u.
const E_CHARGE_C = 1.602176634e-19;
const E2_KEV_FM = 1439.964547;
const M_HE4_U = 4.00260325413;
const M_AU197_U = 196.966570103;

/** Exact lab Rutherford with recoil, mb/sr (C.G. Darwin, Phil. Mag. 27, 499 (1914); Chu, Mayer & Nicolet, Backscattering Spectrometry (1978), ch. 2). */
function darwinLabMbPerSr(z1: number, z2: number, m1U: number, m2U: number, eKeV: number, thetaDeg: number): number {
  const th = (thetaDeg * Math.PI) / 180;
  const x = (m1U / m2U) * Math.sin(th);
  const root = Math.sqrt(1 - x * x);
  const a = (z1 * z2 * E2_KEV_FM) / (4 * eKeV);
  return a * a * (4 / Math.sin(th) ** 4) * ((root + Math.cos(th)) ** 2 / root) * 10;
}
/** L'Ecuyer, Davies & Matsunami, Nucl. Instrum. Methods 160, 337 (1979): F = 1 − 0.049 Z1 Z2^{4/3}/E_cm[keV]. */
const lecuyerF = (eKeV: number) => 1 - (0.049 * 2 * 79 ** (4 / 3)) / ((eKeV * M_AU197_U) / (M_AU197_U + M_HE4_U));
const auSigma = (eKeV: number, thetaDeg: number) => darwinLabMbPerSr(2, 79, M_HE4_U, M_AU197_U, eKeV, thetaDeg) * lecuyerF(eKeV);

function config(normalization: object): SeriesConfig {
  return seriesSchema.parse({
    series: 'wiring-test',
    beam: { projectile: '4He', charge_state: 1 },
    detectors: [
      { id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
      { id: 'mon', angle_deg: 170, angle_unc_deg: 0.1, resolution_fwhm_keV: 15, solid_angle_msr: 1.0 },
    ],
    targets: [
      { id: 'au-ref', layers: [{ composition: { '197Au': 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
      {
        id: 'c-on-au',
        layers: [
          { composition: { '12C': 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 },
          { composition: { '197Au': 1 }, areal_density_1e15_per_cm2: 10, areal_density_unc_rel: 0.02, role: 'reference' },
        ],
      },
    ],
    peaks: [{ label: '12C elastic', target_nuclide: '12C' }],
    normalization,
  });
}

const T0 = Date.UTC(2026, 2, 2, 8);
const run = (id: string, kind: 'reference' | 'sample', hours: number, o: Partial<RunRecord> = {}): RunRecord => ({
  run: id, index: 0, line: 2, startedAt: '', startedAtMs: T0 + hours * 3_600_000, kind, target: kind === 'reference' ? 'au-ref' : 'c-on-au', beamEnergyKeV: 2000, beamEnergyUncKeV: 2, chargeUC: kind === 'reference' ? 4 : 20, realTimeS: 500, note: '', ...o,
});
const CAL = { version: 'cal-a', offsetKeV: 0, gainKeVPerChannel: 2, quadraticKeVPerChannel2: 0, covariance: [[0, 0], [0, 0]] };
function peak(detector: string, n: number | null): MeasuredPeak {
  const window = planPeakWindow(CAL, 1024, 1850, 15, { peak_half_width_fwhm: 1.5, background_gap_fwhm: 0.5, background_width_fwhm: 1.5 });
  return { request: { key: 'reference Au', detector, expectedEnergyKeV: 1850, fwhmKeV: 15 }, window, net: n === null ? null : { gross: n, background: 0, backgroundVariance: 0, net: n, netVariance: n, centroidChannel: 925 }, shiftKeV: 0 };
}
const clock: LiveFraction = liveFraction({ mode: 'live-time', liveTimeS: 475, line: 2 }, 500);
const pulser: LiveFraction = liveFraction({ mode: 'pulser', pulserSent: 10000, pulserCounted: 9000, line: 2 }, 500);
type Measured = Map<string, Map<string, { peak: MeasuredPeak; live: LiveFraction }>>;
const measured = (entries: [string, string, number | null, LiveFraction?][]): Measured => {
  const m: Measured = new Map();
  for (const [r, d, n, live] of entries) {
    if (!m.has(r)) m.set(r, new Map());
    m.get(r)!.set(d, { peak: peak(d, n), live: live ?? clock });
  }
  return m;
};
const sampleLayers = [{ atomsPerCm2: 150e15, thickness: layerThickness('c-on-au', 0, 0.05, false) }];
const nBeam = (uC: number) => (uC * 1e-6) / E_CHARGE_C;

describe('normalize, method reference-run: the exposure model of each sample run × detector', () => {
  const refs = [run('r001', 'reference', 0), run('r004', 'reference', 2)];
  const samples = [run('s1', 'sample', 0.5), run('s2', 'sample', 1.9)];
  const m = measured([['r001', 'd01', 32000], ['r004', 'd01', 32500], ['r001', 'mon', 9000], ['r004', 'mon', 9100]]);

  it('bracketing: L = N_beam · Σ w_k ΔΩ_k with the reference points\' ΔΩ_k (the values of the former bracketing, to rounding)', () => {
    const out = normalize({ config: config({ method: 'reference-run', reference_target: 'au-ref' }), referenceRuns: refs, sampleRuns: samples, measured: m });
    const a = out.points.find((p) => p.run === 'r001' && p.detector === 'd01')!.solidAngleMsr!;
    const b = out.points.find((p) => p.run === 'r004' && p.detector === 'd01')!.solidAngleMsr!;
    const row = out.rows.get('s1')!.get('d01')!;
    expect(row.method).toBe('reference-run');
    expect(row.weights[0]).toBeCloseTo(0.75, 14);
    expect(row.solidAngleMsr / (0.75 * a + 0.25 * b)).toBeCloseTo(1, 14);
    expect(row.solidAngleMsr).toBeCloseTo(out.applied.get('s1')!.get('d01')!.solidAngleMsr, 12);
    expect(valueAtEstimates(row.exposure) / ((nBeam(20) * row.solidAngleMsr) / 1000)).toBeCloseTo(1, 13);
    // ΔΩ_k itself, Chu, Mayer & Nicolet (1978) eq. 3.4 with Darwin × L'Ecuyer written out here
    expect(a / ((32000 / (nBeam(4) * 60e15 * auSigma(2000, 150) * 1e-27 * 0.95)) * 1000)).toBeCloseTo(1, 9);
  });

  it('the charge cancels: no charge component in a row\'s budget (JCGM 100:2008 §5.1.3, the paths add to zero)', () => {
    const out = normalize({ config: config({ method: 'reference-run', reference_target: 'au-ref' }), referenceRuns: refs, sampleRuns: samples, measured: m });
    const lab = firstOrderEstimate(crossSectionLabModel({ run: 's1', detector: 'd01', gross: 4000, background: 0, backgroundVariance: 0, live: pulser, sampleLayers, normalization: out.rows.get('s1')!.get('d01')! }));
    expect(lab.components.some((c) => c.name === 'charge')).toBe(false);
    const keys = lab.components.filter((c) => c.name === 'reference_counting').map((c) => c.key).sort();
    expect(keys).toEqual(['r001/d01', 'r004/d01']);
    // normalization_counting_rel_unc: the reference runs' counting and live time, not the row's own spectrum
    const rel = normalizationCountingRel(lab.components, 's1/d01', lab.value);
    const expected = Math.hypot(0.75 * (a(out) / Math.sqrt(32000)), 0.25 * (b(out) / Math.sqrt(32500))) / (0.75 * a(out) + 0.25 * b(out));
    expect(rel / expected).toBeCloseTo(1, 10);
  });
  const a = (o: ReturnType<typeof normalize>) => o.points.find((p) => p.run === 'r001' && p.detector === 'd01')!.solidAngleMsr!;
  const b = (o: ReturnType<typeof normalize>) => o.points.find((p) => p.run === 'r004' && p.detector === 'd01')!.solidAngleMsr!;

  it('nearest: the reference run nearest in start time alone (s2 at 1.9 h: r004)', () => {
    const out = normalize({ config: config({ method: 'reference-run', reference_target: 'au-ref', reference_rule: 'nearest' }), referenceRuns: refs, sampleRuns: samples, measured: m });
    expect(out.rows.get('s2')!.get('d01')!.referenceRuns).toEqual(['r004']);
    expect(out.rows.get('s1')!.get('d01')!.referenceRuns).toEqual(['r001']);
    expect(out.applied.size).toBe(0);
  });

  it('series-mean: the same reference runs and weights for every sample run', () => {
    const out = normalize({ config: config({ method: 'reference-run', reference_target: 'au-ref', reference_rule: 'series-mean' }), referenceRuns: refs, sampleRuns: samples, measured: m });
    expect(out.rows.get('s1')!.get('d01')!.referenceRuns).toEqual(['r001', 'r004']);
    expect(out.rows.get('s2')!.get('d01')!.weights).toEqual(out.rows.get('s1')!.get('d01')!.weights);
  });
});

describe('normalize, method internal-reference: the role: reference gold layer in the same spectrum', () => {
  const cfg = config({ method: 'internal-reference', screening: 'lecuyer' });
  const s = run('s1', 'sample', 0);

  it('uses no reference run and needs no reference_target; the element is the reference layer\'s (Au)', () => {
    expect(checkSeriesReferences(cfg).filter((i) => i.severity === 'error')).toEqual([]);
    expect(normalizingElement(cfg)).toBe('Au');
    const w = planNormalizingWindows(cfg, seriesPeakPlanner(cfg), 'Au', s);
    expect(w.requests.map((r) => r.detector)).toEqual(['d01', 'mon']);
    expect(planNormalizingWindows(cfg, seriesPeakPlanner(cfg), 'Au', run('r001', 'reference', 0)).requests).toEqual([]);
  });

  it('dσ/dΩ = σ_R,Au(E, θ) · (Y/Y_ref) · (n_Au/n_C), whatever the charge and live fraction (Chu, Mayer & Nicolet 1978, eq. 3.4, two layers in one spectrum)', () => {
    const value = (chargeUC: number, live: LiveFraction) => {
      const out = normalize({ config: cfg, referenceRuns: [], sampleRuns: [{ ...s, chargeUC }], measured: new Map(), sampleMeasured: measured([['s1', 'd01', 2500, live]]) });
      const norm = out.rows.get('s1')!.get('d01')!;
      expect(norm.method).toBe('internal-reference');
      return firstOrderEstimate(crossSectionLabModel({ run: 's1', detector: 'd01', gross: 4000, background: 0, backgroundVariance: 0, live, sampleLayers, normalization: norm }));
    };
    const expected = auSigma(2000, 150) * (4000 / 2500) * (10e15 / 150e15);
    const one = value(20, pulser);
    expect(one.value / expected).toBeCloseTo(1, 9);
    expect(value(33, clock).value / one.value).toBeCloseTo(1, 12);
    expect(one.components.some((c) => c.name === 'live_time' || c.name === 'charge')).toBe(false);
    const byName = new Map(one.components.map((c) => [c.name, c]));
    expect(byName.get('reference_counting')!.value / one.value).toBeCloseTo(-1 / Math.sqrt(2500), 12);
    expect(byName.get('reference_areal_density')!.value / one.value).toBeCloseTo(0.02, 12);
  });

  it('a reference peak not measured in a spectrum: that detector\'s rows have no normalization, one warning', () => {
    const out = normalize({ config: cfg, referenceRuns: [], sampleRuns: [s, run('s2', 'sample', 1)], measured: new Map(), sampleMeasured: measured([['s1', 'd01', null], ['s2', 'd01', null]]) });
    expect(out.rows.get('s1')!.get('d01')).toBeNull();
    const d = out.diagnostics.filter((x) => x.detector === 'd01');
    expect(d.length).toBe(1);
    expect(d[0]!.message).toMatch(/1 more sample run/);
  });
});

describe('normalize, method monitor: detector "mon" sees the gold of the sample target in every run', () => {
  const cfg = config({ method: 'monitor', reference_target: 'au-ref', monitor_detector: 'mon' });
  const refs = [run('r001', 'reference', 0), run('r004', 'reference', 2)];
  const m = measured([['r001', 'd01', 32000], ['r004', 'd01', 32500], ['r001', 'mon', 9000], ['r004', 'mon', 9100]]);

  it('L_d = Y_m/(f_m Σ n σ_R(θ_m)) · Σ w_k ΔΩ_d,k/ΔΩ_m,k: the charge of the sample run does not enter', () => {
    const at = (chargeUC: number) => normalize({ config: cfg, referenceRuns: refs, sampleRuns: [run('s1', 'sample', 1, { chargeUC })], measured: m, sampleMeasured: measured([['s1', 'mon', 1200]]) });
    const out = at(20);
    const row = out.rows.get('s1')!.get('d01')!;
    expect(row.method).toBe('monitor');
    const p = (r: string, d: string) => out.points.find((x) => x.run === r && x.detector === d)!.solidAngleMsr!;
    const rho = 0.5 * (p('r001', 'd01') / p('r001', 'mon')) + 0.5 * (p('r004', 'd01') / p('r004', 'mon'));
    const expected = (1200 / (0.95 * 10e15 * auSigma(2000, 170) * 1e-27)) * rho;
    expect(valueAtEstimates(row.exposure) / expected).toBeCloseTo(1, 9);
    expect(valueAtEstimates(at(55).rows.get('s1')!.get('d01')!.exposure) / valueAtEstimates(row.exposure)).toBeCloseTo(1, 13);
    expect(firstOrderEstimate(row.exposure).components.some((c) => c.name === 'charge')).toBe(false);
  });

  it('only the monitor detector\'s spectrum of a sample run is searched for the gold peak', () => {
    expect(planNormalizingWindows(cfg, seriesPeakPlanner(cfg), 'Au', run('s1', 'sample', 0)).requests.map((r) => r.detector)).toEqual(['mon']);
    expect(planNormalizingWindows(cfg, seriesPeakPlanner(cfg), 'Au', run('r001', 'reference', 0)).requests.map((r) => r.detector)).toEqual(['d01', 'mon']);
  });
});

describe('normalize, method absolute', () => {
  it('L = Q/e · ΔΩ_nominal, no reference runs, element none', () => {
    const cfg = config({ method: 'absolute' });
    expect(normalizingElement(cfg)).toBeNull();
    const out = normalize({ config: cfg, referenceRuns: [], sampleRuns: [run('s1', 'sample', 0)], measured: new Map() });
    expect(valueAtEstimates(out.rows.get('s1')!.get('mon')!.exposure) / (nBeam(20) * 1.0e-3)).toBeCloseTo(1, 13);
    expect(out.diagnostics).toEqual([]);
  });
});

describe('series.yaml checks of the methods (checkSeriesReferences)', () => {
  const rules = (normalization: object) => checkSeriesReferences(config(normalization)).filter((i) => i.severity === 'error').map((i) => i.rule);
  it('reference-run and monitor need reference_target; monitor needs a monitor_detector that is a detector id', () => {
    expect(rules({ method: 'reference-run' })).toEqual(['series-unknown-target']);
    expect(rules({ method: 'monitor', reference_target: 'au-ref' })).toEqual(['series-monitor-detector']);
    expect(rules({ method: 'monitor', reference_target: 'au-ref', monitor_detector: 'd09' })).toEqual(['series-monitor-detector']);
    expect(rules({ method: 'absolute' })).toEqual([]);
  });
  it('internal-reference needs a layer with role: reference', () => {
    const cfg = config({ method: 'internal-reference' });
    const bare = { ...cfg, targets: cfg.targets.map((t) => ({ ...t, layers: t.layers.map((l) => ({ ...l, role: undefined })) })) };
    expect(checkSeriesReferences(bare).filter((i) => i.severity === 'error').map((i) => i.rule)).toEqual(['series-no-reference-layer']);
  });
});
