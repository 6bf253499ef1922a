import { z } from 'zod';
import { calibrationSchema } from '../core/config/calibration-schema.js';
import { extractSettingsSchema, normalizationSchema, physicsSettingsSchema, reportSettingsSchema, seriesSchema, seriesSettingRows } from '../core/config/series-schema.js';
import { CROSS_SECTION_COLUMNS } from '../../stages/report/cross-section-columns.js';

const withId = (schema: z.ZodType, id: string, title: string) => ({ $id: id, title, ...(z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as object) });

/** The generated files of configs/, as path (relative to the repository) and text. */
export function schemaFiles(): { path: string; text: string }[] {
  const json = (v: unknown) => `${JSON.stringify(v, null, 2)}\n`;
  const defaults = {
    extract: extractSettingsSchema.parse({}),
    physics: physicsSettingsSchema.parse({}),
    report: reportSettingsSchema.parse({}),
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
  const rows = seriesSettingRows();
  const lines = ['| key in series.yaml | values | unit | default | meaning |', '|---|---|---|---|---|'];
  for (const r of rows) lines.push(`| \`${r.key}\` | ${r.type} | ${r.unit} | ${r.default} | ${r.description} |`);
  return `${lines.join('\n')}\n`;
}

/** The README table of cross_sections.arrow, from the report's column definitions. */
export function columnsTableMarkdown(): string {
  const lines = ['| column | unit | meaning |', '|---|---|---|'];
  for (const c of CROSS_SECTION_COLUMNS) lines.push(`| \`${c.name}\` | ${c.unit ?? ''} | ${c.description.replace(/\|/g, '\\|')} |`);
  return `${lines.join('\n')}\n`;
}

/** Replaces the text between `<!-- name:start -->` and `<!-- name:end -->`. */
export function replaceBetween(text: string, name: string, body: string): string {
  const start = `<!-- ${name}:start -->`;
  const end = `<!-- ${name}:end -->`;
  const i = text.indexOf(start);
  const j = text.indexOf(end);
  if (i < 0 || j < i) throw new Error(`README has no ${start} … ${end} block`);
  return `${text.slice(0, i + start.length)}\n${body}${text.slice(j)}`;
}
