import { describe, expect, it } from 'vitest';
import { encodeSpectrumCsv } from '../../pipeline/simulate/encode-spectrum-csv.js';

describe('encodeSpectrumCsv', () => {
  it('writes the DESIGN.md spectrum layout: header channel,<ids>, channels 0…N−1 in order, integers, \\n endings', () => {
    const a = Int32Array.from([0, 9, 10, 99, 100, 123456789, 7, 2147483647, 1, 0, 1000, 42]);
    const b = Int32Array.from([5, 0, 0, 1, 19, 20, 999999, 3, 0, 0, 0, 8]);
    const text = encodeSpectrumCsv(['d01', 'd-back'], [a, b]).toString('ascii');
    // An independent, naive encoding of the same layout.
    const naive = `channel,d01,d-back\n${Array.from(a, (v, ch) => `${ch},${v},${b[ch]}`).join('\n')}\n`;
    expect(text).toBe(naive);
    const lines = text.trimEnd().split('\n');
    expect(lines).toHaveLength(13);
    lines.slice(1).forEach((line, ch) => expect(line.startsWith(`${ch},`)).toBe(true));
  });

  it('handles 4,096 channels and the counts of a real spectrum byte-for-byte like the naive encoding', () => {
    const counts = Array.from({ length: 3 }, (_, d) => Int32Array.from({ length: 4096 }, (_, ch) => (ch * 7919 + d * 104729) % 50000));
    const text = encodeSpectrumCsv(['a', 'b', 'c'], counts).toString('ascii');
    const naive = `channel,a,b,c\n${Array.from({ length: 4096 }, (_, ch) => `${ch},${counts[0]![ch]},${counts[1]![ch]},${counts[2]![ch]}`).join('\n')}\n`;
    expect(text).toBe(naive);
  });

  it('refuses negative counts, unequal lengths and a count array per missing id', () => {
    expect(() => encodeSpectrumCsv(['d01'], [Int32Array.from([1, -1])])).toThrow(RangeError);
    expect(() => encodeSpectrumCsv(['d01', 'd02'], [new Int32Array(4), new Int32Array(5)])).toThrow(RangeError);
    expect(() => encodeSpectrumCsv(['d01', 'd02'], [new Int32Array(4)])).toThrow(RangeError);
  });
});
