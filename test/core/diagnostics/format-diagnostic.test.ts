import { describe, expect, it } from 'vitest';
import { formatDiagnostic } from '../../../pipeline/core/diagnostics/format-diagnostic.js';

describe('formatDiagnostic', () => {
  it('pins the file:line:col: severity: message [rule] format (common practice of compilers, GNU Coding Standards §4.4)', () => {
    const text = formatDiagnostic({
      severity: 'error',
      message: 'count is negative: "-3"',
      file: 'spectra/r007.csv',
      line: 12,
      column: 9,
      run: 'r007',
      detector: 'd02',
      rule: 'spectrum-negative-count',
      expected: 'a non-negative integer',
      actual: '-3',
      hint: 'check the export settings of the acquisition',
    });
    expect(text).toBe(
      'spectra/r007.csv:12:9: error: count is negative: "-3" [spectrum-negative-count] (run r007, detector d02)\n' +
        '  expected: a non-negative integer; found: -3\n' +
        '  hint: check the export settings of the acquisition',
    );
  });
  it('leaves out missing position parts', () => {
    expect(formatDiagnostic({ severity: 'warning', message: 'm', rule: 'r', file: 'a.csv' })).toBe('a.csv: warning: m [r]');
    expect(formatDiagnostic({ severity: 'info', message: 'm', rule: 'r', file: 'a.csv', line: 3 })).toBe('a.csv:3: info: m [r]');
    expect(formatDiagnostic({ severity: 'info', message: 'm', rule: 'r' })).toBe('info: m [r]');
  });
});
