import { describe, expect, it } from 'vitest';
import { CODATA2018 } from '../../../pipeline/core/physics/codata2018.js';
import { rutherfordCmMbPerSr } from '../../../pipeline/core/physics/rutherford-cm.js';

describe('Rutherford CM form (Rutherford 1911)', () => {
  it('8 MeV alphas on Z = 79 at 60 deg, recoil neglected: (2*79*1.44/32)^2 / sin^4 30 fm^2 = 8.09 b/sr (common practice)', () => {
    const tradeMbPerSr = ((2 * 79 * 1.44) / 32) ** 2 / Math.sin(Math.PI / 6) ** 4 * 10; // 8088 mb/sr with e^2 = 1.44 MeV fm
    const ours = rutherfordCmMbPerSr(2, 79, 8000, 60);
    expect(ours / 1000).toBeCloseTo(8.09, 2);
    // 1.44 vs CODATA 1.439964547 MeV fm: ratio squared 0.99995
    expect(ours / tradeMbPerSr).toBeCloseTo((CODATA2018.coulombConstantMeVFm / 1.44) ** 2, 12);
  });

  it('rejects invalid arguments', () => {
    expect(() => rutherfordCmMbPerSr(2, 79, 0, 60)).toThrow(RangeError);
    expect(() => rutherfordCmMbPerSr(2, 79, 1000, 0)).toThrow(RangeError);
  });
});
