import type { SeriesConfig } from '../../pipeline/core/config/series-schema.js';
import type { PeakRequest } from '../../pipeline/core/counting/peak-window.js';
import type { SeriesPeakPlanner } from '../../pipeline/core/kinematics/series-peak-planner.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import { planReferenceWindow } from './plan-reference-window.js';

export interface NormalizingWindows {
  /** Windows of the normalizing element's elastic peak to measure in this run (key referenceKey(element)). */
  requests: PeakRequest[];
  /** Detectors where the peak cannot be placed, with the reason. */
  problems: { detector: string; problem: string }[];
}

/**
 * Which spectra of a run hold the normalizing peak, by method: a reference run, in every
 * detector (reference-run, monitor); a sample run, in every detector (internal-reference: the
 * role: reference layer of the sample target) or in the monitor detector only (monitor: the
 * reference element in the sample target). Nothing for absolute or without an element.
 */
export function planNormalizingWindows(config: SeriesConfig, planner: SeriesPeakPlanner, element: string | null, run: RunRecord): NormalizingWindows {
  const out: NormalizingWindows = { requests: [], problems: [] };
  const n = config.normalization;
  if (element === null || n.method === 'absolute') return out;
  let targetId: string | undefined;
  let detectors = config.detectors;
  if (run.kind === 'reference') {
    if (n.method === 'internal-reference') return out;
    targetId = n.reference_target;
  } else if (run.kind === 'sample' && n.method !== 'reference-run') {
    targetId = run.target;
    if (n.method === 'monitor') detectors = detectors.filter((d) => d.id === n.monitor_detector);
  }
  const target = config.targets.find((t) => t.id === targetId);
  if (target === undefined) return out;
  for (const d of detectors) {
    const w = planReferenceWindow(planner, target, { element, nuclides: [], atomsPerCm2: 0, relUnc: 0 }, d, run.beamEnergyKeV);
    if (w.problem !== undefined) out.problems.push({ detector: d.id, problem: w.problem });
    out.requests.push(w.request);
  }
  return out;
}
