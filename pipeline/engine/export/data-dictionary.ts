import type * as arrow from 'apache-arrow';

/** One column of an export's data dictionary. */
export interface DictionaryColumn {
  name: string;
  /** Arrow type: float64, int32, utf8 … */
  type: string;
  /** Unit ('1' for a pure number, '' for text and identifiers). */
  unit: string;
  description: string;
  /** How the column's uncertainty is defined, or which columns hold its uncertainties; '' when it has none. */
  uncertainty: string;
}

export interface DataDictionary {
  file: string;
  format: string;
  source: string;
  table: string;
  series: string;
  software_version: string;
  version: string;
  frame: string;
  rows: number;
  missing_values: string;
  columns: DictionaryColumn[];
}

const TYPE = (t: arrow.DataType) => String(t).toLowerCase();

/** The uncertainty token in a column name (`_stat`, `_sys`, `_unc`, `_rel_unc`) and the column it belongs to. */
function uncertaintyOf(name: string, names: ReadonlySet<string>): { kind: 'stat' | 'sys' | 'unc' | 'rel'; base: string } | null {
  for (const [token, kind] of [['_rel_unc', 'rel'], ['_stat', 'stat'], ['_sys', 'sys'], ['_unc', 'unc']] as const) {
    const i = name.indexOf(token);
    if (i < 0 || !(i + token.length === name.length || name[i + token.length] === '_')) continue;
    const base = name.slice(0, i) + name.slice(i + token.length);
    return { kind, base: names.has(base) ? base : '' };
  }
  return null;
}

const DEFINITION = {
  stat: 'statistical standard uncertainty (one standard deviation, coverage factor k = 1) of {base}: counting, background and live time; independent between rows, so it averages down',
  sys: 'systematic standard uncertainty (k = 1) of {base}: areal densities, normalization, angle; shared by rows of the same target, detector or reference runs — correlated, it does not average down',
  unc: 'standard uncertainty (k = 1) of {base}',
  rel: 'relative standard uncertainty (k = 1, a fraction, not percent){base}',
} as const;

/**
 * The data dictionary of an exported table, from the Arrow field metadata (`unit`,
 * `description`, and `uncertainty` where a table states it) and the column names: an
 * uncertainty column says what it is the uncertainty of and how it is defined; a value column
 * names its uncertainty columns.
 */
export function dataDictionary(table: arrow.Table, info: Omit<DataDictionary, 'columns' | 'rows' | 'table' | 'series' | 'software_version' | 'missing_values'> & { missingValues: string }): DataDictionary {
  const names = new Set(table.schema.fields.map((f) => f.name));
  const uncOf = new Map<string, string[]>();
  for (const n of names) {
    const u = uncertaintyOf(n, names);
    if (u?.base) uncOf.set(u.base, [...(uncOf.get(u.base) ?? []), n]);
  }
  const columns = table.schema.fields.map((f): DictionaryColumn => {
    const stated = f.metadata.get('uncertainty');
    const u = uncertaintyOf(f.name, names);
    let uncertainty = stated ?? '';
    if (!stated && u) uncertainty = DEFINITION[u.kind].replace('{base}', u.base ? (u.kind === 'rel' ? ` of ${u.base}` : u.base) : u.kind === 'rel' ? '' : 'the quantity described');
    else if (!stated && uncOf.has(f.name)) uncertainty = uncOf.get(f.name)!.length === 1 ? `standard uncertainty (k = 1) in ${uncOf.get(f.name)![0]}` : `standard uncertainties (k = 1) in ${uncOf.get(f.name)!.join(', ')}`;
    return { name: f.name, type: TYPE(f.type), unit: f.metadata.get('unit') ?? '', description: f.metadata.get('description') ?? '', uncertainty };
  });
  const m = table.schema.metadata;
  return {
    file: info.file,
    format: info.format,
    source: info.source,
    table: m.get('xsred.table') ?? '',
    series: m.get('xsred.series') ?? '',
    software_version: m.get('xsred.version') ?? '',
    version: info.version,
    frame: info.frame,
    rows: table.numRows,
    missing_values: info.missingValues,
    columns,
  };
}

const cell = (s: string) => s.replace(/\|/g, '\\|').replace(/\r?\n/g, ' ');

/** The dictionary as Markdown: a header of facts, then one table row per column. */
export function dictionaryMarkdown(d: DataDictionary): string {
  return [
    `# Data dictionary: ${d.file}`,
    '',
    `- format: ${d.format}; rows: ${d.rows}; frame: ${d.frame}`,
    `- source: ${d.source}${d.version ? ` (archive version ${d.version})` : ''}; series: ${d.series}; xsred ${d.software_version}`,
    `- table: ${d.table}`,
    `- missing values: ${d.missing_values}`,
    '- uncertainties are standard uncertainties (one standard deviation, coverage factor k = 1); statistical and systematic parts are kept apart',
    '',
    '| column | type | unit | description | uncertainty |',
    '|---|---|---|---|---|',
    ...d.columns.map((c) => `| \`${cell(c.name)}\` | ${cell(c.type)} | ${cell(c.unit)} | ${cell(c.description)} | ${cell(c.uncertainty)} |`),
    '',
  ].join('\n');
}
