import { z } from 'zod';
import { describeSettings, enumSetting, numberSetting, type SettingRow } from './setting.js';

/**
 * The `series.yaml` contract (DESIGN.md, "Run-series layout"). One definition: ingest
 * validates with it and `pipeline/tools/write-schemas.ts` emits configs/series.schema.json
 * from it. Objects are strict: an unknown key is a diagnostic, so a typo never silently
 * falls back to a default.
 */

const idPattern = /^[A-Za-z0-9][A-Za-z0-9_.-]*$/;
const id = (what: string) =>
  z.string().regex(idPattern, `${what} must start with a letter or digit and hold only letters, digits, '_', '.', '-'`);

/** Element symbol (natural abundance) or nuclide (mass number + symbol). */
const compositionKey = z.string().regex(/^(\d{1,3})?[A-Z][a-z]?$/, "expected an element symbol ('Au') or a nuclide ('13C')");
const nuclideName = z.string().regex(/^\d{1,3}[A-Z][a-z]?$/, "expected a nuclide as mass number + symbol, e.g. '12C', '4He'");

const oneArealDensity = {
  check: (l: { areal_density_1e15_per_cm2?: number | undefined; areal_density_ug_per_cm2?: number | undefined }) =>
    (l.areal_density_1e15_per_cm2 === undefined) !== (l.areal_density_ug_per_cm2 === undefined),
  message: 'give exactly one of areal_density_1e15_per_cm2 or areal_density_ug_per_cm2',
};

const layerFields = {
  composition: z.record(compositionKey, z.number().positive()).meta({ description: 'atom ratios by element or nuclide' }),
  areal_density_1e15_per_cm2: z.number().positive().optional().meta({ description: 'areal density', unit: '1e15 atoms/cm^2' }),
  areal_density_ug_per_cm2: z.number().positive().optional().meta({ description: 'areal density', unit: 'ug/cm^2' }),
};

export const layerSchema = z
  .strictObject({
    ...layerFields,
    areal_density_unc_rel: z.number().min(0).max(1).default(0).meta({ description: 'relative standard uncertainty of the areal density' }),
    role: z.enum(['reference']).optional().meta({ description: 'reference: the layer whose Rutherford yield normalizes (internal-reference method)' }),
  })
  .refine(oneArealDensity.check, { message: oneArealDensity.message });

/** A foil or dead layer the detected particle crosses (no role, its thickness uncertainty is not propagated). */
export const foilSchema = z.strictObject(layerFields).refine(oneArealDensity.check, { message: oneArealDensity.message });

export const detectorSchema = z.strictObject({
  id: id('detector id'),
  angle_deg: z.number().gt(0).lt(180).meta({ description: 'lab scattering angle', unit: 'deg' }),
  angle_unc_deg: z.number().min(0).default(0).meta({ description: 'standard uncertainty of the angle', unit: 'deg' }),
  resolution_fwhm_keV: z.number().positive().meta({ description: 'energy resolution (FWHM)', unit: 'keV' }),
  solid_angle_msr: z.number().positive().meta({ description: 'nominal solid angle', unit: 'msr' }),
  half_aperture_deg: z.number().min(0).max(20).default(0).meta({ description: 'angular acceptance (half-angle), for kinematic broadening', unit: 'deg' }),
  dead_layer: foilSchema.optional().meta({ description: 'the detector entrance dead layer' }),
  absorber: z.array(foilSchema).default([]).meta({ description: 'foils between target and detector, target side first' }),
});

export const targetSchema = z.strictObject({
  id: id('target id'),
  tilt_deg: z.number().gt(-90).lt(90).default(0).meta({ description: 'beam incidence angle from the target normal, tilted towards the detectors (IBM geometry)', unit: 'deg' }),
  exit_angle_mode: z.enum(['reflection', 'transmission']).default('reflection').meta({ description: 'reflection: detectors on the beam side; transmission: detectors behind the target' }),
  layers: z.array(layerSchema).min(1).meta({ description: 'layers, beam side first' }),
});

export const peakSchema = z.strictObject({
  label: z.string().min(1).max(80),
  target_nuclide: nuclideName,
  excitation_keV: z.number().min(0).default(0).meta({ description: 'excitation energy of the residual nucleus', unit: 'keV' }),
  q_value_keV: z.number().optional().meta({ description: 'overrides Q computed from AME2020 masses and excitation_keV', unit: 'keV' }),
  ejectile: nuclideName.optional().meta({ description: 'the light outgoing particle b of A(a,b)B (default: the projectile)' }),
  detect: z.enum(['ejectile', 'recoil']).default('ejectile').meta({ description: 'which outgoing particle the detector sees: b (ejectile) or the residual B (recoil, e.g. elastic recoil detection)' }),
  method: z.enum(['window']).default('window').meta({ description: 'how the peak area is measured' }),
});

export const normalizationSchema = z.strictObject({
  method: z.enum(['reference-run']).default('reference-run').meta({ description: 'normalization method' }),
  reference_target: id('target id').meta({ description: 'the target whose yield follows the Rutherford cross section' }),
  reference_element: z
    .string()
    .regex(/^[A-Z][a-z]?$/)
    .optional()
    .meta({ description: 'element of the reference target whose elastic peak normalizes (default: the heaviest)' }),
  screening: enumSetting(['lecuyer', 'andersen', 'none'] as const, { default: 'lecuyer', doc: 'electron-screening correction of the Rutherford cross section' }),
  reference_rule: enumSetting(['bracketing'] as const, {
    default: 'bracketing',
    doc: 'which reference runs normalize a sample run: bracketing = interpolate in time between the nearest before and after',
  }),
  outlier_pull: numberSetting({ default: 3, min: 1, doc: 'a reference run further than this many standard deviations from its detector mean is flagged' }),
  nominal_tolerance_rel: numberSetting({ default: 0.1, min: 0, doc: "flag a detector whose mean effective solid angle is further than this fraction from the nominal one" }),
});

export const extractSettingsSchema = z.strictObject({
  peak_half_width_fwhm: numberSetting({ default: 1.5, min: 0.3, max: 6, unit: 'FWHM', doc: 'half-width of the peak integration window' }),
  background_gap_fwhm: numberSetting({ default: 0.5, min: 0, max: 6, unit: 'FWHM', doc: 'gap between the peak window and each background window' }),
  background_width_fwhm: numberSetting({ default: 1.5, min: 0.2, max: 20, unit: 'FWHM', doc: 'width of each background side window' }),
  shift_tolerance_fwhm: numberSetting({
    default: 0.5,
    min: 0,
    unit: 'FWHM',
    doc: 'flag a peak whose centroid lies further than this from the expected position',
  }),
});

export const physicsSettingsSchema = z.strictObject({
  energy_loss: enumSetting(['none', 'layers'] as const, {
    default: 'none',
    doc: 'none = thin target (reaction at the beam energy); layers = slow the beam to mid-depth of each layer, and the detected particle through the exit path, foils and dead layer',
  }),
  stopping_tables: z.array(z.string().min(1)).default([]).meta({ description: 'CSV files of stopping powers (relative to the series folder) that override the built-in tables for the materials they name' }),
});

/** The summary page's settings. Caps keep a 1,000-run × 16-detector series' page small. */
export const reportSettingsSchema = z.strictObject({
  max_spectra: numberSetting({ default: 64, min: 0, max: 2000, doc: 'run × detector spectra embedded in summary.html (spread evenly over the series); the page says which were left out' }),
  spectrum_bins: numberSetting({ default: 512, min: 16, max: 4096, doc: 'a spectrum is summed into at most this many bins for the page' }),
  max_angular_energies: numberSetting({ default: 12, min: 1, max: 200, doc: 'beam energies drawn as angular distributions (spread evenly)' }),
});

export const seriesSchema = z.strictObject({
  series: z.string().regex(/^[a-z0-9-]+$/, "series id must match [a-z0-9-]+, e.g. 'lab-2026-c12'"),
  title: z.string().default(''),
  beam: z.strictObject({
    projectile: nuclideName,
    charge_state: z.number().int().min(1).meta({ description: 'charge state of the beam ions (charge integrated per ion, in e)' }),
  }),
  detectors: z.array(detectorSchema).min(1),
  targets: z.array(targetSchema).min(1),
  peaks: z.array(peakSchema).min(1),
  normalization: normalizationSchema,
  extract: extractSettingsSchema.default(extractSettingsSchema.parse({})),
  physics: physicsSettingsSchema.default(physicsSettingsSchema.parse({})),
  report: reportSettingsSchema.default(reportSettingsSchema.parse({})),
});

export type LayerConfig = z.output<typeof layerSchema>;
export type FoilConfig = z.output<typeof foilSchema>;
export type PhysicsSettings = z.output<typeof physicsSettingsSchema>;
export type ReportSettings = z.output<typeof reportSettingsSchema>;
export type DetectorConfig = z.output<typeof detectorSchema>;
export type TargetConfig = z.output<typeof targetSchema>;
export type PeakConfig = z.output<typeof peakSchema>;
export type NormalizationConfig = z.output<typeof normalizationSchema>;
export type ExtractSettings = z.output<typeof extractSettingsSchema>;
export type SeriesConfig = z.output<typeof seriesSchema>;

/** Every tunable setting with a default (for the CLI help, the README table and configs/defaults.json). */
export function seriesSettingRows(): SettingRow[] {
  return [
    ...describeSettings('normalization', normalizationSchema),
    ...describeSettings('extract', extractSettingsSchema),
    ...describeSettings('physics', physicsSettingsSchema),
    ...describeSettings('report', reportSettingsSchema),
  ].filter((r) => r.default !== '');
}
