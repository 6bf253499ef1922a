import * as arrow from 'apache-arrow';

/**
 * Parquet bytes of a table through parquet-wasm (ZSTD). The Arrow schema travels with the file
 * (field `unit` and `description` metadata included), and the schema metadata (`xsred.columns`,
 * series, version, editions) is also written as Parquet key-value metadata for readers that
 * ignore the Arrow schema.
 */
export async function tableToParquet(table: arrow.Table): Promise<Uint8Array> {
  const mod = (await import('parquet-wasm')) as typeof import('parquet-wasm') & { default?: typeof import('parquet-wasm') };
  const pq = typeof mod.default?.writeParquet === 'function' ? mod.default : mod;
  const props = new pq.WriterPropertiesBuilder()
    .setCompression(pq.Compression.ZSTD)
    .setCreatedBy('xsred export (parquet-wasm)')
    .setKeyValueMetadata(new Map([...table.schema.metadata].filter(([k]) => k.startsWith('xsred.'))))
    .build();
  const wasmTable = pq.Table.fromIPCStream(arrow.tableToIPC(table, 'stream'));
  return pq.writeParquet(wasmTable, props);
}
