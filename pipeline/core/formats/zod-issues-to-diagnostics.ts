import type { Diagnostic, StageName } from '../diagnostics/diagnostic.js';
import type { YamlSource } from './yaml-source.js';

/**
 * The parts of a zod 4 issue this module reads. Only `path` and `message` are required, so
 * hand-made issues work too; the optional fields are those zod sets for its own checks.
 */
export interface SchemaIssue {
  path: ReadonlyArray<PropertyKey>;
  message: string;
  code?: string;
  expected?: unknown;
  values?: ReadonlyArray<unknown>;
  keys?: ReadonlyArray<string>;
  minimum?: unknown;
  maximum?: unknown;
  inclusive?: boolean;
  origin?: string;
  errors?: ReadonlyArray<ReadonlyArray<SchemaIssue>>;
  issues?: ReadonlyArray<SchemaIssue>;
}

type Segment = string | number;

/** `detectors[2].angle_deg`; keys that are not plain words are bracketed: `composition["my key"]`. */
export function formatIssuePath(path: ReadonlyArray<Segment>): string {
  let out = '';
  for (const segment of path) {
    if (typeof segment === 'number') out += `[${segment}]`;
    else if (/^[A-Za-z0-9_-]+$/.test(segment)) out += out === '' ? segment : `.${segment}`;
    else out += `[${JSON.stringify(segment)}]`;
  }
  return out;
}

/** The value found at `path` in plain data, or undefined. */
function valueAt(root: unknown, path: ReadonlyArray<Segment>): unknown {
  let v = root;
  for (const segment of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<string, unknown>)[segment as string];
  }
  return v;
}

/** A found value as a message shows it: strings quoted, collections summarized. */
export function describeFound(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (typeof v === 'string') return JSON.stringify(v.length > 60 ? `${v.slice(0, 60)}…` : v);
  if (Array.isArray(v)) return `a list of ${v.length} item${v.length === 1 ? '' : 's'}`;
  if (v !== null && typeof v === 'object') {
    const keys = Object.keys(v);
    return keys.length === 0 ? 'an empty mapping' : `a mapping with keys ${keys.slice(0, 5).join(', ')}${keys.length > 5 ? ', …' : ''}`;
  }
  return String(v);
}

const TYPE_WORDS: Record<string, string> = {
  number: 'a number',
  int: 'an integer',
  string: 'a string',
  boolean: 'true or false',
  object: 'a mapping',
  record: 'a mapping',
  array: 'a list',
  tuple: 'a list',
  null: 'null',
  date: 'a date',
  bigint: 'an integer',
};

function typeWord(t: unknown): string {
  return TYPE_WORDS[String(t)] ?? `a ${String(t)}`;
}

function bound(issue: SchemaIssue, small: boolean): string {
  const limit = small ? issue.minimum : issue.maximum;
  const op = small ? (issue.inclusive === false ? '>' : '≥') : issue.inclusive === false ? '<' : '≤';
  if (issue.origin === 'array' || issue.origin === 'set') return `${small ? 'at least' : 'at most'} ${String(limit)} item${Number(limit) === 1 ? '' : 's'}`;
  if (issue.origin === 'string') return `${small ? 'at least' : 'at most'} ${String(limit)} character${Number(limit) === 1 ? '' : 's'}`;
  return `a number ${op} ${String(limit)}`;
}

/** zod's own wording (as opposed to a message the schema author wrote) starts with one of these. */
const ZOD_DEFAULT = /^(Invalid input|Invalid option|Invalid string|Invalid key|Invalid element|Too small|Too big|Unrecognized key|Invalid number)/;

/** What was expected, in words, when zod's default message would otherwise be shown. */
function expectedWords(issue: SchemaIssue): string | undefined {
  switch (issue.code) {
    case 'invalid_type':
      return typeWord(issue.expected);
    case 'too_small':
      return bound(issue, true);
    case 'too_big':
      return bound(issue, false);
    case 'invalid_value': {
      const values = (issue.values ?? []).map((v) => JSON.stringify(v));
      return values.length === 1 ? values[0] : `one of ${values.join(', ')}`;
    }
    case 'invalid_union': {
      const kinds = new Set<string>();
      for (const branch of issue.errors ?? []) for (const inner of branch) if (inner.code === 'invalid_type' && inner.path.length === 0) kinds.add(typeWord(inner.expected));
      return kinds.size > 0 ? [...kinds].join(' or ') : undefined;
    }
    default:
      return undefined;
  }
}

function hintFor(issue: SchemaIssue, found: unknown, path: ReadonlyArray<Segment>): string | undefined {
  const last = path[path.length - 1];
  if (issue.code === 'invalid_type' && typeof found === 'string' && /^\s*[-+]?[0-9.]+(e[-+]?\d+)?\s*[^\s0-9.]/i.test(found)) {
    return `write the bare number: the unit is fixed by the key name${typeof last === 'string' ? ` (${last})` : ''}`;
  }
  if (issue.code === 'invalid_type' && found === undefined) return 'add this key; it is required';
  if (issue.code === 'invalid_value' && issue.values !== undefined) return `use one of: ${issue.values.map(String).join(', ')}`;
  return undefined;
}

/**
 * Turns zod issues from validating `source.value` into diagnostics at the YAML position
 * of each offending value, e.g. `detectors[2].angle_deg: expected a number, found "150 deg"`.
 * zod's default wording is rephrased; a message written in the schema is kept as is, with
 * the value found appended. Rule ids are `<rulePrefix>-<zod code>` (`series-invalid-type`).
 * An unknown key gives one diagnostic per key, at the key.
 */
export function zodIssuesToDiagnostics(
  issues: ReadonlyArray<SchemaIssue>,
  source: YamlSource,
  stage: StageName,
  rulePrefix: string,
): Diagnostic[] {
  const out: Diagnostic[] = [];
  for (const issue of issues) {
    const path = issue.path.map((p) => (typeof p === 'symbol' ? String(p.description) : p)) as Segment[];
    const code = issue.code ?? 'custom';
    const rule = `${rulePrefix}-${code.replace(/_/g, '-')}`;
    const where = path.length === 0 ? 'top level' : formatIssuePath(path);

    if (code === 'unrecognized_keys' && issue.keys !== undefined && issue.keys.length > 0) {
      for (const key of issue.keys) {
        const keyPath = [...path, key];
        out.push({
          severity: 'error',
          message: `${where}: unknown key ${JSON.stringify(key)}`,
          file: source.file,
          ...((source.locateKey !== undefined ? source.locateKey(keyPath) : source.locate(keyPath)) ?? {}),
          stage,
          rule,
          actual: JSON.stringify(key),
          hint: 'check the spelling against the documented keys; unknown keys are refused so a typo never falls back to a default',
        });
      }
      continue;
    }

    const found = valueAt(source.value, path);
    const isDefault = ZOD_DEFAULT.test(issue.message);
    const expected = isDefault ? expectedWords(issue) : undefined;
    let body: string;
    if (code === 'invalid_key') {
      const inner = issue.issues?.[0];
      const reason = inner === undefined ? '' : `: ${ZOD_DEFAULT.test(inner.message) ? (expectedWords(inner) ?? inner.message) : inner.message}`;
      body = `key ${JSON.stringify(String(path[path.length - 1]))} is not allowed${reason}`;
    } else if (expected !== undefined) {
      body = found === undefined ? `missing; expected ${expected}` : `expected ${expected}, found ${describeFound(found)}`;
    } else {
      const text = isDefault ? issue.message.charAt(0).toLowerCase() + issue.message.slice(1) : issue.message;
      body = found === undefined ? text : `${text}, found ${describeFound(found)}`;
    }
    const position = code === 'invalid_key' && source.locateKey !== undefined ? source.locateKey(path) : source.locate(path);
    const hint = hintFor(issue, found, path);
    out.push({
      severity: 'error',
      message: `${where}: ${body}`,
      file: source.file,
      ...(position ?? {}),
      stage,
      rule,
      ...(expected !== undefined ? { expected } : {}),
      actual: describeFound(found),
      ...(hint !== undefined ? { hint } : {}),
    });
  }
  return out;
}
