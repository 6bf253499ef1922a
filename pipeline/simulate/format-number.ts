/**
 * Locale-free number formatting for the files the simulator writes, so the same numbers give
 * the same bytes on every machine.
 */

/** x with exactly `digits` decimals; never "-0.000". */
export function fixed(x: number, digits: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`cannot write a non-finite number (${x})`);
  const s = x.toFixed(digits);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/** x rounded to `digits` decimals, trailing zeros (and a bare point) removed: 2000, 20.6, 0.035. */
export function trimmed(x: number, digits: number): string {
  const s = fixed(x, digits);
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

/** x in exponent notation with `digits` decimals in the mantissa: 4.812345678e+1. */
export function scientific(x: number, digits: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`cannot write a non-finite number (${x})`);
  return x.toExponential(digits);
}

/** A CSV field (RFC 4180): quoted, with doubled quotes, only when it holds a comma, quote, line break or edge space. */
export function csvField(text: string): string {
  return /[",\r\n]|^\s|\s$/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
