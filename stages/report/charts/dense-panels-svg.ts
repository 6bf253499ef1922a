import { escapeHtml as h } from '../../../pipeline/core/text/escape-html.js';
import { niceTicks, tickLabel } from './nice-ticks.js';

/** One value with its statistical (slo…shi) and total (tlo…thi) bounds, in a panel named `detector`. */
export interface BandPoint {
  detector: string;
  e: number;
  v: number;
  slo: number;
  shi: number;
  tlo: number;
  thi: number;
}

const W = 210;
const H = 140;
const LEFT = 52;
const TOP = 20;
const GAP_X = 22;
const BOTTOM = 34;
const COLUMNS = 4;
/** A pixel coordinate to a tenth of a pixel, as text. */
const n1 = (x: number) => String(Math.round(x * 10) / 10);

/**
 * Small multiples drawn directly as SVG, for panels with more points than pixels (where vega's
 * per-row marks cost seconds and the eye sees a line anyway): per panel (one per `detector`,
 * sorted), the total band (light), the statistical band (dark) and a line through every value,
 * each one path, on a linear x axis and an independent linear y axis with round ticks. Same size
 * and look as the vega-lite facets it stands in for; marks sit in `g.role-mark` groups too.
 */
export function densePanelsSvg(points: readonly BandPoint[], xTitle: string, yTitle: string): string {
  const panels = new Map<string, BandPoint[]>();
  let xLo = Infinity;
  let xHi = -Infinity;
  for (const p of points) {
    if (!Number.isFinite(p.e) || !Number.isFinite(p.v)) continue;
    let list = panels.get(p.detector);
    if (list === undefined) panels.set(p.detector, (list = []));
    list.push(p);
    if (p.e < xLo) xLo = p.e;
    if (p.e > xHi) xHi = p.e;
  }
  const names = [...panels.keys()].sort();
  const xs = niceTicks(xLo, xHi, 4);
  const cellW = LEFT + W + GAP_X;
  const cellH = TOP + H + BOTTOM;
  const rows = Math.ceil(names.length / COLUMNS);
  const width = Math.min(COLUMNS, names.length) * cellW;
  const height = rows * cellH;
  const out: string[] = [`<svg class="marks dense-panels" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="system-ui, sans-serif">`];
  names.forEach((name, i) => {
    const pts = panels.get(name)!.slice().sort((a, b) => a.e - b.e);
    let yLo = Infinity;
    let yHi = -Infinity;
    for (const p of pts) for (const y of [p.tlo, p.thi, p.v]) if (Number.isFinite(y)) (yLo = Math.min(yLo, y)), (yHi = Math.max(yHi, y));
    const ys = niceTicks(yLo, yHi, 5);
    const X = (e: number) => ((e - xs.lo) / (xs.hi - xs.lo)) * W;
    const Y = (y: number) => H - ((y - ys.lo) / (ys.hi - ys.lo)) * H;
    const band = (lo: (p: BandPoint) => number, hi: (p: BandPoint) => number) =>
      `M${pts.map((p) => `${n1(X(p.e))},${n1(Y(hi(p)))}`).join('L')}L${pts.slice().reverse().map((p) => `${n1(X(p.e))},${n1(Y(lo(p)))}`).join('L')}Z`;
    const line = `M${pts.map((p) => `${n1(X(p.e))},${n1(Y(p.v))}`).join('L')}`;
    const ox = (i % COLUMNS) * cellW + LEFT;
    const oy = Math.floor(i / COLUMNS) * cellH + TOP;
    const xStep = xs.ticks.length > 1 ? xs.ticks[1]! - xs.ticks[0]! : 1;
    const yStep = ys.ticks.length > 1 ? ys.ticks[1]! - ys.ticks[0]! : 1;
    const xAxis = xs.ticks.map((t) => `<line x1="${n1(X(t))}" x2="${n1(X(t))}" y1="${H}" y2="${H + 4}" stroke="#888"/><text x="${n1(X(t))}" y="${H + 14}" text-anchor="middle" font-size="10">${tickLabel(t, xStep)}</text>`).join('');
    const yAxis = ys.ticks.map((t) => `<line x1="-4" x2="0" y1="${n1(Y(t))}" y2="${n1(Y(t))}" stroke="#888"/><line x1="0" x2="${W}" y1="${n1(Y(t))}" y2="${n1(Y(t))}" stroke="#eee"/><text x="-6" y="${n1(Y(t) + 3)}" text-anchor="end" font-size="10">${tickLabel(t, yStep)}</text>`).join('');
    out.push(
      `<g class="panel" transform="translate(${ox},${oy})"><text x="${W / 2}" y="-7" text-anchor="middle" font-size="11">${h(name)}</text>`,
      `<g class="axis">${yAxis}${xAxis}<text x="${W / 2}" y="${H + 28}" text-anchor="middle" font-size="11" font-weight="bold">${h(xTitle)}</text><text transform="translate(-40,${H / 2}) rotate(-90)" text-anchor="middle" font-size="11" font-weight="bold">${h(yTitle)}</text></g>`,
      `<g class="mark-area role-mark"><path d="${band((p) => p.tlo, (p) => p.thi)}" fill="#7a9cc6" fill-opacity="0.35"/><path d="${band((p) => p.slo, (p) => p.shi)}" fill="#1d3f6e" fill-opacity="0.55"/></g>`,
      `<g class="mark-line role-mark"><path d="${line}" fill="none" stroke="#0b1f3a" stroke-width="0.8"/></g>`,
      `<rect width="${W}" height="${H}" fill="none" stroke="#ccc"/></g>`,
    );
  });
  out.push('</svg>');
  return out.join('');
}
