import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { AppliedNormalization, ReferencePoint } from '../../pipeline/core/model/result-rows.js';
import { PROPAGATED_REFERENCE_FLAGS } from './reference-point.js';

/**
 * The `bracketing` rule: a sample run at time t uses the nearest usable reference run at or
 * before t and the nearest at or after t, interpolated linearly in time,
 *   ΔΩ(t) = (1 − w) ΔΩ_before + w ΔΩ_after,  w = (t − t_before)/(t_after − t_before),
 * so a slow drift of the charge integration or the geometry is followed. Before the first
 * or after the last reference run, the nearest one alone is used (flag `reference-one-sided`).
 * Independent parts combine as sqrt(Σ (w_i ΔΩ_i u_i)²)/ΔΩ; shared parts linearly.
 */
export function applyBracketing(sample: RunRecord, points: readonly ReferencePoint[]): AppliedNormalization | null {
  return prepareBracketing(points)(sample);
}

/**
 * The same rule, prepared once per detector: usable points sorted by start time (stable, so
 * runlog order breaks ties), then two binary searches per sample run — O(log n) per run
 * instead of a scan of every reference run.
 */
export function prepareBracketing(points: readonly ReferencePoint[]): (sample: RunRecord) => AppliedNormalization | null {
  const usable = points
    .map((p, i) => ({ p, i }))
    .filter(({ p }) => p.solidAngleMsr !== null)
    .sort((a, b) => a.p.startedAtMs - b.p.startedAtMs || a.i - b.i)
    .map(({ p }) => p);
  const firstAtOrAfter = (t: number) => {
    let lo = 0;
    let hi = usable.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (usable[mid]!.startedAtMs < t) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  const firstAfter = (t: number) => {
    let lo = 0;
    let hi = usable.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (usable[mid]!.startedAtMs <= t) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  return (sample) => {
    if (usable.length === 0) return null;
    const t = sample.startedAtMs;
    const before = usable[firstAfter(t) - 1];
    const after = usable[firstAtOrAfter(t)];
    return combine(before, after, t);
  };
}

function combine(before: ReferencePoint | undefined, after: ReferencePoint | undefined, t: number): AppliedNormalization {
  const flags: string[] = [];
  let chosen: { p: ReferencePoint; w: number }[];
  if (before && after && before !== after && after.startedAtMs > before.startedAtMs) {
    const w = (t - before.startedAtMs) / (after.startedAtMs - before.startedAtMs);
    chosen = [
      { p: before, w: 1 - w },
      { p: after, w },
    ];
  } else {
    const only = before ?? after!;
    if (!(before && after)) flags.push('reference-one-sided');
    chosen = [{ p: only, w: 1 }];
  }
  const value = chosen.reduce((s, c) => s + c.w * c.p.solidAngleMsr!, 0);
  const quad = (f: (p: ReferencePoint) => number) => Math.sqrt(chosen.reduce((s, c) => s + (c.w * c.p.solidAngleMsr! * f(c.p)) ** 2, 0)) / value;
  const lin = (f: (p: ReferencePoint) => number) => chosen.reduce((s, c) => s + c.w * c.p.solidAngleMsr! * f(c.p), 0) / value;
  for (const c of chosen) for (const f of c.p.flags) if (PROPAGATED_REFERENCE_FLAGS.has(f)) flags.push(`uses-${f}`);
  return {
    solidAngleMsr: value,
    referenceRuns: chosen.map((c) => c.p.run),
    weights: chosen.map((c) => c.w),
    relCounting: quad((p) => p.relCounting),
    relLive: quad((p) => p.relLive),
    relEnergy: quad((p) => p.relEnergy),
    relAreal: lin((p) => p.relAreal),
    dLnSigmaDThetaPerDeg: lin((p) => p.dLnSigmaDThetaPerDeg),
    flags: [...new Set(flags)],
  };
}
