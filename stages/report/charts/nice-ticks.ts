/**
 * Round axis ticks for a linear scale: a step of 1, 2 or 5 × 10^k giving about `count` ticks,
 * and the domain widened to whole steps (common practice for chart axes).
 */
export function niceTicks(lo: number, hi: number, count = 5): { lo: number; hi: number; ticks: number[] } {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return { lo: 0, hi: 1, ticks: [0, 1] };
  if (hi < lo) [lo, hi] = [hi, lo];
  if (hi === lo) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.05;
    lo -= pad;
    hi += pad;
  }
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const f = raw / mag;
  const step = (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * mag;
  const a = Math.floor(lo / step);
  const b = Math.ceil(hi / step);
  const ticks: number[] = [];
  for (let i = a; i <= b; i++) ticks.push(Number((i * step).toPrecision(12)));
  return { lo: a * step, hi: b * step, ticks };
}

/** A tick label: the shortest form the step allows (no float noise such as 0.30000000000000004). */
export function tickLabel(v: number, step: number): string {
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return v.toFixed(Math.min(decimals, 10));
}
