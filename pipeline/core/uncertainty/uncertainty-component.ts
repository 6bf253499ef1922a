/**
 * The uncertainty budget of one result row: named components, each with the correlation class
 * that says which other rows share it (the classes of the project's budget; the split into
 * uncorrelated and shared parts follows JCGM 100:2008 §5.2 and is common practice).
 */

/** The fixed component names, in the order tables list them. */
export const COMPONENT_NAMES = [
  'counting',
  'background',
  'reference_counting',
  'reference_spread',
  'reference_areal_density',
  'sample_areal_density',
  'areal_density_ratio',
  'charge',
  'live_time',
  'screening',
  'beam_energy',
  'angle',
  'solid_angle',
  'calibration',
] as const;

export type ComponentName = (typeof COMPONENT_NAMES)[number];

/**
 * uncorrelated: belongs to this row alone (ρ = 0 with every other row);
 * run: shared, fully correlated (ρ = 1), by every row of the run named by `key`;
 * detector: shared by every row of the detector named by `key`;
 * series: shared by every row of the series named by `key`.
 */
export const CORRELATION_CLASSES = ['uncorrelated', 'run', 'detector', 'series'] as const;

export type CorrelationClass = (typeof CORRELATION_CLASSES)[number];

export interface UncertaintyComponent {
  name: ComponentName;
  /**
   * The component's contribution c·u(x) to the row's value, in the row's unit (absolute, not
   * relative). Its magnitude is the standard uncertainty; its sign (that of the sensitivity c)
   * matters only for covariances between rows that share it.
   */
  value: number;
  class: CorrelationClass;
  /** Run id, detector id or series id that shares it; ignored for `uncorrelated`. */
  key: string;
}

const NAMES = new Set<string>(COMPONENT_NAMES);
const CLASSES = new Set<string>(CORRELATION_CLASSES);

/** Throws a RangeError naming the offending field when a component is not one of the fixed names/classes or its value is not finite. */
export function checkComponent(c: UncertaintyComponent): void {
  if (!NAMES.has(c.name)) throw new RangeError(`unknown uncertainty component "${c.name}"; expected one of ${COMPONENT_NAMES.join(', ')}`);
  if (!CLASSES.has(c.class)) throw new RangeError(`unknown correlation class "${c.class}" for component "${c.name}"; expected one of ${CORRELATION_CLASSES.join(', ')}`);
  if (!Number.isFinite(c.value)) throw new RangeError(`component "${c.name}" has value ${c.value}; expected a finite number`);
  if (c.class !== 'uncorrelated' && c.key === '') throw new RangeError(`component "${c.name}" of class "${c.class}" needs the key of the ${c.class} that shares it`);
}
