import type * as arrow from 'apache-arrow';

/**
 * JSON text of a table: an array with one object per row, keys in column order, nulls as
 * null. Numbers are written as JavaScript writes them (the shortest form that reads back to
 * the same double).
 */
export function tableToJson(table: arrow.Table): string {
  const names = table.schema.fields.map((f) => f.name);
  const cols = names.map((n) => table.getChild(n)!);
  const rows: string[] = [];
  for (let i = 0; i < table.numRows; i++) {
    const o: Record<string, unknown> = {};
    names.forEach((n, k) => {
      const v = cols[k]!.get(i);
      o[n] = typeof v === 'number' && !Number.isFinite(v) ? null : typeof v === 'bigint' ? Number(v) : (v ?? null);
    });
    rows.push(JSON.stringify(o));
  }
  return `[\n${rows.join(',\n')}\n]\n`;
}
