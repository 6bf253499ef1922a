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

function vector(type: ColumnType, values: (number | string | null)[]): arrow.Vector {
  switch (type) {
    case 'float64':
      return arrow.vectorFromArray(
        values.map((v) => (typeof v === 'number' && Number.isFinite(v) ? v : null)),
        new arrow.Float64(),
      );
    case 'int32':
      return arrow.vectorFromArray(
        values.map((v) => (typeof v === 'number' && Number.isFinite(v) ? v : null)),
        new arrow.Int32(),
      );
    case 'utf8':
      return arrow.vectorFromArray(
        values.map((v) => (v === null ? null : String(v))),
        new arrow.Utf8(),
      );
  }
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
  const children = columns.map((c) => vector(c.type, rows.map(c.value)).data[0]!);
  const data = arrow.makeData({ type: new arrow.Struct(schema.fields), length: rows.length, nullCount: 0, children });
  return new arrow.Table(schema, [new arrow.RecordBatch(schema, data)]);
}

/** Arrow IPC file bytes of a table. */
export function tableToIpcFile(table: arrow.Table): Uint8Array {
  return arrow.tableToIPC(table, 'file');
}
