import { describe, expect, it } from 'vitest';
import { netCounts } from '../../../pipeline/core/counting/net-counts.js';
import { measureWindowSums } from '../../../pipeline/core/counting/window-sums.js';
import { liveFraction } from '../../../pipeline/core/counting/live-fraction.js';

describe('netCounts (linear background from two side windows)', () => {
  it('recovers a peak on an exactly linear background (hand computation, common practice)', () => {
    // background b(ch) = 10 + 0.5 ch over channels 0..59, a peak of 1000 counts in 28..32
    const counts = new Float64Array(60).map((_, ch) => 10 + 0.5 * ch);
    for (let ch = 28; ch <= 32; ch++) counts[ch]! += 200;
    const peak = { lo: 25, hi: 35 };
    const left = { lo: 10, hi: 19 };
    const right = { lo: 40, hi: 49 };
    const n = netCounts(measureWindowSums(counts, peak, left, right), peak, left, right);
    // background under 25..35: Σ(10 + 0.5ch) = 11·10 + 0.5·Σch(25..35) = 110 + 0.5·330 = 275
    expect(n.background).toBeCloseTo(275, 10);
    expect(n.net).toBeCloseTo(1000, 10);
    // centroid of the net peak is channel 30
    expect(n.centroidChannel).toBeCloseTo(30, 10);
    // var B = α² S_L + β² S_R, with t = (30 − 14.5)/(44.5 − 14.5), α = 1.1(1 − t), β = 1.1 t
    const t = (30 - 14.5) / 30;
    const sL = 10 * 10 + 0.5 * 145;
    const sR = 10 * 10 + 0.5 * 445;
    const varB = (1.1 * (1 - t)) ** 2 * sL + (1.1 * t) ** 2 * sR;
    expect(n.backgroundVariance).toBeCloseTo(varB, 10);
    expect(n.netVariance).toBeCloseTo(n.gross + varB, 10);
  });
  it('one side window only: flat background at that window mean', () => {
    const counts = new Float64Array(20).fill(4);
    const n = netCounts(measureWindowSums(counts, { lo: 5, hi: 9 }, { lo: 0, hi: 3 }, null), { lo: 5, hi: 9 }, { lo: 0, hi: 3 }, null);
    expect(n.background).toBe(20);
    expect(n.net).toBe(0);
    expect(Number.isNaN(n.centroidChannel)).toBe(true);
  });
});

describe('liveFraction', () => {
  it('pulser: binomial uncertainty sqrt(f(1−f)/N) (binomial variance, common practice)', () => {
    const f = liveFraction({ mode: 'pulser', pulserSent: 10000, pulserCounted: 9000, line: 2 }, 100);
    expect(f.value).toBeCloseTo(0.9, 12);
    expect(f.unc).toBeCloseTo(Math.sqrt((0.9 * 0.1) / 10000), 12);
  });
  it('live-time clock: ratio, no uncertainty; no scaler: 1', () => {
    expect(liveFraction({ mode: 'live-time', liveTimeS: 95, line: 2 }, 100)).toEqual({ value: 0.95, unc: 0, source: 'live-time' });
    expect(liveFraction(undefined, 100).value).toBe(1);
  });
});
