import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { MeasuredPeak } from '../../pipeline/core/counting/peak-window.js';
import { isElasticPeak, peakKinematics } from '../../pipeline/core/kinematics/peak-kinematics.js';
import type { AppliedNormalization, CrossSectionRow } from '../../pipeline/core/model/result-rows.js';
import { nuclideTotals, resolveTarget } from '../../pipeline/core/model/resolve-target.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import { nuclide } from '../../pipeline/core/physics/nuclides.js';
import { elasticKinematicFactor } from '../../pipeline/core/physics/elastic-kinematic-factor.js';
import { crossSectionRow } from './cross-section-row.js';
import { interferenceFlags, type KnownLine } from './interference-flags.js';

export { planPeakWindows, type PlannedPeak } from './plan-peak-windows.js';

export interface ExtractInput {
  config: SeriesConfig;
  /** Usable sample runs, runlog order. */
  sampleRuns: readonly RunRecord[];
  /** Run → `${detector}\t${peak label}` → measured peak. */
  measured: ReadonlyMap<string, ReadonlyMap<string, MeasuredPeak>>;
  live: ReadonlyMap<string, ReadonlyMap<string, LiveFraction>>;
  normalization: ReadonlyMap<string, ReadonlyMap<string, AppliedNormalization | null>>;
  calibrationVersion: ReadonlyMap<string, string>;
  /** Problems found while planning (kinematically forbidden peaks): run → `${detector}\t${label}` → reason. */
  planProblems: ReadonlyMap<string, ReadonlyMap<string, string>>;
}

export interface ExtractOutput {
  rows: CrossSectionRow[];
  diagnostics: Diagnostic[];
}

export const measuredKey = (detector: string, peak: string) => `${detector}\t${peak}`;

/**
 * extract: for each sample run × detector × configured peak of a nuclide in the run's target,
 * dσ/dΩ (lab, CM), σ/σ_R and their statistical and systematic uncertainties.
 */
export function extract(input: ExtractInput): ExtractOutput {
  const { config } = input;
  const projectile = nuclide(config.beam.projectile);
  const rows: CrossSectionRow[] = [];
  const diagnostics: Diagnostic[] = [];
  // One warning per peak (with its first case), not one per run × detector.
  const problems = new Map<string, { count: number; first: Diagnostic }>();
  // Per target and detector, once: every nuclide's elastic line as a kinematic factor (its
  // energy is K·E for each run) and its expected strength, atoms/cm² × Z² (the Rutherford scaling).
  const perTarget = new Map(
    config.targets.map((t) => {
      const totals = nuclideTotals(resolveTarget(t));
      const strength = new Map([...totals].map(([n, tot]) => [n, tot.atomsPerCm2 * nuclide(n).z ** 2]));
      const nuclides = [...totals.keys()];
      return [
        t.id,
        {
          nuclides,
          strength,
          areals: config.peaks.map((p) => totals.get(p.target_nuclide) ?? null),
          linesByDetector: config.detectors.map((det) =>
            nuclides.map((n) => {
              const m2 = nuclide(n).massU;
              return { name: `${n} elastic`, k: m2 > projectile.massU ? elasticKinematicFactor(projectile.massU, m2, det.angle_deg) : Number.NaN, strength: strength.get(n)! };
            }),
          ),
        },
      ] as const;
    }),
  );
  for (const run of input.sampleRuns) {
    const here = perTarget.get(run.target)!;
    const nuclidesHere = here.nuclides;
    const areals = here.areals;
    for (const [di, det] of config.detectors.entries()) {
      // Every peak this spectrum is expected to hold: each nuclide's elastic peak and the configured peaks.
      const lines: KnownLine[] = here.linesByDetector[di]!.map((l) => ({ name: l.name, energyKeV: l.k * run.beamEnergyKeV, strength: l.strength }));
      for (const p of config.peaks) {
        if (!nuclidesHere.includes(p.target_nuclide) || isElasticPeak(p)) continue;
        const k = peakKinematics(projectile, p.target_nuclide, p.excitation_keV, p.q_value_keV, run.beamEnergyKeV, det.angle_deg);
        lines.push({ name: p.label, energyKeV: k.ok ? k.value.energyKeV : Number.NaN, strength: Number.POSITIVE_INFINITY });
      }
      for (const [pi, peak] of config.peaks.entries()) {
        const areal = areals[pi]!;
        if (areal === null) continue;
        const key = measuredKey(det.id, peak.label);
        const measured = input.measured.get(run.run)?.get(key) ?? null;
        const problem = input.planProblems.get(run.run)?.get(key);
        if (problem !== undefined) {
          const seen = problems.get(peak.label);
          if (seen) seen.count++;
          else problems.set(peak.label, { count: 1, first: { severity: 'warning', rule: 'peak-kinematics', stage: 'extract', run: run.run, detector: det.id, message: `peak "${peak.label}": ${problem}` } });
        }
        const own = isElasticPeak(peak) ? `${peak.target_nuclide} elastic` : peak.label;
        const extraFlags = measured ? interferenceFlags(measured.window, own, here.strength.get(peak.target_nuclide)!, lines) : [];
        const live = input.live.get(run.run)?.get(det.id) ?? { value: 1, unc: 0, source: 'none' as const };
        if (live.source === 'none') extraFlags.push('no-live-time');
        const shiftTol = config.extract.shift_tolerance_fwhm * det.resolution_fwhm_keV;
        if (measured && measured.net && Number.isFinite(measured.shiftKeV) && Math.abs(measured.shiftKeV) > shiftTol && measured.net.net > 5 * Math.sqrt(measured.net.netVariance)) {
          extraFlags.push('peak-shifted');
        }
        rows.push(
          crossSectionRow({
            config,
            projectile,
            run,
            detector: det,
            peak,
            measured,
            live,
            normalization: input.normalization.get(run.run)?.get(det.id) ?? null,
            nuclide: areal,
            calibrationVersion: input.calibrationVersion.get(run.run) ?? '',
            extraFlags,
          }),
        );
      }
    }
  }
  for (const { count, first } of problems.values()) {
    diagnostics.push(count === 1 ? first : { ...first, message: `${first.message}; the same in ${count - 1} more run × detector combination${count === 2 ? '' : 's'} (their rows carry no value and a flag)` });
  }
  return { rows, diagnostics };
}
