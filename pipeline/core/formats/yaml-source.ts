import { LineCounter, isAlias, isMap, isScalar, isSeq, parseDocument, type Document, type Node as YamlNode, type YAMLError } from 'yaml';
import type { Diagnostic } from '../diagnostics/diagnostic.js';

export { zodIssuesToDiagnostics } from './zod-issues-to-diagnostics.js';

/** A parsed YAML file that still knows where each value was written. */
export interface YamlSource {
  file: string;
  /** The document as plain data (mappings as objects, sequences as arrays). */
  value: unknown;
  /** 1-based position of the value at `path`, or of the nearest parent that exists. */
  locate(path: ReadonlyArray<string | number>): { line: number; column: number } | undefined;
  /** Like `locate`, but the position of the mapping key that ends `path` when there is one (for "unknown key" messages). */
  locateKey?(path: ReadonlyArray<string | number>): { line: number; column: number } | undefined;
}

const HINTS: Record<string, string> = {
  DUPLICATE_KEY: 'each key may appear once in a mapping: remove or rename one of them',
  TAB_AS_INDENT: 'YAML indents with spaces only: replace the tabs',
  BAD_INDENT: 'line up the keys of one mapping (or the items of one list) at the same indentation, and close every [ and {',
  MISSING_CHAR: 'a quote or bracket opened here is not closed',
  MULTIPLE_DOCS: 'put one document per file: remove the `---` line and what follows, or split the file',
  BLOCK_AS_IMPLICIT_KEY: 'a value on the same line as its key cannot start a nested mapping: move it to the next line, indented',
  MULTILINE_IMPLICIT_KEY: 'a key must fit on one line: check the indentation of the line after',
};

/** The text an error points at: its span on that line, widened to the rest of the line when it is a single character. */
function pointedText(text: string, e: YAMLError): string {
  const lineEnd = text.slice(e.pos[0]).search(/\r?\n|$/) + e.pos[0];
  const end = Math.min(e.pos[1], lineEnd);
  const span = end - e.pos[0] > 1 ? text.slice(e.pos[0], end) : text.slice(e.pos[0], lineEnd);
  return span.slice(0, 40).trimEnd();
}

function errorToDiagnostic(e: YAMLError, severity: 'error' | 'warning', text: string, lineCounter: LineCounter, file: string): Diagnostic {
  const { line, col } = lineCounter.linePos(e.pos[0]);
  const snippet = pointedText(text, e);
  let message = `${e.message.replace(/\.$/, '')}${snippet === '' ? '' : ` at ${JSON.stringify(snippet)}`}`;
  let actual = snippet === '' ? undefined : JSON.stringify(snippet);
  if (e.code === 'DUPLICATE_KEY') {
    const key = snippet.replace(/\s*:.*$/, '').replace(/^(["'])(.*)\1$/, '$2');
    message = `key ${JSON.stringify(key)} appears twice in the same mapping`;
    actual = JSON.stringify(key);
  } else if (e.code === 'MULTIPLE_DOCS') {
    message = 'the file holds more than one YAML document (a `---` line starts another)';
  }
  return {
    severity,
    message,
    file,
    line,
    column: col,
    rule: `yaml-${e.code.toLowerCase().replace(/_/g, '-')}`,
    ...(actual === undefined ? {} : { actual }),
    hint: HINTS[e.code] ?? 'check the YAML syntax at this position',
  };
}

function keyMatches(key: unknown, segment: string | number): boolean {
  return isScalar(key) && String(key.value) === String(segment);
}

/** Walks `path` from the document root; returns the deepest node reached and, when the last step was a mapping key, that key node. */
function walk(doc: Document, path: ReadonlyArray<string | number>): { node: YamlNode | null; key: YamlNode | null } {
  let node = doc.contents as YamlNode | null;
  let key: YamlNode | null = null;
  for (const segment of path) {
    if (isAlias(node)) node = (node.resolve(doc) as YamlNode | undefined) ?? node;
    if (isMap(node)) {
      const pair = node.items.find((p) => keyMatches(p.key, segment));
      if (pair === undefined) return { node, key: null };
      key = pair.key as YamlNode;
      const value = pair.value as YamlNode | null;
      // `key:` with nothing after it: an empty scalar whose position is the key's end.
      const empty = value === null || (isScalar(value) && value.value === null && value.range?.[0] === value.range?.[1]);
      node = empty ? key : value;
    } else if (isSeq(node)) {
      const index = typeof segment === 'number' ? segment : /^\d+$/.test(segment) ? Number(segment) : -1;
      const item = node.items[index] as YamlNode | undefined;
      if (item === undefined || item === null) return { node, key: null };
      key = null;
      node = item;
    } else {
      return { node, key: null };
    }
  }
  return { node, key };
}

/**
 * Parses one YAML document with positions. Syntax errors and duplicate keys are error
 * diagnostics at the parser's line and column (and `source` is null); an empty document is
 * an error too. A BOM, CRLF and lone-CR line ends are accepted.
 */
export function loadYaml(text: string, file: string): { source: YamlSource | null; diagnostics: Diagnostic[] } {
  // A BOM is dropped so line-1 columns match what an editor shows. A lone CR ends a line on
  // old lab machines; YAML 1.2 counts it as a break but the parser does not (same length,
  // so offsets stay valid).
  const normalized = text.replace(/^\uFEFF/, '').replace(/\r(?!\n)/g, '\n');
  const lineCounter = new LineCounter();
  const doc = parseDocument(normalized, { lineCounter, uniqueKeys: true, prettyErrors: false });
  const diagnostics: Diagnostic[] = [
    ...doc.errors.map((e) => errorToDiagnostic(e, 'error', normalized, lineCounter, file)),
    ...doc.warnings.map((e) => errorToDiagnostic(e, 'warning', normalized, lineCounter, file)),
  ];
  if (doc.errors.length > 0) return { source: null, diagnostics };
  if (doc.contents === null) {
    diagnostics.push({
      severity: 'error',
      message: 'the YAML file holds no document (it is empty or only comments)',
      file,
      line: 1,
      column: 1,
      rule: 'yaml-empty',
      expected: 'a mapping of keys to values',
      actual: 'nothing',
      hint: 'check that the file was saved completely',
    });
    return { source: null, diagnostics };
  }
  let value: unknown;
  try {
    value = doc.toJS({ maxAliasCount: 100 });
  } catch (e) {
    diagnostics.push({
      severity: 'error',
      message: `the document cannot be expanded: ${(e as Error).message}`,
      file,
      rule: 'yaml-alias-expansion',
      hint: 'use fewer or shallower aliases (*name); write the values out',
    });
    return { source: null, diagnostics };
  }
  const position = (node: YamlNode | null): { line: number; column: number } | undefined => {
    const offset = node?.range?.[0];
    if (offset === undefined) return undefined;
    const { line, col } = lineCounter.linePos(offset);
    return { line, column: col };
  };
  const source: YamlSource = {
    file,
    value,
    locate: (path) => position(walk(doc, path).node),
    locateKey: (path) => {
      const { node, key } = walk(doc, path);
      return position(key ?? node);
    },
  };
  return { source, diagnostics };
}
