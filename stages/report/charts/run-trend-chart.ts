import { CHART_CONFIG } from './chart-config.js';

export interface RunTrendPoint {
  /** Position of the run in runlog.csv (0-based). */
  order: number;
  run: string;
  detector: string;
  value: number;
  /** Standard uncertainty of the value (drawn as a bar ±unc where given). */
  unc?: number;
}

/** A band of accepted values (a tolerance): shaded; points outside it are drawn in red. */
export interface TrendBand {
  lo: number;
  hi: number;
}

/** Above this many distinct runs, points and error bars are left out (a line per detector only; outliers still marked). */
const MANY_RUNS = 60;

/**
 * vega-lite specification of a per-run figure against run order, one line per detector
 * (dead time per run, the peak centroid shift, the drift-tracking shift). Lines, not points, so a
 * 1,000-run series stays a handful of SVG paths. With a band, it is shaded and every point outside
 * it is marked (red, always drawn); with uncertainties, each point gets a ±u bar (up to 60 runs).
 */
export function runTrendChartSpec(points: readonly RunTrendPoint[], yTitle: string, band?: TrendBand): object | null {
  const values = points.filter((p) => Number.isFinite(p.value)).map((p) => ({ ...p, lo: p.value - (p.unc ?? 0), hi: p.value + (p.unc ?? 0), outside: band !== undefined && (p.value < band.lo || p.value > band.hi) }));
  if (values.length === 0) return null;
  const many = new Set(values.map((p) => p.order)).size > MANY_RUNS;
  const x = { field: 'order', type: 'quantitative', title: 'run (position in runlog.csv, from 0)', scale: { zero: false } };
  const color = { field: 'detector', type: 'nominal', title: 'detector' };
  const line = { mark: { type: 'line', point: many ? false : { size: 18, filled: true }, strokeWidth: 1.2 }, encoding: { x, y: { field: 'value', type: 'quantitative', title: yTitle, scale: { zero: false } }, color } };
  if (band === undefined && values.every((p) => p.unc === undefined)) return { data: { values }, width: 700, height: 170, ...line, config: CHART_CONFIG };
  const layer: object[] = [];
  if (band !== undefined) {
    layer.push({ name: 'tolerance_band', data: { values: [band] }, mark: { type: 'rect', color: '#2a9d8f', opacity: 0.14 }, encoding: { y: { field: 'lo', type: 'quantitative' }, y2: { field: 'hi' } } });
  }
  if (!many && values.some((p) => Number.isFinite(p.unc ?? Number.NaN))) {
    layer.push({ name: 'unc_bars', transform: [{ filter: 'isFinite(datum.unc)' }], mark: { type: 'rule', strokeWidth: 1, opacity: 0.7 }, encoding: { x, y: { field: 'lo', type: 'quantitative' }, y2: { field: 'hi' }, color } });
  }
  layer.push(line);
  if (band !== undefined && values.some((p) => p.outside)) {
    layer.push({ name: 'outside_band', transform: [{ filter: 'datum.outside' }], mark: { type: 'point', shape: 'diamond', filled: true, size: 46, color: '#c1121f' }, encoding: { x, y: { field: 'value', type: 'quantitative' } } });
  }
  return { data: { values }, width: 700, height: 170, layer, config: CHART_CONFIG };
}
