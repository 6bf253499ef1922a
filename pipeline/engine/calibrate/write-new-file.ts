import { closeSync, fsyncSync, linkSync, mkdirSync, openSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';

/**
 * Writes a file that must not exist yet, atomically: the bytes go to a temporary name in the same
 * folder (fsync), then a hard link gives them the final name — link(2) fails with EEXIST instead
 * of replacing an existing file, so a file another process wrote meanwhile is never overwritten —
 * and the temporary name is removed. Readers see no file or the complete one.
 * @returns false when the name already exists (nothing written)
 */
export function writeNewFileAtomic(path: string, bytes: Uint8Array): boolean {
  mkdirSync(dirname(path), { recursive: true });
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  let fd: number | null = null;
  try {
    fd = openSync(tmp, 'wx');
    let off = 0;
    while (off < bytes.length) off += writeSync(fd, bytes, off, bytes.length - off);
    fsyncSync(fd);
    closeSync(fd);
    fd = null;
    try {
      linkSync(tmp, path);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'EEXIST') return false;
      throw e;
    }
    return true;
  } finally {
    if (fd !== null) closeSync(fd);
    rmSync(tmp, { force: true });
  }
}
