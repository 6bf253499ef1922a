import { z } from 'zod';
import { calibrationSchema } from '../core/config/calibration-schema.js';
import { extractSettingsSchema, normalizationSchema, seriesSchema } from '../core/config/series-schema.js';
import { describeSettings } from '../core/config/setting.js';

const withId = (schema: z.ZodType, id: string, title: string) => ({ $id: id, title, ...(z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as object) });

/** The generated files of configs/, as path (relative to the repository) and text. */
export function schemaFiles(): { path: string; text: string }[] {
  const json = (v: unknown) => `${JSON.stringify(v, null, 2)}\n`;
  const defaults = {
    extract: extractSettingsSchema.parse({}),
    normalization: Object.fromEntries(
      Object.entries(normalizationSchema.shape)
        .map(([k, s]) => [k, (s as z.ZodType).safeParse(undefined)] as const)
        .filter(([, r]) => r.success && r.data !== undefined)
        .map(([k, r]) => [k, (r as { data: unknown }).data]),
    ),
  };
  return [
    { path: 'configs/series.schema.json', text: json(withId(seriesSchema, 'xsred/series.schema.json', 'xsred run series (series.yaml)')) },
    { path: 'configs/calibration.schema.json', text: json(withId(calibrationSchema, 'xsred/calibration.schema.json', 'xsred energy calibration version (calibrations/*.yaml)')) },
    { path: 'configs/defaults.json', text: json(defaults) },
  ];
}

/** The README table of every tunable setting, from the same definitions. */
export function settingsTableMarkdown(): string {
  const rows = [...describeSettings('normalization', normalizationSchema), ...describeSettings('extract', extractSettingsSchema)].filter((r) => r.default !== '');
  const lines = ['| key in series.yaml | values | unit | default | meaning |', '|---|---|---|---|---|'];
  for (const r of rows) lines.push(`| \`${r.key}\` | ${r.type} | ${r.unit} | ${r.default} | ${r.description} |`);
  return `${lines.join('\n')}\n`;
}
