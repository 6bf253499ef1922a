import { describe, expect, it } from 'vitest';
import { addGaussianOverChannels, FWHM_PER_SIGMA } from '../../pipeline/simulate/add-gaussian-over-channels.js';

/** Composite Simpson integral of the normal density with centre mu and width sigma over [a, b]. */
function simpsonGaussian(a: number, b: number, mu: number, sigma: number, steps = 2000): number {
  const f = (x: number) => Math.exp(-0.5 * ((x - mu) / sigma) ** 2) / (sigma * Math.sqrt(2 * Math.PI));
  const h = (b - a) / steps;
  let s = f(a) + f(b);
  for (let i = 1; i < steps; i++) s += (i % 2 === 1 ? 4 : 2) * f(a + i * h);
  return (s * h) / 3;
}

describe('addGaussianOverChannels', () => {
  it('uses FWHM = 2√(2 ln 2) σ = 2.3548200450 σ (common practice)', () => {
    expect(FWHM_PER_SIGMA).toBeCloseTo(2.354820045, 9);
  });

  it('puts the whole yield into the spectrum for a peak well inside it (the normal density integrates to 1)', () => {
    const out = new Float64Array(1024);
    addGaussianOverChannels(out, 12345.6, 1500, 16, 22.4, 3.612);
    const sum = out.reduce((s, v) => s + v, 0);
    expect(Math.abs(sum - 12345.6) / 12345.6).toBeLessThan(1e-12);
  });

  it('keeps exactly half of a peak centred on the upper edge of the last channel (symmetry of the normal)', () => {
    const offset = 10;
    const gain = 2;
    const n = 512;
    const edgeKeV = offset + gain * (n - 0.5);
    const out = new Float64Array(n);
    addGaussianOverChannels(out, 1000, edgeKeV, 20, offset, gain);
    expect(out.reduce((s, v) => s + v, 0)).toBeCloseTo(500, 9);
  });

  it('gives each channel the integral over its own energy interval (checked against Simpson integration)', () => {
    const offset = 5;
    const gain = 3.5;
    const fwhm = 15;
    const centre = 700.3;
    const sigma = fwhm / FWHM_PER_SIGMA;
    const out = new Float64Array(400);
    addGaussianOverChannels(out, 1, centre, fwhm, offset, gain);
    for (let ch = 190; ch <= 205; ch++) {
      const lo = offset + gain * (ch - 0.5);
      const expected = simpsonGaussian(lo, lo + gain, centre, sigma);
      expect(Math.abs(out[ch]! - expected)).toBeLessThan(1e-12);
    }
  });

  it('reproduces the centroid and Sheppard\'s binned variance σ² + h²/12 (W.F. Sheppard, Proc. London Math. Soc. 29, 353 (1898))', () => {
    const offset = 0;
    const gain = 4;
    const fwhm = 18;
    const centre = 2001.7;
    const sigma = fwhm / FWHM_PER_SIGMA;
    const out = new Float64Array(1024);
    addGaussianOverChannels(out, 1, centre, fwhm, offset, gain);
    let m1 = 0;
    let m2 = 0;
    out.forEach((w, ch) => {
      const e = offset + gain * ch;
      m1 += w * e;
      m2 += w * e * e;
    });
    expect(m1).toBeCloseTo(centre, 6);
    // Sheppard's correction is exact up to terms of order exp(−2π²σ²/h²) ≈ 1e-12 here.
    expect(m2 - m1 * m1).toBeCloseTo(sigma * sigma + (gain * gain) / 12, 6);
  });

  it('adds nothing for zero yield and rejects a non-positive width or gain', () => {
    const out = new Float64Array(16);
    addGaussianOverChannels(out, 0, 30, 5, 0, 4);
    expect(out.every((v) => v === 0)).toBe(true);
    expect(() => addGaussianOverChannels(out, 1, 30, 0, 0, 4)).toThrow(RangeError);
    expect(() => addGaussianOverChannels(out, 1, 30, 5, 0, -1)).toThrow(RangeError);
    expect(() => addGaussianOverChannels(out, -1, 30, 5, 0, 4)).toThrow(RangeError);
  });
});
