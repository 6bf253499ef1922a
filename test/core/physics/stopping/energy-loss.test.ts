import { describe, expect, it } from 'vitest';
import { nuclide } from '../../../../pipeline/core/physics/nuclides.js';
import { energyAtMidDepth } from '../../../../pipeline/core/physics/energy-loss/energy-at-mid-depth.js';
import { layerEnergySpread } from '../../../../pipeline/core/physics/energy-loss/layer-energy-spread.js';
import { pathForEnergyLoss } from '../../../../pipeline/core/physics/energy-loss/path-for-energy-loss.js';
import { slowDownWith } from '../../../../pipeline/core/physics/energy-loss/slow-down-with.js';
import { slowDown } from '../../../../pipeline/core/physics/energy-loss/slow-down.js';
import { prepareStopping, stoppingPowerEvPer1e15 } from '../../../../pipeline/core/physics/stopping/stopping-power.js';
import { parseUserStoppingTables } from '../../../../pipeline/core/physics/stopping/user-stopping-table.js';

const he4 = nuclide('4He');
const p = nuclide('1H');
const S = (e: number) => {
  const r = stoppingPowerEvPer1e15(he4, { Si: 1 }, e);
  return r.ok ? r.value : Number.NaN;
};

// A made-up power law S = c E^-k (eV/(1e15 atoms/cm²), E in keV) as a user table: log-log interpolation
// holds it exactly, and dE/dN = -S/1000 has the closed form E^(k+1) = E0^(k+1) - (k+1) (c/1000) N.
const c = 60 * 1000 ** 0.7;
const k = 0.7;
const csv = ['material,projectile,energy_keV,stopping_eV_per_1e15_atoms_per_cm2', ...[50, 200, 1000, 3000].map((e) => `X,4He,${e},${c * e ** -k}`)].join('\n');
const user = { userTables: parseUserStoppingTables(csv, 'x.csv').tables, material: 'X' };

describe('slowing down through a layer', () => {
  it('matches the closed-form solution for a power-law stopping to 1e-9 (mathematical identity)', () => {
    for (const n of [10, 1000, 20000]) {
      const r = slowDown(he4, { Si: 1 }, n, 2500, 1, user);
      const exact = (2500 ** (k + 1) - ((k + 1) * c * n) / 1000) ** (1 / (k + 1));
      expect(r.ok && r.energyOutKeV / exact).toBeCloseTo(1, 9);
    }
  });

  it('loses S x t to first order in a thin layer (correction ~ (1/2) dlnS/dlnE x dE/E, < 2e-4 here)', () => {
    for (const t of [1, 10]) {
      const r = slowDown(he4, { Si: 1 }, t, 2000, 1);
      expect(r.ok && r.energyLossKeV / ((S(2000) * t) / 1000)).toBeCloseTo(1, 3);
      expect(Math.abs((r.ok ? r.energyLossKeV : 0) / ((S(2000) * t) / 1000) - 1)).toBeLessThan(2e-4 * t / 10 + 1e-6);
    }
  });

  it('a 60° path through a layer equals twice its areal density at normal incidence (path = t / cos)', () => {
    const tilted = slowDown(he4, { Si: 1 }, 800, 2000, 0.5);
    const doubled = slowDown(he4, { Si: 1 }, 1600, 2000, 1);
    expect(tilted.ok && doubled.ok && tilted.energyOutKeV).toBeCloseTo(doubled.ok ? doubled.energyOutKeV : 0, 9);
    expect(slowDown(he4, { Si: 1 }, 800, 2000, 0)).toMatchObject({ ok: false, rule: 'stopping-bad-input' });
  });

  it('pathForEnergyLoss (Simpson on ln E) inverts slowDown (RK4) to 5e-7 for NIST tables (largest seen 8e-8, protons in Au)', () => {
    for (const [ion, comp, t, e] of [[he4, { Si: 1 }, 3000, 2000], [p, { Au: 1 }, 20000, 1500], [he4, { C: 10, H: 8, O: 4 }, 5000, 5000]] as const) {
      const r = slowDown(ion, comp, t, e, 1);
      expect(r.ok).toBe(true);
      if (!r.ok) continue;
      const back = pathForEnergyLoss(ion, comp, e, r.energyOutKeV);
      expect(back.ok && back.pathAreal1e15 / t).toBeCloseTo(1, 6);
    }
  });

  it('fails, with the depth, when the ion stops in the layer (2 MeV 4He range in Si ~ 3.8e19 atoms/cm², NIST ASTAR CSDA range 7.2 um x 5.0e22 /cm³, from memory)', () => {
    const r = slowDown(he4, { Si: 1 }, 1e5, 2000, 1);
    expect(r).toMatchObject({ ok: false, rule: 'stopping-particle-stopped' });
    expect(r.ok ? '' : r.reason).toMatch(/stops in the layer/);
    expect(slowDown(he4, { Si: 1 }, 3.0e4, 2000, 1).ok).toBe(true);
  });

  it('an incoming energy spread is scaled by S(E_out)/S(E_in) through the layer (dσ/σ = dS/S along the path; common practice)', () => {
    const prepared = prepareStopping(he4, { Au: 1 }, {});
    if (!prepared.ok) throw new Error(prepared.reason);
    const r = slowDownWith(prepared.stopping, 0, 2000, 3000, 25, '4He');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const ratio = prepared.stopping.totalEvPer1e15(r.energyOutKeV) / prepared.stopping.totalEvPer1e15(3000);
    expect(Math.sqrt(r.stragglingKeV2 / 25)).toBeCloseTo(ratio, 4);
  });
});

describe('energy at mid-depth and spread across a layer', () => {
  it('mid-depth energy is half-way to second order, and the uniform spread is ΔE/√12 (common practice)', () => {
    const s = layerEnergySpread(he4, { Si: 1 }, 1000, 2000, 1);
    const mid = energyAtMidDepth(he4, { Si: 1 }, 1000, 2000, 1);
    expect(s.ok && mid.ok).toBe(true);
    if (!s.ok || !mid.ok) return;
    expect(s.energyMidKeV).toBe(mid.energyOutKeV);
    expect(Math.abs(s.energyMidKeV - (s.energyInKeV + s.energyOutKeV) / 2)).toBeLessThan(0.01 * s.energyLossKeV);
    expect(s.uniformRmsKeV).toBeCloseTo(s.energyLossKeV / Math.sqrt(12), 12);
    expect(s.spreadRmsKeV ** 2).toBeCloseTo(s.uniformRmsKeV ** 2 + s.stragglingMidKeV2, 9);
  });
});
