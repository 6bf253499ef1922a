import { z } from 'zod';

/**
 * One tunable parameter, defined once: its zod type carries the default, the bounds,
 * a one-line doc and the unit. The config validator, the JSON Schema in configs/, the
 * CLI help and the README settings table are all generated from these definitions.
 */
export function numberSetting(opts: { default: number; min?: number; max?: number; unit?: string; doc: string; integer?: boolean }) {
  let s = opts.integer ? z.number().int() : z.number();
  if (opts.min !== undefined) s = s.min(opts.min);
  if (opts.max !== undefined) s = s.max(opts.max);
  return s.default(opts.default).meta({ description: opts.doc, ...(opts.unit ? { unit: opts.unit } : {}) });
}

export function enumSetting<const T extends readonly [string, ...string[]]>(values: T, opts: { default: T[number]; doc: string }) {
  return z.enum(values).default(opts.default as never).meta({ description: opts.doc });
}

export interface SettingRow {
  key: string;
  type: string;
  unit: string;
  default: string;
  description: string;
}

/** Rows describing every setting of an object schema (for help texts and the README table). */
export function describeSettings(prefix: string, schema: z.ZodObject): SettingRow[] {
  const json = z.toJSONSchema(schema, { io: 'input' }) as {
    properties?: Record<string, { type?: string; enum?: string[]; default?: unknown; description?: string; unit?: string; minimum?: number; maximum?: number }>;
  };
  const rows: SettingRow[] = [];
  for (const [key, p] of Object.entries(json.properties ?? {})) {
    let type = p.enum ? p.enum.join(' \\| ') : (p.type ?? 'value');
    if (p.minimum !== undefined || p.maximum !== undefined) type += ` [${p.minimum ?? '−∞'}, ${p.maximum ?? '∞'}]`;
    rows.push({
      key: `${prefix}.${key}`,
      type,
      unit: p.unit ?? '',
      default: p.default === undefined ? '' : String(p.default),
      description: p.description ?? '',
    });
  }
  return rows;
}
