import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as arrow from 'apache-arrow';
import * as aq from 'arquero';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REPO_ROOT, runCli } from './run-cli.js';

// Interoperability: the Arrow IPC files read by a second, independent implementation
// (arquero's reader, the flechette library) give the same values as apache-arrow's reader.
const out = mkdtempSync(join(tmpdir(), 'xsred-reader-'));
beforeAll(async () => {
  const r = await runCli(['reduce', join(REPO_ROOT, 'sample-runs/fval-2026-c12-alpha'), '--out', out, '--no-html', '-q']);
  expect(r.code).toBe(0);
});
afterAll(() => rmSync(out, { recursive: true, force: true }));

describe('Arrow outputs read by an independent reader (arquero / flechette)', () => {
  for (const name of ['cross_sections', 'normalization', 'yields', 'qc']) {
    it(`${name}.arrow: same columns, same values, nulls where apache-arrow sees nulls`, () => {
      const bytes = readFileSync(join(out, 'fval-2026-c12-alpha', `${name}.arrow`));
      const a = arrow.tableFromIPC(bytes);
      const b = aq.fromArrow(bytes);
      expect(b.columnNames()).toEqual(a.schema.fields.map((f) => f.name));
      expect(b.numRows()).toBe(a.numRows);
      expect(a.numRows).toBeGreaterThan(0);
      for (const f of a.schema.fields) {
        const col = a.getChild(f.name)!;
        for (let i = 0; i < a.numRows; i++) {
          const x = col.get(i);
          const y = b.get(f.name, i);
          if (x === null) expect(y, `${f.name}[${i}]`).toBeNull();
          else expect(y, `${f.name}[${i}]`).toBe(x);
        }
      }
    });
  }
});
