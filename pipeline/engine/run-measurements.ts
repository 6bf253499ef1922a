import { fileURLToPath } from 'node:url';
import { setImmediate as yieldToEvents } from 'node:timers/promises';
import PQueue from 'p-queue';
import { measureRun, type MeasureResult, type MeasureTask } from './measure-run.js';
import { ReusableFileReader } from './read-file-reusing.js';

/**
 * Measures every task's spectrum, streaming: a file is read, measured and dropped; only its
 * window sums are kept, whatever the number of runs. `jobs` threads share the work: this
 * thread and jobs − 1 worker threads (piscina, compiled JS), all taking the next task from one
 * list, so a faster thread simply takes more; p-queue keeps two tasks in flight per worker.
 */
export async function runMeasurements(tasks: readonly MeasureTask[], jobs: number, onResult: (r: MeasureResult) => void): Promise<void> {
  const reader = new ReusableFileReader();
  let next = 0;
  const here = (t: MeasureTask): MeasureResult => {
    try {
      return measureRun(t, reader.read(t.path));
    } catch (e) {
      return failed(t, e);
    }
  };
  const workers = jobs > 1 && tasks.length >= 8 ? jobs - 1 : 0;
  if (workers === 0) {
    for (const t of tasks) onResult(here(t));
    return;
  }
  const { Piscina } = await import('piscina');
  const self = fileURLToPath(import.meta.url);
  const filename = self.endsWith('.ts') ? self.replace(/run-measurements\.ts$/, 'measure-worker.ts') : self.replace(/run-measurements\.js$/, 'measure-worker.js');
  const pool = new Piscina<MeasureTask, MeasureResult>({ filename, minThreads: workers, maxThreads: workers, idleTimeout: 1000 });
  // p-queue bounds the tasks in flight to the workers (two each); this thread fills the rest.
  const queue = new PQueue({ concurrency: 2 * workers });
  const toWorker = async (t: MeasureTask) => {
    let result: MeasureResult;
    try {
      result = await pool.run(t);
    } catch (e) {
      result = failed(t, e);
    }
    onResult(result);
  };
  try {
    while (next < tasks.length) {
      const t = tasks[next++]!;
      if (queue.pending + queue.size < 2 * workers) {
        void queue.add(() => toWorker(t));
        continue;
      }
      onResult(here(t));
      await yieldToEvents(); // let finished worker results in between
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
