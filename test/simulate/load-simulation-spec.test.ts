import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { stringify } from 'yaml';
import { formatDiagnostic } from '../../pipeline/core/diagnostics/format-diagnostic.js';
import { loadSimulationSpec } from '../../pipeline/simulate/load-simulation-spec.js';
import { smallSpec } from './small-spec.js';

const demoPath = new URL('../../pipeline/simulate/specs/demo.yaml', import.meta.url);

function load(spec: unknown) {
  return loadSimulationSpec(stringify(spec), 'spec.yaml');
}

describe('loadSimulationSpec', () => {
  it('accepts the demo spec without any diagnostic', () => {
    const { spec, diagnostics } = loadSimulationSpec(readFileSync(demoPath, 'utf8'), 'demo.yaml');
    expect(diagnostics).toEqual([]);
    expect(spec?.series).toBe('fval-2026-c12-alpha');
  });

  it('reports a YAML syntax error with its line and column', () => {
    const { spec, diagnostics } = loadSimulationSpec('seed: 1\nseries: [a\n', 'bad.yaml');
    expect(spec).toBeNull();
    // the project's YAML reader names the parser's error code (rules `yaml-…`)
    expect(diagnostics[0]).toMatchObject({ severity: 'error', file: 'bad.yaml' });
    expect(diagnostics[0]!.rule).toMatch(/^yaml-/);
    expect(diagnostics[0]!.line).toBeGreaterThan(1);
  });

  it('points a field error at the offending node: file:line:col of detectors[1].angle_deg', () => {
    const text = stringify(smallSpec()).replace('angle_deg: 135', 'angle_deg: 195');
    const { spec, diagnostics } = loadSimulationSpec(text, 'spec.yaml');
    expect(spec).toBeNull();
    const line = text.split('\n').findIndex((l) => l.includes('angle_deg: 195')) + 1;
    expect(diagnostics).toHaveLength(1);
    expect(diagnostics[0]).toMatchObject({ rule: 'spec-too-big', line, actual: '195' });
    expect(formatDiagnostic(diagnostics[0]!)).toMatch(new RegExp(`^spec\\.yaml:${line}:\\d+: error: detectors\\[1\\]\\.angle_deg: `));
  });

  it('cross-checks: unknown nuclide, inelastic peak without a CM truth, run index beyond the plan, duplicate detector, truth <= 0', () => {
    const base = smallSpec();
    const cases: [unknown, RegExp][] = [
      [{ ...base, peaks: [{ label: 'x', target_nuclide: '12Cx', excitation_keV: 0 }] }, /12Cx/],
      [{ ...base, peaks: [...base.peaks, { label: '12C 4.44', target_nuclide: '12C', excitation_keV: 4438.9 }] }, /needs truth: \{ cm_mb_per_sr/],
      [{ ...base, defects: [{ run_index: 10, kind: 'missing-spectrum' }] }, /run index 10 is beyond the plan's 9 runs/],
      [{ ...base, detectors: [base.detectors[0], base.detectors[0]] }, /detector "d01" is defined twice/],
      [{ ...base, peaks: [{ label: '12C elastic', target_nuclide: '12C', excitation_keV: 0, truth: { ratio_to_rutherford: { base: 0.2, resonances: [{ energy_keV: 2500, fwhm_keV: 50, height: -0.5 }] } } }] }, /must be > 0 at every planned energy/],
      [{ ...base, calibrations: [{ ...base.calibrations[0], from_run_index: 2 }] }, /must start at run index 1/],
      [{ ...base, schedule: { ...base.schedule, sample_target: 'nowhere' } }, /sample_target "nowhere" is not a target id/],
    ];
    for (const [spec, message] of cases) {
      const { spec: parsed, diagnostics } = load(spec);
      expect(parsed).toBeNull();
      expect(diagnostics.map((d) => d.message).join('\n')).toMatch(message);
      expect(diagnostics.every((d) => d.line !== undefined && d.file === 'spec.yaml')).toBe(true);
    }
  });
});
