import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { columnsTableMarkdown, schemaFiles, settingsTableMarkdown } from '../../pipeline/tools/schema-files.js';
import { seriesSchema } from '../../pipeline/core/config/series-schema.js';

const root = resolve(__dirname, '../..');

describe('generated configuration files (regression: run `npm run schemas` when this fails)', () => {
  it('configs/*.json are what the zod definitions generate', () => {
    for (const f of schemaFiles()) expect(readFileSync(resolve(root, f.path), 'utf8'), f.path).toBe(f.text);
  });
  it('the README settings and column tables are current', () => {
    const readme = readFileSync(resolve(root, 'README.md'), 'utf8');
    expect(readme).toContain(settingsTableMarkdown());
    expect(readme).toContain(columnsTableMarkdown());
  });
  it('the shipped demo series.yaml validates against the schema', async () => {
    const { parse } = await import('yaml');
    const text = readFileSync(resolve(root, 'sample-runs/fval-2026-c12-alpha/series.yaml'), 'utf8');
    expect(seriesSchema.safeParse(parse(text)).success).toBe(true);
  });
  it('the minimal series.yaml printed in the README validates', async () => {
    const { parse } = await import('yaml');
    const readme = readFileSync(resolve(root, 'README.md'), 'utf8');
    const block = /A minimal `series.yaml`:\n\n```yaml\n([\s\S]*?)```/.exec(readme);
    expect(block).not.toBeNull();
    const r = seriesSchema.safeParse(parse(block![1]!));
    expect(r.success, JSON.stringify(r.error?.issues)).toBe(true);
  });
});
