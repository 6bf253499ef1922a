import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as arrow from 'apache-arrow';
import pl from 'nodejs-polars';
import { beforeAll, describe, expect, it } from 'vitest';
import { REPO_ROOT, runCli } from '../run-cli.js';

// Exports are read back by an independent reader: nodejs-polars (the Rust Polars engine, its own
// Parquet, Arrow IPC and CSV readers), and compared value by value with cross_sections.arrow as the
// apache-arrow reader sees it. CSV layout: RFC 4180 (comma, header row, quotes doubled).

let work: string;
let reduced: string;
let source: arrow.Table;

const column = (t: arrow.Table, name: string) => Array.from({ length: t.numRows }, (_, i) => t.getChild(name)!.get(i) as unknown);

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'xsred-export-'));
  const r = await runCli(['reduce', join(REPO_ROOT, 'sample-runs/fval-2026-c12-alpha'), '--out', join(work, 'out'), '--no-html', '--quiet']);
  expect(r.code, r.stderr).toBe(0);
  reduced = join(work, 'out/fval-2026-c12-alpha');
  source = arrow.tableFromIPC(readFileSync(join(reduced, 'cross_sections.arrow')));
}, 300_000);

describe('xsred export', () => {
  it('Parquet (parquet-wasm) reads back in polars with identical values, nulls included, and keeps the xsred metadata', async () => {
    const out = join(work, 'xs.parquet');
    const r = await runCli(['export', reduced, '--format', 'parquet', '--out', out]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout.trim().split('\n')).toEqual([out, `${out}.dictionary.json`, `${out}.dictionary.md`]);
    const df = pl.readParquet(readFileSync(out));
    expect(df.columns).toEqual(source.schema.fields.map((f) => f.name));
    expect(df.height).toBe(source.numRows);
    for (const name of df.columns) expect(df.getColumn(name).toArray(), name).toEqual(column(source, name));
    const pq = await import('parquet-wasm');
    const back = arrow.tableFromIPC(pq.readParquet(readFileSync(out)).intoIPCStream());
    expect(back.schema.metadata.get('xsred.series')).toBe('fval-2026-c12-alpha');
    expect(back.schema.fields.find((f) => f.name === 'beam_energy_keV')!.metadata.get('unit')).toBe('keV');
  });

  it('Arrow IPC reads back in polars with identical values (polars readIPC of the bytes)', async () => {
    const out = join(work, 'xs.arrow');
    expect((await runCli(['export', reduced, '--format', 'arrow', '--out', out])).code).toBe(0);
    const df = pl.readIPC(readFileSync(out));
    for (const name of source.schema.fields.map((f) => f.name)) expect(df.getColumn(name).toArray(), name).toEqual(column(source, name));
    const t = arrow.tableFromIPC(readFileSync(out));
    expect(t.schema.fields.find((f) => f.name === 'cross_section_lab_mb_per_sr')!.metadata.get('unit')).toBe('mb/sr');
  });

  it('CSV parses with polars readCSV to the same numbers (RFC 4180; empty field = null)', async () => {
    const out = join(work, 'xs.csv');
    expect((await runCli(['export', reduced, '--format', 'csv', '--out', out])).code).toBe(0);
    const df = pl.readCSV(readFileSync(out, 'utf8'), { inferSchemaLength: 0 });
    expect(df.columns).toEqual(source.schema.fields.map((f) => f.name));
    for (const f of source.schema.fields) {
      const text = df.getColumn(f.name).toArray() as (string | null)[];
      const want = column(source, f.name);
      if (arrow.DataType.isFloat(f.type)) expect(text.map((v) => (v === null ? null : Number(v))), f.name).toEqual(want);
      else expect(text.map((v) => v ?? ''), f.name).toEqual(want.map((v) => v ?? ''));
    }
  });

  it('JSON rows equal the table; --frame cm keeps CM cross sections and drops the lab ones', async () => {
    const out = join(work, 'xs-cm.json');
    expect((await runCli(['export', reduced, '--format', 'json', '--frame', 'cm', '--out', out])).code).toBe(0);
    const rows = JSON.parse(readFileSync(out, 'utf8')) as Record<string, unknown>[];
    expect(rows).toHaveLength(source.numRows);
    expect(Object.keys(rows[0]!)).toContain('cross_section_cm_mb_per_sr');
    expect(Object.keys(rows[0]!).filter((k) => /^(cross_section|rutherford)_lab_/.test(k))).toEqual([]);
    expect(rows.map((r) => r.cross_section_cm_stat_mb_per_sr)).toEqual(column(source, 'cross_section_cm_stat_mb_per_sr'));
  });

  it('the data dictionary lists every column with unit, description and uncertainty definition (JSON and Markdown)', async () => {
    const out = join(work, 'dict.csv');
    expect((await runCli(['export', reduced, '--format', 'csv', '--frame', 'lab', '--out', out])).code).toBe(0);
    const d = JSON.parse(readFileSync(`${out}.dictionary.json`, 'utf8')) as { frame: string; rows: number; columns: { name: string; unit: string; description: string; uncertainty: string }[] };
    const header = readFileSync(out, 'utf8').split('\n')[0]!.split(',');
    expect(d.columns.map((c) => c.name)).toEqual(header);
    expect(d.frame).toBe('lab');
    expect(d.rows).toBe(source.numRows);
    const by = new Map(d.columns.map((c) => [c.name, c]));
    for (const c of d.columns) expect(c.unit).toBe(source.schema.fields.find((f) => f.name === c.name)!.metadata.get('unit') ?? '');
    expect(by.get('cross_section_lab_stat_mb_per_sr')!.uncertainty).toMatch(/^statistical standard uncertainty .* of cross_section_lab_mb_per_sr/);
    expect(by.get('cross_section_lab_sys_mb_per_sr')!.uncertainty).toMatch(/correlated/);
    expect(by.get('cross_section_lab_mb_per_sr')!.uncertainty).toBe('standard uncertainties (k = 1) in cross_section_lab_stat_mb_per_sr, cross_section_lab_sys_mb_per_sr');
    const md = readFileSync(`${out}.dictionary.md`, 'utf8');
    expect(md).toContain('| `cross_section_lab_mb_per_sr` | float64 | mb/sr |');
    expect(md.split('\n').filter((l) => l.startsWith('| `'))).toHaveLength(header.length);
  });

  it('reads an archive series folder through its current link, and records the version', async () => {
    const series = join(work, 'archive/fval-2026-c12-alpha');
    mkdirSync(join(series, 'versions'), { recursive: true });
    cpSync(reduced, join(series, 'versions/v0002'), { recursive: true });
    symlinkSync('versions/v0002', join(series, 'current'));
    const out = join(work, 'from-archive.csv');
    const r = await runCli(['export', series, '--format', 'csv', '--out', out]);
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(readFileSync(`${out}.dictionary.json`, 'utf8')).version).toBe('v0002');
    expect(readFileSync(out, 'utf8')).toBe(readFileSync(join(work, 'xs.csv'), 'utf8'));
  });

  it('a current that is a plain file, not the symbolic link DESIGN.md fixes, is a diagnostic and exit code 2', async () => {
    const series = join(work, 'archive/plain-pointer');
    mkdirSync(join(series, 'versions'), { recursive: true });
    cpSync(reduced, join(series, 'versions/v000001'), { recursive: true });
    writeFileSync(join(series, 'current'), '{"version": "v000001"}\n');
    const r = await runCli(['export', series, '--format', 'csv', '--out', join(work, 'plain.csv')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/is not a symbolic link.*\[export-current-not-a-link\]/);
  });

  it('--combined without combined.arrow, and a folder that is no reduction: a clear diagnostic and exit code 2', async () => {
    // xsred reduce writes combined.arrow since issue 5: a reduction folder without it (an older version) is made here.
    const older = join(work, 'older-reduction');
    cpSync(reduced, older, { recursive: true });
    rmSync(join(older, 'combined.arrow'));
    const c = await runCli(['export', older, '--format', 'csv', '--combined', '--out', join(work, 'c.csv')]);
    expect(c.code).toBe(2);
    expect(c.stderr).toMatch(/combined\.arrow does not exist.*\[export-no-combined-table\]/);
    expect(c.stderr).toMatch(/hint: drop --combined/);
    const n = await runCli(['export', work, '--format', 'csv']);
    expect(n.code).toBe(2);
    expect(n.stderr).toMatch(/export-not-a-reduction/);
    const f = await runCli(['export', reduced, '--format', 'xlsx']);
    expect(f.code).toBe(2);
  });
});
