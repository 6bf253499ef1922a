/**
 * Results of a stopping-power look-up. A look-up never extrapolates silently: outside every valid
 * range it returns `{ ok: false, reason, rule }`, which the caller turns into a Diagnostic (`rule`
 * is meant for Diagnostic.rule, `reason` for its message).
 */

/** Where a stopping value came from. */
export type StoppingMethod = 'nist-compound' | 'bragg' | 'nist-element' | 'user-table' | 'bethe';

/** Stable rule ids of the failures, for Diagnostic.rule. */
export type StoppingFailureRule =
  | 'stopping-below-table'
  | 'stopping-above-table'
  | 'stopping-unknown-element'
  | 'stopping-no-table'
  | 'stopping-unsupported-projectile'
  | 'stopping-bad-input'
  | 'stopping-particle-stopped';

export interface StoppingFailure {
  ok: false;
  reason: string;
  rule: StoppingFailureRule;
}

export interface StoppingValue {
  ok: true;
  /** Total (electronic + nuclear) stopping cross section in eV/(1e15 atoms/cm²), per atom of the material. */
  value: number;
  /** Electronic part, eV/(1e15 atoms/cm²). A user table gives the total, reported here. */
  electronic: number;
  /** Nuclear part, eV/(1e15 atoms/cm²); 0 for a user table and above a NIST table's top energy. */
  nuclear: number;
  /** The method that gave the value; `bethe` when any part of it came from the Bethe formula. */
  method: StoppingMethod;
  /** Labels of the tables used (e.g. `ASTAR GOLD`, `user TiN 1H (stopping.csv)`). */
  tables: string[];
  /** The projectile whose table was read at the same velocity (`1H` for 2H and 3H, `4He` for 3He), when scaled. */
  scaledFrom?: string;
  /** When the Bethe formula was used: Bethe / table - 1 at the table's top energy (largest over the parts). */
  betheMismatchAtTop?: number;
}

export type StoppingResult = StoppingValue | StoppingFailure;

export function stoppingFailure(rule: StoppingFailureRule, reason: string): StoppingFailure {
  return { ok: false, reason, rule };
}
