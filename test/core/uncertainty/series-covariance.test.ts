import { describe, expect, it } from 'vitest';
import { covarianceFactors } from '../../../pipeline/core/uncertainty/covariance-factors.js';
import { denseCovariance } from '../../../pipeline/core/uncertainty/dense-covariance.js';
import { forEachCovarianceEntry } from '../../../pipeline/core/uncertainty/for-each-covariance-entry.js';
import { isPositiveSemidefinite } from '../../../pipeline/core/uncertainty/is-positive-semidefinite.js';
import { seriesCovariance } from '../../../pipeline/core/uncertainty/series-covariance.js';
import { splitStatSys } from '../../../pipeline/core/uncertainty/split-stat-sys.js';
import type { UncertaintyComponent } from '../../../pipeline/core/uncertainty/uncertainty-component.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';

/** A small series: 3 runs × 2 detectors, one row each, with every class present (values in mb/sr, seeded). */
function demoRows(): UncertaintyComponent[][] {
  const rng = Xoshiro128StarStar.fromSeed(2024);
  const rows: UncertaintyComponent[][] = [];
  for (const run of ['r1', 'r2', 'r3']) {
    for (const det of ['d1', 'd2']) {
      const v = (): number => 0.1 + rng.nextFloat64();
      rows.push([
        { name: 'counting', value: v(), class: 'uncorrelated', key: '' },
        { name: 'background', value: v(), class: 'uncorrelated', key: '' },
        { name: 'charge', value: v(), class: 'run', key: run },
        { name: 'live_time', value: v(), class: 'run', key: run },
        { name: 'angle', value: det === 'd1' ? v() : -v(), class: 'detector', key: det },
        { name: 'sample_areal_density', value: v(), class: 'series', key: 's' },
      ]);
    }
  }
  return rows;
}

/** Independent brute-force definition: Σ over component pairs with equal (name, class, key) of a shared class. */
function bruteForce(rows: UncertaintyComponent[][]): number[][] {
  return rows.map((a, i) => rows.map((b, j) => {
    let s = 0;
    for (const ca of a) for (const cb of b) {
      if (ca.class === 'uncorrelated') {
        if (i === j && ca === cb) s += ca.value * ca.value;
        continue;
      }
      if (ca.name === cb.name && ca.class === cb.class && ca.key === cb.key) s += ca.value * cb.value;
    }
    return s;
  }));
}

describe('seriesCovariance (shared components, ρ = 1 within a group; JCGM 100:2008 §F.1.2.3)', () => {
  it('equals the brute-force pairwise definition entry by entry', () => {
    const rows = demoRows();
    const dense = denseCovariance(seriesCovariance(rows));
    const ref = bruteForce(rows);
    for (let i = 0; i < rows.length; i++) for (let j = 0; j < rows.length; j++) expect(dense[i]![j]).toBeCloseTo(ref[i]![j]!, 13);
  });

  it('is symmetric positive semi-definite and its diagonal equals the squared total of each row (stat² + sys²)', () => {
    const rows = demoRows();
    const dense = denseCovariance(seriesCovariance(rows));
    expect(isPositiveSemidefinite(dense)).toEqual({ psd: true, reason: '' });
    rows.forEach((r, i) => expect(dense[i]![i]).toBeCloseTo(splitStatSys(r).total ** 2, 13));
    for (let i = 0; i < rows.length; i++) for (let j = 0; j < i; j++) expect(dense[i]![j]).toBe(dense[j]![i]);
  });

  it('gives cov(d1, d2 of the same run) = charge·charge + live·live + areal·areal; rows of different runs and detectors share only the series term', () => {
    const rows = demoRows();
    const dense = denseCovariance(seriesCovariance(rows));
    const val = (i: number, n: string): number => rows[i]!.find((c) => c.name === n)!.value;
    const sameRun = ['charge', 'live_time', 'sample_areal_density'].reduce((s, n) => s + val(0, n) * val(1, n), 0);
    expect(dense[0]![1]).toBeCloseTo(sameRun, 14);
    expect(dense[0]![3]).toBeCloseTo(val(0, 'sample_areal_density') * val(3, 'sample_areal_density'), 14);
    // Same detector (d1) in runs r1 and r2: angle (same sign) plus the series term.
    expect(dense[0]![2]).toBeCloseTo(val(0, 'angle') * val(2, 'angle') + val(0, 'sample_areal_density') * val(2, 'sample_areal_density'), 14);
  });

  it('is ordered by i then j with i ≤ j, lists every diagonal entry, and leaves rows that share nothing out', () => {
    const rows: UncertaintyComponent[][] = [
      [{ name: 'counting', value: 2, class: 'uncorrelated', key: '' }, { name: 'charge', value: 1, class: 'run', key: 'a' }],
      [{ name: 'counting', value: 3, class: 'uncorrelated', key: '' }],
      [{ name: 'charge', value: 0.5, class: 'run', key: 'a' }],
      [],
    ];
    const long = seriesCovariance(rows);
    expect(Array.from(long.i)).toEqual([0, 0, 1, 2, 3]);
    expect(Array.from(long.j)).toEqual([0, 2, 1, 2, 3]);
    expect(Array.from(long.covariance)).toEqual([5, 0.5, 9, 0.25, 0]);
  });

  it('stays sparse for 10⁴ rows sharing only per-run components: n + Σ_runs C(k, 2) entries (k = 16 detectors per run)', () => {
    const runs = 625;
    const perRun = 16;
    const rows: UncertaintyComponent[][] = [];
    for (let r = 0; r < runs; r++) for (let d = 0; d < perRun; d++) rows.push([
      { name: 'counting', value: 1, class: 'uncorrelated', key: '' },
      { name: 'live_time', value: 0.1, class: 'run', key: `r${r}` },
    ]);
    const long = seriesCovariance(rows);
    expect(long.i.length).toBe(rows.length + (runs * perRun * (perRun - 1)) / 2);
    expect(long.covariance[0]).toBeCloseTo(1.01, 14);
    expect(long.covariance[1]).toBeCloseTo(0.01, 14);
  });

  it('streams a dense series-class matrix of 2000 rows row by row in column order (2001000 entries)', () => {
    const rows: UncertaintyComponent[][] = Array.from({ length: 2000 }, (_, i) => [
      { name: 'counting', value: 1, class: 'uncorrelated', key: '' },
      { name: 'reference_areal_density', value: 0.01 * (1 + (i % 7)), class: 'series', key: 'x' },
    ]);
    let count = 0;
    let ordered = true;
    let lastI = -1;
    let lastJ = -1;
    forEachCovarianceEntry(covarianceFactors(rows), (i, j, c) => {
      if (i < lastI || (i === lastI && j <= lastJ) || j < i) ordered = false;
      if (i !== j && Math.abs(c - 1e-4 * (1 + (i % 7)) * (1 + (j % 7))) > 1e-16) ordered = false;
      lastI = i;
      lastJ = j;
      count += 1;
    });
    expect(ordered).toBe(true);
    expect(count).toBe((2000 * 2001) / 2);
  });

  it('rejects a row carrying the same shared component twice, an unknown name and a shared class without key', () => {
    const dup: UncertaintyComponent[][] = [[
      { name: 'charge', value: 1, class: 'run', key: 'a' },
      { name: 'charge', value: 2, class: 'run', key: 'a' },
    ]];
    expect(() => seriesCovariance(dup)).toThrow(/twice/);
    expect(() => seriesCovariance([[{ name: 'nonsense' as 'charge', value: 1, class: 'run', key: 'a' }]])).toThrow(/unknown uncertainty component/);
    expect(() => seriesCovariance([[{ name: 'charge', value: 1, class: 'run', key: '' }]])).toThrow(/needs the key/);
  });
});

describe('isPositiveSemidefinite (Cholesky with tolerance; Golub & Van Loan 2013, §4.2)', () => {
  it('accepts a singular PSD matrix [[1, 1], [1, 1]] and rejects [[1, 2], [2, 1]] (eigenvalues 3 and −1) and an asymmetric one', () => {
    expect(isPositiveSemidefinite([[1, 1], [1, 1]]).psd).toBe(true);
    expect(isPositiveSemidefinite([[1, 2], [2, 1]]).psd).toBe(false);
    expect(isPositiveSemidefinite([[1, 0.5], [0.4, 1]]).psd).toBe(false);
    expect(isPositiveSemidefinite([[0, 1], [1, 0]]).psd).toBe(false);
  });
});
