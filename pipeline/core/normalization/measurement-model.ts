// Law of propagation of uncertainty, JCGM 100:2008 (GUM) §5.1.3 (u_i(y) = c_i u(x_i)) with c_i by the chain rule through sub-models; JCGM 101:2008 §6 for the input distributions.
import { dualVariable, type Dual } from '../uncertainty/dual.js';
import type { InputDistribution } from '../uncertainty/input-distribution.js';
import { checkComponent, COMPONENT_NAMES, type ComponentName, type CorrelationClass, type UncertaintyComponent } from '../uncertainty/uncertainty-component.js';
import { dualOps, numberOps, type ScalarOps } from './scalar-ops.js';

/**
 * One input quantity of a measurement model: its estimate and standard uncertainty (in the
 * input's own unit), the budget component it belongs to, and how Monte Carlo draws it
 * (`poisson`: a number of counts with the estimate as expectation; `normal` otherwise).
 * Shared inputs (class run, detector or series) are the same quantity wherever their
 * (name, class, key) is the same; an `uncorrelated` input belongs to one row only.
 */
export interface ModelInput {
  name: ComponentName;
  class: CorrelationClass;
  key: string;
  value: number;
  standardUncertainty: number;
  distribution: 'normal' | 'poisson';
}

/**
 * A measurement model y = f(x_own, p_1 … p_m): its own inputs and the values of sub-models
 * ("parts", e.g. a reference run's effective solid angle used by many rows). `evaluate` is
 * written once in ScalarOps, so the value, its derivatives and every Monte Carlo trial come
 * from the same formula.
 */
export interface MeasurementModel {
  readonly inputs: readonly ModelInput[];
  readonly parts: readonly MeasurementModel[];
  evaluate<T>(x: readonly T[], parts: readonly T[], ops: ScalarOps<T>): T;
}

export interface ModelEstimate {
  value: number;
  /** Signed c·u(x) per component, merged over paths for shared inputs, in y's unit; sorted. */
  components: UncertaintyComponent[];
}

const identity = (c: { name: string; class: string; key: string }) => `${c.class}\u0000${c.name}\u0000${c.key}`;
/** A shared input is one quantity per (name, class, key); an uncorrelated one is its own object. */
const leafId = (inp: ModelInput): string | ModelInput => (inp.class === 'uncorrelated' ? inp : identity(inp));

interface Estimate {
  value: number;
  /** Leaf terms (∂y/∂leaf)·u(leaf), in parallel arrays (no object per term: rows are many). */
  inputs: ModelInput[];
  /** leafId of each term's input (kept so a part's terms are not re-identified by every row using it). */
  ids: (string | ModelInput)[];
  values: number[];
  abs: number[];
  paths: number[];
  components: UncertaintyComponent[];
}

/** Dual arithmetic per slot count, made once (the ops hold no state beyond `slots`). */
const dualOpsBySlots: ScalarOps<Dual>[] = [];
const dualOpsFor = (slots: number): ScalarOps<Dual> => (dualOpsBySlots[slots] ??= dualOps(slots));

/** Cache of estimates: a part shared by many rows is differentiated once. */
export type EstimateCache = WeakMap<MeasurementModel, Estimate>;

/**
 * Value and budget of a model, first order: forward-mode duals over its own inputs and one
 * slot per part; a part's terms enter as (∂y/∂p)·(∂p/∂x u(x)), and the terms of one input
 * reached along several paths are added (chain rule). Two inputs with the same shared
 * identity must carry the same estimate and uncertainty (else RangeError). A term that
 * cancels to rounding over several paths (|sum| <= 1e-12 × Σ|terms|) is left out: that input
 * cancels in y (e.g. the charge under the reference-run method).
 */
export function firstOrderEstimate(model: MeasurementModel, cache: EstimateCache = new WeakMap()): ModelEstimate {
  const { value, components } = estimate(model, cache);
  return { value, components };
}

function estimate(model: MeasurementModel, cache: EstimateCache): Estimate {
  const hit = cache.get(model);
  if (hit !== undefined) return hit;
  const parts = model.parts.map((p) => estimate(p, cache));
  const nOwn = model.inputs.length;
  const slots = nOwn + parts.length;
  if (slots === 0) throw new RangeError('a measurement model needs at least one input or part');
  const x: Dual[] = model.inputs.map((inp, i) => dualVariable(inp.value, i, slots));
  const p: Dual[] = parts.map((e, j) => dualVariable(e.value, nOwn + j, slots));
  const y = model.evaluate(x, p, dualOpsFor(slots));
  const out: Estimate = { value: y.value, inputs: [], ids: [], values: [], abs: [], paths: [], components: [] };
  const ids = out.ids;
  /** Terms are few per row: a linear scan finds a repeated identity (same equality as a Map key) without a Map per row. */
  let index: Map<string | ModelInput, number> | null = null;
  const find = (id: string | ModelInput): number => {
    if (index !== null) return index.get(id) ?? -1;
    for (let k = 0; k < ids.length; k++) if (ids[k] === id) return k;
    return -1;
  };
  const addTerm = (input: ModelInput, id: string | ModelInput, value: number, abs: number, paths: number) => {
    const k = find(id);
    if (k < 0) {
      const n = out.inputs.push(input) - 1;
      ids.push(id);
      if (index !== null) index.set(id, n);
      else if (n >= 32) index = new Map(ids.map((d, m) => [d, m]));
      out.values.push(value);
      out.abs.push(abs);
      out.paths.push(paths);
      return;
    }
    const seen = out.inputs[k]!;
    if (seen.value !== input.value || seen.standardUncertainty !== input.standardUncertainty) {
      throw new RangeError(`input "${input.name}" (${input.class} "${input.key}") appears with two estimates (${seen.value} ± ${seen.standardUncertainty} and ${input.value} ± ${input.standardUncertainty}); one shared quantity has one value`);
    }
    out.values[k]! += value;
    out.abs[k]! += abs;
    out.paths[k]! += paths;
  };
  model.inputs.forEach((inp, i) => {
    const u = inp.standardUncertainty;
    if (!(u >= 0) || !Number.isFinite(u)) throw new RangeError(`input "${inp.name}" has standard uncertainty ${u}; expected a finite value >= 0`);
    const v = y.tangent[i]! * u;
    addTerm(inp, leafId(inp), v, Math.abs(v), 1);
  });
  parts.forEach((e, j) => {
    const dy = y.tangent[nOwn + j]!;
    const ady = Math.abs(dy);
    for (let t = 0; t < e.inputs.length; t++) addTerm(e.inputs[t]!, e.ids[t]!, dy * e.values[t]!, ady * e.abs[t]!, e.paths[t]!);
  });
  for (let t = 0; t < out.inputs.length; t++) {
    const input = out.inputs[t]!;
    if (input.standardUncertainty === 0) continue;
    const v = out.values[t]!;
    if (out.paths[t]! > 1 && Math.abs(v) <= 1e-12 * out.abs[t]!) continue;
    const c: UncertaintyComponent = { name: input.name, class: input.class, key: input.key, value: v };
    checkComponent(c);
    out.components.push(c);
  }
  out.components.sort(componentOrder);
  cache.set(model, out);
  return out;
}

/** Rank of each component name (a prototype-free record: an unknown name gives undefined, as a Map would). */
const nameRank: Record<string, number> = Object.assign(Object.create(null) as Record<string, number>, Object.fromEntries(COMPONENT_NAMES.map((n, i) => [n, i])));
const classRank = { uncorrelated: 0, run: 1, detector: 2, series: 3 } as const;

/** Table order: component name as COMPONENT_NAMES lists them, then class, then key. */
export function componentOrder(a: UncertaintyComponent, b: UncertaintyComponent): number {
  return nameRank[a.name]! - nameRank[b.name]! || classRank[a.class] - classRank[b.class] || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0);
}

/** A model reduced to its distinct leaf inputs and a plain-number evaluator (for Monte Carlo). */
export interface FlatModel {
  inputs: ModelInput[];
  distributions: InputDistribution[];
  /** y for one draw of every leaf input (in `inputs` order); `x` is not kept. */
  evaluate(x: ArrayLike<number>): number;
}

/**
 * The leaves of a model tree, a shared input once however many parts use it (so one Monte
 * Carlo draw of it acts on every path, as the correlation requires), and the evaluator.
 */
export function flattenModel(model: MeasurementModel): FlatModel {
  const inputs: ModelInput[] = [];
  const index = new Map<string, number>();
  const byObject = new Map<ModelInput, number>();
  const leafIndex = (inp: ModelInput): number => {
    if (inp.class === 'uncorrelated') {
      let i = byObject.get(inp);
      if (i === undefined) byObject.set(inp, (i = inputs.push(inp) - 1));
      return i;
    }
    const id = identity(inp);
    let i = index.get(id);
    if (i === undefined) index.set(id, (i = inputs.push(inp) - 1));
    return i;
  };
  const build = (m: MeasurementModel): ((x: ArrayLike<number>) => number) => {
    const own = m.inputs.map(leafIndex);
    const parts = m.parts.map(build);
    return (x) => m.evaluate(own.map((i) => x[i]!), parts.map((f) => f(x)), numberOps);
  };
  const evaluate = build(model);
  const distributions: InputDistribution[] = inputs.map((inp) =>
    inp.standardUncertainty === 0
      ? { kind: 'constant', value: inp.value }
      : inp.distribution === 'poisson'
        ? { kind: 'poisson', mean: inp.value }
        : { kind: 'normal', mean: inp.value, standardDeviation: inp.standardUncertainty },
  );
  return { inputs, distributions, evaluate };
}

/** y at the estimates of every input, in plain numbers (the value firstOrderEstimate also returns). */
export function valueAtEstimates(model: MeasurementModel): number {
  return model.evaluate(model.inputs.map((i) => i.value), model.parts.map(valueAtEstimates), numberOps);
}
