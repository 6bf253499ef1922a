import { fixed } from './format-number.js';
import type { ScalerReading } from './simulate-run.js';

/**
 * scalers.csv (DESIGN.md): `run,detector` then `live_time_s`, or `pulser_sent,pulser_counted`,
 * or all three when the series uses both modes (each row fills its own kind, the others empty).
 */
export function scalersCsvText(rows: readonly { run: string; detector: string; reading: ScalerReading }[]): string {
  const hasLive = rows.some((r) => 'liveTimeS' in r.reading);
  const hasPulser = rows.some((r) => 'pulserSent' in r.reading);
  const header = ['run', 'detector', ...(hasLive || !hasPulser ? ['live_time_s'] : []), ...(hasPulser ? ['pulser_sent', 'pulser_counted'] : [])];
  const lines = [header.join(',')];
  for (const { run, detector, reading } of rows) {
    const cells = [run, detector];
    if ('liveTimeS' in reading) {
      cells.push(fixed(reading.liveTimeS, 3));
      if (hasPulser) cells.push('', '');
    } else {
      if (hasLive) cells.push('');
      cells.push(String(reading.pulserSent), String(reading.pulserCounted));
    }
    lines.push(cells.join(','));
  }
  return `${lines.join('\n')}\n`;
}
