import { existsSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, readlinkSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { buildDir, listVersions, nextVersionName, publishVersion, pruneVersions, readCurrent, removeLeftovers, switchCurrent, versionDir, versionsDir } from '../../../pipeline/engine/archive/version-store.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-versions-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

function publish(seriesOut: string, previous: string | null = null): string {
  const v = nextVersionName(seriesOut);
  const b = buildDir(seriesOut, v);
  writeFileSync(join(b, 'manifest.json'), '{}');
  publishVersion(seriesOut, b, v, previous, new Date('2026-01-01T00:00:00Z'));
  return v;
}

describe('version store: build hidden, rename into place, swap the current link (rename is atomic on POSIX: common practice)', () => {
  it('numbers versions v000001, v000002, … and hides folders being built', () => {
    const s = join(root, 'a');
    expect(nextVersionName(s)).toBe('v000001');
    const b = buildDir(s, 'v000001');
    expect(listVersions(s), 'a build folder is not a version').toEqual([]);
    writeFileSync(join(b, 'x'), '1');
    publishVersion(s, b, 'v000001', null);
    expect(listVersions(s)).toEqual(['v000001']);
    expect(nextVersionName(s)).toBe('v000002');
  });

  it('current is a relative symbolic link to versions/<V>, swapped by renaming a new link over it; the version record names the previous one', () => {
    const s = join(root, 'b');
    mkdirSync(s, { recursive: true });
    expect(readCurrent(s)).toBeNull();
    const v1 = publish(s);
    const v2 = publish(s, v1);
    expect(JSON.parse(readFileSync(join(versionDir(s, v2), 'version.json'), 'utf8'))).toEqual({ version: 'v000002', previous: 'v000001', published_at: '2026-01-01T00:00:00.000Z' });
    switchCurrent(s, v1);
    expect(lstatSync(join(s, 'current')).isSymbolicLink()).toBe(true);
    expect(readlinkSync(join(s, 'current'))).toBe('versions/v000001');
    expect(readCurrent(s)).toEqual({ version: 'v000001', previous: null });
    const before = lstatSync(join(s, 'current')).ino;
    switchCurrent(s, v2);
    expect(readlinkSync(join(s, 'current'))).toBe('versions/v000002');
    expect(lstatSync(join(s, 'current')).ino, 'a new link, not the old one edited').not.toBe(before);
    expect(readCurrent(s)).toEqual({ version: 'v000002', previous: 'v000001' });
    expect(readFileSync(join(s, 'current', 'manifest.json'), 'utf8'), 'the link resolves to the version folder').toBe('{}');
    expect(readdirSync(s).filter((n) => n.startsWith('.')), 'no temporary link left').toEqual([]);
    expect(() => switchCurrent(s, 'v000009'), 'no link to a version that does not exist').toThrow(/no such version/);
    expect(readCurrent(s)?.version).toBe('v000002');
  });

  it('anything but a link to an existing versions/<V> reads as no current version', () => {
    const s = join(root, 'b2');
    mkdirSync(s, { recursive: true });
    const v1 = publish(s);
    for (const target of ['../etc', `/tmp/versions/${v1}`, 'versions/v000007', `versions/${v1}/../${v1}`]) {
      rmSync(join(s, 'current'), { force: true });
      symlinkSync(target, join(s, 'current'));
      expect(readCurrent(s), target).toBeNull();
    }
    rmSync(join(s, 'current'));
    writeFileSync(join(s, 'current'), '{"version": "v000001"}');
    expect(readCurrent(s), 'a plain file (the pointer file of an older layout)').toBeNull();
    switchCurrent(s, v1);
    expect(readCurrent(s)?.version, 'the swap replaces a plain file too').toBe(v1);
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
    symlinkSync('versions/v000002', join(s, '.current.12345.tmp')); // a link made but never renamed
    expect(removeLeftovers(s).sort()).toEqual(['.building-v000002-12345', '.current.12345.tmp', '.trash-v000000-12345']);
    expect(readdirSync(versionsDir(s))).toEqual(['v000001']);
    expect(lstatSync(join(s, '.current.12345.tmp'), { throwIfNoEntry: false })).toBeUndefined();
  });
});
