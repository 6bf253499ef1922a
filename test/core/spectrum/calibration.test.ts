import { describe, expect, it } from 'vitest';
import { fitCalibration, toEnergyCalibration, type CalibrationPoint } from '../../../pipeline/core/spectrum/fit-calibration.js';
import { assignLines } from '../../../pipeline/core/spectrum/assign-lines.js';
import { alphaSourceLines } from '../../../pipeline/core/spectrum/alpha-source-lines.js';
import { mergeUnresolvedLines, type ReferenceLine } from '../../../pipeline/core/spectrum/merge-unresolved-lines.js';
import { searchPeaks } from '../../../pipeline/core/spectrum/peak-search.js';
import { multipletSpec } from '../../../pipeline/core/fitting/multiplet-spec.js';
import { fitPeaks } from '../../../pipeline/core/fitting/fit-peaks.js';
import { spectrumModel } from '../../../pipeline/core/fitting/spectrum-model.js';
import { parameterTie } from '../../../pipeline/core/fitting/linear-tie.js';
import { channelToEnergyKeV, energyToChannel } from '../../../pipeline/core/calibration/energy-calibration.js';
import { Xoshiro128StarStar, type UniformSource } from '../../../pipeline/core/random/xoshiro128-star-star.js';
import { samplePoisson } from '../../../pipeline/core/random/sample-poisson.js';

// Box–Muller normal deviates: G.E.P. Box, M.E. Muller, Ann. Math. Statist. 29, 610 (1958).
const normal = (rng: UniformSource) => Math.sqrt(-2 * Math.log(1 - rng.nextFloat64())) * Math.cos(2 * Math.PI * rng.nextFloat64());

/** (θ̂ − θ)ᵀ C⁻¹ (θ̂ − θ) for a 2×2 or 3×3 covariance (Cramer's rule on small matrices). */
function mahalanobis(d: number[], c: number[][]): number {
  const n = d.length;
  const m = c.map((r) => [...r]);
  const inv = m.map((_, i) => m.map((__, j) => (i === j ? 1 : 0)));
  for (let i = 0; i < n; i++) {
    const p = m[i]![i]!;
    for (let j = 0; j < n; j++) { m[i]![j]! /= p; inv[i]![j]! /= p; }
    for (let k = 0; k < n; k++) {
      if (k === i) continue;
      const f = m[k]![i]!;
      for (let j = 0; j < n; j++) { m[k]![j]! -= f * m[i]![j]!; inv[k]![j]! -= f * inv[i]![j]!; }
    }
  }
  let s = 0;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) s += d[i]! * inv[i]![j]! * d[j]!;
  return s;
}

describe('calibration fit (Orear 1982 effective variance)', () => {
  for (const degree of [1, 2] as const) {
    it(`reproduces a simulated degree-${degree} calibration within its covariance: mean χ² of the coefficients ≈ ${degree + 1} over 2000 trials (χ² distribution, ${degree + 1} dof)`, () => {
      const truth = [12.5, 2.6, degree === 2 ? 2e-5 : 0];
      const lines = alphaSourceLines(['148Gd', '239Pu', '241Am', '244Cm']);
      const rng = Xoshiro128StarStar.fromSeed(77, degree);
      const chi2: number[] = [];
      for (let t = 0; t < 2000; t++) {
        const points: CalibrationPoint[] = lines.map((l) => {
          const eTrue = l.energyKeV + l.energyUncKeV * normal(rng);
          // channel of the true energy under the true calibration, then its measurement noise
          const ch = energyToChannel({ version: 't', offsetKeV: truth[0]!, gainKeVPerChannel: truth[1]!, quadraticKeVPerChannel2: truth[2]!, covariance: [] }, eTrue);
          const chUnc = 0.15;
          return { channel: ch + chUnc * normal(rng), channelUnc: chUnc, energyKeV: l.energyKeV, energyUncKeV: l.energyUncKeV };
        });
        const fit = fitCalibration(points, degree);
        const est = [fit.offsetKeV, fit.gainKeVPerChannel, fit.quadraticKeVPerChannel2].slice(0, degree + 1);
        chi2.push(mahalanobis(est.map((v, i) => v - truth[i]!), fit.covariance));
      }
      const k = degree + 1;
      const m = chi2.reduce((s, x) => s + x, 0) / chi2.length;
      // Var χ²_k = 2k: the mean over 2000 trials has standard error √(2k/2000).
      expect(Math.abs(m - k)).toBeLessThan(3 * Math.sqrt((2 * k) / 2000));
    });
  }

  it('gives the EnergyCalibration shape (E at channel centres, covariance order [offset, gain]) and refuses too few points', () => {
    const pts: CalibrationPoint[] = [0, 1, 2].map((i) => ({ channel: 100 * (i + 1), channelUnc: 0, energyKeV: 10 + 2 * 100 * (i + 1), energyUncKeV: 0.5 }));
    const cal = toEnergyCalibration(fitCalibration(pts, 1), 'cal-test');
    expect(cal.offsetKeV).toBeCloseTo(10, 9);
    expect(cal.gainKeVPerChannel).toBeCloseTo(2, 12);
    expect(channelToEnergyKeV(cal, 150)).toBeCloseTo(310, 9);
    expect(cal.covariance.length).toBe(2);
    // Straight-line covariance for equal weights σ² = 0.25: var b = σ²/Σ(x − x̄)² (common practice).
    expect(cal.covariance[1]![1]).toBeCloseTo(0.25 / 20000, 15);
    expect(() => fitCalibration(pts.slice(0, 2), 2)).toThrow(RangeError);
  });
});

describe('line assignment', () => {
  it('refuses an ambiguous pattern: three peaks, four equally spaced lines (two assignments fit exactly)', () => {
    const lines: ReferenceLine[] = [1000, 2000, 3000, 4000].map((e) => ({ label: `${e}`, nuclide: 'x', energyKeV: e, energyUncKeV: 0.1, intensityPercent: 100, members: [] }));
    const r = assignLines([{ centroidChannel: 100 }, { centroidChannel: 200 }, { centroidChannel: 300 }], lines, { toleranceKeV: 5 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.reason).toMatch(/two assignments match 3 lines/);
      expect(r.diagnostic.rule).toBe('calibration-assignment-ambiguous');
    }
    const two = assignLines([{ centroidChannel: 100 }, { centroidChannel: 200 }], lines, { toleranceKeV: 5 });
    expect(two.ok).toBe(false);
    // With the gain known to lie in 9.5…10.5 keV/channel and the offset in 900…1100 keV, only one remains.
    const known = assignLines([{ centroidChannel: 10 }, { centroidChannel: 110 }, { centroidChannel: 210 }], lines, { toleranceKeV: 5, gainRangeKeVPerChannel: [9.5, 10.5], offsetRangeKeV: [800, 1000] });
    expect(known.ok).toBe(true);
  });

  it('calibrates a simulated mixed 239Pu/241Am/244Cm spectrum end to end: search, assignment, tailed-peak fits, calibration within its covariance', () => {
    // Truth: E = 35 + 2.9·ch keV, FWHM 18 keV, tail fraction 0.4 and length 12 keV (Bortels & Collaers form).
    const offset = 35;
    const gain = 2.9;
    const fwhmKeV = 18;
    const sigmaCh = fwhmKeV / gain / (2 * Math.sqrt(2 * Math.LN2));
    const tauCh = 12 / gain;
    const lines = alphaSourceLines(['239Pu', '241Am', '244Cm']);
    const activity: Record<string, number> = { '239Pu': 4e4, '241Am': 3e4, '244Cm': 2e4 };
    const n = 2048;
    const names = ['A', 'c', 's', 'eta', 'tau'];
    const mu = new Float64Array(n).fill(0.5);
    for (const l of lines) {
      const one = new Float64Array(n);
      const spec = { firstChannel: 0, channelCount: n, parameters: names.map((name) => ({ name, start: 0 })), peaks: [{ label: 'x', area: 0, centroid: parameterTie(1), sigma: parameterTie(2), tail: { fraction: parameterTie(3), length: parameterTie(4) } }] };
      spectrumModel(spec).evaluate(Float64Array.from([activity[l.nuclide]! * l.intensityPercent / 100, (l.energyKeV - offset) / gain, sigmaCh, 0.4, tauCh]), one, new Float64Array(n * 5));
      for (let i = 0; i < n; i++) mu[i] += one[i]!;
    }
    const rng = Xoshiro128StarStar.fromSeed(2026);
    const counts = mu.map((m) => samplePoisson(rng, m));
    const found = searchPeaks(counts, { fwhmChannels: fwhmKeV / gain });
    const ref = mergeUnresolvedLines(lines, fwhmKeV);
    const assignment = assignLines(found, ref, { toleranceKeV: 10, gainRangeKeVPerChannel: [2, 4] });
    expect(assignment.ok).toBe(true);
    if (!assignment.ok) return;
    expect(assignment.pairs.length).toBeGreaterThanOrEqual(4);
    // Fit each nuclide's lines as one multiplet: positions tied by the line energies (c_i = c₀ + g·(E_i − E₀)),
    // shared width and tail; the strongest line's centroid is that nuclide's calibration point.
    const points: CalibrationPoint[] = [];
    const cal0 = { offset: assignment.offsetKeV, gain: assignment.gainKeVPerChannel };
    for (const nuc of ['239Pu', '241Am', '244Cm']) {
      const members = alphaSourceLines([nuc]).sort((a, b) => b.intensityPercent - a.intensityPercent);
      const toCh = (e: number) => (e - cal0.offset) / cal0.gain;
      const sigma0 = fwhmKeV / cal0.gain / (2 * Math.sqrt(2 * Math.LN2));
      const lo = Math.round(toCh(Math.min(...members.map((m) => m.energyKeV)) - 4 * fwhmKeV));
      const hi = Math.round(toCh(Math.max(...members.map((m) => m.energyKeV)) + 3 * fwhmKeV));
      const spec = multipletSpec(counts, {
        firstChannel: lo, channelCount: hi - lo + 1, sigmaChannels: sigma0, positions: 'tied', channelsPerKeV: 1 / cal0.gain,
        lines: members.map((m) => ({ label: `${nuc} ${m.energyKeV}`, expectedChannel: toCh(m.energyKeV), energyKeV: m.energyKeV })),
        tail: { mode: 'shared', fraction: 0.3, lengthChannels: 10 / cal0.gain }, background: 'constant',
      });
      const fit = fitPeaks(counts, spec);
      expect(fit.converged).toBe(true);
      expect(fit.diagnostics.filter((d) => d.severity === 'warning')).toEqual([]);
      const pk = fit.peaks[0]!;
      points.push({ label: nuc, channel: pk.centroidChannel, channelUnc: pk.centroidUncChannel, energyKeV: members[0]!.energyKeV, energyUncKeV: members[0]!.energyUncKeV });
    }
    expect(points.length).toBeGreaterThanOrEqual(3);
    const cal = fitCalibration(points, 1);
    // χ² of the coefficients against the truth, 2 dof: below 13.8 (P = 0.001).
    expect(mahalanobis([cal.offsetKeV - offset, cal.gainKeVPerChannel - gain], cal.covariance)).toBeLessThan(13.8);
  });
});
