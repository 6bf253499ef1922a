import { describe, expect, it } from 'vitest';
import { addBackgroundOverChannels } from '../../pipeline/simulate/add-background-over-channels.js';

describe('addBackgroundOverChannels', () => {
  const model = { flatPerKeVPerUC: 0.02, exponentialPerKeVPerUC: 1.5, exponentialDecayKeV: 160 };

  it('integrates b(E) = flat + A exp(−E/λ) over each channel (checked against the midpoint rule on a fine grid)', () => {
    const out = new Float64Array(256);
    addBackgroundOverChannels(out, model, 30, 22.4, 3.612);
    for (const ch of [0, 1, 10, 100, 255]) {
      const lo = 22.4 + 3.612 * (ch - 0.5);
      let integral = 0;
      const steps = 10000;
      const h = 3.612 / steps;
      for (let i = 0; i < steps; i++) {
        const e = lo + (i + 0.5) * h;
        integral += (0.02 + 1.5 * Math.exp(-e / 160)) * h;
      }
      expect(out[ch]! / (30 * integral)).toBeCloseTo(1, 8);
    }
  });

  it('puts nothing below 0 keV (a negative offset leaves the lowest channels empty)', () => {
    const out = new Float64Array(32);
    addBackgroundOverChannels(out, model, 1, -20, 4);
    expect(out[0]).toBe(0);
    expect(out[4]).toBe(0);
    expect(out[5]!).toBeGreaterThan(0);
  });

  it('leaves the spectrum alone for a zero background', () => {
    const out = new Float64Array(8).fill(3);
    addBackgroundOverChannels(out, { flatPerKeVPerUC: 0, exponentialPerKeVPerUC: 0, exponentialDecayKeV: 100 }, 10, 0, 1);
    expect([...out]).toEqual(new Array(8).fill(3));
  });
});
