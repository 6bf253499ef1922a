import { z } from 'zod';

/**
 * The declared truth of one peak's cross section as a function of beam energy: a smooth base
 * plus Lorentzian (Breit–Wigner-shaped) bumps, invented shapes for a simulation, not a
 * resonance-theory fit:
 *
 *   value(E) = base + Σ_i height_i · (Γ_i/2)² / ((E − E_i)² + (Γ_i/2)²)
 *
 * E, E_i and Γ_i (FWHM) in keV of lab beam energy; `height` is the bump's value at E = E_i, in
 * the unit of the model (dimensionless for ratio_to_rutherford, mb/sr for cm_mb_per_sr).
 */
export const resonanceSchema = z.strictObject({
  energy_keV: z.number().positive().meta({ description: 'lab beam energy of the bump centre', unit: 'keV' }),
  fwhm_keV: z.number().positive().meta({ description: 'full width at half maximum', unit: 'keV' }),
  height: z.number().meta({ description: 'value added at the centre (negative for a dip)' }),
});

export const energyCurveSchema = z.strictObject({
  base: z.number().meta({ description: 'value away from every resonance' }),
  resonances: z.array(resonanceSchema).default([]),
});

export const truthSchema = z.union([
  z.strictObject({
    ratio_to_rutherford: energyCurveSchema.meta({
      description: 'σ_lab / (σ_R,lab × screening factor), the same at every angle',
    }),
  }),
  z.strictObject({
    cm_mb_per_sr: energyCurveSchema.meta({ description: 'dσ/dΩ in the CM frame, isotropic, mb/sr' }),
  }),
]);

export type EnergyCurve = z.output<typeof energyCurveSchema>;
export type PeakTruth = z.output<typeof truthSchema>;

/** value(E) of an energy curve at lab beam energy `beamEnergyKeV` (keV). */
export function energyCurveValue(curve: EnergyCurve, beamEnergyKeV: number): number {
  let value = curve.base;
  for (const r of curve.resonances) {
    const halfWidth = r.fwhm_keV / 2;
    const d = beamEnergyKeV - r.energy_keV;
    value += (r.height * halfWidth * halfWidth) / (d * d + halfWidth * halfWidth);
  }
  return value;
}
