import { readFileSync } from 'node:fs';
import { measureRun, type MeasureResult, type MeasureTask } from './measure-run.js';

/** Worker-thread entry (piscina): read the file here, so both cores parse. */
export default function measureWorker(task: MeasureTask): MeasureResult {
  return measureRun(task, readFileSync(task.path));
}
