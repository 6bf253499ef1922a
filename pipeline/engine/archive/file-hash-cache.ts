import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
import type { Ledger } from './ledger.js';

interface Entry {
  size: number;
  mtime_ns: string;
  ino: string;
  sha256: string;
}

/**
 * sha256 of input files, remembered in the ledger by (path, size, mtime in ns, inode): a file
 * whose size, modification time and inode are unchanged is taken as unchanged and not read
 * again, so a night with no new data reads no spectrum. A file rewritten in place to the same
 * size within the same nanosecond would be missed; `xsred rereduce` hashes every file afresh.
 * New hashes are written to the ledger in one transaction by `flush`.
 */
export class FileHashCache {
  private readonly pending = new Map<string, Entry>();
  private readonly get: ((path: string) => Entry | undefined) | null;
  /** Files read and hashed (not taken from the ledger). */
  readCount = 0;

  constructor(
    private readonly ledger: Ledger,
    /** false: hash every file afresh (still remembering the results). */
    private readonly trustStat: boolean,
  ) {
    const q = ledger.db.prepare('SELECT size, mtime_ns, ino, sha256 FROM file_hashes WHERE path = ?');
    this.get = trustStat ? (path) => q.get(path) as Entry | undefined : null;
  }

  /** sha256 (hex) of the file at an absolute path. */
  hash(path: string): string {
    const st = statSync(path, { bigint: true });
    const size = Number(st.size);
    const mtimeNs = String(st.mtimeNs);
    const ino = String(st.ino);
    const known = this.pending.get(path) ?? this.get?.(path);
    if (known && known.size === size && known.mtime_ns === mtimeNs && known.ino === ino) return known.sha256;
    const sha256 = createHash('sha256').update(readFileSync(path)).digest('hex');
    this.readCount++;
    this.pending.set(path, { size, mtime_ns: mtimeNs, ino, sha256 });
    return sha256;
  }

  /** Writes the hashes learnt since the last flush (one transaction). */
  flush(): void {
    if (this.pending.size === 0) return;
    const put = this.ledger.db.prepare('INSERT OR REPLACE INTO file_hashes (path, size, mtime_ns, ino, sha256) VALUES (?, ?, ?, ?, ?)');
    this.ledger.db.transaction(() => {
      for (const [p, e] of this.pending) put.run(p, e.size, e.mtime_ns, e.ino, e.sha256);
    })();
    this.pending.clear();
  }
}
