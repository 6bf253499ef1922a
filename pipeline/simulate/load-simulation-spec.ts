import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { loadYaml, zodIssuesToDiagnostics } from '../core/formats/yaml-source.js';
import { simulationSpecSchema, type SimulationSpec } from './simulation-spec.js';

/**
 * Parses and validates a simulation spec from YAML text with the project's YAML reader: every
 * problem — YAML syntax, a schema violation, a failed cross-check — is a diagnostic with the
 * file, line and column of the offending node. `spec` is null when any error was found.
 * @param text the YAML source
 * @param file the path to name in diagnostics
 */
export function loadSimulationSpec(text: string, file: string): { spec: SimulationSpec | null; diagnostics: Diagnostic[] } {
  const loaded = loadYaml(text, file);
  const diagnostics = loaded.diagnostics.map((d) => ({ ...d, stage: 'simulate' as const }));
  if (loaded.source === null || diagnostics.some((d) => d.severity === 'error')) return { spec: null, diagnostics };
  const parsed = simulationSpecSchema.safeParse(loaded.source.value);
  if (parsed.success) return { spec: parsed.data, diagnostics };
  return { spec: null, diagnostics: [...diagnostics, ...zodIssuesToDiagnostics(parsed.error.issues, loaded.source, 'simulate', 'spec')] };
}
