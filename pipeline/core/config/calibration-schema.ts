import { z } from 'zod';

/** One energy-calibration version file, `calibrations/<version>.yaml` (DESIGN.md). */
const isoTimestamp = z.string().meta({ description: 'ISO 8601 timestamp' });

export const calibrationDetectorSchema = z.strictObject({
  id: z.string().min(1),
  offset_keV: z.number().meta({ description: 'energy at the centre of channel 0', unit: 'keV' }),
  gain_keV_per_channel: z.number().positive().meta({ unit: 'keV/channel', description: 'linear coefficient' }),
  quadratic_keV_per_channel2: z.number().optional().meta({ unit: 'keV/channel^2', description: 'quadratic coefficient' }),
  covariance: z
    .array(z.array(z.number()))
    .optional()
    .meta({ description: 'covariance of [offset, gain(, quadratic)] in their units squared' }),
});

export const calibrationSchema = z.strictObject({
  version: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9_.-]*$/),
  valid_from_run: z.string().optional(),
  valid_to_run: z.string().optional(),
  valid_from: isoTimestamp.optional(),
  valid_to: isoTimestamp.optional(),
  supersedes: z.array(z.string()).default([]),
  detectors: z.array(calibrationDetectorSchema).min(1),
});

export type CalibrationFile = z.output<typeof calibrationSchema>;
export type CalibrationDetectorFile = z.output<typeof calibrationDetectorSchema>;
