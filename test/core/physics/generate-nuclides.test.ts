import { describe, expect, it } from 'vitest';
import { parseAmeFile, parseAmeLine, renderModule, shiftDecimalLeft } from '../../../pipeline/tools/generate-nuclides.js';
import { AME2020_ATOMIC_MASSES } from '../../../pipeline/core/physics/ame2020-masses.js';

// Lines copied verbatim from mass.mas20 (AME2020, Wang et al., Chinese Physics C 45, 030003 (2021)).
const LINES = [
  '0  1    1    0    1  n         8071.31806     0.00044       0.0        0.0     B-    782.3470     0.0004    1 008664.91590     0.00047',
  '  -1    0    1    1 H          7288.971064    0.000013      0.0        0.0     B-      *                    1 007825.031898    0.000014',
  '  -3    0    3    3 Li  -pp   28667#       2000#        -2267#       667#      B-      *                    3 030775#       2147#',
  '   0    6    6   12 C             0.0         0.0        7680.1446     0.0002  B- -17338.0681     0.9999   12 000000.0         0.0',
  '  39  118   79  197 Au       -31139.751       0.542      7915.6548     0.0028  B-   -599.5206     3.2022  196 966570.103       0.581',
];

describe('generate-nuclides: reading the fixed-width mass.mas20 layout', () => {
  it('reads Z, A, symbol and the atomic mass from column 107 in micro-u', () => {
    expect(parseAmeLine(LINES[1])).toEqual({ z: 1, a: 1, symbol: 'H', massU: '1.007825031898', massUncU: '0.000000000014', estimated: false });
    expect(parseAmeLine(LINES[3])).toEqual({ z: 6, a: 12, symbol: 'C', massU: '12', massUncU: '0', estimated: false });
    expect(parseAmeLine(LINES[4])?.massU).toBe('196.966570103');
  });

  it('flags # (value from systematics) as estimated', () => {
    expect(parseAmeLine(LINES[2])).toEqual({ z: 3, a: 3, symbol: 'Li', massU: '3.030775', massUncU: '0.002147', estimated: true });
  });

  it('skips header lines', () => {
    expect(parseAmeLine('N-Z    N    Z   A  EL    O     MASS EXCESS           BINDING ENERGY/A')).toBeUndefined();
    expect(parseAmeLine('')).toBeUndefined();
  });

  it('shifts decimal points exactly', () => {
    expect(shiftDecimalLeft('1007825.031898', 6)).toBe('1.007825031898');
    expect(shiftDecimalLeft('0.00047', 6)).toBe('0.00000000047');
    expect(shiftDecimalLeft('12000000.0', 6)).toBe('12');
    expect(shiftDecimalLeft('2147', 6)).toBe('0.002147');
  });

  it('renders rows that the committed table contains verbatim', () => {
    const rendered = renderModule(parseAmeFile(LINES.join('\n')));
    for (const row of ['0 1 1.0086649159 0.00000000047', '3 3 3.030775 0.002147 #', '79 197 196.966570103 0.000000581']) {
      expect(rendered).toContain(`\n${row}\n`);
      expect(AME2020_ATOMIC_MASSES).toContain(`\n${row}\n`);
    }
  });

  it('the committed table holds all 3558 nuclides of mass.mas20 (count of its data lines)', () => {
    expect(AME2020_ATOMIC_MASSES.trim().split('\n')).toHaveLength(3558);
  });

  it('rejects a symbol that disagrees with the element table', () => {
    expect(() => parseAmeFile(LINES[1].replace(' H ', ' He'))).toThrow(/symbol "He"/);
  });
});
