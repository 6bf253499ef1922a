/**
 * One spectrum file, `spectra/<run>.csv` (DESIGN.md): header `channel,<detector ids…>`, then one
 * row per channel 0…N−1 of non-negative integer counts, `\n` line ends. Encoded straight into
 * bytes (no per-line strings) so a 4,096-channel, 16-detector run takes a fraction of a ms.
 * @param detectorIds column names after `channel`
 * @param counts one array per detector, all of the same length N
 */
export function encodeSpectrumCsv(detectorIds: readonly string[], counts: readonly Int32Array[]): Buffer {
  if (detectorIds.length !== counts.length) throw new RangeError(`${detectorIds.length} detector ids but ${counts.length} count arrays`);
  const n = counts[0]?.length ?? 0;
  for (const c of counts) if (c.length !== n) throw new RangeError('every detector needs the same number of channels');
  const header = Buffer.from(`channel,${detectorIds.join(',')}\n`, 'ascii');
  let size = header.length;
  let maxCount = 0;
  for (const c of counts) for (let i = 0; i < n; i++) if (c[i]! > maxCount) maxCount = c[i]!;
  size += n * (decimalDigits(Math.max(n - 1, 0)) + 1 + counts.length * (decimalDigits(maxCount) + 1));
  const out = Buffer.allocUnsafe(size);
  header.copy(out, 0);
  let pos = header.length;
  for (let ch = 0; ch < n; ch++) {
    pos = writeUint(out, pos, ch);
    for (let d = 0; d < counts.length; d++) {
      out[pos++] = 44; // ','
      const v = counts[d]![ch]!;
      if (v < 0 || !Number.isInteger(v)) throw new RangeError(`count ${v} in channel ${ch} is not a non-negative integer`);
      pos = writeUint(out, pos, v);
    }
    out[pos++] = 10; // '\n'
  }
  return out.subarray(0, pos);
}

function decimalDigits(v: number): number {
  let digits = 1;
  while (v >= 10) {
    v = Math.floor(v / 10);
    digits++;
  }
  return digits;
}

function writeUint(buf: Buffer, pos: number, v: number): number {
  if (v < 10) {
    buf[pos] = 48 + v;
    return pos + 1;
  }
  const end = pos + decimalDigits(v);
  let p = end;
  while (v >= 10) {
    const q = Math.floor(v / 10);
    buf[--p] = 48 + (v - q * 10);
    v = q;
  }
  buf[--p] = 48 + v;
  return end;
}
