import { describe, expect, it } from 'vitest';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';
import { twoBodyParamsFromNuclides } from '../../../pipeline/core/physics/two-body-params-from-nuclides.js';

const n = nuclide;

describe('two-body parameters from nuclides (AME2020 masses, Wang et al., Chin. Phys. C 45, 030003 (2021))', () => {
  it('14N(d,p)15N: residual from Z and A conservation, Q = 8608.7 keV (AME2020, from memory 8.609 MeV)', () => {
    const p = twoBodyParamsFromNuclides(n('2H'), n('14N'), n('1H'), 1400);
    expect(p.residual.name).toBe('15N');
    expect(p.qValueKeV).toBeCloseTo(8608.7, 0);
    expect(p.residualMassU).toBe(n('15N').massU);
  });

  it('7Li(p,a)4He: Q = 17 346 keV (AME2020, from memory 17.35 MeV); excitation lowers Q by Ex', () => {
    expect(twoBodyParamsFromNuclides(n('1H'), n('7Li'), n('4He'), 1000).qValueKeV).toBeCloseTo(17_346.2, 0);
    const ground = twoBodyParamsFromNuclides(n('2H'), n('12C'), n('1H'), 1000).qValueKeV;
    expect(twoBodyParamsFromNuclides(n('2H'), n('12C'), n('1H'), 1000, 3089.4).qValueKeV).toBeCloseTo(ground - 3089.4, 9);
  });

  it('scattering and elastic recoil: Q = −Ex exactly, residual is the other nucleus', () => {
    const recoil = twoBodyParamsFromNuclides(n('4He'), n('1H'), n('1H'), 2000);
    expect(recoil.residual.name).toBe('4He');
    expect(recoil.qValueKeV === 0).toBe(true);
    expect(twoBodyParamsFromNuclides(n('1H'), n('12C'), n('1H'), 5000, 4438.9).qValueKeV).toBe(-4438.9);
    expect(twoBodyParamsFromNuclides(n('1H'), n('12C'), n('1H'), 5000, 0, -100).qValueKeV).toBe(-100);
  });

  it('rejects impossible channels and negative excitation', () => {
    expect(() => twoBodyParamsFromNuclides(n('1H'), n('2H'), n('4He'), 1000)).toThrow(RangeError);
    expect(() => twoBodyParamsFromNuclides(n('1H'), n('12C'), n('1H'), 1000, -1)).toThrow(RangeError);
  });
});
