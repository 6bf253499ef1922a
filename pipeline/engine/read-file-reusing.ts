import { closeSync, fstatSync, openSync, readSync } from 'node:fs';

/**
 * Reads a whole file into a buffer that is reused from call to call (one per thread), so a
 * stream of thousands of spectrum files allocates no new memory per file. The returned view
 * is valid until the next call.
 */
export class ReusableFileReader {
  private buffer = Buffer.allocUnsafe(1 << 20);

  read(path: string): Uint8Array {
    const fd = openSync(path, 'r');
    try {
      let size = fstatSync(fd).size;
      if (size + 1 > this.buffer.length) this.buffer = Buffer.allocUnsafe(Math.max(size + 1, this.buffer.length * 2));
      let off = 0;
      for (;;) {
        if (off === this.buffer.length) {
          const grown = Buffer.allocUnsafe(this.buffer.length * 2);
          this.buffer.copy(grown, 0, 0, off);
          this.buffer = grown;
        }
        const n = readSync(fd, this.buffer, off, this.buffer.length - off, off);
        if (n === 0) break;
        off += n;
        if (off >= size) size = off; // the file may still grow while read; keep reading to its end
      }
      return new Uint8Array(this.buffer.buffer, this.buffer.byteOffset, off);
    } finally {
      closeSync(fd);
    }
  }
}
