import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { buildDir, listVersions, nextVersionName, publishVersion, pruneVersions, readCurrent, removeLeftovers, versionsDir, writeCurrent } from '../../../pipeline/engine/archive/version-store.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-versions-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

function publish(seriesOut: string): string {
  const v = nextVersionName(seriesOut);
  const b = buildDir(seriesOut, v);
  writeFileSync(join(b, 'manifest.json'), '{}');
  publishVersion(seriesOut, b, v);
  return v;
}

describe('version store: build hidden, rename into place, switch the pointer (rename is atomic on POSIX: common practice)', () => {
  it('numbers versions v000001, v000002, … and hides folders being built', () => {
    const s = join(root, 'a');
    expect(nextVersionName(s)).toBe('v000001');
    const b = buildDir(s, 'v000001');
    expect(listVersions(s), 'a build folder is not a version').toEqual([]);
    writeFileSync(join(b, 'x'), '1');
    publishVersion(s, b, 'v000001');
    expect(listVersions(s)).toEqual(['v000001']);
    expect(nextVersionName(s)).toBe('v000002');
  });

  it('the pointer names the current and the previous version; an unreadable pointer reads as none', () => {
    const s = join(root, 'b');
    mkdirSync(s, { recursive: true });
    expect(readCurrent(s)).toBeNull();
    writeCurrent(s, { version: 'v000002', previous: 'v000001', switched_at: '2026-01-01T00:00:00Z' });
    expect(readCurrent(s)).toEqual({ version: 'v000002', previous: 'v000001', switched_at: '2026-01-01T00:00:00Z' });
    expect(readdirSync(s).filter((n) => n.startsWith('.')), 'no temporary file left').toEqual([]);
    writeFileSync(join(s, 'current'), '{"version": "../etc"}');
    expect(readCurrent(s)).toBeNull();
  });

  it('--keep N keeps the newest N and always the current and previous versions', () => {
    const s = join(root, 'c');
    for (let i = 0; i < 6; i++) publish(s);
    expect(pruneVersions(s, 2, ['v000002', 'v000001'])).toEqual(['v000003', 'v000004']);
    expect(listVersions(s)).toEqual(['v000001', 'v000002', 'v000005', 'v000006']);
  });

  it('removes build and trash folders and temporary files a killed run left', () => {
    const s = join(root, 'd');
    publish(s);
    mkdirSync(join(versionsDir(s), '.building-v000002-12345'));
    mkdirSync(join(versionsDir(s), '.trash-v000000-12345'));
    writeFileSync(join(s, '.current.12345.tmp'), 'partial');
    expect(removeLeftovers(s).sort()).toEqual(['.building-v000002-12345', '.current.12345.tmp', '.trash-v000000-12345']);
    expect(readdirSync(versionsDir(s))).toEqual(['v000001']);
    expect(existsSync(join(s, '.current.12345.tmp'))).toBe(false);
  });
});
