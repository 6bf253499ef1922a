import type { CrossSectionRow } from '../../pipeline/core/model/result-rows.js';

/**
 * vega-lite specification of the excitation functions: σ/σ_R against beam energy, one panel
 * per detector, one colour per peak, statistical error bars (lighter: total). Peaks without a
 * Rutherford ratio (inelastic) are drawn as dσ/dΩ in a second chart.
 */
export function excitationChartSpec(rows: readonly CrossSectionRow[], quantity: 'ratio' | 'lab'): object | null {
  const values = rows
    .filter((r) => Number.isFinite(quantity === 'ratio' ? r.ratioToRutherford : r.crossSectionLabMbPerSr))
    .map((r) => {
      const v = quantity === 'ratio' ? r.ratioToRutherford : r.crossSectionLabMbPerSr;
      const s = quantity === 'ratio' ? r.ratioToRutherfordStat : r.crossSectionLabStatMbPerSr;
      const y = quantity === 'ratio' ? r.ratioToRutherfordSys : r.crossSectionLabSysMbPerSr;
      const t = Math.hypot(s, y);
      return { detector: `${r.detector} (${r.angleLabDeg}°)`, peak: r.peak, e: r.beamEnergyKeV, v, slo: v - s, shi: v + s, tlo: v - t, thi: v + t };
    });
  if (values.length === 0) return null;
  const yTitle = quantity === 'ratio' ? 'σ/σ_R' : 'dσ/dΩ lab (mb/sr)';
  const x = { field: 'e', type: 'quantitative', title: 'beam energy (keV)', scale: { zero: false } };
  return {
    data: { values },
    facet: { field: 'detector', type: 'nominal', title: null },
    columns: 2,
    spec: {
      width: 300,
      height: 170,
      layer: [
        { mark: { type: 'rule', opacity: 0.35 }, encoding: { x, y: { field: 'tlo', type: 'quantitative', scale: { zero: false }, title: yTitle }, y2: { field: 'thi' }, color: { field: 'peak', type: 'nominal' } } },
        { mark: { type: 'rule', strokeWidth: 1.5 }, encoding: { x, y: { field: 'slo', type: 'quantitative' }, y2: { field: 'shi' }, color: { field: 'peak', type: 'nominal' } } },
        { mark: { type: 'point', filled: true, size: 22 }, encoding: { x, y: { field: 'v', type: 'quantitative' }, color: { field: 'peak', type: 'nominal', title: 'peak' } } },
      ],
    },
    resolve: { scale: { y: 'independent' } },
    config: { font: 'sans-serif', view: { stroke: '#ccc' } },
  };
}

/** Compiles a vega-lite spec to an SVG string in Node (no canvas; vega loaded only when needed). */
export async function renderSvg(spec: object): Promise<string> {
  const [vega, vl] = await Promise.all([import('vega'), import('vega-lite')]);
  const compiled = vl.compile(spec as never).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: 'none' });
  try {
    // Inline SVG in HTML5 needs no namespace declarations; dropping them keeps the page free of URLs.
    return (await view.toSVG()).replace(/ xmlns(:xlink)?="[^"]*"/g, '');
  } finally {
    view.finalize();
  }
}
