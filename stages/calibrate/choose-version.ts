import type { CalibrationVersion, RunRecord } from '../../pipeline/core/model/series-model.js';

/** Does a version's validity range cover the run? Run ranges compare runlog positions. */
export function covers(v: CalibrationVersion, r: RunRecord): boolean {
  if (v.fromIndex !== undefined && r.index < v.fromIndex) return false;
  if (v.toIndex !== undefined && r.index > v.toIndex) return false;
  if (v.fromMs !== undefined && !(r.startedAtMs >= v.fromMs)) return false;
  if (v.toMs !== undefined && !(r.startedAtMs <= v.toMs)) return false;
  return true;
}

export type Choice =
  | { ok: true; version: CalibrationVersion }
  | { ok: false; reason: 'none' }
  | { ok: false; reason: 'ambiguous' | 'cycle'; candidates: string[] };

/**
 * Exactly one version must apply (DESIGN.md): among the versions covering the run, drop
 * every one that another covering version names in `supersedes`; one must remain. Two
 * left means an overlap nobody resolved; none left means the covering versions supersede
 * each other in a cycle.
 */
export function chooseVersion(versions: readonly CalibrationVersion[], run: RunRecord): Choice {
  const covering = versions.filter((v) => covers(v, run));
  if (covering.length === 0) return { ok: false, reason: 'none' };
  if (covering.length === 1) return { ok: true, version: covering[0]! };
  const superseded = new Set(covering.flatMap((v) => v.supersedes));
  const left = covering.filter((v) => !superseded.has(v.version));
  if (left.length === 1) return { ok: true, version: left[0]! };
  return { ok: false, reason: left.length === 0 ? 'cycle' : 'ambiguous', candidates: (left.length === 0 ? covering : left).map((v) => v.version).sort() };
}
