import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, afterEach, describe, expect, it, vi } from 'vitest';
import { stringify } from 'yaml';
import { runSimulateCommand } from '../../pipeline/engine/simulate-command.js';
import { smallSpec } from '../simulate/small-spec.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-simulate-command-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));
afterEach(() => vi.restoreAllMocks());

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  vi.spyOn(process.stdout, 'write').mockImplementation((chunk) => (out.push(String(chunk)), true));
  vi.spyOn(process.stderr, 'write').mockImplementation((chunk) => (err.push(String(chunk)), true));
  return { out, err };
}

describe('runSimulateCommand', () => {
  it('writes the series, prints its path and returns 0', async () => {
    const specPath = join(root, 'ok.yaml');
    writeFileSync(specPath, stringify(smallSpec()));
    const io = capture();
    const code = await runSimulateCommand(specPath, join(root, 'out'));
    expect(code).toBe(0);
    expect(io.out.join('')).toBe(`${join(root, 'out', 'test-small')}\n`);
    expect(existsSync(join(root, 'out', 'test-small', 'truth.csv'))).toBe(true);
  });

  it('returns 2 with file:line:col diagnostics for an invalid spec and writes nothing', async () => {
    const specPath = join(root, 'bad.yaml');
    writeFileSync(specPath, stringify(smallSpec({ channels: 3 })));
    const io = capture();
    expect(await runSimulateCommand(specPath, join(root, 'bad-out'))).toBe(2);
    expect(io.err.join('')).toMatch(new RegExp(`^${specPath.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:\\d+:\\d+: error: channels: `));
    expect(existsSync(join(root, 'bad-out'))).toBe(false);
  });

  it('returns 2 for a missing spec file and for an output folder holding a series that was not simulated', async () => {
    const io = capture();
    expect(await runSimulateCommand(join(root, 'nope.yaml'), join(root, 'x'))).toBe(2);
    expect(io.err.join('')).toMatch(/cannot read the simulation spec/);
    const specPath = join(root, 'ok2.yaml');
    writeFileSync(specPath, stringify(smallSpec()));
    mkdirSync(join(root, 'taken', 'test-small'), { recursive: true });
    expect(await runSimulateCommand(specPath, join(root, 'taken'))).toBe(2);
    expect(io.err.join('')).toMatch(/not a simulated series/);
  });
});
