import { cpSync, mkdtempSync, rmSync, writeFileSync, readFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { reduceSeries } from '../../pipeline/engine/reduce-series.js';

// Contract of the foundation issue: series-level errors stop the series with a diagnostic and write nothing.
const demo = resolve(__dirname, '../../sample-runs/fval-2026-c12-alpha');
const work = mkdtempSync(join(tmpdir(), 'xsred-engine-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('reduceSeries (in-process, one thread)', () => {
  it('stops with exit 2 and writes nothing when every reference spectrum is unusable', async () => {
    const dir = join(work, 'no-usable-reference');
    cpSync(demo, dir, { recursive: true });
    const runlog = readFileSync(join(dir, 'runlog.csv'), 'utf8').split('\n');
    const refs = runlog.filter((l) => l.includes(',reference,')).map((l) => l.split(',')[0]!);
    expect(refs.length).toBeGreaterThan(1);
    for (const r of refs) writeFileSync(join(dir, 'spectra', `${r}.csv`), 'channel,d01,d02,d03,d04\n0,1,2,3,-4\n');
    const out = join(work, 'out1');
    const r = await reduceSeries({ seriesDir: dir, outDir: out, jobs: 1, html: false, commandLine: [] });
    expect(r.exitCode).toBe(2);
    expect(r.diagnostics.some((d) => d.rule === 'series-no-reference-run')).toBe(true);
    expect(r.diagnostics.filter((d) => d.rule === 'spectrum-negative-count').map((d) => d.run).sort()).toEqual([...refs].sort());
    expect(existsSync(out)).toBe(false);
  });
  it('reduces the demo with exit 0 and reports the time of each phase', async () => {
    const r = await reduceSeries({ seriesDir: demo, outDir: join(work, 'out2'), jobs: 1, html: false, commandLine: [] });
    expect(r.exitCode).toBe(0);
    expect(Object.keys(r.phasesMs)).toEqual(['ingest_calibrate', 'plan', 'measure', 'normalize', 'extract', 'audit', 'report', 'write']);
    // 17 sample runs × 4 detectors × 2 peaks (12C and 16O elastic) in the demo spec
    expect(r.counts.rows).toBe(17 * 4 * 2);
  });
  it('reads UTF-16 files with a byte-order mark (spreadsheet "Unicode text" exports) exactly as their UTF-8 originals (common practice of lab PCs)', async () => {
    const dir = join(work, 'utf16');
    cpSync(demo, dir, { recursive: true });
    for (const f of ['runlog.csv', 'scalers.csv', 'spectra/r003.csv']) {
      writeFileSync(join(dir, f), Buffer.from(`\ufeff${readFileSync(join(dir, f), 'utf8')}`, 'utf16le'));
    }
    const a = await reduceSeries({ seriesDir: dir, outDir: join(work, 'out-utf16'), jobs: 1, html: false, commandLine: [] });
    const b = await reduceSeries({ seriesDir: demo, outDir: join(work, 'out-utf8'), jobs: 1, html: false, commandLine: [] });
    expect(a.exitCode).toBe(0);
    expect(a.diagnostics.filter((d) => d.rule === 'text-utf16').map((d) => d.file).sort()).toEqual(['runlog.csv', 'scalers.csv', 'spectra/r003.csv']);
    const table = (o: string) => readFileSync(join(work, o, 'fval-2026-c12-alpha', 'cross_sections.arrow'));
    expect(table('out-utf16').equals(table('out-utf8'))).toBe(true);
    expect(b.exitCode).toBe(0);
  });
});
