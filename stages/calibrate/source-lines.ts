import type { CalibrationSourceConfig, DetectorConfig, SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import { alphaSourceLines } from '../../pipeline/core/spectrum/alpha-source-lines.js';
import { mergeUnresolvedLines, type ReferenceLine } from '../../pipeline/core/spectrum/merge-unresolved-lines.js';

/**
 * The lines a calibration run must show in one detector:
 * (a) `lines_from`: the alpha lines of the named emitters (DDEP table, alpha-source-lines.ts),
 *     lines of one nuclide closer than the detector FWHM merged (merge-unresolved-lines.ts);
 * (b) `target`: the elastic peak of every nuclide of that target at the run's beam energy, at the
 *     detected energy the series peak planner computes (kinematics, energy loss when enabled);
 *     u(E) = u(E_beam)·E/E_beam (the elastic energy scales with the beam energy, common practice);
 *     isotopes of one element closer than the FWHM merged, weighted by atoms × Z².
 * Throws a RangeError naming what is wrong (unknown emitter).
 */
export function sourceLines(config: SeriesConfig, source: CalibrationSourceConfig, detector: DetectorConfig, planner: SeriesPeakPlanner, beamEnergyKeV: number, beamEnergyUncKeV: number): ReferenceLine[] {
  if (source.lines_from !== undefined) return mergeUnresolvedLines(alphaSourceLines(source.lines_from), detector.resolution_fwhm_keV);
  const target = config.targets.find((t) => t.id === source.target);
  if (target === undefined) throw new RangeError(`calibration source ${source.id} names target "${source.target}", which series.yaml does not define`);
  if (!(beamEnergyKeV > 0)) throw new RangeError(`calibration source ${source.id} uses elastic peaks, so its runs need beam_energy_keV in runlog.csv`);
  // Isotopes of one element closer than the FWHM merge like unresolved alpha lines, weighted by atoms·Z² (Rutherford scaling).
  const peaks = planner.elasticPeaks(target, detector, beamEnergyKeV).peaks.filter((p) => p.branch === 'single');
  const strongest = Math.max(...peaks.map((p) => p.atomsPerCm2 * p.reaction.target.z ** 2));
  return mergeUnresolvedLines(
    peaks.map((p) => ({
      nuclide: p.reaction.target.symbol,
      energyKeV: p.detectedEnergyKeV,
      energyUncKeV: Math.max(beamEnergyUncKeV * (p.detectedEnergyKeV / beamEnergyKeV), 1e-6),
      intensityPercent: (100 * p.atomsPerCm2 * p.reaction.target.z ** 2) / strongest,
      intensityUncPercent: 0,
      daughterLevelKeV: 0,
    })),
    detector.resolution_fwhm_keV,
  );
}
