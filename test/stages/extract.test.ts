import { describe, expect, it } from 'vitest';
import { extract, measuredKey, type ExtractInput } from '../../stages/extract/index.js';
import { crossSectionRow, type RowInput } from '../../stages/extract/cross-section-row.js';
import { interferenceFlags, type KnownLine } from '../../stages/extract/interference-flags.js';
import { seriesSchema, type PeakConfig, type SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import { liveFraction, type LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import { planPeakWindow, type MeasuredPeak, type PeakWindow } from '../../pipeline/core/counting/peak-window.js';
import type { NetCounts } from '../../pipeline/core/counting/net-counts.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import type { ScalarOps } from '../../pipeline/core/normalization/scalar-ops.js';
import { modelInput } from '../../pipeline/core/normalization/shared-inputs.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import { nuclide } from '../../pipeline/core/physics/nuclides.js';
import { seriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';

// Constants typed in here, independent of the project's tables: e = 1.602176634e-19 C (exact,
// SI 2019); e²/4πε₀ = 1.439964547 MeV fm (CODATA 2018, Tiesinga et al., Rev. Mod. Phys. 93,
// 025010 (2021)); AME2020 atomic masses (Wang et al., Chinese Physics C 45, 030003 (2021)):
// 4He 4.00260325413 u, 12C 12 u (exact by definition).
const E_CHARGE_C = 1.602176634e-19;
const E2_KEV_FM = 1439.964547;
const M1 = 4.00260325413;
const M2 = 12;
const DEG = Math.PI / 180;

/** Lab Rutherford with recoil, mb/sr (Darwin, Phil. Mag. 27, 499 (1914); Chu, Mayer & Nicolet 1978, ch. 2). */
function darwinLabMbPerSr(z1: number, z2: number, m1: number, m2: number, eKeV: number, thetaDeg: number): number {
  const th = thetaDeg * DEG;
  const x = (m1 / m2) * Math.sin(th);
  const root = Math.sqrt(1 - x * x);
  const a = (z1 * z2 * E2_KEV_FM) / (4 * eKeV);
  return a * a * (4 / Math.sin(th) ** 4) * ((root + Math.cos(th)) ** 2 / root) * 10;
}
/** CM Rutherford, mb/sr (E. Rutherford, Phil. Mag. 21, 669 (1911)): (Z1 Z2 e²/4E_cm)² / sin⁴(θ_cm/2). */
function rutherfordCm(z1: number, z2: number, eCmKeV: number, thetaCmDeg: number): number {
  const a = (z1 * z2 * E2_KEV_FM) / (4 * eCmKeV);
  return (a * a * 10) / Math.sin((thetaCmDeg * DEG) / 2) ** 4;
}
/** L'Ecuyer, Davies & Matsunami, Nucl. Instrum. Methods 160, 337 (1979). */
const lecuyerF = (z1: number, z2: number, eCmKeV: number) => 1 - (0.049 * z1 * z2 ** (4 / 3)) / eCmKeV;

const CAL = { version: 'cal-a', offsetKeV: 0, gainKeVPerChannel: 2, quadraticKeVPerChannel2: 0, covariance: [[0, 0], [0, 0]] };
const WIDTHS = { peak_half_width_fwhm: 1.5, background_gap_fwhm: 0.5, background_width_fwhm: 1.5 };

function config(targets?: object[], peaks?: object[]): SeriesConfig {
  return seriesSchema.parse({
    series: 'extract-test',
    beam: { projectile: '4He', charge_state: 1 },
    detectors: [
      { id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
      { id: 'd02', angle_deg: 165, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
    ],
    targets: targets ?? [
      { id: 'au-ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
      { id: 'c-foil', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }] },
    ],
    peaks: peaks ?? [{ label: '12C elastic', target_nuclide: '12C' }],
    normalization: { method: 'reference-run', reference_target: 'au-ref' },
  });
}

const sample = (o: Partial<RunRecord> = {}): RunRecord => ({
  run: 'r002', index: 1, line: 3, startedAt: '', startedAtMs: 0, kind: 'sample', target: 'c-foil',
  beamEnergyKeV: 2000, beamEnergyUncKeV: 2, chargeUC: 30, realTimeS: 1000, note: '', ...o,
});

function measuredPeak(key: string, detector: string, expectedKeV: number, net: NetCounts | null, shiftKeV = 0): MeasuredPeak {
  return { request: { key, detector, expectedEnergyKeV: expectedKeV, fwhmKeV: 15 }, window: planPeakWindow(CAL, 1024, expectedKeV, 15, WIDTHS), net, shiftKeV };
}

const NET: NetCounts = { gross: 5200, background: 200, backgroundVariance: 150, net: 5000, netVariance: 5350, centroidChannel: 250 };
// pulser: 18000 of 20000 counted, f = 0.9, u(f) = √(f(1 − f)/n) (binomial; common practice)
const LIVE: LiveFraction = liveFraction({ mode: 'pulser', pulserSent: 20000, pulserCounted: 18000, line: 2 }, 1000);

/** ∂lnσ_R/∂θ of the gold reference at 150°, per degree, by central difference of the Darwin formula. */
const dLnAuDTheta = (Math.log(darwinLabMbPerSr(2, 79, M1, 196.966570103, 2000, 150 + 1e-4)) - Math.log(darwinLabMbPerSr(2, 79, M1, 196.966570103, 2000, 150 - 1e-4))) / 2e-4;

/**
 * A reference-run normalization written out by hand as an exposure model: L = N_beam ΔΩ with
 * ΔΩ = 2.45 msr carrying relative errors 0.4 % (reference counting), 0.1 % (reference live
 * time), 0.25 % (reference energy), 3 % (reference film) and the detector angle through
 * ΔΩ ∝ 1/σ_Au(θ), for a run of 30 µC (the sample run of these tests).
 */
function stubNormalization(flags: string[] = []): RowNormalization {
  const beam = 30e-6 / E_CHARGE_C;
  const inputs = [
    modelInput('reference_counting', 'run', 'r001/d01', 0, 0.004),
    modelInput('live_time', 'run', 'r001/d01', 0, 0.001),
    modelInput('beam_energy', 'run', 'r001', 0, 0.0025),
    modelInput('reference_areal_density', 'series', 'au-ref/layer 1', 0, 0.03),
    modelInput('angle', 'detector', 'd01', 0, 0.2),
  ];
  return {
    method: 'reference-run',
    exposure: {
      inputs,
      parts: [],
      evaluate<T>(v: readonly T[], _p: readonly T[], ops: ScalarOps<T>): T {
        let f = ops.add(ops.k(1), v[0]!);
        for (let i = 1; i < 4; i++) f = ops.mul(f, ops.add(ops.k(1), v[i]!));
        return ops.scale(ops.mul(f, ops.exp(ops.scale(v[4]!, -dLnAuDTheta))), (beam * 2.45) / 1000);
      },
    },
    referenceRuns: ['r001', 'r004'],
    weights: [0.5, 0.5],
    solidAngleMsr: 2.45,
    flags,
  };
}
const NORM = stubNormalization();

const N12C = 150e15 * 0.9893; // 12C atoms/cm²: 150e15 C × 0.9893 (IUPAC 2013 abundance of 12C)

function rowInput(o: Partial<RowInput> = {}): RowInput {
  const base = config();
  const peak = o.peak ?? base.peaks[0]!;
  const cfg = { ...base, peaks: [peak] };
  const planner = seriesPeakPlanner(cfg);
  const run = o.run ?? sample();
  const detector = o.detector ?? cfg.detectors[0]!;
  const plannedHere = planner.samplePeaks(cfg.targets[1]!, detector, run.beamEnergyKeV).peaks.find((p) => p.label === peak.label) ?? null;
  return {
    config: cfg,
    projectile: nuclide('4He'),
    run,
    detector,
    peak,
    planned: plannedHere,
    key: peak.label,
    planner,
    measured: measuredPeak('12C elastic', 'd01', 503, NET),
    live: LIVE,
    normalization: NORM,
    calibrationVersion: 'cal-a',
    extraFlags: [],
    ...o,
  };
}

describe('crossSectionRow: a hand case (README, "Cross sections"; 2000 keV 4He on 12C at 150°)', () => {
  const row = crossSectionRow(rowInput());
  const nBeam = 30e-6 / E_CHARGE_C;
  const perCount = 1 / (nBeam * N12C * 2.45e-3 * 0.9) / 1e-27; // mb/sr per net count
  const lab = 5000 * perCount;
  const gamma = M1 / M2; // elastic: γ = M1/M2 (Marion & Young 1968)
  const thetaCm = 150 + Math.asin(gamma * Math.sin(150 * DEG)) / DEG;
  const cosCm = Math.cos(thetaCm * DEG);
  const jacobian = Math.abs(1 + gamma * cosCm) / (1 + gamma * gamma + 2 * gamma * cosCm) ** 1.5;
  const eCm = (2000 * M2) / (M1 + M2);
  const sigmaR = darwinLabMbPerSr(2, 6, M1, M2, 2000, 150) * lecuyerF(2, 6, eCm);

  it('dσ/dΩ_lab = N / (Q/e · n · ΔΩ · f) in mb/sr', () => {
    expect(row.crossSectionLabMbPerSr / lab).toBeCloseTo(1, 12);
    expect(row.netCounts).toBe(5000);
    expect(row.netCountsUnc).toBeCloseTo(Math.sqrt(5350), 12);
    expect(row.nuclideArealDensity1e15PerCm2).toBeCloseTo(148.395, 9);
    expect(row.solidAngleMsr).toBe(2.45);
    expect(row.liveFraction).toBe(0.9);
  });

  // The reduction uses exact relativistic kinematics; the classical forms below are its limit,
  // differing by O(T/mc²) = 2000/3727 × 1e-3 ≈ 5e-4 at 2 MeV (pipeline/core/physics tests the
  // exact forms). RELATIVISTIC bounds that difference.
  const RELATIVISTIC = 2000 / 3727e3;
  const near = (a: number, b: number) => expect(Math.abs(a / b - 1)).toBeLessThan(RELATIVISTIC);

  it('θ_cm = θ + asin(γ sin θ) and dσ/dΩ_cm = dσ/dΩ_lab · |1 + γ cos θ_cm| / (1 + γ² + 2γ cos θ_cm)^{3/2} (Marion & Young 1968), to O(T/mc²)', () => {
    near(row.angleCmDeg, thetaCm);
    near(row.jacobianLabPerCm, jacobian);
    expect(row.crossSectionCmMbPerSr / (lab * row.jacobianLabPerCm)).toBeCloseTo(1, 12);
  });

  it('the Jacobian equals σ_R,cm(θ_cm, E_cm) / σ_R,lab(θ, E): Rutherford (1911) against Darwin (1914), to O(T/mc²)', () => {
    const fromRutherford = rutherfordCm(2, 6, eCm, thetaCm) / darwinLabMbPerSr(2, 6, M1, M2, 2000, 150);
    near(row.jacobianLabPerCm, fromRutherford);
  });

  it('elastic peak energy K·E₀ with K from Chu, Mayer & Nicolet (1978), eq. 2.5, to O(T/mc²)', () => {
    const s = Math.sin(150 * DEG);
    const k = ((Math.sqrt(M2 * M2 - M1 * M1 * s * s) + M1 * Math.cos(150 * DEG)) / (M1 + M2)) ** 2;
    near(row.peakEnergyKeV, k * 2000);
    expect(row.qValueKeV).toBe(0);
  });

  it('σ/σ_R divides by the screened lab Rutherford cross section on 12C', () => {
    expect(row.rutherfordLabMbPerSr / sigmaR).toBeCloseTo(1, 9);
    expect(row.screeningFactor).toBeCloseTo(lecuyerF(2, 6, eCm), 12);
    expect(row.ratioToRutherford / (lab / sigmaR)).toBeCloseTo(1, 9);
  });

  it('stat = √(var N)·perCount (the uncorrelated counting and background), the same relative part in CM and in σ/σ_R (JCGM 100:2008 §5.1.6)', () => {
    const stat = Math.sqrt(5350) * perCount;
    expect(LIVE.unc).toBeCloseTo(Math.sqrt((0.9 * 0.1) / 20000), 15);
    expect(row.crossSectionLabStatMbPerSr / stat).toBeCloseTo(1, 12);
    expect(row.crossSectionCmStatMbPerSr / (stat * row.jacobianLabPerCm)).toBeCloseTo(1, 12);
    expect(row.ratioToRutherfordStat / (stat / sigmaR)).toBeCloseTo(1, 9);
  });

  it('sys = σ · [u_n ⊕ u(f)/f ⊕ (normalization counting ⊕ live ⊕ energy ⊕ reference areal) ⊕ ∂lnσ_ref/∂θ·u_θ] (JCGM 100:2008 §5.1.6)', () => {
    const normRel = Math.hypot(0.004, 0.001, 0.0025, 0.03);
    const sys = lab * Math.hypot(0.05, LIVE.unc / 0.9, normRel, dLnAuDTheta * 0.2);
    expect(row.crossSectionLabSysMbPerSr / sys).toBeCloseTo(1, 12);
    expect(row.crossSectionCmSysMbPerSr / (sys * row.jacobianLabPerCm)).toBeCloseTo(1, 12);
    expect(row.normalizationCountingRelUnc).toBeCloseTo(Math.hypot(0.004, 0.001), 15);
  });

  it('σ/σ_R sys: the angle through ∂ln(σ_ref/σ_R)/∂θ and the run energy through ∂lnσ_R/∂E (README, "Uncertainties"; JCGM 100:2008 §5.1.6)', () => {
    const ln = (e: number, t: number) => Math.log(darwinLabMbPerSr(2, 6, M1, M2, e, t) * lecuyerF(2, 6, (e * M2) / (M1 + M2)));
    const dLnCDTheta = (ln(2000, 150 + 1e-4) - ln(2000, 150 - 1e-4)) / 2e-4;
    const dLnCDE = (ln(2000.01, 150) - ln(1999.99, 150)) / 0.02;
    const normRel = Math.hypot(0.004, 0.001, 0.0025, 0.03);
    const ratio = lab / sigmaR;
    // screening: σ_R·F with the correction 1 − F scaled by 1 + δs, u(δs) = normalization.screening_unc_frac (default 0.1)
    const f = lecuyerF(2, 6, eCm);
    const sys = ratio * Math.hypot(0.05, LIVE.unc / 0.9, normRel, (dLnAuDTheta - dLnCDTheta) * 0.2, dLnCDE * 2, (0.1 * (1 - f)) / f);
    expect(row.ratioToRutherfordSys / sys).toBeCloseTo(1, 6);
  });

  it('identifiers and provenance columns (README, cross_sections.arrow columns)', () => {
    expect(row).toMatchObject({ run: 'r002', detector: 'd01', peak: '12C elastic', target: 'c-foil', targetNuclide: '12C', referenceRuns: 'r001+r004', calibrationVersion: 'cal-a', chargeUC: 30, beamEnergyUncKeV: 2, angleLabUncDeg: 0.2 });
    expect(row.flags).toEqual([]);
  });

  it('pure Coulomb scattering gives σ/σ_R = 1 (README: "so pure Coulomb scattering gives 1 with the screening chosen")', () => {
    const n = sigmaR * nBeam * N12C * 2.45e-3 * 0.9 * 1e-27;
    const r = crossSectionRow(rowInput({ measured: measuredPeak('12C elastic', 'd01', 503, { ...NET, net: n, netVariance: n }) }));
    expect(r.ratioToRutherford).toBeCloseTo(1, 9);
  });
});

describe('crossSectionRow: rows without a value', () => {
  const inelastic: PeakConfig = { label: '12C 4.44 MeV', target_nuclide: '12C', excitation_keV: 4439.8, method: 'window', detect: 'ejectile' };

  it('inelastic peak (12C, Ex = 4439.8 keV) at 10 MeV: dσ/dΩ is given, σ/σ_R is NaN (null in the table)', () => {
    const run = sample({ beamEnergyKeV: 10000 });
    const row = crossSectionRow(rowInput({ run, peak: inelastic }));
    expect(Number.isFinite(row.crossSectionLabMbPerSr)).toBe(true);
    expect(row.ratioToRutherford).toBeNaN();
    expect(row.ratioToRutherfordStat).toBeNaN();
    expect(row.ratioToRutherfordSys).toBeNaN();
    expect(row.rutherfordLabMbPerSr).toBeNaN();
    expect(row.qValueKeV).toBeCloseTo(-4439.8, 6);
    // Q-equation (Marion & Young 1968): √E_b = [√(m_a m_b E) cos θ + √(m_a m_b E cos²θ + (m_B + m_b)(m_B Q + (m_B − m_a) E))]/(m_B + m_b)
    const c = Math.cos(150 * DEG);
    const q = -4439.8;
    const sq = (Math.sqrt(M1 * M1 * 10000) * c + Math.sqrt(M1 * M1 * 10000 * c * c + (M2 + M1) * (M2 * q + (M2 - M1) * 10000))) / (M2 + M1);
    // Classical limit of the exact relativistic kinematics used: within O(T/mc²) = 10000/3727e3.
    const within = (a: number, b: number) => expect(Math.abs(a / b - 1)).toBeLessThan(10000 / 3727e3);
    within(row.peakEnergyKeV, sq * sq);
    // γ = V_cm / v'_cm from momentum and energy conservation: γ² = m_a m_b E / (m_B (m_A E + (m_a + m_A) Q))
    const gamma = Math.sqrt((M1 * M1 * 10000) / (M2 * (M2 * 10000 + (M1 + M2) * q)));
    const thetaCm = 150 + Math.asin(gamma * Math.sin(150 * DEG)) / DEG;
    within(row.angleCmDeg, thetaCm);
    const cosCm = Math.cos(thetaCm * DEG);
    within(row.jacobianLabPerCm, Math.abs(1 + gamma * cosCm) / (1 + gamma * gamma + 2 * gamma * cosCm) ** 1.5);
  });

  it('the same inelastic peak at 2000 keV is below threshold ((M1 + M2)/M2 · Ex ≈ 5920 keV): kinematically-forbidden, no CM values', () => {
    const row = crossSectionRow(rowInput({ peak: inelastic, measured: null }));
    expect(row.flags).toEqual(['kinematically-forbidden']);
    expect(row.angleCmDeg).toBeNaN();
    expect(row.crossSectionLabMbPerSr).toBeNaN();
    expect(row.crossSectionCmMbPerSr).toBeNaN();
  });

  it('no normalization: values NaN, flag no-normalization', () => {
    const row = crossSectionRow(rowInput({ normalization: null }));
    expect(row.crossSectionLabMbPerSr).toBeNaN();
    expect(row.ratioToRutherford).toBeNaN();
    expect(row.solidAngleMsr).toBeNaN();
    expect(row.referenceRuns).toBe('');
    expect(row.flags).toEqual(['no-normalization']);
    expect(Number.isFinite(row.netCounts)).toBe(true);
  });

  it('net counts ≤ 0 are kept (an upper-limit input) and flagged net-not-positive', () => {
    const row = crossSectionRow(rowInput({ measured: measuredPeak('12C elastic', 'd01', 503, { ...NET, gross: 180, net: -20, netVariance: 330 }) }));
    expect(row.flags).toEqual(['net-not-positive']);
    expect(row.crossSectionLabMbPerSr).toBeLessThan(0);
    expect(row.crossSectionLabSysMbPerSr).toBeGreaterThan(0);
  });

  it('flags from the window, the normalization and the caller are merged, de-duplicated and sorted (README, "Flags")', () => {
    const row = crossSectionRow(rowInput({ normalization: stubNormalization(['reference-one-sided']), extraFlags: ['no-live-time', 'reference-one-sided'] }));
    expect(row.flags).toEqual(['no-live-time', 'reference-one-sided']);
  });
});

describe('interferenceFlags: another expected peak inside a window (±1 FWHM reaches it; lines under 1 % of the peak\'s strength ignored; common practice)', () => {
  // peak at 500 keV, FWHM 15: peak window 477.5–522.5, background 447.5–470 and 530–552.5 keV
  const window: PeakWindow = planPeakWindow(CAL, 1024, 500, 15, WIDTHS);
  const OWN = 1000;
  const line = (name: string, energyKeV: number, strength = OWN): KnownLine => ({ name, energyKeV, strength });
  const flags = (lines: KnownLine[]) => interferenceFlags(window, 'own', OWN, lines);

  it('window edges are as the settings say', () => {
    expect(window.peakKeV).toEqual([477.5, 522.5]);
    expect(window.leftKeV).toEqual([447.5, 470]);
    expect(window.rightKeV).toEqual([530, 552.5]);
  });

  it('a line inside the peak window: overlap-in-peak', () => {
    expect(flags([line('13C elastic', 510)])).toEqual(['overlap-in-peak:13C elastic']);
  });

  it('a line just outside the peak window but within 1 FWHM of it still counts as in the peak', () => {
    expect(flags([line('x', 522.5 + 14.9)])).toEqual(['overlap-in-peak:x']);
  });

  it('a line in a background window only: overlap-in-background', () => {
    expect(flags([line('low', 455)])).toEqual(['overlap-in-background:low']);
    expect(flags([line('high', 560)])).toEqual(['overlap-in-background:high']);
  });

  it('lines far away, the peak itself, a line at the same energy and a forbidden line (NaN) give nothing', () => {
    expect(flags([line('far', 700), line('below', 400), line('own', 505), line('alias', 500), line('forbidden', Number.NaN)])).toEqual([]);
  });

  it('a line expected weaker than 1 % of the peak is ignored; 1 % and an unknown (infinite) strength are flagged', () => {
    expect(flags([line('weak', 510, 9.99)])).toEqual([]);
    expect(flags([line('one-percent', 510, 10)])).toEqual(['overlap-in-peak:one-percent']);
    expect(flags([line('configured', 510, Number.POSITIVE_INFINITY)])).toEqual(['overlap-in-peak:configured']);
  });

  it('several lines: one flag each, in the order given', () => {
    expect(flags([line('a', 490), line('b', 545)])).toEqual(['overlap-in-peak:a', 'overlap-in-background:b']);
  });
});

describe('extract: which rows are made (README, "peaks": a peak gives rows for every sample run whose target contains its nuclide)', () => {
  const targets = [
    { id: 'au-ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
    { id: 'c-foil', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }] },
    { id: 'co-foil', layers: [{ composition: { C: 1, O: 1 }, areal_density_1e15_per_cm2: 100, areal_density_unc_rel: 0.05 }] },
  ];
  const peaks = [
    { label: '12C elastic', target_nuclide: '12C' },
    { label: '16O elastic', target_nuclide: '16O' },
  ];
  const cfg = config(targets, peaks);
  const runs = [sample({ run: 'r002', target: 'c-foil' }), sample({ run: 'r003', target: 'co-foil' })];
  const energies: Record<string, number> = { '12C elastic': 503.2, '16O elastic': 745.3 };
  const measured = new Map(
    runs.map((r) => [
      r.run,
      new Map(cfg.detectors.flatMap((d) => peaks.map((p) => [measuredKey(d.id, p.label), measuredPeak(p.label, d.id, energies[p.label]!, NET)] as const))),
    ]),
  );
  const input = (o: Partial<ExtractInput> = {}): ExtractInput => ({
    config: cfg,
    sampleRuns: runs,
    measured,
    live: new Map(runs.map((r) => [r.run, new Map(cfg.detectors.map((d) => [d.id, LIVE]))])),
    normalization: new Map(runs.map((r) => [r.run, new Map(cfg.detectors.map((d) => [d.id, NORM]))])),
    calibrationVersion: new Map(runs.map((r) => [r.run, 'cal-a'])),
    planProblems: new Map(),
    ...o,
  });

  it('a peak whose nuclide is absent from the run\'s target gives no row', () => {
    const out = extract(input());
    const keys = out.rows.map((r) => `${r.run} ${r.detector} ${r.peak}`);
    expect(keys).toEqual(['r002 d01 12C elastic', 'r002 d02 12C elastic', 'r003 d01 12C elastic', 'r003 d01 16O elastic', 'r003 d02 12C elastic', 'r003 d02 16O elastic']);
    expect(out.diagnostics).toEqual([]);
  });

  it('the atom fraction and abundance give the nuclide areal density (C:O = 1:1, 100e15/cm²; IUPAC 2013 12C 0.9893, 16O 0.99757)', () => {
    const out = extract(input());
    const r3 = out.rows.filter((r) => r.run === 'r003' && r.detector === 'd01');
    expect(r3[0]!.nuclideArealDensity1e15PerCm2).toBeCloseTo(50 * 0.9893, 9);
    expect(r3[1]!.nuclideArealDensity1e15PerCm2).toBeCloseTo(50 * 0.99757, 9);
    expect(out.rows[0]!.nuclideArealDensity1e15PerCm2).toBeCloseTo(150 * 0.9893, 9);
  });

  it('no live fraction known: flag no-live-time, f = 1', () => {
    const out = extract(input({ live: new Map() }));
    expect(out.rows.every((r) => r.flags.includes('no-live-time') && r.liveFraction === 1)).toBe(true);
  });

  it('a significant centroid shift beyond shift_tolerance_fwhm × FWHM (0.5 × 15 keV): flag peak-shifted', () => {
    const shifted = new Map(measured);
    shifted.set('r002', new Map([[measuredKey('d01', '12C elastic'), measuredPeak('12C elastic', 'd01', 503.2, NET, 9)], [measuredKey('d02', '12C elastic'), measuredPeak('12C elastic', 'd02', 503.2, NET, 7)]]));
    const out = extract(input({ measured: shifted }));
    const r2 = out.rows.filter((r) => r.run === 'r002');
    expect(r2.map((r) => r.flags.includes('peak-shifted'))).toEqual([true, false]);
  });

  it('a planning problem becomes a warning and the row carries no value', () => {
    const problems = new Map([['r002', new Map([[measuredKey('d01', '12C elastic'), 'kinematically forbidden (test)']])]]);
    const m = new Map(measured);
    m.set('r002', new Map([[measuredKey('d02', '12C elastic'), measuredPeak('12C elastic', 'd02', 503.2, NET)]]));
    const out = extract(input({ measured: m, planProblems: problems }));
    expect(out.diagnostics).toHaveLength(1);
    expect(out.diagnostics[0]).toMatchObject({ severity: 'warning', rule: 'peak-kinematics', run: 'r002', detector: 'd01', stage: 'extract' });
    const row = out.rows.find((r) => r.run === 'r002' && r.detector === 'd01')!;
    expect(row.crossSectionLabMbPerSr).toBeNaN();
  });

  it('the same planning problem in several run × detector combinations is one warning per peak, counting the others', () => {
    const problems = new Map([['r002', new Map([[measuredKey('d01', '12C elastic'), 'kinematically forbidden (test)'], [measuredKey('d02', '12C elastic'), 'kinematically forbidden (test)']])]]);
    const m = new Map(measured);
    m.set('r002', new Map());
    const out = extract(input({ measured: m, planProblems: problems }));
    expect(out.diagnostics).toHaveLength(1);
    expect(out.diagnostics[0]).toMatchObject({ rule: 'peak-kinematics', run: 'r002', detector: 'd01' });
    expect(out.diagnostics[0]!.message).toContain('1 more run × detector combination');
    expect(out.rows.filter((r) => r.run === 'r002').every((r) => Number.isNaN(r.crossSectionLabMbPerSr))).toBe(true);
  });

  it('natural carbon at 30°: the 13C elastic peak (1.08 % of 12C in n·Z²) lies in the 12C window; pure 12C has no such flag', () => {
    // K(12C, 30°) = 0.9139, K(13C, 30°) = 0.9204 (Chu, Mayer & Nicolet 1978, eq. 2.5): 13 keV apart at 2 MeV
    const forward = (composition: object) =>
      seriesSchema.parse({
        series: 'extract-forward',
        beam: { projectile: '4He', charge_state: 1 },
        detectors: [{ id: 'd30', angle_deg: 30, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 }],
        targets: [
          { id: 'au-ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 60 }] },
          { id: 'c-foil', layers: [{ composition, areal_density_1e15_per_cm2: 150 }] },
        ],
        peaks: [{ label: '12C elastic', target_nuclide: '12C' }],
        normalization: { reference_target: 'au-ref' },
      });
    const run = sample({ run: 'r010' });
    const rowFor = (cfg: SeriesConfig) =>
      extract({
        config: cfg,
        sampleRuns: [run],
        measured: new Map([['r010', new Map([[measuredKey('d30', '12C elastic'), measuredPeak('12C elastic', 'd30', 1827.8, NET)]])]]),
        live: new Map([['r010', new Map([['d30', LIVE]])]]),
        normalization: new Map([['r010', new Map([['d30', NORM]])]]),
        calibrationVersion: new Map([['r010', 'cal-a']]),
        planProblems: new Map(),
      }).rows[0]!;
    expect(rowFor(forward({ C: 1 })).flags).toEqual(['overlap-in-peak:13C elastic']);
    expect(rowFor(forward({ '12C': 1 })).flags).toEqual([]);
  });

  it('no sample runs: no rows', () => {
    expect(extract(input({ sampleRuns: [] })).rows).toEqual([]);
  });
});
