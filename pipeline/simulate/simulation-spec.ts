import { z } from 'zod';
import { detectorSchema, normalizationSchema, peakSchema, physicsSettingsSchema, targetSchema } from '../core/config/series-schema.js';
import { truthSchema } from './truth-model.js';
import { checkSimulationSpec } from './check-simulation-spec.js';

/**
 * What `xsred simulate` builds a run series from: the experiment as series.yaml will state it
 * (beam, detectors, targets, peaks, normalization — the same schemas ingest reads), plus the
 * truth the series.yaml does not reveal (true solid angles, cross-section models, live
 * fractions, the charge integrator's reading error) and the run plan. Run indices are 1-based
 * positions in runlog.csv (run index 1 is the first row, id r001).
 */
const runIndex = z.number().int().min(1).meta({ description: '1-based position of the run in runlog.csv' });

export const simulatedDetectorSchema = detectorSchema.extend({
  true_solid_angle_msr: z.number().positive().meta({ description: 'solid angle used to generate counts (series.yaml gets solid_angle_msr)', unit: 'msr' }),
});

export const simulatedPeakSchema = peakSchema.extend({
  truth: truthSchema.optional().meta({ description: 'cross-section model; elastic peaks default to ratio_to_rutherford 1' }),
});

export const DEFECT_KINDS = [
  'truncated-spectrum', 'negative-count', 'non-integer-count', 'ragged-row',
  'missing-spectrum', 'unknown-target', 'unknown-detector-column', 'missing-scalers',
] as const;
export type DefectKind = (typeof DEFECT_KINDS)[number];

const calibrationVersionSchema = z.strictObject({
  version: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9_.-]*$/, 'version must hold only letters, digits, _ . -'),
  from_run_index: runIndex.meta({ description: 'first run this version applies to; it holds until the next version starts' }),
  offset_unc_keV: z.number().min(0).default(0.4).meta({ description: 'standard uncertainty of every offset in the file', unit: 'keV' }),
  gain_unc_rel: z.number().min(0).default(1.5e-4).meta({ description: 'relative standard uncertainty of every gain in the file' }),
  offset_gain_correlation: z.number().min(-1).max(1).default(-0.8).meta({ description: 'correlation coefficient of offset and gain' }),
  detectors: z.array(z.strictObject({
    id: z.string().min(1),
    offset_keV: z.number().meta({ description: 'energy at the centre of channel 0', unit: 'keV' }),
    gain_keV_per_channel: z.number().positive().meta({ unit: 'keV/channel' }),
  })).min(1),
});

const energyRangeSchema = z.strictObject({
  from: z.number().positive().meta({ unit: 'keV' }),
  to: z.number().positive().meta({ unit: 'keV' }),
  step: z.number().positive().meta({ unit: 'keV' }),
});

export const simulationSpecObjectSchema = z
  .strictObject({
    seed: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER).meta({ description: 'seed of every random draw: same spec and seed, same bytes' }),
    series: z.string().regex(/^[a-z0-9-]+$/, "series id must match [a-z0-9-]+, e.g. 'lab-2026-c12'"),
    title: z.string().default(''),
    beam: z.strictObject({ projectile: z.string(), charge_state: z.number().int().min(1) }),
    channels: z.number().int().min(16).max(65536).meta({ description: 'channels per spectrum, written as 0…N−1' }),
    detectors: z.array(simulatedDetectorSchema).min(1),
    targets: z.array(targetSchema).min(2),
    peaks: z.array(simulatedPeakSchema).min(1),
    normalization: normalizationSchema,
    physics: physicsSettingsSchema.pick({ energy_loss: true }).default({ energy_loss: 'none' }).meta({ description: 'energy loss in the target layers (foils and dead layers are always crossed), as the reduction will be told' }),
    energies_keV: z.union([z.array(z.number().positive()).min(1), energyRangeSchema]).meta({ description: 'sample beam energies, a list or {from, to, step}', unit: 'keV' }),
    beam_energy_unc_keV: z.number().min(0).meta({ description: 'written to runlog.csv for every run', unit: 'keV' }),
    schedule: z.strictObject({
      sample_target: z.string().meta({ description: 'target id of the sample runs' }),
      samples_per_energy: z.number().int().min(1).default(1),
      reference_every: z.number().int().min(1).meta({ description: 'a reference run after every this many sample runs (and always first and last)' }),
      reference_beam_energy_keV: z.number().positive().optional().meta({ description: 'fixed reference energy; default: that of the neighbouring sample run', unit: 'keV' }),
      start_at: z.iso.datetime({ offset: true }).meta({ description: 'start of the first run, ISO 8601 with Z or offset' }),
      changeover_s: z.number().min(0).default(300).meta({ description: 'time between the end of one run and the start of the next', unit: 's' }),
    }),
    charge: z.strictObject({
      sample_uC: z.number().positive().meta({ description: 'true integrated charge of a sample run', unit: 'uC' }),
      reference_uC: z.number().positive().meta({ description: 'true integrated charge of a reference run', unit: 'uC' }),
      charge_reading_factor: z.number().positive().default(1).meta({ description: 'runlog charge_uC = true charge × this factor' }),
      beam_current_nA: z.strictObject({ sample: z.number().positive(), reference: z.number().positive() }).meta({ unit: 'nA', description: 'sets real_time_s = charge / current' }),
    }),
    dead_time: z.discriminatedUnion('model', [
      z.strictObject({ model: z.literal('uniform'), live_fraction_min: z.number().gt(0).max(1), live_fraction_max: z.number().gt(0).max(1) })
        .meta({ description: 'live fraction drawn uniformly per run and detector' }),
      z.strictObject({ model: z.literal('non-paralyzable'), dead_time_us: z.number().min(0) })
        .meta({ description: 'live fraction 1/(1 + n τ) from the detector\'s true event rate n (common practice)' }),
    ]),
    scalers: z.strictObject({
      pulser_rate_hz: z.number().positive().default(100).meta({ unit: 'Hz' }),
      modes: z.array(z.strictObject({ from_run_index: runIndex, mode: z.enum(['live_time', 'pulser']) })).min(1)
        .default([{ from_run_index: 1, mode: 'live_time' }]).meta({ description: 'scaler mode from a run on, until the next entry' }),
    }).default({ pulser_rate_hz: 100, modes: [{ from_run_index: 1, mode: 'live_time' }] }),
    calibrations: z.array(calibrationVersionSchema).min(1),
    background: z.strictObject({
      flat_per_keV_per_uC: z.number().min(0).default(0),
      exponential_per_keV_per_uC: z.number().min(0).default(0),
      exponential_decay_keV: z.number().positive().default(200),
    }).default({ flat_per_keV_per_uC: 0, exponential_per_keV_per_uC: 0, exponential_decay_keV: 200 })
      .meta({ description: 'continuum b(E) = flat + exponential·exp(−E/decay), counts per keV per uC' }),
    calibration_runs: z.strictObject({
      source_id: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9_.-]*$/).meta({ description: 'calibration source id (series.yaml calibration_sources, runlog target of the runs)' }),
      lines_from: z.array(z.string()).min(1).meta({ description: 'alpha emitters of the mixed source (pipeline/core/spectrum/alpha-source-lines.ts)' }),
      counts_per_nuclide: z.number().positive().meta({ description: 'expected counts per emitter in each detector, shared among its lines by emission probability', unit: 'counts' }),
      background_per_channel: z.number().min(0).default(0.2).meta({ description: 'flat background of a calibration spectrum', unit: 'counts/channel' }),
      real_time_s: z.number().positive().default(600).meta({ unit: 's' }),
    }).optional().meta({ description: 'a calibration run with a mixed alpha source before the first run of every calibration version (indices elsewhere count the plan without them)' }),
    gain_drift: z.array(z.strictObject({
      run_index: runIndex,
      gain_factor: z.number().positive().meta({ description: 'the true gain of this run is the calibration file\'s gain times this factor' }),
      detector: z.string().optional().meta({ description: 'the drifting detector (default: all)' }),
    })).default([]).meta({ description: 'gain drift injected into single runs; the calibration files do not know it' }),
    defects: z.array(z.strictObject({
      run_index: runIndex,
      kind: z.enum(DEFECT_KINDS),
      detector: z.string().optional().meta({ description: 'column to damage (default: the first detector)' }),
    })).default([]),
  });

/**
 * The spec schema with its cross-field checks (ids, run indices, truth > 0), which run only
 * on a spec that passed every per-field check.
 */
export const simulationSpecSchema = simulationSpecObjectSchema.superRefine(checkSimulationSpec, {
  when: (payload) => payload.issues.length === 0,
});

export type SimulationSpecInput = z.input<typeof simulationSpecObjectSchema>;
export type SimulationSpec = z.output<typeof simulationSpecObjectSchema>;
export type CalibrationVersionSpec = SimulationSpec['calibrations'][number];
export type SimulatedDetectorSpec = SimulationSpec['detectors'][number];
export type SimulatedPeakSpec = SimulationSpec['peaks'][number];
export type DefectSpec = SimulationSpec['defects'][number];
