import { describe, expect, it } from 'vitest';
import { loadYaml, type YamlSource } from '../../../pipeline/core/formats/yaml-source.js';

function mustLoad(text: string): YamlSource {
  const { source, diagnostics } = loadYaml(text, 'series.yaml');
  if (source === null) throw new Error(diagnostics.map((d) => d.message).join('; '));
  expect(diagnostics).toEqual([]);
  return source;
}

// YAML 1.2.2 spec, Example 2.3 "Mapping Scalars to Sequences" (text from memory; the positions
// below are counted by hand from the text as written here, so they do not depend on it).
const example23 = [
  'american:',
  '- Boston Red Sox',
  '- Detroit Tigers',
  '- New York Yankees',
  'national:',
  '- New York Mets',
  '- Chicago Cubs',
  '- Atlanta Braves',
  '',
].join('\n');

// YAML 1.2.2 spec, Example 2.4 "Sequence of Mappings" (text from memory, positions counted by hand).
const example24 = ['-', '  name: Mark McGwire', '  hr:   65', '  avg:  0.278', '-', '  name: Sammy Sosa', '  hr:   63', '  avg:  0.288', ''].join('\n');

describe('loadYaml positions', () => {
  it('locates sequence items under mapping keys (YAML 1.2.2 Example 2.3)', () => {
    const src = mustLoad(example23);
    expect(src.value).toEqual({
      american: ['Boston Red Sox', 'Detroit Tigers', 'New York Yankees'],
      national: ['New York Mets', 'Chicago Cubs', 'Atlanta Braves'],
    });
    expect(src.locate(['national', 1])).toEqual({ line: 7, column: 3 });
    expect(src.locate(['american', 2])).toEqual({ line: 4, column: 3 });
    expect(src.locate(['national'])).toEqual({ line: 6, column: 1 });
    expect(src.locate(['national', '0'])).toEqual({ line: 6, column: 3 });
  });

  it('locates nested keys in a sequence of mappings (YAML 1.2.2 Example 2.4)', () => {
    const src = mustLoad(example24);
    expect(src.locate([1, 'hr'])).toEqual({ line: 7, column: 9 });
    expect(src.locate([0, 'avg'])).toEqual({ line: 4, column: 9 });
    expect(src.locateKey?.([1, 'hr'])).toEqual({ line: 7, column: 3 });
    expect(src.locate([1])).toEqual({ line: 6, column: 3 });
  });

  it('falls back to the nearest existing parent', () => {
    const src = mustLoad(example24);
    expect(src.locate([1, 'team'])).toEqual({ line: 6, column: 3 });
    expect(src.locate([5, 'hr'])).toEqual({ line: 1, column: 1 });
    expect(src.locate([0, 'avg', 'x'])).toEqual({ line: 4, column: 9 });
    expect(src.locate([])).toEqual({ line: 1, column: 1 });
  });

  it('locates values in flow mappings, and an empty value at its key', () => {
    const src = mustLoad('detectors:\n  - { id: d01, angle_deg: 150.0 }\nnote:\n');
    expect(src.locate(['detectors', 0, 'angle_deg'])).toEqual({ line: 2, column: 27 });
    expect(src.locate(['note'])).toEqual({ line: 3, column: 1 });
  });

  it('reads a BOM, CRLF and lone-CR line ends with the same positions (common practice)', () => {
    for (const eol of ['\n', '\r\n', '\r']) {
      const src = mustLoad(`\uFEFFbeam:${eol}  projectile: 4He${eol}  charge_state: 1${eol}`);
      expect(src.value).toEqual({ beam: { projectile: '4He', charge_state: 1 } });
      expect(src.locate(['beam', 'charge_state'])).toEqual({ line: 3, column: 17 });
      expect(src.locate(['beam'])).toEqual({ line: 2, column: 3 });
    }
  });
});

describe('loadYaml refusals', () => {
  it('a syntax error carries the parser position', () => {
    const { source, diagnostics } = loadYaml('beam:\n  projectile: [4He, 3He\nseries: x\n', 'series.yaml');
    expect(source).toBeNull();
    expect(diagnostics.length).toBeGreaterThan(0);
    expect(diagnostics[0]).toMatchObject({ severity: 'error', file: 'series.yaml', line: 3, column: 1 });
    expect(diagnostics[0].rule).toMatch(/^yaml-/);
  });

  it('tabs as indentation are refused at the tab', () => {
    const { diagnostics } = loadYaml('beam:\n\tprojectile: 4He\n', 'series.yaml');
    expect(diagnostics.map((d) => [d.rule, d.line, d.column])).toEqual([['yaml-tab-as-indent', 2, 1]]);
  });

  it('a duplicate key is an error at the second occurrence (YAML 1.2.2 §3.2.1.1: "each of the keys is unique")', () => {
    const { source, diagnostics } = loadYaml('series: demo\ntitle: a\nseries: other\n', 'series.yaml');
    expect(source).toBeNull();
    expect(diagnostics.map((d) => [d.severity, d.rule, d.line, d.column])).toEqual([['error', 'yaml-duplicate-key', 3, 1]]);
    expect(diagnostics[0]).toMatchObject({ message: 'key "series" appears twice in the same mapping', actual: '"series"' });
  });

  it('an empty file or one of only comments holds no document', () => {
    for (const text of ['', '# nothing yet\n']) {
      const { source, diagnostics } = loadYaml(text, 'calibrations/cal-a.yaml');
      expect(source).toBeNull();
      expect(diagnostics.map((d) => [d.rule, d.file, d.line])).toEqual([['yaml-empty', 'calibrations/cal-a.yaml', 1]]);
    }
  });
});
