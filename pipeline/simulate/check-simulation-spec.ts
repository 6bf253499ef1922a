import type { z } from 'zod';
import { checkSeriesReferences } from '../core/config/check-series-references.js';
import { sampleEnergiesKeV } from './sample-energies.js';
import { scheduleRuns } from './schedule-runs.js';
import type { SimulationSpec } from './simulation-spec.js';
import { energyCurveValue } from './truth-model.js';

type Path = (string | number)[];

/**
 * Cross-field checks of a simulation spec that a per-field schema cannot state: ids unique and
 * referenced ids defined, nuclides known, calibration and scaler entries ordered and complete,
 * run indices inside the plan, every truth curve positive at every planned energy.
 */
export function checkSimulationSpec(spec: SimulationSpec, ctx: z.RefinementCtx): void {
  const issue = (path: Path, message: string) => ctx.addIssue({ code: 'custom', path, message });
  // What a series.yaml must satisfy too (ids, nuclides, references): the shared core checks.
  for (const r of checkSeriesReferences(spec)) if (r.severity === 'error') issue(r.path, r.message);
  const versions = new Set<string>();
  spec.calibrations.forEach((c, i) => {
    if (versions.has(c.version)) issue(['calibrations', i, 'version'], `calibration version "${c.version}" is defined twice`);
    versions.add(c.version);
  });
  const states = new Map<string, string>();
  spec.peaks.forEach((p, i) => {
    const state = `${p.target_nuclide} at Q = ${p.q_value_keV ?? -p.excitation_keV} keV`;
    const first = states.get(state);
    if (first !== undefined) issue(['peaks', i, 'label'], `peak "${p.label}" is the same final state as "${first}" (${state}); declare it once`);
    states.set(state, p.label);
    if (p.excitation_keV > 0 && (p.truth === undefined || !('cm_mb_per_sr' in p.truth))) {
      issue(['peaks', i, 'truth'], `inelastic peak "${p.label}" needs truth: { cm_mb_per_sr: { base, resonances } }`);
    }
  });

  const targetIds = new Set(spec.targets.map((t) => t.id));
  if (spec.normalization.reference_target === undefined) issue(['normalization', 'reference_target'], 'the simulated run plan holds reference runs: name their target in normalization.reference_target (whatever the method)');
  if (!targetIds.has(spec.schedule.sample_target)) issue(['schedule', 'sample_target'], `sample_target "${spec.schedule.sample_target}" is not a target id (${[...targetIds].join(', ')})`);
  else if (spec.schedule.sample_target === spec.normalization.reference_target) issue(['schedule', 'sample_target'], 'sample_target must differ from the reference target');
  if (spec.dead_time.model === 'uniform' && spec.dead_time.live_fraction_min > spec.dead_time.live_fraction_max) {
    issue(['dead_time', 'live_fraction_min'], `live_fraction_min ${spec.dead_time.live_fraction_min} exceeds live_fraction_max ${spec.dead_time.live_fraction_max}`);
  }

  const energies = sampleEnergiesKeV(spec.energies_keV);
  if (energies.length === 0) {
    issue(['energies_keV'], 'no sample energies: `to` is below `from`');
    return;
  }
  const detectorIds = spec.detectors.map((d) => d.id);
  const ordered = (entries: { from_run_index: number }[], prefix: Path) => entries.forEach((e, i) => {
    if (i === 0 && e.from_run_index !== 1) issue([...prefix, 0, 'from_run_index'], `the first entry must start at run index 1, not ${e.from_run_index}`);
    if (i > 0 && e.from_run_index <= entries[i - 1]!.from_run_index) issue([...prefix, i, 'from_run_index'], `from_run_index ${e.from_run_index} must exceed the previous entry's ${entries[i - 1]!.from_run_index}`);
  });
  ordered(spec.calibrations, ['calibrations']);
  ordered(spec.scalers.modes, ['scalers', 'modes']);
  spec.calibrations.forEach((c, i) => {
    const ids = c.detectors.map((d) => d.id);
    for (const id of detectorIds) if (!ids.includes(id)) issue(['calibrations', i, 'detectors'], `version ${c.version} has no entry for detector ${id}`);
    ids.forEach((id, k) => {
      if (!detectorIds.includes(id)) issue(['calibrations', i, 'detectors', k, 'id'], `detector "${id}" is not in detectors (${detectorIds.join(', ')})`);
      if (ids.indexOf(id) !== k) issue(['calibrations', i, 'detectors', k, 'id'], `detector "${id}" appears twice in version ${c.version}`);
    });
  });
  if (spec.schedule.sample_target !== spec.normalization.reference_target && targetIds.has(spec.schedule.sample_target)) {
    const runCount = scheduleRuns(spec).length;
    const inPlan = (index: number, path: Path) => {
      if (index > runCount) issue(path, `run index ${index} is beyond the plan's ${runCount} runs`);
    };
    spec.calibrations.forEach((c, i) => inPlan(c.from_run_index, ['calibrations', i, 'from_run_index']));
    spec.scalers.modes.forEach((m, i) => inPlan(m.from_run_index, ['scalers', 'modes', i, 'from_run_index']));
    spec.defects.forEach((d, i) => inPlan(d.run_index, ['defects', i, 'run_index']));
  }
  spec.defects.forEach((d, i) => {
    if (d.detector !== undefined && !detectorIds.includes(d.detector)) issue(['defects', i, 'detector'], `detector "${d.detector}" is not in detectors (${detectorIds.join(', ')})`);
  });

  const allEnergies = spec.schedule.reference_beam_energy_keV === undefined ? energies : [...energies, spec.schedule.reference_beam_energy_keV];
  spec.peaks.forEach((p, i) => {
    if (p.truth === undefined) return;
    const curve = 'ratio_to_rutherford' in p.truth ? p.truth.ratio_to_rutherford : p.truth.cm_mb_per_sr;
    const bad = allEnergies.find((e) => !(energyCurveValue(curve, e) > 0));
    if (bad !== undefined) issue(['peaks', i, 'truth'], `truth of "${p.label}" is ${energyCurveValue(curve, bad)} at ${bad} keV; it must be > 0 at every planned energy`);
  });
}
