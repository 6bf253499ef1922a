import type * as arrow from 'apache-arrow';

/** RFC 4180 field: quoted when it holds a comma, a quote, a line break or edge spaces; quotes doubled. */
function field(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
  if (typeof v === 'bigint') return v.toString();
  const s = String(v);
  return /[",\r\n]|^\s|\s$/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * CSV text of a table (RFC 4180: comma-separated, header row of column names, LF line ends,
 * UTF-8). Numbers are written in the shortest form that reads back to the same double;
 * a null is an empty field.
 */
export function tableToCsv(table: arrow.Table): string {
  const names = table.schema.fields.map((f) => f.name);
  const cols = names.map((n) => table.getChild(n)!);
  const lines = [names.map(field).join(',')];
  for (let i = 0; i < table.numRows; i++) lines.push(cols.map((c) => field(c.get(i))).join(','));
  return `${lines.join('\n')}\n`;
}
