import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve, dirname } from 'node:path';
import { describe, expect, it } from 'vitest';

// The layering of DEVELOPERS.md ("Layout"): pipeline/core ← stages ← pipeline/engine; no stage imports another.
const root = resolve(__dirname, '../..');
function files(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? files(p) : p.endsWith('.ts') ? [p] : [];
  });
}
const layerOf = (p: string) => {
  const r = relative(root, p);
  if (r.startsWith('pipeline/core/')) return 'core';
  if (r.startsWith('stages/')) return `stage:${r.split('/')[1]}`;
  if (r.startsWith('pipeline/simulate/')) return 'simulate';
  if (r.startsWith('pipeline/engine/')) return 'engine';
  if (r.startsWith('pipeline/tools/')) return 'tools';
  return 'other';
};
const allowed: Record<string, (to: string, from: string) => boolean> = {
  core: (to) => to === 'core',
  simulate: (to) => to === 'core' || to === 'simulate',
  engine: (to) => to !== 'tools',
  tools: () => true,
};

describe('imports run one way', () => {
  it('core imports only core; a stage imports core and itself; simulate imports core', () => {
    const bad: string[] = [];
    for (const f of [...files(join(root, 'pipeline')), ...files(join(root, 'stages'))]) {
      const from = layerOf(f);
      const text = readFileSync(f, 'utf8');
      for (const m of text.matchAll(/(?:from|import)\s*\(?\s*'(\.[^']+)'/g)) {
        const to = layerOf(resolve(dirname(f), m[1]!));
        const ok = from.startsWith('stage:') ? to === 'core' || to === from : (allowed[from]?.(to, from) ?? true);
        if (!ok) bad.push(`${relative(root, f)} (${from}) imports ${m[1]} (${to})`);
      }
    }
    expect(bad).toEqual([]);
  });
});
