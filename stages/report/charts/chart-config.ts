/** Look shared by every chart of the summary page: system fonts (no web fonts), light frames. */
export const CHART_CONFIG = {
  font: 'system-ui, sans-serif',
  aria: false,
  view: { stroke: '#ccc' },
  axis: { labelFontSize: 10, titleFontSize: 11 },
  header: { labelFontSize: 11 },
  legend: { labelFontSize: 10, titleFontSize: 11 },
} as const;

/** Error-bar layers (total: light, statistical: dark) and the points, on fields lo/hi (stat) and tlo/thi (total). */
export function errorBarLayers(x: object, yTitle: string, color: object | undefined, yScale: object = { zero: false }) {
  const c = color ? { color } : {};
  const fixed = (hex: string) => (color ? {} : { color: hex });
  return [
    { mark: { type: 'rule', opacity: 0.45, strokeWidth: 1, ...fixed('#7a9cc6') }, encoding: { x, y: { field: 'tlo', type: 'quantitative', scale: yScale, title: yTitle }, y2: { field: 'thi' }, ...c } },
    { mark: { type: 'rule', strokeWidth: 1.6, ...fixed('#1d3f6e') }, encoding: { x, y: { field: 'slo', type: 'quantitative' }, y2: { field: 'shi' }, ...c } },
    { mark: { type: 'point', filled: true, size: 22, ...fixed('#1d3f6e') }, encoding: { x, y: { field: 'v', type: 'quantitative' }, ...c } },
  ];
}

/**
 * Above this many points in one panel (210 px wide) markers overlap: a panel is drawn as a line
 * through every value with shaded uncertainty bands instead of a point and two bars per row
 * (densePanelsSvg).
 */
export const DENSE_PANEL_POINTS = 200;

/** Value with its statistical and total (stat ⊕ sys) bounds, as the error-bar layers read them. */
export function withBars(v: number, stat: number, sys: number) {
  const s = Number.isFinite(stat) ? stat : 0;
  const t = Math.hypot(s, Number.isFinite(sys) ? sys : 0);
  return { v, slo: v - s, shi: v + s, tlo: v - t, thi: v + t };
}
