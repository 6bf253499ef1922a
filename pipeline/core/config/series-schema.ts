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
  stopping_material: z.string().min(1).optional().meta({ description: "stopping of the whole layer from this table: a user table's material name (physics.stopping_tables) or a NIST material (C-graphite, H2O-liquid, polyethylene, mylar, kapton, SiO2, Al2O3); default: from the composition" }),
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
  method: z.enum(['window', 'fit']).default('window').meta({ description: 'how the peak area is measured: window = sum above a side-window background; fit = Poisson maximum-likelihood line-shape fit (README, "Peak fitting, calibration from calibration runs, and gain drift")' }),
  fit_group: id('fit group').optional().meta({ description: 'peaks (method: fit) sharing a fit_group are fitted together as one multiplet' }),
});

/** A calibration source: a mixed alpha source (lines from the shipped table) or a target whose elastic peaks are known from kinematics. */
export const calibrationSourceSchema = z
  .strictObject({
    id: id('calibration source id'),
    lines_from: z.array(nuclideName).min(1).optional().meta({ description: 'alpha emitters of a mixed source, e.g. [239Pu, 241Am, 244Cm] (lines from pipeline/core/spectrum/alpha-source-lines.ts)' }),
    target: id('target id').optional().meta({ description: 'a target of series.yaml whose elastic peaks at the run\'s beam energy calibrate' }),
  })
  .refine((s) => (s.lines_from === undefined) !== (s.target === undefined), { message: 'give exactly one of lines_from (alpha source) or target (elastic peaks)' });

export const calibrateSettingsSchema = z.strictObject({
  degree: numberSetting({ default: 1, min: 1, max: 2, integer: true, doc: 'polynomial degree of a fitted calibration (1 linear, 2 quadratic)' }),
  search_threshold: numberSetting({ default: 5, min: 2, doc: 'peak-search significance threshold (smoothed second difference / its standard deviation)' }),
  match_tolerance_keV: numberSetting({ default: 25, min: 0.1, unit: 'keV', doc: 'a found peak matches a known line within this distance through the trial calibration' }),
  gain_range_rel: numberSetting({ default: 0.2, min: 0.001, max: 0.9, doc: 'trial gains are searched within this fraction of the current calibration\'s gain' }),
});

export const driftSchema = z.strictObject({
  mode: enumSetting(['off', 'track', 'correct'] as const, { default: 'off', doc: 'gain drift: track = locate the tracking peak in every run and detector and report its shift; correct = also rescale the gain per run so the tracking peak sits where the calibration predicts' }),
  tracking_peak: z.string().min(1).optional().meta({ description: 'label of the peak to track (default: the strongest elastic peak of each run)' }),
  tolerance_keV: numberSetting({ default: 3, min: 0, unit: 'keV', doc: 'flag gain-drift where the tracking peak lies further than this from its predicted energy' }),
});

export const normalizationSchema = z.strictObject({
  method: enumSetting(['reference-run', 'internal-reference', 'monitor', 'absolute'] as const, {
    default: 'reference-run',
    doc: 'reference-run = separate reference target runs; internal-reference = a role: reference layer in the sample target; monitor = one detector\'s Rutherford yield on the reference element in every run; absolute = charge × nominal solid angle (README, "Normalization methods and uncertainties")',
  }),
  reference_target: id('target id').optional().meta({ description: 'the target whose yield follows the Rutherford cross section (required by reference-run and monitor)' }),
  reference_element: z
    .string()
    .regex(/^[A-Z][a-z]?$/)
    .optional()
    .meta({ description: 'element of the reference target whose elastic peak normalizes (default: the heaviest)' }),
  screening: enumSetting(['lecuyer', 'andersen', 'none'] as const, { default: 'lecuyer', doc: 'electron-screening correction of the Rutherford cross section' }),
  reference_rule: enumSetting(['bracketing', 'nearest', 'series-mean'] as const, {
    default: 'bracketing',
    doc: 'which reference runs normalize a sample run (reference-run, monitor): bracketing = interpolate in time between the nearest before and after; nearest = the nearest in start time; series-mean = weighted mean of all of the detector\'s reference runs',
  }),
  monitor_detector: id('detector id').optional().meta({ description: 'monitor method: the detector whose Rutherford yield on the reference element in the sample target normalizes every run' }),
  reference_layer: enumSetting(['role'] as const, { default: 'role', doc: 'internal-reference: which layer of the sample target normalizes; role = the layer marked role: reference' }),
  charge_unc_rel: numberSetting({ default: 0.02, min: 0, max: 1, doc: 'relative standard uncertainty of the charge integrator (enters where the charge does not cancel: absolute); common practice for a suppressed Faraday cup' }),
  solid_angle_unc_rel: numberSetting({ default: 0.03, min: 0, max: 1, doc: 'relative standard uncertainty of the nominal solid angles (absolute method); common practice for a collimated detector' }),
  screening_unc_frac: numberSetting({ default: 0.1, min: 0, max: 1, doc: 'relative standard uncertainty of the screening correction 1 − F (common practice, not a published figure; compare screening: lecuyer and andersen for your geometry)' }),
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
  combine_energy_tolerance_keV: numberSetting({ default: 1, min: 0, unit: 'keV', doc: 'rows of one peak and lab angle whose beam energies lie within this of the lowest of their group are combined (combined.arrow)' }),
  covariance_max_rows: numberSetting({ default: 3000, min: 0, doc: 'covariance.arrow is written when the series has at most this many rows (a shared series-wide component makes it dense: n(n+1)/2 entries)' }),
  fit_region_fwhm: numberSetting({ default: 3, min: 1, max: 20, unit: 'FWHM', doc: 'a fit region reaches this far beyond the outermost expected peak of its group' }),
  fit_background: enumSetting(['none', 'constant', 'linear', 'quadratic'] as const, { default: 'linear', doc: 'background polynomial under fitted peaks' }),
  fit_step: enumSetting(['none', 'erfc'] as const, { default: 'none', doc: 'erfc = a smooth step under each fitted peak (Phillips & Marlow 1976)' }),
  fit_positions: enumSetting(['tied', 'tied-gain', 'free'] as const, { default: 'tied', doc: 'tied = centroids of a group keep the expected energy differences through the run\'s calibration (one centroid fitted); tied-gain = the same with channels-per-keV fitted too; free = one centroid per peak' }),
  fit_widths: enumSetting(['shared', 'free'] as const, { default: 'shared', doc: 'shared = one width, each peak scaled by its predicted FWHM; free = one width per peak' }),
  fit_tail: enumSetting(['none', 'fixed', 'shared', 'free'] as const, { default: 'none', doc: 'low-energy exponential tail (Bortels & Collaers 1987): none, fixed at the values below, one shared fraction and length, or one per peak' }),
  fit_tail_fraction: numberSetting({ default: 0.1, min: 0, max: 1, doc: 'tail fraction η (start or fixed value)' }),
  fit_tail_length_fwhm: numberSetting({ default: 0.5, min: 0.01, max: 20, unit: 'FWHM', doc: 'tail length τ (start or fixed value)' }),
  fit_flag_probability: numberSetting({ default: 0.001, min: 0, max: 0.5, doc: 'flag a fit whose deviance or residual-runs test has an upper-tail probability below this' }),
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
  calibration_sources: z.array(calibrationSourceSchema).default([]).meta({ description: 'sources that runs of kind calibration name as their target (xsred calibrate)' }),
  calibrate: calibrateSettingsSchema.default(calibrateSettingsSchema.parse({})),
  drift: driftSchema.default(driftSchema.parse({})),
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
export type CalibrationSourceConfig = z.output<typeof calibrationSourceSchema>;
export type CalibrateSettings = z.output<typeof calibrateSettingsSchema>;
export type DriftSettings = z.output<typeof driftSchema>;

/** Every tunable setting with a default (for the CLI help, the README table and configs/defaults.json). */
export function seriesSettingRows(): SettingRow[] {
  return [
    ...describeSettings('normalization', normalizationSchema),
    ...describeSettings('extract', extractSettingsSchema),
    ...describeSettings('physics', physicsSettingsSchema),
    ...describeSettings('report', reportSettingsSchema),
    ...describeSettings('calibrate', calibrateSettingsSchema),
    ...describeSettings('drift', driftSchema),
  ].filter((r) => r.default !== '');
}
