import * as arrow from 'apache-arrow';

/**
 * A column of an output table, described once: name (with its unit suffix), Arrow type, unit,
 * and a sentence saying what it is. The writer puts unit and description into the field
 * metadata and a JSON dictionary of all columns into the schema metadata (`xsred.columns`).
 */
export type ColumnType = 'float64' | 'int32' | 'utf8';

export interface ColumnSpec<R> {
  name: string;
  type: ColumnType;
  unit?: string;
  description: string;
  value: (row: R) => number | string | null;
}

export interface TableMeta {
  /** Short title of the table (schema metadata `xsred.table`). */
  table: string;
  /** Extra schema metadata, e.g. editions of constants and mass tables. */
  extra?: Record<string, string>;
}

/** Validity bitmap (LSB first, 1 = valid) or undefined when every value is valid. */
function bitmap(valid: (i: number) => boolean, length: number): { nullBitmap: Uint8Array | undefined; nullCount: number } {
  const bits = new Uint8Array((length + 7) >> 3);
  let nullCount = 0;
  for (let i = 0; i < length; i++) {
    if (valid(i)) bits[i >> 3]! |= 1 << (i & 7);
    else nullCount++;
  }
  return nullCount === 0 ? { nullBitmap: undefined, nullCount } : { nullBitmap: bits, nullCount };
}

const encoder = new TextEncoder();

/**
 * Column data built straight into Arrow buffers (no per-value builder): numbers into a typed
 * array, strings encoded once per distinct value (most columns repeat run and detector ids).
 */
function columnData<R>(type: ColumnType, rows: readonly R[], value: (row: R) => number | string | null): arrow.Data {
  const length = rows.length;
  if (type === 'float64' || type === 'int32') {
    const data = type === 'float64' ? new Float64Array(length) : new Int32Array(length);
    const valid = new Uint8Array(length);
    for (let i = 0; i < length; i++) {
      const v = value(rows[i]!);
      if (typeof v === 'number' && Number.isFinite(v)) {
        data[i] = v;
        valid[i] = 1;
      }
    }
    const { nullBitmap, nullCount } = bitmap((i) => valid[i] === 1, length);
    return arrow.makeData({ type: type === 'float64' ? new arrow.Float64() : new arrow.Int32(), length, nullCount, data, nullBitmap } as never);
  }
  const cache = new Map<string, Uint8Array>();
  const encoded: (Uint8Array | null)[] = rows.map((row) => {
    const v = value(row);
    if (v === null) return null;
    const text = String(v);
    let e = cache.get(text);
    if (e === undefined) cache.set(text, (e = encoder.encode(text)));
    return e;
  });
  const valueOffsets = new Int32Array(length + 1);
  let total = 0;
  for (let i = 0; i < length; i++) {
    total += encoded[i]?.length ?? 0;
    valueOffsets[i + 1] = total;
  }
  const data = new Uint8Array(total);
  for (let i = 0; i < length; i++) if (encoded[i]) data.set(encoded[i]!, valueOffsets[i]!);
  const { nullBitmap, nullCount } = bitmap((i) => encoded[i] !== null, length);
  return arrow.makeData({ type: new arrow.Utf8(), length, nullCount, valueOffsets, data, nullBitmap });
}

/** Builds an Arrow table (NaN and non-finite numbers become nulls). Deterministic: no clock, no random ids. */
export function buildTable<R>(columns: readonly ColumnSpec<R>[], rows: readonly R[], meta: TableMeta): arrow.Table {
  const fields = columns.map(
    (c) =>
      new arrow.Field(
        c.name,
        c.type === 'float64' ? new arrow.Float64() : c.type === 'int32' ? new arrow.Int32() : new arrow.Utf8(),
        true,
        new Map([...(c.unit ? [['unit', c.unit] as [string, string]] : []), ['description', c.description]]),
      ),
  );
  const dictionary = columns.map((c) => ({ name: c.name, type: c.type, unit: c.unit ?? '', description: c.description }));
  const schema = new arrow.Schema(
    fields,
    new Map([['xsred.table', meta.table], ['xsred.columns', JSON.stringify(dictionary)], ...Object.entries(meta.extra ?? {}).sort(([a], [b]) => a.localeCompare(b))]),
  );
  const children = columns.map((c) => columnData(c.type, rows, c.value));
  const data = arrow.makeData({ type: new arrow.Struct(schema.fields), length: rows.length, nullCount: 0, children });
  return new arrow.Table(schema, [new arrow.RecordBatch(schema, data)]);
}

/** Arrow IPC file bytes of a table. */
export function tableToIpcFile(table: arrow.Table): Uint8Array {
  return arrow.tableToIPC(table, 'file');
}
