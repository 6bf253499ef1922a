import type { ReferencePoint } from '../../pipeline/core/model/result-rows.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import { valueAtEstimates, type MeasurementModel } from '../../pipeline/core/normalization/measurement-model.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import type { ScalarOps } from '../../pipeline/core/normalization/scalar-ops.js';
import { chargeScale } from '../../pipeline/core/normalization/shared-inputs.js';
import { microCoulombToParticles } from '../../pipeline/core/physics/units.js';
import { prepareBracketing } from './apply-bracketing.js';
import { runRelUnc } from './reference-point.js';
import type { SharedUncertainties } from './reference-solid-angle-model.js';
import { PROPAGATED_REFERENCE_FLAGS } from './reference-point.js';

export const REFERENCE_RULES = ['bracketing', 'nearest', 'series-mean'] as const;
export type ReferenceRule = (typeof REFERENCE_RULES)[number];

/** Which reference runs normalize a sample run, with their weights (summing to 1). */
export interface RuleChoice {
  referenceRuns: string[];
  weights: number[];
  flags: string[];
}

const usesFlags = (chosen: readonly ReferencePoint[]) => [
  ...new Set(chosen.flatMap((p) => p.flags.filter((f) => PROPAGATED_REFERENCE_FLAGS.has(f)).map((f) => `uses-${f}`))),
];

/**
 * The rule, prepared once per detector from its reference points (unusable ones, with no
 * effective solid angle, are skipped):
 * - bracketing: the nearest run at or before and at or after the sample run, weights linear in
 *   start time (applyBracketing; one-sided at the ends, flag reference-one-sided);
 * - nearest: the one reference run nearest in start time (the earlier one on a tie);
 * - series-mean: every usable reference run, weights w_k ∝ 1/u_k² with u_k the run-independent
 *   uncertainty (counting, live time, beam energy) of ΔΩ_k — the weighted mean (common practice).
 * Returns null when the detector has no usable reference run. The series-mean choice is one
 * object for every sample run (so its model is shared and differentiated once).
 */
export function prepareReferenceRule(rule: ReferenceRule, points: readonly ReferencePoint[]): (sample: RunRecord) => RuleChoice | null {
  const usable = points.filter((p) => p.solidAngleMsr !== null);
  if (rule === 'bracketing') {
    const bracket = prepareBracketing(points);
    return (sample) => {
      const a = bracket(sample);
      return a === null ? null : { referenceRuns: a.referenceRuns, weights: a.weights, flags: a.flags };
    };
  }
  if (usable.length === 0) return () => null;
  if (rule === 'nearest') {
    return (sample) => {
      let best = usable[0]!;
      for (const p of usable) {
        const d = Math.abs(p.startedAtMs - sample.startedAtMs);
        const b = Math.abs(best.startedAtMs - sample.startedAtMs);
        if (d < b || (d === b && p.startedAtMs < best.startedAtMs)) best = p;
      }
      return { referenceRuns: [best.run], weights: [1], flags: usesFlags([best]) };
    };
  }
  const raw = usable.map((p) => 1 / (runRelUnc(p) * p.solidAngleMsr!) ** 2);
  const w = raw.every((x) => Number.isFinite(x) && x > 0) ? raw : usable.map(() => 1);
  const sw = w.reduce((a, b) => a + b, 0);
  const mean: RuleChoice = { referenceRuns: usable.map((p) => p.run), weights: w.map((x) => x / sw), flags: usesFlags(usable) };
  return () => mean;
}

const sums = new WeakMap<RuleChoice, MeasurementModel>();

/**
 * The exposure of a sample run × detector under the reference-run method:
 *   L = g · N_beam · ΔΩ_eff / 10³ (sr),  ΔΩ_eff = Σ_k w_k ΔΩ_k (msr),  N_beam = Q/(q e)
 * with ΔΩ_k the reference runs' models (referenceSolidAngleModel, by run id). The same g,
 * the charge integrator's scale, is in every ΔΩ_k, so it cancels: the charge component
 * vanishes from the budget. Weights are constants (evaluated at the estimates).
 */
export function referenceRunExposure(sample: RunRecord, chargeState: number, choice: RuleChoice, solidAngles: ReadonlyMap<string, MeasurementModel>, shared: SharedUncertainties): RowNormalization {
  let sum = sums.get(choice);
  if (sum === undefined) {
    const parts = choice.referenceRuns.map((r) => {
      const m = solidAngles.get(r);
      if (m === undefined) throw new RangeError(`reference run ${r} has no effective-solid-angle model`);
      return m;
    });
    const w = choice.weights.slice();
    sum = {
      inputs: [],
      parts,
      evaluate<T>(_x: readonly T[], p: readonly T[], ops: ScalarOps<T>): T {
        let s = ops.scale(p[0]!, w[0]!);
        for (let k = 1; k < p.length; k++) s = ops.add(s, ops.scale(p[k]!, w[k]!));
        return s;
      },
    };
    sums.set(choice, sum);
  }
  const beam = microCoulombToParticles(sample.chargeUC, chargeState);
  const exposure: MeasurementModel = {
    inputs: [chargeScale(shared.series, shared.chargeUncRel)],
    parts: [sum],
    evaluate<T>(x: readonly T[], p: readonly T[], ops: ScalarOps<T>): T {
      return ops.mul(ops.scale(x[0]!, beam / 1000), p[0]!);
    },
  };
  const solidAngleMsr = valueAtEstimates(sum);
  return { method: 'reference-run', exposure, referenceRuns: choice.referenceRuns, weights: choice.weights, solidAngleMsr, flags: choice.flags };
}
