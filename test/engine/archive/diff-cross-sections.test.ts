import * as arrow from 'apache-arrow';
import { describe, expect, it } from 'vitest';
import { summarizeDiff } from '../../../pipeline/engine/archive/change-summary.js';
import { diffCrossSections } from '../../../pipeline/engine/archive/diff-cross-sections.js';
import { diffTable } from '../../../pipeline/engine/archive/diff-versions.js';
import { formatDiff } from '../../../pipeline/engine/archive/format-diff.js';

interface Row {
  run: string;
  detector: string;
  peak: string;
  lab: number | null;
  labStat: number;
  labSys: number;
  flags: string;
}

/** A cross_sections-like table with the columns the diff reads (cm and ratio left null). */
function table(rows: Row[]): arrow.Table {
  const nulls = () => rows.map(() => null);
  const t = arrow.tableFromArrays({
    run: rows.map((r) => r.run),
    detector: rows.map((r) => r.detector),
    peak: rows.map((r) => r.peak),
    cross_section_lab_mb_per_sr: Float64Array.from(rows.map((r) => r.lab ?? Number.NaN)),
    cross_section_lab_stat_mb_per_sr: Float64Array.from(rows.map((r) => r.labStat)),
    cross_section_lab_sys_mb_per_sr: Float64Array.from(rows.map((r) => r.labSys)),
    cross_section_cm_mb_per_sr: nulls(),
    ratio_to_rutherford: nulls(),
    flags: rows.map((r) => r.flags),
  } as never);
  return t as unknown as arrow.Table;
}

const base: Row[] = [
  { run: 'r002', detector: 'd01', peak: '12C elastic', lab: 10, labStat: 0.3, labSys: 0.4, flags: '' },
  { run: 'r002', detector: 'd02', peak: '12C elastic', lab: 20, labStat: 1, labSys: 0, flags: '' },
  { run: 'r003', detector: 'd01', peak: '12C elastic', lab: 30, labStat: 1, labSys: 0, flags: '' },
  { run: 'r004', detector: 'd01', peak: '12C elastic', lab: 40, labStat: 1, labSys: 0, flags: '' },
];

describe('diffCrossSections: rows matched by (run, detector, peak), shifts in combined standard uncertainties', () => {
  const next: Row[] = [
    // 10 ± 0.5 (0.3 ⊕ 0.4) → 11 ± 1.0 (0.6 ⊕ 0.8): shift = 1/√(0.5² + 1²) = 0.894427191 (worked example, by hand)
    { ...base[0]!, lab: 11, labStat: 0.6, labSys: 0.8 },
    base[1]!,
    // 30 ± 1 → 35 ± 1: shift = 5/√2 = 3.535533906 (by hand)
    { ...base[2]!, lab: 35 },
    { run: 'r005', detector: 'd01', peak: '12C elastic', lab: 50, labStat: 1, labSys: 0, flags: '' },
  ];
  next.splice(1, 1, { ...base[1]!, flags: 'uses-reference-outlier' });
  const diff = diffCrossSections(table(base), table(next));

  it('lists moved, relabelled, added and removed rows and leaves unchanged ones out', () => {
    expect(diff.rows.map((r) => [r.run, r.detector, r.change])).toEqual([
      ['r002', 'd01', 'moved'],
      ['r002', 'd02', 'relabelled'],
      ['r003', 'd01', 'moved'],
      ['r005', 'd01', 'added'],
      ['r004', 'd01', 'removed'],
    ]);
    expect(diff.matched).toBe(3);
    expect(diff.rows[1]!.changedColumns).toEqual(['flags']);
  });

  it('gives (new − old)/√(u_old² + u_new²) with u = stat ⊕ sys (hand-computed values)', () => {
    expect(diff.rows[0]!.quantities.cross_section_lab.shiftSigma).toBeCloseTo(0.894427191, 9);
    expect(diff.rows[0]!.quantities.cross_section_lab.uncFrom).toBeCloseTo(0.5, 12);
    expect(diff.rows[2]!.quantities.cross_section_lab.shiftSigma).toBeCloseTo(3.535533906, 9);
    expect(diff.rows[1]!.quantities.cross_section_lab.shiftSigma).toBe(0);
    expect(diff.rows[3]!.quantities.cross_section_lab.shiftSigma).toBeNull();
  });

  it('summarizes: counts beyond 1σ and 3σ and the largest shift', () => {
    const s = summarizeDiff(diff, 'v000001', 'v000002');
    expect(s).toMatchObject({ moved: 2, relabelled: 1, added: 1, removed: 1, beyond1Sigma: 1, beyond3Sigma: 1 });
    expect(s.largest).toMatchObject({ run: 'r003', detector: 'd01', quantity: 'cross_section_lab' });
    expect(s.largest!.shiftSigma).toBeCloseTo(3.535533906, 9);
    const text = formatDiff(diff, s);
    expect(text).toMatch(/v000001 → v000002: 4 → 4 rows; 2 moved, 1 relabelled, 1 added, 1 removed, 0 unchanged/);
    expect(text).toMatch(/r003 +d01 +12C elastic +moved +dσ\/dΩ lab +30\.000 +35\.000 +\+3\.54/);
  });

  it('writes diff.arrow with units and descriptions in the field metadata', () => {
    const t = arrow.tableFromIPC(arrow.tableToIPC(diffTable(diff, 'test', 'v000001', 'v000002'), 'file'));
    expect(t.numRows).toBe(5);
    const f = t.schema.fields.find((x) => x.name === 'cross_section_lab_shift_sigma')!;
    expect(f.metadata.get('unit')).toBe('1');
    expect(t.schema.fields.find((x) => x.name === 'cross_section_lab_from_mb_per_sr')!.metadata.get('unit')).toBe('mb/sr');
    expect(t.getChild('change')!.toArray()).toEqual(['moved', 'relabelled', 'moved', 'added', 'removed']);
  });

  it('two identical tables give an empty diff', () => {
    const d = diffCrossSections(table(base), table(base));
    expect(d.rows).toEqual([]);
    expect(d.matched).toBe(4);
  });
});
