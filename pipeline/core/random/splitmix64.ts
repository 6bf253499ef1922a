// SplitMix64: G.L. Steele Jr., D. Lea, C.H. Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014, ACM SIGPLAN Notices 49(10), 453-472.
/**
 * One step of SplitMix64 on a 64-bit state (BigInt, taken mod 2^64):
 *
 *   state ← state + 0x9E3779B97F4A7C15
 *   z ← (state ⊕ (state ≫ 30)) · 0xBF58476D1CE4E5B9
 *   z ← (z ⊕ (z ≫ 27)) · 0x94D049BB133111EB
 *   output z ⊕ (z ≫ 31)
 *
 * Used only to expand a seed into generator state (the use its authors and Blackman & Vigna
 * recommend), so BigInt speed does not matter.
 */
const MASK64 = (1n << 64n) - 1n;

export function splitMix64(state: bigint): { state: bigint; value: bigint } {
  const next = (state + 0x9e3779b97f4a7c15n) & MASK64;
  let z = next;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
  return { state: next, value: z ^ (z >> 31n) };
}

/** The first `count` SplitMix64 outputs from `seed` (a 64-bit unsigned value). */
export function splitMix64Sequence(seed: bigint, count: number): bigint[] {
  const out: bigint[] = [];
  let state = seed & MASK64;
  for (let i = 0; i < count; i++) {
    const step = splitMix64(state);
    state = step.state;
    out.push(step.value);
  }
  return out;
}
