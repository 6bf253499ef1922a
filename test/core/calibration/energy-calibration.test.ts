import { describe, expect, it } from 'vitest';
import { channelToEnergyKeV, energyToChannel, energyUncertaintyKeV } from '../../../pipeline/core/calibration/energy-calibration.js';

const linear = { version: 'v', offsetKeV: 26.351, gainKeVPerChannel: 1.052266, quadraticKeVPerChannel2: 0, covariance: [[9.0e-2, -4.8e-5], [-4.8e-5, 4.0e-8]] };
const quad = { ...linear, quadraticKeVPerChannel2: 2.5e-5, covariance: [[0, 0, 0], [0, 0, 0], [0, 0, 0]] };

describe('energy calibration', () => {
  it('E(ch) = offset + gain·ch (+ quadratic·ch²) and its inverse round-trip', () => {
    for (const cal of [linear, quad]) for (const ch of [0, 17.5, 1000, 4095]) expect(energyToChannel(cal, channelToEnergyKeV(cal, ch))).toBeCloseTo(ch, 9);
  });
  it('var E(ch) = J C Jᵀ with J = [1, ch] (first-order propagation, JCGM 100:2008 eq. 13)', () => {
    const ch = 1000;
    const v = 9.0e-2 + 2 * ch * -4.8e-5 + ch * ch * 4.0e-8;
    expect(energyUncertaintyKeV(linear, ch)).toBeCloseTo(Math.sqrt(v), 12);
  });
});
