import { describe, expect, it } from 'vitest';
import { normalize, type NormalizeInput } from '../../stages/normalize/index.js';
import { seriesSchema, type SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import { liveFraction, type LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import { planPeakWindow, type MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import { nuclide } from '../../pipeline/core/physics/nuclides.js';
import { rutherfordLabMbPerSr } from '../../pipeline/core/physics/rutherford-lab.js';
import { lecuyerScreeningFactor } from '../../pipeline/core/physics/screening-lecuyer.js';
import { MB_TO_CM2, microCoulombToParticles } from '../../pipeline/core/physics/units.js';

// Constants typed in here, independent of the project's tables:
// e = 1.602176634e-19 C (exact, SI 2019); e²/4πε₀ = αħc = 1.439964547 MeV fm (CODATA 2018,
// Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)); atomic masses from AME2020 (Wang et al.,
// Chinese Physics C 45, 030003 (2021)): 4He 4.00260325413 u, 197Au 196.966570103 u.
const E_CHARGE_C = 1.602176634e-19;
const E2_KEV_FM = 1439.964547;
const M_HE4_U = 4.00260325413;
const M_AU197_U = 196.966570103;

/**
 * Exact lab-frame Rutherford cross section with recoil, mb/sr, written out independently:
 *   dσ/dΩ_lab = (Z1 Z2 e²/4E)² · 4/sin⁴θ · [√(1 − x²) + cos θ]² / √(1 − x²),  x = (M1/M2) sin θ
 * (C.G. Darwin, Phil. Mag. 27, 499 (1914); W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering
 * Spectrometry (Academic Press, 1978), ch. 2). 1 fm² = 10 mb.
 */
function darwinLabMbPerSr(z1: number, z2: number, m1U: number, m2U: number, eKeV: number, thetaDeg: number): number {
  const th = (thetaDeg * Math.PI) / 180;
  const x = (m1U / m2U) * Math.sin(th);
  const root = Math.sqrt(1 - x * x);
  const a = (z1 * z2 * E2_KEV_FM) / (4 * eKeV);
  return a * a * (4 / Math.sin(th) ** 4) * ((root + Math.cos(th)) ** 2 / root) * 10;
}
/** L'Ecuyer, Davies & Matsunami, Nucl. Instrum. Methods 160, 337 (1979): F = 1 − 0.049 Z1 Z2^{4/3}/E_cm[keV]. */
const lecuyerF = (z1: number, z2: number, eCmKeV: number) => 1 - (0.049 * z1 * z2 ** (4 / 3)) / eCmKeV;

function config(extra: { detectors?: object[]; normalization?: object } = {}): SeriesConfig {
  return seriesSchema.parse({
    series: 'normalize-test',
    beam: { projectile: '4He', charge_state: 1 },
    detectors: extra.detectors ?? [{ id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 }],
    targets: [
      { id: 'au-ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
      { id: 'c-foil', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }] },
    ],
    peaks: [{ label: '12C elastic', target_nuclide: '12C' }],
    normalization: { method: 'reference-run', reference_target: 'au-ref', ...(extra.normalization ?? {}) },
  });
}

const T0 = Date.UTC(2026, 2, 2, 8, 0, 0);
const HOUR = 3_600_000;

function run(id: string, kind: 'reference' | 'sample', hours: number, o: Partial<RunRecord> = {}): RunRecord {
  return { run: id, index: 0, line: 2, startedAt: '', startedAtMs: T0 + hours * HOUR, kind, target: kind === 'reference' ? 'au-ref' : 'c-foil', beamEnergyKeV: 2000, beamEnergyUncKeV: 2, chargeUC: 4, realTimeS: 500, note: '', ...o };
}

const CAL = { version: 'cal-a', offsetKeV: 0, gainKeVPerChannel: 2, quadraticKeVPerChannel2: 0, covariance: [[0, 0], [0, 0]] };

/** A measured reference peak with Poisson net counts (no background: var N = N). */
function peak(detector: string, netCounts: number | null, expectedKeV = 1850): MeasuredPeak {
  const window = planPeakWindow(CAL, 1024, expectedKeV, 15, { peak_half_width_fwhm: 1.5, background_gap_fwhm: 0.5, background_width_fwhm: 1.5 });
  return {
    request: { key: 'reference Au', detector, expectedEnergyKeV: expectedKeV, fwhmKeV: 15 },
    window,
    net: netCounts === null ? null : { gross: netCounts, background: 0, backgroundVariance: 0, net: netCounts, netVariance: netCounts, centroidChannel: expectedKeV / 2 },
    shiftKeV: 0,
  };
}

const LIVE_095: LiveFraction = liveFraction({ mode: 'live-time', liveTimeS: 475, line: 2 }, 500);

function measured(entries: [string, string, number | null][], live = LIVE_095): NormalizeInput['measured'] {
  const m = new Map<string, Map<string, { peak: MeasuredPeak; live: LiveFraction }>>();
  for (const [r, d, n] of entries) {
    if (!m.has(r)) m.set(r, new Map());
    m.get(r)!.set(d, { peak: peak(d, n), live });
  }
  return m;
}

describe('normalize: effective solid angle from a reference run (thin-target yield, Chu, Mayer & Nicolet 1978, eq. 3.4)', () => {
  // 2000 keV 4He on 60e15 197Au/cm² (gold is monoisotopic, IUPAC 2013), detector at 150°,
  // Q = 4 µC (q = 1), live fraction 475 s / 500 s = 0.95, N = 32000 net counts.
  const N = 32000;
  const ref = run('r001', 'reference', 0);
  const out = normalize({ config: config(), referenceRuns: [ref], sampleRuns: [], measured: measured([['r001', 'd01', N]]) });
  const p = out.points[0]!;

  it('uses gold as the reference element and reads one point', () => {
    expect(out.element).toBe('Au');
    expect(out.points).toHaveLength(1);
    expect(p.liveFraction).toBe(0.95);
  });

  it('ΔΩ = N / (Q/e · n · σ_R,lab · F · f), from the physics functions', () => {
    const he = nuclide('4He');
    const au = nuclide('197Au');
    const eCm = (2000 * au.massU) / (au.massU + he.massU);
    const sigmaF = rutherfordLabMbPerSr(2, 79, he.massU, au.massU, 2000, 150) * lecuyerScreeningFactor(2, 79, eCm);
    const expectedMsr = (N / (microCoulombToParticles(4, 1) * 60e15 * sigmaF * MB_TO_CM2 * 0.95)) * 1000;
    expect(p.solidAngleMsr! / expectedMsr).toBeCloseTo(1, 12);
  });

  it('ΔΩ agrees with the Darwin (1914) formula and the L\'Ecuyer (1979) factor written out in the test', () => {
    const eCm = (2000 * M_AU197_U) / (M_AU197_U + M_HE4_U);
    const f = lecuyerF(2, 79, eCm);
    const sigma = darwinLabMbPerSr(2, 79, M_HE4_U, M_AU197_U, 2000, 150);
    const nBeam = 4e-6 / E_CHARGE_C;
    const expectedMsr = (N / (nBeam * 60e15 * sigma * f * 1e-27 * 0.95)) * 1000;
    expect(p.solidAngleMsr! / expectedMsr).toBeCloseTo(1, 9);
    expect(p.rutherfordMbPerSr / (sigma * f)).toBeCloseTo(1, 9);
    expect(p.screeningFactor).toBeCloseTo(f, 12);
    // hand evaluation: (2·79·1439.96/8000)² fm² = 808.8 fm², angular factor 1.1476, F = 0.9831 → about 9.1e3 mb/sr
    // and ΔΩ ≈ 2.46 msr for these counts (regression of the hand evaluation, 3 digits)
    expect(sigma * f).toBeCloseTo(9127, 0);
    expect(p.solidAngleMsr!).toBeCloseTo(2.464, 3);
  });

  it('uncertainty parts: counting 1/√N, live 0 (clock), areal 3 %, energy |∂lnσF/∂E|·u_E (JCGM 100:2008 §5.1.6)', () => {
    expect(p.relCounting).toBeCloseTo(1 / Math.sqrt(N), 14);
    expect(p.relLive).toBe(0);
    expect(p.relAreal).toBe(0.03);
    const lnSF = (e: number) => Math.log(darwinLabMbPerSr(2, 79, M_HE4_U, M_AU197_U, e, 150) * lecuyerF(2, 79, (e * M_AU197_U) / (M_AU197_U + M_HE4_U)));
    const h = 0.01;
    const dLnDE = (lnSF(2000 + h) - lnSF(2000 - h)) / (2 * h);
    expect(p.relEnergy / (Math.abs(dLnDE) * 2)).toBeCloseTo(1, 6);
    const lnTheta = (t: number) => Math.log(darwinLabMbPerSr(2, 79, M_HE4_U, M_AU197_U, 2000, t));
    const dLnDTheta = (lnTheta(150 + 1e-4) - lnTheta(150 - 1e-4)) / 2e-4;
    expect(p.dLnSigmaDThetaPerDeg / dLnDTheta).toBeCloseTo(1, 6);
  });

  it('screening: none gives F = 1 and a ΔΩ smaller by the factor F_LEcuyer (the unscreened σ is larger)', () => {
    const none = normalize({ config: config({ normalization: { screening: 'none' } }), referenceRuns: [ref], sampleRuns: [], measured: measured([['r001', 'd01', N]]) }).points[0]!;
    expect(none.screeningFactor).toBe(1);
    const eCm = (2000 * M_AU197_U) / (M_AU197_U + M_HE4_U);
    expect(none.solidAngleMsr! / p.solidAngleMsr!).toBeCloseTo(lecuyerF(2, 79, eCm), 9);
  });

  it('a pulser live fraction enters relLive as its binomial uncertainty over f (common practice)', () => {
    const live = liveFraction({ mode: 'pulser', pulserSent: 10000, pulserCounted: 9500, line: 2 }, 500);
    const q = normalize({ config: config(), referenceRuns: [ref], sampleRuns: [], measured: measured([['r001', 'd01', N]], live) }).points[0]!;
    expect(q.relLive).toBeCloseTo(Math.sqrt((0.95 * 0.05) / 10000) / 0.95, 14);
    expect(q.solidAngleMsr).toBeCloseTo(p.solidAngleMsr!, 12);
  });

  it('charge state 2: half the ions per µC, so ΔΩ doubles (N_beam = Q/(q e))', () => {
    const cfg = config();
    const q2 = normalize({ config: { ...cfg, beam: { ...cfg.beam, charge_state: 2 } }, referenceRuns: [ref], sampleRuns: [], measured: measured([['r001', 'd01', N]]) }).points[0]!;
    expect(q2.solidAngleMsr! / p.solidAngleMsr!).toBeCloseTo(2, 12);
  });
});

describe('normalize: the reference element and its isotopes (README, "Normalization")', () => {
  const N = 20000;
  const withTargets = (layers: object[]) =>
    seriesSchema.parse({
      series: 'normalize-isotopes',
      beam: { projectile: '4He', charge_state: 1 },
      detectors: [{ id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 }],
      targets: [
        { id: 'au-ref', layers },
        { id: 'c-foil', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 150 }] },
      ],
      peaks: [{ label: '12C elastic', target_nuclide: '12C' }],
      normalization: { reference_target: 'au-ref' },
    });
  const one = (cfg: SeriesConfig) => normalize({ config: cfg, referenceRuns: [run('r001', 'reference', 0)], sampleRuns: [], measured: measured([['r001', 'd01', N]]) });

  it('a carbon backing under the gold changes nothing: the heaviest element (Au) normalizes', () => {
    const bare = one(withTargets([{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }]));
    const backed = one(withTargets([
      { composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 },
      { composition: { C: 1 }, areal_density_1e15_per_cm2: 40, areal_density_unc_rel: 0.1 },
    ]));
    expect(backed.element).toBe('Au');
    expect(backed.points[0]!.solidAngleMsr).toBeCloseTo(bare.points[0]!.solidAngleMsr!, 12);
    expect(backed.points[0]!.relAreal).toBe(0.03);
  });

  it('natural silver: ΔΩ = N / (Q/e · Σ n_i σ_R,i F_i · f) over 107Ag and 109Ag (IUPAC 2013 0.51839 / 0.48161; AME2020 106.905091509 u, 108.904755778 u)', () => {
    const out = one(withTargets([{ composition: { Ag: 1 }, areal_density_1e15_per_cm2: 80, areal_density_unc_rel: 0.02 }]));
    expect(out.element).toBe('Ag');
    let sum = 0;
    for (const [x, m2] of [[0.51839, 106.905091509], [0.48161, 108.904755778]] as const) {
      sum += 80e15 * x * darwinLabMbPerSr(2, 47, M_HE4_U, m2, 2000, 150) * lecuyerF(2, 47, (2000 * m2) / (m2 + M_HE4_U));
    }
    const expectedMsr = (N / ((4e-6 / E_CHARGE_C) * sum * 1e-27 * 0.95)) * 1000;
    expect(out.points[0]!.solidAngleMsr! / expectedMsr).toBeCloseTo(1, 9);
    // the tabulated cross section is the isotope average Σ n_i σ_i / n
    expect(out.points[0]!.rutherfordMbPerSr / (sum / 80e15)).toBeCloseTo(1, 9);
  });
});

describe('normalize: the bracketing rule (README, "Which reference runs")', () => {
  const N = 32000;
  // two reference runs 2 h apart with different yields, so interpolation is visible
  const refs = [run('r001', 'reference', 0), run('r004', 'reference', 2)];
  const m = measured([
    ['r001', 'd01', N],
    ['r004', 'd01', N * 1.01],
  ]);
  const samples = [run('r000', 'sample', -1), run('r002', 'sample', 1), run('r003', 'sample', 1.5), run('r005', 'sample', 3), run('r006', 'sample', 2)];
  const out = normalize({ config: config(), referenceRuns: refs, sampleRuns: samples, measured: m });
  const a = out.points[0]!.solidAngleMsr!;
  const b = out.points[1]!.solidAngleMsr!;
  const applied = (id: string) => out.applied.get(id)!.get('d01')!;

  it('halfway in time: equal weights, the mean of the two, no flag', () => {
    const x = applied('r002');
    expect(x.referenceRuns).toEqual(['r001', 'r004']);
    expect(x.weights).toEqual([0.5, 0.5]);
    expect(x.solidAngleMsr).toBeCloseTo((a + b) / 2, 12);
    expect(x.flags).toEqual([]);
  });

  it('three quarters of the way: weights 1/4 and 3/4', () => {
    const x = applied('r003');
    expect(x.weights[0]).toBeCloseTo(0.25, 12);
    expect(x.weights[1]).toBeCloseTo(0.75, 12);
    expect(x.solidAngleMsr).toBeCloseTo(0.25 * a + 0.75 * b, 12);
  });

  it('independent parts add in quadrature with the weights, shared parts linearly (JCGM 100:2008 §5.1.2)', () => {
    const x = applied('r002');
    const ua = (0.5 * a) / Math.sqrt(N);
    const ub = (0.5 * b) / Math.sqrt(N * 1.01);
    expect(x.relCounting).toBeCloseTo(Math.hypot(ua, ub) / x.solidAngleMsr, 12);
    expect(x.relAreal).toBeCloseTo(0.03, 12);
  });

  it('before the first reference run: the nearest alone, flag reference-one-sided', () => {
    const x = applied('r000');
    expect(x.referenceRuns).toEqual(['r001']);
    expect(x.weights).toEqual([1]);
    expect(x.solidAngleMsr).toBe(a);
    expect(x.flags).toEqual(['reference-one-sided']);
  });

  it('after the last reference run: the last alone, flag reference-one-sided', () => {
    const x = applied('r005');
    expect(x.referenceRuns).toEqual(['r004']);
    expect(x.flags).toEqual(['reference-one-sided']);
  });

  it('at the very time of a reference run: that run alone, not one-sided', () => {
    const x = applied('r006');
    expect(x.referenceRuns).toEqual(['r004']);
    expect(x.weights).toEqual([1]);
    expect(x.flags).toEqual([]);
  });

  it('detector summary: the weighted mean lies between the two points, ndf = points − 1 (inverse-variance weighting, common practice)', () => {
    const d = out.detectors[0]!;
    expect(d.ndf).toBe(1);
    expect(d.meanMsr!).toBeGreaterThan(a);
    expect(d.meanMsr!).toBeLessThan(b);
    expect(d.nominalMsr).toBe(2.5);
  });
});

describe('normalize: flags (README, "Flags")', () => {
  const N = 32000;

  it('one reference run far off the others is flagged reference-outlier; samples that use it say so', () => {
    // five runs; r003 has 6 % more counts: about 9 standard deviations of its 0.56 % counting uncertainty
    const refs = [0, 1, 2, 3, 4].map((h) => run(`r00${h}`, 'reference', h * 2));
    const counts = [N, N * 1.002, N * 1.06, N * 0.998, N];
    const m = measured(refs.map((r, i) => [r.run, 'd01', counts[i]!]));
    const samples = [run('s01', 'sample', 1), run('s02', 'sample', 3), run('s03', 'sample', 7)];
    const out = normalize({ config: config(), referenceRuns: refs, sampleRuns: samples, measured: m });
    expect(out.points.map((p) => p.flags.includes('reference-outlier'))).toEqual([false, false, true, false, false]);
    const d = out.diagnostics.filter((x) => x.rule === 'reference-outlier');
    expect(d.map((x) => x.run)).toEqual(['r002']);
    expect(d[0]!.severity).toBe('warning');
    expect(out.applied.get('s01')!.get('d01')!.flags).toEqual([]);
    expect(out.applied.get('s02')!.get('d01')!.flags).toEqual(['uses-reference-outlier']);
    expect(out.applied.get('s03')!.get('d01')!.flags).toEqual([]);
    expect(out.points.some((p) => p.flags.includes('solid-angle-off-nominal'))).toBe(false);
  });

  it('a single reference run is never an outlier (no others to disagree with)', () => {
    const out = normalize({ config: config(), referenceRuns: [run('r001', 'reference', 0)], sampleRuns: [], measured: measured([['r001', 'd01', N]]) });
    expect(out.points[0]!.flags).toEqual([]);
    expect(out.detectors[0]!.ndf).toBe(0);
  });

  it('an effective solid angle 20 % above the nominal one is flagged solid-angle-off-nominal (tolerance 10 %)', () => {
    // N = 32000 gives 2.464 msr (see above); nominal 2.05 msr puts it 20 % off
    const cfg = config({ detectors: [{ id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.05 }] });
    const out = normalize({ config: cfg, referenceRuns: [run('r001', 'reference', 0)], sampleRuns: [run('s01', 'sample', 1)], measured: measured([['r001', 'd01', N]]) });
    expect(out.points[0]!.flags).toEqual(['solid-angle-off-nominal']);
    const d = out.diagnostics.find((x) => x.rule === 'solid-angle-off-nominal')!;
    // one warning per detector (the geometry is the detector's), not per reference run
    expect(d).toMatchObject({ severity: 'warning', detector: 'd01' });
    expect(d.run).toBeUndefined();
    expect(d.message).toContain('20.');
    expect(out.applied.get('s01')!.get('d01')!.flags.sort()).toEqual(['reference-one-sided', 'uses-solid-angle-off-nominal']);
  });

  it('within the tolerance there is no flag (2.464 msr against 2.5 nominal: −1.4 %)', () => {
    const out = normalize({ config: config(), referenceRuns: [run('r001', 'reference', 0)], sampleRuns: [], measured: measured([['r001', 'd01', N]]) });
    expect(out.points[0]!.flags).toEqual([]);
    expect(out.diagnostics).toEqual([]);
  });

  it('no usable reference for a detector: diagnostic normalization-missing and applied null; the other detector is normalized', () => {
    const cfg = config({
      detectors: [
        { id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
        { id: 'd02', angle_deg: 165, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
      ],
    });
    const out = normalize({
      config: cfg,
      referenceRuns: [run('r001', 'reference', 0)],
      sampleRuns: [run('s01', 'sample', 1)],
      measured: measured([
        ['r001', 'd01', N],
        ['r001', 'd02', null],
      ]),
    });
    const miss = out.diagnostics.filter((x) => x.rule === 'normalization-missing');
    expect(miss).toHaveLength(1);
    expect(miss[0]).toMatchObject({ severity: 'error', detector: 'd02', stage: 'normalize' });
    expect(out.diagnostics.find((x) => x.rule === 'reference-unusable')).toMatchObject({ run: 'r001', detector: 'd02' });
    const d02 = out.points.find((p) => p.detector === 'd02')!;
    expect(d02.solidAngleMsr).toBeNull();
    expect(d02.flags).toContain('reference-not-measured');
    expect(out.applied.get('s01')!.get('d02')).toBeNull();
    expect(out.applied.get('s01')!.get('d01')!.solidAngleMsr).toBeCloseTo(out.points[0]!.solidAngleMsr!, 12);
    expect(out.detectors.find((d) => d.detector === 'd02')!.meanMsr).toBeNull();
  });

  it('a reference peak with net counts ≤ 0 does not normalize (flag reference-net-not-positive)', () => {
    const out = normalize({ config: config(), referenceRuns: [run('r001', 'reference', 0)], sampleRuns: [run('s01', 'sample', 1)], measured: measured([['r001', 'd01', -3]]) });
    expect(out.points[0]!.solidAngleMsr).toBeNull();
    expect(out.points[0]!.flags).toContain('reference-net-not-positive');
    expect(out.applied.get('s01')!.get('d01')).toBeNull();
    expect(out.diagnostics.map((d) => d.rule).sort()).toEqual(['normalization-missing', 'reference-unusable']);
  });

  it('no reference runs measured at all: every detector is missing', () => {
    const out = normalize({ config: config(), referenceRuns: [], sampleRuns: [run('s01', 'sample', 1)], measured: new Map() });
    expect(out.points).toEqual([]);
    expect(out.applied.get('s01')!.get('d01')).toBeNull();
    expect(out.diagnostics.map((d) => d.rule)).toEqual(['normalization-missing']);
  });
});

describe('normalize: a reference above the onset of non-Rutherford scattering (Bozoian, Nucl. Instrum. Methods B 58, 127 (1991); 4He: E_NR = 0.25 Z2 + 0.4 MeV, from memory)', () => {
  // A silicon reference (Z = 14: E_NR = 3.9 MeV) at 4.5 MeV and at 3.0 MeV.
  const siConfig = (): SeriesConfig =>
    seriesSchema.parse({
      series: 'onset-test',
      beam: { projectile: '4He', charge_state: 1 },
      detectors: [{ id: 'd01', angle_deg: 170, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 }],
      targets: [
        { id: 'si-ref', layers: [{ composition: { Si: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
        { id: 'c-foil', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }] },
      ],
      peaks: [{ label: '12C elastic', target_nuclide: '12C' }],
      normalization: { method: 'reference-run', reference_target: 'si-ref', nominal_tolerance_rel: 1e6 },
    });
  const refRun = (id: string, e: number, h: number) => run(id, 'reference', h, { target: 'si-ref', beamEnergyKeV: e });
  const reduce = (e: number) => {
    const cfg = siConfig();
    return normalize({ config: cfg, referenceRuns: [refRun('r001', e, 0)], sampleRuns: [run('s01', 'sample', 1, { beamEnergyKeV: e })], measured: measured([['r001', 'd01', 30000]]) });
  };
  it('4.5 MeV > 3.9 MeV: the point is flagged, one warning names the onset, and the sample row normalized by it carries uses-…', () => {
    const out = reduce(4500);
    expect(out.points[0]!.flags).toContain('reference-above-non-rutherford-onset');
    const warnings = out.diagnostics.filter((d) => d.rule === 'reference-above-non-rutherford-onset');
    expect(warnings).toHaveLength(1);
    expect(warnings[0]!.message).toMatch(/3900 keV/);
    const row = out.rows.get('s01')!.get('d01')!;
    expect(row.flags).toContain('uses-reference-above-non-rutherford-onset');
  });
  it('3.0 MeV < 3.9 MeV: no flag, no warning', () => {
    const out = reduce(3000);
    expect(out.points[0]!.flags).not.toContain('reference-above-non-rutherford-onset');
    expect(out.diagnostics.filter((d) => d.rule === 'reference-above-non-rutherford-onset')).toEqual([]);
  });
});
