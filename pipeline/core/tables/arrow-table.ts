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

const encoder = new TextEncoder();

/**
 * One column being filled straight into Arrow buffers (no per-value builder): numbers into a
 * typed array, strings kept until their UTF-8 length is known, and the validity bitmap (LSB
 * first, 1 = valid) set as values arrive.
 */
class ColumnBuilder {
  readonly bits: Uint8Array;
  nulls = 0;
  readonly numbers: Float64Array | Int32Array | null;
  readonly texts: (string | null)[] | null;
  readonly valueOffsets: Int32Array | null;
  total = 0;
  /** UTF-8 of the non-ASCII strings, once per distinct value. */
  readonly nonAscii = new Map<string, Uint8Array>();

  constructor(
    readonly type: ColumnType,
    readonly length: number,
  ) {
    this.bits = new Uint8Array((length + 7) >> 3);
    this.numbers = type === 'float64' ? new Float64Array(length) : type === 'int32' ? new Int32Array(length) : null;
    this.texts = type === 'utf8' ? new Array<string | null>(length) : null;
    this.valueOffsets = type === 'utf8' ? new Int32Array(length + 1) : null;
  }

  /** Value of row i (rows arrive in order); NaN and non-finite numbers become nulls. */
  set(i: number, v: number | string | null): void {
    if (this.numbers !== null) {
      if (typeof v === 'number' && Number.isFinite(v)) {
        this.numbers[i] = v;
        this.bits[i >> 3]! |= 1 << (i & 7);
      } else this.nulls++;
      return;
    }
    if (v === null) {
      this.texts![i] = null;
      this.nulls++;
    } else {
      const text = typeof v === 'string' ? v : String(v);
      this.texts![i] = text;
      let ascii = true;
      for (let c = 0; c < text.length; c++) {
        if (text.charCodeAt(c) >= 0x80) {
          ascii = false;
          break;
        }
      }
      if (ascii) this.total += text.length;
      else {
        let e = this.nonAscii.get(text);
        if (e === undefined) this.nonAscii.set(text, (e = encoder.encode(text)));
        this.total += e.length;
      }
      this.bits[i >> 3]! |= 1 << (i & 7);
    }
    this.valueOffsets![i + 1] = this.total;
  }

  finish(): arrow.Data {
    const { length, nulls } = this;
    const nullBitmap = nulls === 0 ? undefined : this.bits;
    if (this.numbers !== null) {
      return arrow.makeData({ type: this.type === 'float64' ? new arrow.Float64() : new arrow.Int32(), length, nullCount: nulls, data: this.numbers, nullBitmap } as never);
    }
    // ASCII text is copied char by char; a string is ASCII exactly when its UTF-8 length equals
    // its UTF-16 length (every other character takes more bytes).
    const texts = this.texts!;
    const valueOffsets = this.valueOffsets!;
    const data = new Uint8Array(this.total);
    for (let i = 0; i < length; i++) {
      const text = texts[i];
      if (text === null || text === undefined) continue;
      const at = valueOffsets[i]!;
      if (valueOffsets[i + 1]! - at === text.length) for (let c = 0; c < text.length; c++) data[at + c] = text.charCodeAt(c);
      else data.set(this.nonAscii.get(text)!, at);
    }
    return arrow.makeData({ type: new arrow.Utf8(), length, nullCount: nulls, valueOffsets, data, nullBitmap });
  }
}

/**
 * Column data of every column, filled row by row (each row object is read once, for all its
 * columns, rather than once per column).
 */
function columnsData<R>(columns: readonly ColumnSpec<R>[], rows: readonly R[]): arrow.Data[] {
  const builders = columns.map((c) => new ColumnBuilder(c.type, rows.length));
  const values = columns.map((c) => c.value);
  const n = columns.length;
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i]!;
    for (let c = 0; c < n; c++) builders[c]!.set(i, values[c]!(row));
  }
  return builders.map((b) => b.finish());
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
  const children = columnsData(columns, rows);
  const data = arrow.makeData({ type: new arrow.Struct(schema.fields), length: rows.length, nullCount: 0, children });
  return new arrow.Table(schema, [new arrow.RecordBatch(schema, data)]);
}

/** Arrow IPC file bytes of a table. */
export function tableToIpcFile(table: arrow.Table): Uint8Array {
  return arrow.tableToIPC(table, 'file');
}
