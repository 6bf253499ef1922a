import type { Dual } from './dual.js';
import { checkComponent, type ComponentName, type CorrelationClass, type UncertaintyComponent } from './uncertainty-component.js';

/** One model input as a budget entry: which component it is, who shares it, and u(x) in the input's unit. */
export interface BudgetInput {
  name: ComponentName;
  class: CorrelationClass;
  key: string;
  standardUncertainty: number;
}

/**
 * The budget of one row from its dual value y (tangent slot i ↔ inputs[i]):
 * value_i = (∂y/∂x_i) · u(x_i), signed, in y's unit (JCGM 100:2008 §5.1.3, u_i(y) = c_i u(x_i)).
 * Inputs with u(x_i) = 0 are left out.
 */
export function budgetFromGradient(y: Dual, inputs: readonly BudgetInput[]): UncertaintyComponent[] {
  if (y.slots !== inputs.length) throw new RangeError(`dual has ${y.slots} tangent slots but ${inputs.length} budget inputs were given`);
  const out: UncertaintyComponent[] = [];
  for (let i = 0; i < inputs.length; i++) {
    const x = inputs[i]!;
    if (!(x.standardUncertainty >= 0) || !Number.isFinite(x.standardUncertainty)) throw new RangeError(`budget input "${x.name}" has standard uncertainty ${x.standardUncertainty}; expected a finite value >= 0`);
    if (x.standardUncertainty === 0) continue;
    const c: UncertaintyComponent = { name: x.name, value: y.tangent[i]! * x.standardUncertainty, class: x.class, key: x.key };
    checkComponent(c);
    out.push(c);
  }
  return out;
}
