import type { Diagnostic } from './diagnostic.js';

/**
 * Formats a diagnostic the way compilers do, so editors and terminals can jump to it:
 *
 *   file:line:col: severity: message [rule] (run r007, detector d02)
 *     expected: …; found: …
 *     hint: …
 *
 * Missing position parts are left out (`file: severity: …`, `file:line: severity: …`).
 */
export function formatDiagnostic(d: Diagnostic): string {
  let where = '';
  if (d.file !== undefined) {
    where = d.file;
    if (d.line !== undefined) {
      where += `:${d.line}`;
      if (d.column !== undefined) where += `:${d.column}`;
    }
    where += ': ';
  }
  const context: string[] = [];
  if (d.run !== undefined) context.push(`run ${d.run}`);
  if (d.detector !== undefined) context.push(`detector ${d.detector}`);
  let text = `${where}${d.severity}: ${d.message} [${d.rule}]`;
  if (context.length > 0) text += ` (${context.join(', ')})`;
  const detail: string[] = [];
  if (d.expected !== undefined) detail.push(`expected: ${d.expected}`);
  if (d.actual !== undefined) detail.push(`found: ${d.actual}`);
  if (detail.length > 0) text += `\n  ${detail.join('; ')}`;
  if (d.hint !== undefined) text += `\n  hint: ${d.hint}`;
  return text;
}
