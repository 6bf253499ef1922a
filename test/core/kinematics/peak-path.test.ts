import { describe, expect, it } from 'vitest';
import { peakPath, type KinematicsAt, type PeakPathInput } from '../../../pipeline/core/kinematics/peak-path.js';
import type { SlowingModel } from '../../../pipeline/core/kinematics/slowing-model.js';
import { elasticKinematicFactor } from '../../../pipeline/core/physics/elastic-kinematic-factor.js';
import { nuclide } from '../../../pipeline/core/physics/nuclides.js';

// A slowing model with a constant stopping cross section ε (keV per 1e15 atoms/cm²) and no
// straggling: E_out = E_in − ε·N exactly, so the layer geometry can be checked in closed form.
const EPS = 0.06;
const constantStopping: SlowingModel = {
  slowDown: (_p, _c, pathAtoms, eIn) => {
    const out = eIn - (EPS * pathAtoms) / 1e15;
    return out > 0 ? { ok: true, energyOutKeV: out, stragglingKeV2: 0 } : { ok: false, reason: 'stops' };
  },
};
const alpha = nuclide('4He');
const au = nuclide('197Au');
const elastic: KinematicsAt = (e, theta) => ({
  ok: true,
  solutions: [{ branch: 'single', energyKeV: elasticKinematicFactor(alpha.massU, au.massU, theta) * e, thetaCmDeg: theta, jacobianLabPerCm: 1 }],
});
const base = (over: Partial<PeakPathInput> = {}): PeakPathInput => ({
  detected: alpha,
  projectile: alpha,
  kinematics: elastic,
  layers: [{ composition: { Au: 1 }, atomsPerCm2: 500e15 }],
  layerIndex: 0,
  tiltDeg: 0,
  exitMode: 'reflection',
  targetEnergyLoss: true,
  thetaLabDeg: 170,
  halfApertureDeg: 0,
  resolutionFwhmKeV: 0,
  foils: [],
  beamEnergyKeV: 2000,
  slowing: constantStopping,
  ...over,
});
const one = (x: PeakPathInput) => {
  const r = peakPath(x);
  if (!r.ok) throw new Error(r.reason);
  return r.branches[0]!;
};

describe('peakPath against the surface-approximation energy width of a layer', () => {
  // Chu, Mayer & Nicolet, Backscattering Spectrometry (1978), eqs. 3.6–3.9: a layer of N atoms/cm²
  // gives a signal of width ΔE = [ε] N with [ε] = K ε_in / cos α + ε_out / cos β — exact for
  // constant stopping.
  for (const tilt of [0, 30, 45]) {
    it(`tilt ${tilt}°: ΔE = (K/cos α + 1/cos β) ε N, β = 180° − θ − α`, () => {
      const r = one(base({ tiltDeg: tilt }));
      const k = elasticKinematicFactor(alpha.massU, au.massU, 170);
      const cosA = Math.cos((tilt * Math.PI) / 180);
      const cosB = Math.cos(((180 - 170 - tilt) * Math.PI) / 180);
      expect(r.widthKeV.layer).toBeCloseTo((k / cosA + 1 / cosB) * EPS * 500, 9);
      // Mid-depth: the beam has lost half the inward path; the particle the outward half.
      expect(r.reactionEnergyKeV).toBeCloseTo(2000 - (EPS * 250) / cosA, 9);
      expect(r.detectedEnergyKeV).toBeCloseTo(k * r.reactionEnergyKeV - (EPS * 250) / cosB, 9);
      // Uniform depth: standard deviation of the reaction energy = (inward loss)/√12.
      expect(r.reactionEnergySpreadKeV).toBeCloseTo((EPS * 500) / cosA / Math.sqrt(12), 9);
    });
  }
  it('a layer behind another: the beam loses energy in the first, the particle again on the way out', () => {
    const r = one(base({ layers: [{ composition: { C: 1 }, atomsPerCm2: 1000e15 }, { composition: { Au: 1 }, atomsPerCm2: 100e15 }], layerIndex: 1 }));
    const k = elasticKinematicFactor(alpha.massU, au.massU, 170);
    const eMid = 2000 - EPS * (1000 + 50);
    expect(r.reactionEnergyKeV).toBeCloseTo(eMid, 9);
    expect(r.detectedEnergyKeV).toBeCloseTo(k * eMid - (EPS * (50 + 1000)) / Math.cos((10 * Math.PI) / 180), 9);
  });
  it('transmission: the particle leaves through the back, crossing the layers behind', () => {
    const r = one(base({ exitMode: 'transmission', thetaLabDeg: 30, layers: [{ composition: { Au: 1 }, atomsPerCm2: 100e15 }, { composition: { C: 1 }, atomsPerCm2: 400e15 }], layerIndex: 0 }));
    const k = elasticKinematicFactor(alpha.massU, au.massU, 30);
    const eMid = 2000 - EPS * 50;
    expect(r.detectedEnergyKeV).toBeCloseTo(k * eMid - (EPS * (50 + 400)) / Math.cos((30 * Math.PI) / 180), 9);
  });
  it('foils in front of the detector are crossed at normal incidence after the target', () => {
    const r = one(base({ foils: [{ composition: { C: 1 }, atomsPerCm2: 300e15 }, { composition: { Si: 1 }, atomsPerCm2: 200e15 }] }));
    const plain = one(base());
    expect(plain.detectedEnergyKeV - r.detectedEnergyKeV).toBeCloseTo(EPS * 500, 9);
  });
  it('thin target (no energy loss): the peak sits at K·E and has the detector resolution only', () => {
    const r = one(base({ targetEnergyLoss: false, resolutionFwhmKeV: 15, slowing: null }));
    expect(r.detectedEnergyKeV).toBeCloseTo(elasticKinematicFactor(alpha.massU, au.massU, 170) * 2000, 9);
    expect(r.fwhmKeV).toBe(15);
    expect(r.reactionEnergySpreadKeV).toBe(0);
  });
  it('kinematic broadening: |dE/dθ| · a/2 · 2.355 (common practice), from the elastic K(θ) derivative', () => {
    const r = one(base({ targetEnergyLoss: false, slowing: null, thetaLabDeg: 90, halfApertureDeg: 1 }));
    const h = 1e-4;
    const dKdTheta = (elasticKinematicFactor(alpha.massU, au.massU, 90 + h) - elasticKinematicFactor(alpha.massU, au.massU, 90 - h)) / (2 * h) / (Math.PI / 180);
    expect(r.widthKeV.kinematic).toBeCloseTo(2.3548 * Math.abs(dKdTheta * 2000) * ((Math.PI / 180) / 2), 2);
  });
  it('grazing exit and a beam that stops are refused with a reason', () => {
    const g = peakPath(base({ exitMode: 'transmission', tiltDeg: 30, thetaLabDeg: 60 }));
    expect(g.ok).toBe(false);
    const s = peakPath(base({ beamEnergyKeV: 10 }));
    expect(s.ok).toBe(false);
    if (!s.ok) expect(s.reason).toMatch(/stops/);
  });
});
