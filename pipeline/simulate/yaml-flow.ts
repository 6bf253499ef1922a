/**
 * Minimal, deterministic YAML writing for the simulator's files: scalars, and flow mappings
 * and sequences (`{ id: d01, angle_deg: 150 }`), as DESIGN.md shows the layout. Numbers use
 * JavaScript's shortest round-trip form (locale-free); strings stay plain only when YAML cannot
 * read them as anything but that string, else they are double-quoted (JSON escapes are valid YAML).
 */
const PLAIN = /^(?:[A-Za-z]|\d+[A-Za-z])[A-Za-z0-9_.-]*$/;
const KEYWORDS = /^(?:true|false|null|yes|no|on|off|y|n|nan|inf)$/i;

export function yamlScalar(value: string | number | boolean): string {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new RangeError(`cannot write a non-finite number (${value})`);
    return String(value);
  }
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  return PLAIN.test(value) && !KEYWORDS.test(value) && !/^\d+e\d*$/i.test(value) ? value : JSON.stringify(value);
}

export type YamlValue = string | number | boolean | readonly YamlValue[] | { readonly [key: string]: YamlValue | undefined };

/** A value in flow style; object keys in insertion order, undefined members left out. */
export function yamlFlow(value: YamlValue): string {
  if (Array.isArray(value)) return `[${value.map((v) => yamlFlow(v)).join(', ')}]`;
  if (typeof value === 'object') {
    const parts = Object.entries(value as Record<string, YamlValue | undefined>)
      .filter((e): e is [string, YamlValue] => e[1] !== undefined)
      .map(([k, v]) => `${yamlScalar(k)}: ${yamlFlow(v)}`);
    return `{ ${parts.join(', ')} }`;
  }
  return yamlScalar(value as string | number | boolean);
}
