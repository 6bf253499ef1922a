import { mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { FileHashCache } from '../../../pipeline/engine/archive/file-hash-cache.js';
import { Ledger } from '../../../pipeline/engine/archive/ledger.js';
import { decodeResult, encodeResult, measureKey } from '../../../pipeline/engine/archive/measure-cache.js';
import type { MeasureResult, MeasureTask } from '../../../pipeline/engine/measure-run.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-cache-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

const task: MeasureTask = {
  run: 'r001', path: '/a/spectra/r001.csv', file: 'spectra/r001.csv', detectorIds: ['d01'],
  calibrations: { d01: { version: 'cal-a', offsetKeV: 20, gainKeVPerChannel: 14, quadraticKeVPerChannel2: 0, covariance: [[0, 0], [0, 0]] } },
  requests: [], widths: { peak_half_width_fwhm: 1.5, background_gap_fwhm: 0.5, background_width_fwhm: 1.5 } as never,
};

describe('measured-result cache', () => {
  it('keeps window sums bit for bit, NaN and −0 included (IEEE 754 round trip)', () => {
    const sums = Float64Array.from([1, Number.NaN, -0, 1e-300, 123456789.125]);
    const r: MeasureResult = { run: 'r001', sha256: 'ab', ok: true, channelCount: 256, totals: [5], sums, diagnostics: [] };
    const back = decodeResult(encodeResult(r));
    expect(back.sums).toBeInstanceOf(Float64Array);
    expect(Buffer.from(back.sums.buffer).equals(Buffer.from(sums.buffer))).toBe(true);
    expect({ ...back, sums: null }).toEqual({ ...r, sums: null });
  });

  it('keys by spectrum content and plan, not by where the series lies', () => {
    const k = measureKey(task, 'aa');
    expect(measureKey({ ...task, path: '/elsewhere/r001.csv' }, 'aa')).toBe(k);
    expect(measureKey(task, 'ab')).not.toBe(k);
    expect(measureKey({ ...task, calibrations: { d01: { ...task.calibrations.d01!, offsetKeV: 21 } } }, 'aa')).not.toBe(k);
  });
});

describe('file hashes by (path, size, mtime, inode): an unchanged file is not read again', () => {
  it('returns the remembered hash while the stat is unchanged, and rereduce mode reads afresh', () => {
    const out = join(root, 'out');
    const file = join(root, 'r001.csv');
    writeFileSync(file, 'abc');
    utimesSync(file, 1_780_000_000, 1_780_000_000);
    const ledger = new Ledger(out);
    try {
      const first = new FileHashCache(ledger, true);
      const h1 = first.hash(file);
      // FIPS 180-2, appendix B.1: SHA-256("abc")
      expect(h1).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
      first.flush();
      writeFileSync(file, 'abd'); // same size, same inode
      utimesSync(file, 1_780_000_000, 1_780_000_000);
      const trusting = new FileHashCache(ledger, true);
      expect(trusting.hash(file), 'stat unchanged: the file is not read').toBe(h1);
      expect(trusting.readCount).toBe(0);
      const fresh = new FileHashCache(ledger, false);
      expect(fresh.hash(file)).not.toBe(h1);
      expect(fresh.readCount).toBe(1);
    } finally {
      ledger.close();
    }
  });
});
