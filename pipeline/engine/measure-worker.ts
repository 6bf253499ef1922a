import { ReusableFileReader } from './read-file-reusing.js';
import { measureRun, type MeasureResult, type MeasureTask } from './measure-run.js';

/** Worker-thread entry (piscina): read the file here, so both cores parse. */
const reader = new ReusableFileReader();

export default function measureWorker(task: MeasureTask): MeasureResult {
  return measureRun(task, reader.read(task.path));
}
