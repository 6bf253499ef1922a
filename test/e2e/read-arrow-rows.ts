import { readFileSync } from 'node:fs';
import * as arrow from 'apache-arrow';

export type ArrowRow = Record<string, string | number | null>;

/** Every row of an Arrow IPC file as a plain object keyed by column name (nulls stay null). */
export function readArrowRows(path: string): ArrowRow[] {
  const table = arrow.tableFromIPC(readFileSync(path));
  return table.toArray().map((row) => row.toJSON() as ArrowRow);
}

