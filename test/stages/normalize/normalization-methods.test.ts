import { describe, expect, it } from 'vitest';
import { seriesSchema } from '../../../pipeline/core/config/series-schema.js';
import { liveFraction } from '../../../pipeline/core/counting/live-fraction.js';
import type { NetCounts } from '../../../pipeline/core/counting/net-counts.js';
import type { ReferencePoint } from '../../../pipeline/core/model/result-rows.js';
import type { RunRecord } from '../../../pipeline/core/model/series-model.js';
import { firstOrderEstimate, valueAtEstimates } from '../../../pipeline/core/normalization/measurement-model.js';
import { layerThickness } from '../../../pipeline/core/normalization/shared-inputs.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';
import { absoluteExposure } from '../../../stages/normalize/absolute.js';
import { prepareBracketing } from '../../../stages/normalize/apply-bracketing.js';
import { internalReferenceExposure } from '../../../stages/normalize/internal-reference.js';
import { monitorExposure } from '../../../stages/normalize/monitor.js';
import { normalizingNuclides } from '../../../stages/normalize/normalizing-nuclides.js';
import { referenceMeasurement } from '../../../stages/normalize/reference-measurement.js';
import { prepareReferenceRule, referenceRunExposure } from '../../../stages/normalize/reference-rule.js';
import { referenceSolidAngleModel } from '../../../stages/normalize/reference-solid-angle-model.js';
import { referenceSpread } from '../../../stages/normalize/reference-spread.js';
import { crossSectionLabModel } from '../../../stages/extract/row-budget.js';

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
const lecuyerF = (z2: number, m2U: number, eKeV: number) => 1 - (0.049 * 2 * z2 ** (4 / 3)) / ((eKeV * m2U) / (m2U + M_HE4_U));
const auSigma = (eKeV: number, thetaDeg: number) => darwinLabMbPerSr(2, 79, M_HE4_U, M_AU197_U, eKeV, thetaDeg) * lecuyerF(79, M_AU197_U, eKeV);

const config = seriesSchema.parse({
  series: 'methods-test',
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
  normalization: { method: 'reference-run', reference_target: 'au-ref' },
});
const he = nuclide('4He');
const det = config.detectors[0]!;
const mon = config.detectors[1]!;
const T0 = Date.UTC(2026, 2, 2, 8);
const run = (id: string, hours: number, o: Partial<RunRecord> = {}): RunRecord => ({
  run: id, index: 0, line: 2, startedAt: '', startedAtMs: T0 + hours * 3_600_000, kind: 'reference', target: 'au-ref', beamEnergyKeV: 2000, beamEnergyUncKeV: 2, chargeUC: 4, realTimeS: 500, note: '', ...o,
});
const net = (n: number, background = 0): NetCounts => ({ gross: n + background, background, backgroundVariance: background, net: n, netVariance: n + 2 * background, centroidChannel: 0 });
const clock = liveFraction({ mode: 'live-time', liveTimeS: 475, line: 2 }, 500);
const pulser = liveFraction({ mode: 'pulser', pulserSent: 10000, pulserCounted: 9000, line: 2 }, 500);
const shared = { series: config.series, chargeUncRel: 0.02, screeningUncFrac: 0.1 };
const sampleLayers = [{ atomsPerCm2: 150e15, thickness: layerThickness('c-on-au', 0, 0.05, false) }];
const rel = (c: { value: number }, y: number) => c.value / y;

describe('reference-run method: ΔΩ_k of one reference run as a model (Chu, Mayer & Nicolet 1978, eq. 3.4)', () => {
  const N = 32000;
  const m = referenceMeasurement(config, he, 'Au', run('r001', 0), det, net(N), pulser)!;
  const model = referenceSolidAngleModel(m, shared, 0);
  const e = firstOrderEstimate(model);

  it('ΔΩ = N/(Q/e · n · σ_R,lab F · f) with Darwin (1914) and L\'Ecuyer (1979) written out here', () => {
    const expected = (N / ((4e-6 / E_CHARGE_C) * 60e15 * auSigma(2000, 150) * 1e-27 * 0.9)) * 1000;
    expect(e.value / expected).toBeCloseTo(1, 9);
  });

  it('budget of a product of powers: relative parts 1/√N, −u_f/f, −u_n/n, −u_g (JCGM 100:2008 §5.1.6)', () => {
    const by = new Map(e.components.map((c) => [`${c.name} ${c.key}`, c]));
    expect(rel(by.get('reference_counting r001/d01')!, e.value)).toBeCloseTo(1 / Math.sqrt(N), 12);
    expect(rel(by.get('live_time r001/d01')!, e.value)).toBeCloseTo(-pulser.unc / pulser.value, 12);
    expect(rel(by.get('reference_areal_density au-ref/layer 1')!, e.value)).toBeCloseTo(-0.03, 12);
    expect(rel(by.get('charge methods-test')!, e.value)).toBeCloseTo(-0.02, 12);
    // screening: ∂lnΔΩ/∂δs = +(1 − F)/F, u = 0.1
    const f = lecuyerF(79, M_AU197_U, 2000);
    expect(rel(by.get('screening methods-test')!, e.value)).toBeCloseTo((0.1 * (1 - f)) / f, 6);
    // the spread input has u = 0 here and is left out
    expect(by.has('reference_spread r001/d01')).toBe(false);
  });

  it('beam energy and angle: −∂lnσ/∂E·u_E and −∂lnσ/∂θ·u_θ, checked against central differences of Darwin × L\'Ecuyer', () => {
    const h = 0.01;
    const dLnDE = (Math.log(auSigma(2000 + h, 150)) - Math.log(auSigma(2000 - h, 150))) / (2 * h);
    const dLnDT = (Math.log(auSigma(2000, 150 + 1e-4)) - Math.log(auSigma(2000, 150 - 1e-4))) / 2e-4;
    const by = new Map(e.components.map((c) => [c.name, c]));
    expect(rel(by.get('beam_energy')!, e.value) / (-dLnDE * 2)).toBeCloseTo(1, 5);
    expect(rel(by.get('angle')!, e.value) / (-dLnDT * 0.2)).toBeCloseTo(1, 5);
  });

  it('the reference runs\' spread enters as reference_spread (run class, key "<run>/<detector>") with u = the relative spread', () => {
    const s = firstOrderEstimate(referenceSolidAngleModel(m, shared, 0.004));
    const spread = s.components.find((c) => c.name === 'reference_spread')!;
    expect(spread.key).toBe('r001/d01');
    expect(rel(spread, s.value)).toBeCloseTo(0.004, 12);
    expect(s.value).toBe(e.value);
  });

  it('unmeasured or non-positive reference peaks give no measurement', () => {
    expect(referenceMeasurement(config, he, 'Au', run('r001', 0), det, null, clock)).toBeNull();
    expect(referenceMeasurement(config, he, 'Au', run('r001', 0), det, net(0), clock)).toBeNull();
  });
});

const point = (id: string, hours: number, msr: number | null, relCounting = 0.01): ReferencePoint => ({
  run: id, detector: 'd01', startedAtMs: T0 + hours * 3_600_000, beamEnergyKeV: 2000, reactionEnergyKeV: 2000, chargeUC: 4, netCounts: 1, netCountsUnc: 1, liveFraction: 1, liveFractionUnc: 0,
  rutherfordMbPerSr: 1, screeningFactor: 1, solidAngleMsr: msr, relCounting, relLive: 0, relEnergy: 0, dLnSigmaDThetaPerDeg: 0, relAreal: 0.03, flags: [],
});

describe('reference rules (README, "Which reference runs"; common practice)', () => {
  const points = [point('r001', 0, 2.5), point('r004', 2, 2.6, 0.02), point('r007', 5, null), point('r009', 6, 2.55)];
  const sample = run('s1', 1.5, { kind: 'sample' });

  it('bracketing is applyBracketing\'s choice (runs, weights)', () => {
    const a = prepareBracketing(points)(sample)!;
    const c = prepareReferenceRule('bracketing', points)(sample)!;
    expect(c.referenceRuns).toEqual(a.referenceRuns);
    expect(c.weights).toEqual(a.weights);
    expect(c.weights[1]).toBeCloseTo(0.75, 14);
  });

  it('nearest: the usable run nearest in start time (r004, 0.5 h away), the earlier on a tie; unusable points skipped', () => {
    const nearest = prepareReferenceRule('nearest', points);
    expect(nearest(sample)).toEqual({ referenceRuns: ['r004'], weights: [1], flags: [] });
    expect(nearest(run('s2', 1, { kind: 'sample' }))!.referenceRuns).toEqual(['r001']);
    expect(nearest(run('s3', 5, { kind: 'sample' }))!.referenceRuns).toEqual(['r009']);
  });

  it('series-mean: every usable run, w ∝ 1/u², Σw = 1, one object for all sample runs', () => {
    const mean = prepareReferenceRule('series-mean', points);
    const c = mean(sample)!;
    expect(c.referenceRuns).toEqual(['r001', 'r004', 'r009']);
    const raw = [1 / (0.01 * 2.5) ** 2, 1 / (0.02 * 2.6) ** 2, 1 / (0.01 * 2.55) ** 2];
    const s = raw.reduce((a, b) => a + b, 0);
    c.weights.forEach((w, i) => expect(w).toBeCloseTo(raw[i]! / s, 14));
    expect(mean(run('s9', 40, { kind: 'sample' }))).toBe(c);
  });

  it('no usable reference run: null for every rule', () => {
    for (const rule of ['bracketing', 'nearest', 'series-mean'] as const) expect(prepareReferenceRule(rule, [point('r1', 0, null)])(sample)).toBeNull();
  });
});

describe('reference spread beyond counting: DerSimonian & Laird (1986) moment estimator', () => {
  it('equal uncertainties: τ² = s² − u² (s² the sample variance) — the estimator\'s closed form for equal weights', () => {
    const x = [2.50, 2.56, 2.47, 2.61, 2.52];
    const u = 0.02;
    const mean = x.reduce((a, b) => a + b, 0) / x.length;
    const s2 = x.reduce((a, b) => a + (b - mean) ** 2, 0) / (x.length - 1);
    const r = referenceSpread(x, x.map(() => u));
    expect(r.tau ** 2).toBeCloseTo(s2 - u * u, 14);
    expect(r.tauRel).toBeCloseTo(Math.sqrt(s2 - u * u) / mean, 14);
    expect(r.ndf).toBe(4);
  });

  it('scatter within the uncertainties (Q <= k − 1) and a single run give τ = 0; a zero uncertainty is refused', () => {
    expect(referenceSpread([2.5, 2.51, 2.49], [0.02, 0.02, 0.02]).tau).toBe(0);
    expect(referenceSpread([2.5], [0.02]).tau).toBe(0);
    expect(() => referenceSpread([2.5, 2.6], [0.02, 0])).toThrow(/u > 0/);
  });
});

function refModels(detector: typeof det, counts: [string, number, number][]) {
  return new Map(counts.map(([id, hours, n]) => [id, referenceSolidAngleModel(referenceMeasurement(config, he, 'Au', run(id, hours, { chargeUC: 4 + hours }), detector, net(n), clock)!, shared, 0)]));
}

describe('reference-run exposure and the row: charge cancels (README, "Normalization")', () => {
  const models = refModels(det, [['r001', 0, 32000], ['r004', 2, 33000]]);
  const choice = { referenceRuns: ['r001', 'r004'], weights: [0.25, 0.75], flags: [] };
  const sample = run('s1', 1.5, { kind: 'sample', target: 'c-on-au', chargeUC: 20 });
  const norm = referenceRunExposure(sample, 1, choice, models, shared);
  const lab = crossSectionLabModel({ run: 's1', detector: 'd01', gross: 5000, background: 0, backgroundVariance: 0, live: clock, sampleLayers, normalization: norm });

  it('ΔΩ_eff = Σ w_k ΔΩ_k and dσ/dΩ = N/(Q/e · n · ΔΩ_eff · f) (the existing bracketing formula)', () => {
    const omega = 0.25 * valueAtEstimates(models.get('r001')!) + 0.75 * valueAtEstimates(models.get('r004')!);
    expect(norm.solidAngleMsr).toBeCloseTo(omega, 13);
    const expected = 5000 / ((20e-6 / E_CHARGE_C) * 150e15 * (omega / 1000) * 0.95) / 1e-27;
    expect(firstOrderEstimate(lab).value / expected).toBeCloseTo(1, 12);
  });

  it('the charge integrator scale is in the sample and in every reference run: no charge component is left', () => {
    const e = firstOrderEstimate(lab);
    expect(e.components.some((c) => c.name === 'charge')).toBe(false);
    expect(e.components.some((c) => c.name === 'reference_counting' && c.key === 'r004/d01')).toBe(true);
  });
});

describe('internal-reference: dσ/dΩ = σ_R,ref × (Y/Y_ref) × (N_ref/N) (issue 5)', () => {
  const sample = run('s1', 1, { kind: 'sample', target: 'c-on-au', chargeUC: 20 });
  const target = config.targets[1]!;
  const refNuclides = normalizingNuclides(he, target, 'Au', 2000, 150, 'lecuyer', { layer: (l) => l.role === 'reference' })!;
  const build = (r: RunRecord, live: typeof clock) =>
    crossSectionLabModel({
      run: r.run, detector: 'd01', gross: 5000, background: 0, backgroundVariance: 0, live, sampleLayers,
      normalization: internalReferenceExposure({ run: r, detector: 'd01', angleUncDeg: 0.2, referencePeak: net(12000), live, nuclides: refNuclides, shared }),
    });

  it('the value is the issue\'s ratio formula with Darwin × L\'Ecuyer for the gold layer (n_ref = 10e15, n = 150e15)', () => {
    const expected = auSigma(2000, 150) * (5000 / 12000) * (10e15 / 150e15);
    expect(firstOrderEstimate(build(sample, clock)).value / expected).toBeCloseTo(1, 9);
  });

  it('charge and live time cancel: another charge or live fraction gives the same value, and neither is in the budget', () => {
    const a = firstOrderEstimate(build(sample, pulser));
    const b = firstOrderEstimate(build({ ...sample, chargeUC: 123 }, clock));
    expect(a.value).toBeCloseTo(b.value, 9);
    expect(a.components.map((c) => c.name)).not.toContain('live_time');
    expect(a.components.map((c) => c.name)).not.toContain('charge');
  });

  it('budget: counting 1/√Y, reference counting −1/√Y_ref, both layers\' thicknesses (JCGM 100:2008 §5.1.6)', () => {
    const e = firstOrderEstimate(build(sample, clock));
    const by = new Map(e.components.map((c) => [c.name, c]));
    expect(rel(by.get('counting')!, e.value)).toBeCloseTo(1 / Math.sqrt(5000), 12);
    expect(rel(by.get('reference_counting')!, e.value)).toBeCloseTo(-1 / Math.sqrt(12000), 12);
    expect(rel(by.get('sample_areal_density')!, e.value)).toBeCloseTo(-0.05, 12);
    expect(rel(by.get('reference_areal_density')!, e.value)).toBeCloseTo(0.02, 12);
    expect(by.get('reference_counting')!.class).toBe('run');
  });
});

describe('monitor: Y_m normalizes each run, ΔΩ_d/ΔΩ_m from the reference runs (issue 5)', () => {
  const dModels = refModels(det, [['r001', 0, 32000]]);
  const mModels = refModels(mon, [['r001', 0, 20000]]);
  const choice = { referenceRuns: ['r001'], weights: [1], flags: [] };
  const sample = run('s1', 1, { kind: 'sample', target: 'c-on-au', chargeUC: 20 });
  const target = config.targets[1]!;
  const monNuclides = normalizingNuclides(he, target, 'Au', 2000, 170, 'lecuyer')!;
  const exposure = (detector: string) => monitorExposure({ run: sample, detector, monitor: { detector: 'mon', angleUncDeg: 0.1, peak: net(9000), live: pulser, nuclides: monNuclides }, choice, detectorSolidAngles: detector === 'mon' ? mModels : dModels, monitorSolidAngles: mModels, shared });

  it('L_d = Y_m/(f_m n_Au σ_R(170°)) · ΔΩ_d/ΔΩ_m: the row equals σ_R ratio formula written out (charge and absolute ΔΩ cancel)', () => {
    const lab = firstOrderEstimate(crossSectionLabModel({ run: 's1', detector: 'd01', gross: 5000, background: 0, backgroundVariance: 0, live: clock, sampleLayers, normalization: exposure('d01') }));
    // ΔΩ_d/ΔΩ_m from r001 = (32000/σ(150°)) / (20000/σ(170°)) (same charge, film and live fraction)
    const rho = (32000 / auSigma(2000, 150)) / (20000 / auSigma(2000, 170));
    const beamOmega = (9000 / (pulser.value * 10e15 * auSigma(2000, 170) * 1e-27)) * rho;
    const expected = 5000 / (0.95 * 150e15 * beamOmega) / 1e-27;
    expect(lab.value / expected).toBeCloseTo(1, 9);
    expect(lab.components.map((c) => c.name)).not.toContain('charge');
    // the reference film's areal density cancels in ΔΩ_d/ΔΩ_m; the gold layer of the sample target stays (−u_n/n = −2 %)
    expect(lab.components.map((c) => c.key)).not.toContain('au-ref/layer 1');
    expect(lab.components.find((c) => c.key === 'c-on-au/layer 2')!.value / lab.value).toBeCloseTo(0.02, 12);
    expect(lab.components.find((c) => c.name === 'reference_counting' && c.key === 's1/mon')!.value / lab.value).toBeCloseTo(-1 / Math.sqrt(9000), 12);
  });

  it('the monitor\'s own rows: ρ = 1 exactly and the reference runs drop out of the budget', () => {
    const norm = exposure('mon');
    const lab = firstOrderEstimate(crossSectionLabModel({ run: 's1', detector: 'mon', gross: 5000, background: 0, backgroundVariance: 0, live: pulser, sampleLayers, normalization: norm }));
    expect(lab.components.some((c) => c.key.startsWith('r001'))).toBe(false);
    expect(lab.components.some((c) => c.name === 'live_time')).toBe(false);
  });
});

describe('absolute: charge × nominal solid angle × areal density (issue 5)', () => {
  const sample = run('s1', 1, { kind: 'sample', target: 'c-on-au', chargeUC: 20 });
  const norm = absoluteExposure({ run: sample, chargeState: 1, detector: 'd01', solidAngleMsr: 2.5, solidAngleUncRel: 0.03, shared });
  const lab = firstOrderEstimate(crossSectionLabModel({ run: 's1', detector: 'd01', gross: 5000, background: 0, backgroundVariance: 0, live: clock, sampleLayers, normalization: norm }));

  it('dσ/dΩ = N/(Q/e · n · ΔΩ_nom · f), and the charge and solid angle add −2 % and −3 % (linear: exact)', () => {
    const expected = 5000 / ((20e-6 / E_CHARGE_C) * 150e15 * 2.5e-3 * 0.95) / 1e-27;
    expect(lab.value / expected).toBeCloseTo(1, 12);
    const by = new Map(lab.components.map((c) => [c.name, c]));
    expect(rel(by.get('charge')!, lab.value)).toBeCloseTo(-0.02, 12);
    expect(rel(by.get('solid_angle')!, lab.value)).toBeCloseTo(-0.03, 12);
    expect(by.get('solid_angle')!.class).toBe('detector');
    expect(by.get('solid_angle')!.key).toBe('d01');
  });
});
