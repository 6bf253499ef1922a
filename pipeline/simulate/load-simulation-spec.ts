import { isNode, LineCounter, parseDocument } from 'yaml';
import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { simulationSpecSchema, type SimulationSpec } from './simulation-spec.js';

/**
 * Parses and validates a simulation spec from YAML text. Every problem — YAML syntax, a schema
 * violation, a failed cross-check — is a diagnostic with the file, line and column of the
 * offending node (or of the nearest enclosing one that exists). `spec` is null when any error
 * was found.
 * @param text the YAML source
 * @param file the path to name in diagnostics
 */
export function loadSimulationSpec(text: string, file: string): { spec: SimulationSpec | null; diagnostics: Diagnostic[] } {
  const lineCounter = new LineCounter();
  const doc = parseDocument(text, { lineCounter, prettyErrors: false, uniqueKeys: true });
  const at = (offset: number) => {
    const pos = lineCounter.linePos(offset);
    return { line: pos.line, column: pos.col };
  };
  const diagnostics: Diagnostic[] = [];
  for (const e of doc.errors) {
    diagnostics.push({ severity: 'error', rule: 'spec-yaml-syntax', stage: 'simulate', file, ...at(e.pos[0]), message: e.message.split('\n')[0]! });
  }
  for (const w of doc.warnings) {
    diagnostics.push({ severity: 'warning', rule: 'spec-yaml-warning', stage: 'simulate', file, ...at(w.pos[0]), message: w.message.split('\n')[0]! });
  }
  if (diagnostics.some((d) => d.severity === 'error')) return { spec: null, diagnostics };
  const parsed = simulationSpecSchema.safeParse(doc.toJS());
  if (parsed.success) return { spec: parsed.data, diagnostics };
  for (const issue of parsed.error.issues) {
    const path = issue.path.map((p) => (typeof p === 'symbol' ? String(p) : p));
    let position: { line: number; column: number } | undefined;
    for (let n = path.length; n >= 0 && position === undefined; n--) {
      const node = n === 0 ? doc.contents : doc.getIn(path.slice(0, n), true);
      if (isNode(node) && node.range) position = at(node.range[0]);
    }
    const where = path.length > 0 ? path.join('.') : '(top level)';
    diagnostics.push({ severity: 'error', rule: 'spec-invalid', stage: 'simulate', file, ...(position ?? {}), message: `${where}: ${issue.message}` });
  }
  return { spec: null, diagnostics };
}
