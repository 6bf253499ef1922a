import { checkComponent, type UncertaintyComponent } from './uncertainty-component.js';

export interface StatSys {
  /** √(Σ value²) over components of class `uncorrelated`, in the row's unit. */
  stat: number;
  /** √(Σ value²) over the shared classes (run, detector, series), in the row's unit. */
  sys: number;
  /** √(stat² + sys²): the row's combined standard uncertainty (components independent within a row). */
  total: number;
}

/**
 * The `stat` and `sys` columns of a row from its budget (the project's definition, common
 * practice): stat is what no other row shares, sys is everything shared with other rows, each
 * summed in quadrature (JCGM 100:2008 §5.1.2 eq. (10) with unit sensitivities).
 */
export function splitStatSys(components: readonly UncertaintyComponent[]): StatSys {
  let stat2 = 0;
  let sys2 = 0;
  for (const c of components) {
    checkComponent(c);
    if (c.class === 'uncorrelated') stat2 += c.value * c.value;
    else sys2 += c.value * c.value;
  }
  return { stat: Math.sqrt(stat2), sys: Math.sqrt(sys2), total: Math.sqrt(stat2 + sys2) };
}
