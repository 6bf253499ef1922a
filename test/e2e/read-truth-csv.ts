import { readFileSync } from 'node:fs';

export type TruthCsvRow = Record<string, string>;

/**
 * truth.csv as the simulator writes it (a header, then one line per sample run × detector ×
 * peak; fields with a comma or quote are quoted, quotes doubled), keyed `run|detector|peak`.
 */
export function readTruthCsv(path: string): Map<string, TruthCsvRow> {
  const lines = readFileSync(path, 'utf8').split('\n').filter((l) => l !== '');
  const header = splitCsvLine(lines[0]!);
  const out = new Map<string, TruthCsvRow>();
  for (const line of lines.slice(1)) {
    const cells = splitCsvLine(line);
    const row: TruthCsvRow = Object.fromEntries(header.map((h, i) => [h, cells[i] ?? '']));
    out.set(truthKey(row.run!, row.detector!, row.peak!), row);
  }
  return out;
}

export const truthKey = (run: string, detector: string, peak: string) => `${run}|${detector}|${peak}`;

function splitCsvLine(line: string): string[] {
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i]!;
    if (quoted) {
      if (c === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      cells.push(cell);
      cell = '';
    } else cell += c;
  }
  cells.push(cell);
  return cells;
}
