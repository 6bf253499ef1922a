import { describe, expect, it } from 'vitest';
import { fitGroup } from '../../../pipeline/engine/fit/fit-group.js';
import type { FitSettings } from '../../../pipeline/engine/fit/fit-plan.js';
import { attachFitCurves } from '../../../stages/report/spectra/fit-curves.js';
import type { FitResidualRow } from '../../../stages/report/fits-columns.js';
import type { ReportSpectrum } from '../../../stages/report/index.js';

// Curves drawn over the page's spectra: the fitted model and its background, binned as the counts are
// (rebinning sums whole channels and conserves counts — common practice).

const spectrum = (run: string, detector: string, w: number): ReportSpectrum => ({ run, detector, channelCount: 64, binWidthChannels: w, counts: new Float64Array(Math.ceil(64 / w)) });
const row = (run: string, detector: string, group: string, channel: number, model: number, background?: number): FitResidualRow => ({
  run, detector, group, channel, energyKeV: channel, observed: model, model, residual: 0, ...(background === undefined ? {} : { background }),
});

describe('attachFitCurves: fit_residuals rows as curves over the embedded spectra', () => {
  it('bins a region of channels 10–17 into bins of 4 channels: means per channel at bin centres, whole bins sum to the channel total (common practice)', () => {
    const model = [1, 3, 10, 20, 30, 40, 5, 7];
    const rows = model.map((m, i) => row('r1', 'd1', 'carbon', 10 + i, m, 2));
    const [s] = attachFitCurves([spectrum('r1', 'd1', 4)], rows);
    const fit = s!.curves!.find((c) => c.role === 'model')!;
    expect(fit.label).toBe('fit: carbon');
    expect(Array.from(fit.channel)).toEqual([9.5, 13.5, 17.5]); // bins 2, 3, 4: b·4 + 1.5
    expect(Array.from(fit.countsPerChannel)).toEqual([(1 + 3) / 2, (10 + 20 + 30 + 40) / 4, (5 + 7) / 2]);
    expect(fit.countsPerChannel[1]! * 4).toBe(10 + 20 + 30 + 40); // a whole bin: the summed model, as the counts
    const bg = s!.curves!.find((c) => c.role === 'background')!;
    expect(bg.label).toBe('background: carbon');
    expect(Array.from(bg.countsPerChannel)).toEqual([2, 2, 2]);
  });

  it('with one channel a bin, the curve is the model channel by channel; two groups give two model curves', () => {
    const rows = [row('r1', 'd1', 'a', 5, 4, 1), row('r1', 'd1', 'a', 6, 9, 1), row('r1', 'd1', 'b', 30, 7, 1)];
    const [s] = attachFitCurves([spectrum('r1', 'd1', 1)], rows);
    const models = s!.curves!.filter((c) => c.role === 'model');
    expect(models.map((c) => c.label)).toEqual(['fit: a', 'fit: b']);
    expect(Array.from(models[0]!.channel)).toEqual([5, 6]);
    expect(Array.from(models[0]!.countsPerChannel)).toEqual([4, 9]);
  });

  it('leaves spectra without a fit region unchanged, and draws no background where it is not known (older cached results)', () => {
    const plain = spectrum('r2', 'd1', 2);
    const out = attachFitCurves([plain, spectrum('r1', 'd2', 2)], [row('r1', 'd2', 'a', 3, 5), row('r9', 'd1', 'a', 3, 5, 1)]);
    expect(out[0]).toBe(plain);
    expect(out[1]!.curves!.map((c) => c.role)).toEqual(['model']);
    expect(attachFitCurves([plain], [])).toEqual([plain]);
  });
});

describe('fitGroup keeps the background per channel (model with the areas set to zero)', () => {
  // A noiseless Gaussian of area 20000 counts (σ = 3 channels) on a flat 50 counts/channel: the fitted
  // linear background must come back as 50 per channel, and model − background summed over the region
  // must be the peak's area inside the region (the Gaussian's integral over ±4.7σ is 0.999997 of it).
  // Values of the construction itself (common practice for fit checks).
  it('returns the flat background of a constructed spectrum and model − background = the peak', () => {
    const n = 128;
    const c0 = 64;
    const sigma = 3;
    const area = 20000;
    const counts = new Float64Array(n);
    const phi = (x: number) => 0.5 * (1 + erf(x / Math.SQRT2));
    for (let ch = 0; ch < n; ch++) counts[ch] = 50 + area * (phi((ch + 0.5 - c0) / sigma) - phi((ch - 0.5 - c0) / sigma));
    const cal = { version: 't', offsetKeV: 0, gainKeVPerChannel: 1, quadraticKeVPerChannel2: 0, covariance: [[0, 0], [0, 0]] };
    const fwhm = 2 * Math.sqrt(2 * Math.LN2) * sigma;
    const settings: FitSettings = { regionFwhm: 2, background: 'linear', step: 'none', positions: 'tied', widths: 'shared', tail: 'none', tailFraction: 0.1, tailLengthFwhm: 1, flagProbability: 0.001 };
    const r = fitGroup(counts, cal, [{ key: 'p', detector: 'd1', expectedEnergyKeV: c0, fwhmKeV: fwhm }], { groupKey: 'p', detector: 'd1', requestIndices: [0] }, settings);
    expect(r.problem).toBe('');
    expect(r.background!.length).toBe(r.channelCount);
    for (const b of r.background!) expect(b).toBeCloseTo(50, 1);
    let peak = 0;
    for (let i = 0; i < r.channelCount; i++) peak += r.model[i]! - r.background![i]!;
    const inside = area * (phi((r.firstChannel + r.channelCount - 0.5 - c0) / sigma) - phi((r.firstChannel - 0.5 - c0) / sigma));
    expect(peak).toBeCloseTo(inside, 0);
    expect(structuredClone(r).background).toEqual(r.background); // crosses a worker boundary intact
  });
});

/** erf by Abramowitz & Stegun 7.1.26 (|error| < 1.5e-7), enough for counts of 10⁴. */
function erf(x: number): number {
  const t = 1 / (1 + 0.3275911 * Math.abs(x));
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x);
  return x >= 0 ? y : -y;
}
