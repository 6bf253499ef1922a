// xoshiro128**: D. Blackman, S. Vigna, "Scrambled linear pseudorandom number generators", ACM Trans. Math. Softw. 47(4), 36 (2021).
import { splitMix64Sequence } from './splitmix64.js';

/**
 * The xoshiro128** 1.1 generator: 128 bits of state (four 32-bit words), period 2^128 − 1.
 *
 *   output = rotl(s1 · 5, 7) · 9
 *   t = s1 ≪ 9;  s2 ⊕= s0;  s3 ⊕= s1;  s1 ⊕= s2;  s0 ⊕= s3;  s2 ⊕= t;  s3 = rotl(s3, 11)
 *
 * All arithmetic is mod 2^32. Not for cryptography; for reproducible simulation.
 */
export class Xoshiro128StarStar {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;

  /** From four 32-bit state words (not all zero). */
  constructor(state: readonly [number, number, number, number]) {
    [this.s0, this.s1, this.s2, this.s3] = state.map((w) => w | 0) as [number, number, number, number];
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) throw new RangeError('xoshiro128** state must not be all zero');
  }

  /**
   * A generator for a seed and any number of stream keys (e.g. run index, detector index):
   * the keys are folded into a 64-bit value with SplitMix64 steps, whose next two outputs fill
   * the state. Different keys give statistically independent streams.
   */
  static fromSeed(seed: number, ...streamKeys: number[]): Xoshiro128StarStar {
    if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`seed must be a non-negative safe integer, got ${seed}`);
    let folded = BigInt(seed);
    for (const key of streamKeys) {
      if (!Number.isSafeInteger(key) || key < 0) throw new RangeError(`stream key must be a non-negative safe integer, got ${key}`);
      folded = splitMix64Sequence(folded ^ BigInt(key), 1)[0]!;
    }
    const [a, b] = splitMix64Sequence(folded, 2) as [bigint, bigint];
    const words: [number, number, number, number] = [
      Number(a & 0xffffffffn), Number(a >> 32n), Number(b & 0xffffffffn), Number(b >> 32n),
    ];
    if ((words[0] | words[1] | words[2] | words[3]) === 0) words[0] = 1;
    return new Xoshiro128StarStar(words);
  }

  /** Next 32-bit output as an unsigned integer in [0, 2^32). */
  nextUint32(): number {
    const s1 = this.s1;
    const m = Math.imul(s1, 5);
    const result = Math.imul((m << 7) | (m >>> 25), 9) >>> 0;
    const t = s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = (this.s3 << 11) | (this.s3 >>> 21);
    return result;
  }

  /** Uniform double in [0, 1) with 53 random bits (two outputs: 27 high bits, then 26). */
  nextFloat64(): number {
    const hi = this.nextUint32() >>> 5;
    const lo = this.nextUint32() >>> 6;
    return (hi * 67108864 + lo) / 9007199254740992;
  }
}

/** The generator interface the samplers need. */
export interface UniformSource {
  nextFloat64(): number;
}
