import { describe, expect, it } from 'vitest';
import { calibrate } from '../../stages/calibrate/index.js';
import type { CalibrationVersion, RunRecord } from '../../pipeline/core/model/series-model.js';

// Version-selection rules of the input contract (DESIGN.md, calibrations/*.yaml): a fact of this project's contract.
const cal = { version: '', offsetKeV: 0, gainKeVPerChannel: 1, quadraticKeVPerChannel2: 0, covariance: [[0, 0], [0, 0]] };
const v = (version: string, o: Partial<CalibrationVersion>): CalibrationVersion => ({ version, file: `calibrations/${version}.yaml`, supersedes: [], detectors: new Map([['d01', { ...cal, version }]]), ...o });
const run = (i: number, t = Date.UTC(2026, 2, 1, i)): RunRecord => ({ run: `r${String(i).padStart(3, '0')}`, index: i, line: i + 2, startedAt: '', startedAtMs: t, kind: 'sample', target: 'x', beamEnergyKeV: 2000, beamEnergyUncKeV: 1, chargeUC: 1, realTimeS: 1, note: '' });
const runs = [0, 1, 2, 3, 4, 5].map((i) => run(i));
const choose = (versions: CalibrationVersion[]) => calibrate({ runs, versions, detectorIds: ['d01'], runlogFile: 'runlog.csv' });

describe('calibrate: one version per run', () => {
  it('picks by run position, inclusive at both ends, open-ended when valid_to_run is absent', () => {
    const out = choose([v('a', { fromIndex: 0, toIndex: 2 }), v('b', { fromIndex: 3 })]);
    expect(runs.map((r) => out.byRun.get(r.run)?.version)).toEqual(['a', 'a', 'a', 'b', 'b', 'b']);
    expect(out.setAside.size).toBe(0);
  });
  it('picks by time range', () => {
    const out = choose([v('t', { fromMs: Date.UTC(2026, 2, 1, 2), toMs: Date.UTC(2026, 2, 1, 3) })]);
    expect([...out.byRun.keys()]).toEqual(['r002', 'r003']);
    expect(out.setAside.get('r000')?.[0]?.rule).toBe('calibration-none');
  });
  it('a version that supersedes another wins where both cover the run', () => {
    const out = choose([v('old', { fromIndex: 0 }), v('new', { fromIndex: 2, toIndex: 3, supersedes: ['old'] })]);
    expect(runs.map((r) => out.byRun.get(r.run)?.version)).toEqual(['old', 'old', 'new', 'new', 'old', 'old']);
  });
  it('an unresolved overlap sets the run aside and names both versions', () => {
    const out = choose([v('a', { fromIndex: 0, toIndex: 3 }), v('b', { fromIndex: 3 })]);
    const d = out.setAside.get('r003')![0]!;
    expect(d.rule).toBe('calibration-ambiguous');
    expect(d.message).toContain('a, b');
    expect(d.line).toBe(5);
    expect(out.byRun.get('r004')?.version).toBe('b');
  });
  it('a supersedes cycle sets the run aside', () => {
    const out = choose([v('a', { supersedes: ['b'] }), v('b', { supersedes: ['a'] })]);
    expect(out.setAside.get('r000')?.[0]?.rule).toBe('calibration-cycle');
  });
  it('a version without the run\'s detector sets it aside', () => {
    const out = calibrate({ runs, versions: [v('a', {})], detectorIds: ['d01', 'd02'], runlogFile: 'runlog.csv' });
    expect(out.setAside.get('r000')?.[0]?.rule).toBe('calibration-missing-detector');
  });
});
