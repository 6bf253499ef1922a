/**
 * ISO 8601 / RFC 3339 date-times as lab computers write them: `2026-03-04T12:30:05Z`,
 * `2026-03-04T12:30:05.250+01:00`, `2026-03-04 12:30` (space separator allowed by RFC 3339 §5.6).
 * A time without an offset is read as UTC: only order and differences between runs matter.
 */
const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?\s*(Z|z|[+-]\d{2}:?\d{2})?$/;

export function parseTimestampMs(text: string): number | null {
  const m = ISO.exec(text.trim());
  if (!m) return null;
  const [, y, mo, d, h = '0', mi = '0', s = '0', frac = '', zone] = m;
  const month = Number(mo);
  const day = Number(d);
  const hour = Number(h);
  const minute = Number(mi);
  const second = Number(s);
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 23 || minute > 59 || second > 60) return null;
  let ms = Date.UTC(Number(y), month - 1, day, hour, minute, second, frac ? Math.round(Number(`0.${frac}`) * 1000) : 0);
  const check = new Date(Date.UTC(Number(y), month - 1, day));
  if (check.getUTCDate() !== day) return null;
  if (zone && zone !== 'Z' && zone !== 'z') {
    const sign = zone[0] === '-' ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    const offsetMin = Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4));
    ms -= sign * offsetMin * 60_000;
  }
  return ms;
}
