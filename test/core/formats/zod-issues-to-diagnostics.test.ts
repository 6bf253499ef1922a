import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { loadYaml } from '../../../pipeline/core/formats/yaml-source.js';
import { formatIssuePath, zodIssuesToDiagnostics } from '../../../pipeline/core/formats/zod-issues-to-diagnostics.js';

// A schema local to this test (the project's series schema lives elsewhere and may change).
const schema = z.strictObject({
  series: z.string().regex(/^[a-z0-9-]+$/, 'series id must hold only a-z, 0-9 and -'),
  detectors: z
    .array(
      z.strictObject({
        id: z.string(),
        angle_deg: z.number().gt(0).lt(180),
      }),
    )
    .min(1),
  normalization: z.strictObject({ screening: z.enum(['lecuyer', 'andersen', 'none']) }),
  composition: z.record(z.string().regex(/^(\d{1,3})?[A-Z][a-z]?$/), z.number()),
});

// Positions below are counted by hand from this text.
const text = [
  'series: Demo_1', //                         line 1
  'detectors:', //                             line 2
  '  - { id: d01, angle_deg: 150.0 }', //      line 3
  '  - id: d02', //                            line 4
  '    angle_deg: -5', //                      line 5
  '  - id: d03', //                            line 6
  '    angle_deg: 150 deg', //                 line 7
  '  - id: d04', //                            line 8
  '    anglee: 30', //                         line 9
  'normalization: { screening: lecuyre }', //  line 10
  'composition: { C: 1, cc: 2 }', //           line 11
  '',
].join('\n');

function diagnose() {
  const { source } = loadYaml(text, 'series.yaml');
  if (source === null) throw new Error('fixture must parse');
  const result = schema.safeParse(source.value);
  if (result.success) throw new Error('fixture must fail the schema');
  return zodIssuesToDiagnostics(result.error.issues, source, 'ingest', 'series');
}

describe('zodIssuesToDiagnostics', () => {
  const byPath = (prefix: string) => diagnose().filter((d) => d.message.startsWith(prefix));

  it('maps a wrong type to the line of the value, quoting what was found', () => {
    const [d] = byPath('detectors[2].angle_deg');
    expect(d).toMatchObject({
      severity: 'error',
      message: 'detectors[2].angle_deg: expected a number, found "150 deg"',
      file: 'series.yaml',
      line: 7,
      column: 16,
      stage: 'ingest',
      rule: 'series-invalid-type',
      expected: 'a number',
      actual: '"150 deg"',
    });
    expect(d.hint).toContain('angle_deg');
  });

  it('rephrases a bound and keeps a schema author’s own message', () => {
    expect(byPath('detectors[1].angle_deg')[0]).toMatchObject({
      message: 'detectors[1].angle_deg: expected a number > 0, found -5',
      line: 5,
      column: 16,
      rule: 'series-too-small',
    });
    expect(byPath('series:')[0]).toMatchObject({
      message: 'series: series id must hold only a-z, 0-9 and -, found "Demo_1"',
      line: 1,
      column: 9,
      rule: 'series-invalid-format',
    });
  });

  it('a missing key points at its parent mapping; an unknown key points at the key', () => {
    const missing = byPath('detectors[3].angle_deg')[0];
    expect(missing).toMatchObject({ message: 'detectors[3].angle_deg: missing; expected a number', line: 8, column: 5 });
    expect(missing.hint).toContain('required');
    expect(byPath('detectors[3]: unknown key')[0]).toMatchObject({
      message: 'detectors[3]: unknown key "anglee"',
      line: 9,
      column: 5,
      rule: 'series-unrecognized-keys',
    });
  });

  it('lists the allowed values of an enum, and refuses a record key at the key', () => {
    expect(byPath('normalization.screening')[0]).toMatchObject({
      message: 'normalization.screening: expected one of "lecuyer", "andersen", "none", found "lecuyre"',
      line: 10,
      column: 29,
      rule: 'series-invalid-value',
      hint: 'use one of: lecuyer, andersen, none',
    });
    expect(byPath('composition.cc')[0]).toMatchObject({ line: 11, column: 22, rule: 'series-invalid-key' });
  });

  it('formats paths with indices and bracketed odd keys', () => {
    expect(formatIssuePath(['targets', 0, 'layers', 1, 'composition', '13C'])).toBe('targets[0].layers[1].composition.13C');
    expect(formatIssuePath(['peaks', 2, 'my label'])).toBe('peaks[2]["my label"]');
  });

  it('accepts hand-made issues with only path and message', () => {
    const { source } = loadYaml('a:\n  b: 3\n', 'x.yaml');
    const [d] = zodIssuesToDiagnostics([{ path: ['a', 'b'], message: 'b must be even' }], source!, 'calibrate', 'cal');
    expect(d).toMatchObject({ message: 'a.b: b must be even, found 3', line: 2, column: 6, rule: 'cal-custom', stage: 'calibrate' });
  });
});
