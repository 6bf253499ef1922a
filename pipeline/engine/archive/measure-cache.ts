import { createHash } from 'node:crypto';
import { canonicalJson } from '../canonical-json.js';
import type { MeasureResult, MeasureTask } from '../measure-run.js';
import type { MeasureCache } from '../reduce-series.js';
import type { FileHashCache } from './file-hash-cache.js';
import type { Ledger } from './ledger.js';

/** JSON that keeps Float64Arrays bit for bit (NaN included), as base64 of their bytes. */
export function encodeResult(r: MeasureResult): string {
  return JSON.stringify(r, (_k, v: unknown) => (v instanceof Float64Array ? { $f64: Buffer.from(v.buffer, v.byteOffset, v.byteLength).toString('base64') } : v));
}

export function decodeResult(text: string): MeasureResult {
  return JSON.parse(text, (_k, v: unknown) => {
    if (v !== null && typeof v === 'object' && typeof (v as { $f64?: unknown }).$f64 === 'string') {
      const b = Buffer.from((v as { $f64: string }).$f64, 'base64');
      const out = new Float64Array(b.length / 8);
      new Uint8Array(out.buffer).set(b);
      return out;
    }
    return v;
  }) as MeasureResult;
}

/** The cache key: sha256 of the spectrum's sha256 and the task's plan (everything but the absolute path). */
export function measureKey(task: MeasureTask, spectrumSha256: string): string {
  const { path: _path, ...plan } = task;
  return createHash('sha256').update(spectrumSha256).update('\n').update(canonicalJson(plan)).digest('hex');
}

/**
 * The measured results of a series kept in the ledger (`measure_cache`), so a run whose
 * spectrum and plan (calibration, peak windows, detectors) are unchanged is not read again.
 * Each stored result is committed at once: a reduction killed half-way keeps what it measured,
 * and the next run goes on from there. Results of unreadable files (no hash) are not kept.
 */
export function ledgerMeasureCache(ledger: Ledger, files: FileHashCache, series: string, reductionId: number): MeasureCache & { hits: number } {
  const get = ledger.db.prepare('SELECT result_json FROM measure_cache WHERE key = ?');
  const touch = ledger.db.prepare('UPDATE measure_cache SET used_by = ? WHERE key = ?');
  const put = ledger.db.prepare('INSERT OR REPLACE INTO measure_cache (key, series, run, used_by, result_json) VALUES (?, ?, ?, ?, ?)');
  const cache = {
    hits: 0,
    lookup(task: MeasureTask): MeasureResult | undefined {
      let sha: string;
      try {
        sha = files.hash(task.path);
      } catch {
        return undefined; // unreadable now: the measurement reports it
      }
      const key = measureKey(task, sha);
      const row = get.get(key) as { result_json: string } | undefined;
      if (row === undefined) return undefined;
      touch.run(reductionId, key);
      cache.hits++;
      return decodeResult(row.result_json);
    },
    store(task: MeasureTask, result: MeasureResult): void {
      if (result.sha256 === '') return;
      put.run(measureKey(task, result.sha256), series, task.run, reductionId, encodeResult(result));
    },
  };
  return cache;
}

/** Drops cached results of a series not used by its latest reduction (one transaction). */
export function pruneMeasureCache(ledger: Ledger, series: string, reductionId: number): number {
  return ledger.db.prepare('DELETE FROM measure_cache WHERE series = ? AND used_by <> ?').run(series, reductionId).changes;
}
