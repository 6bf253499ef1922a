import { ReusableFileReader } from './read-file-reusing.js';
import { fileURLToPath } from 'node:url';
import PQueue from 'p-queue';
import { measureRun, type MeasureResult, type MeasureTask } from './measure-run.js';

/**
 * Measures every task's spectrum, streaming: at most a few files are in memory at once,
 * whatever the number of runs. With jobs > 1 the work goes to worker threads (piscina,
 * compiled JS), one per core; p-queue bounds how many tasks are in flight.
 */
export async function runMeasurements(tasks: readonly MeasureTask[], jobs: number, onResult: (r: MeasureResult) => void): Promise<void> {
  if (jobs <= 1 || tasks.length < 4) {
    // In this thread. (Reading ahead asynchronously was measured slower here: page-cache reads
    // are faster than the thread-pool round trips.)
    const reader = new ReusableFileReader();
    for (const t of tasks) {
      let result: MeasureResult;
      try {
        result = measureRun(t, reader.read(t.path));
      } catch (e) {
        result = failed(t, e);
      }
      onResult(result);
    }
    return;
  }
  const { Piscina } = await import('piscina');
  const self = fileURLToPath(import.meta.url);
  const filename = self.endsWith('.ts') ? self.replace(/run-measurements\.ts$/, 'measure-worker.ts') : self.replace(/run-measurements\.js$/, 'measure-worker.js');
  const pool = new Piscina<MeasureTask, MeasureResult>({ filename, minThreads: jobs, maxThreads: jobs, idleTimeout: 1000 });
  const queue = new PQueue({ concurrency: jobs * 16 });
  try {
    for (const t of tasks) {
      void queue.add(async () => {
        let result: MeasureResult;
        try {
          result = await pool.run(t);
        } catch (e) {
          result = failed(t, e);
        }
        onResult(result);
      });
    }
    await queue.onIdle();
  } finally {
    await pool.destroy();
  }
}

/** A run whose file could not be read (or whose worker died) is set aside; the others go on. */
function failed(t: MeasureTask, e: unknown): MeasureResult {
  const err = e as NodeJS.ErrnoException;
  return {
    run: t.run,
    sha256: '',
    ok: false,
    channelCount: 0,
    totals: [],
    sums: new Float64Array(0),
    diagnostics: [{ severity: 'error', rule: 'spectrum-unreadable', stage: 'ingest', file: t.file, run: t.run, message: `could not read ${t.file}: ${err.code ?? ''} ${err.message}`.trim() }],
  };
}
