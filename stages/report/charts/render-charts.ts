import type { SummaryInput, RenderedChart, RenderedCharts } from '../summary-input.js';
import { angularChartSpec, angularEnergies } from './angular-chart.js';
import { budgetChartSpec } from './budget-chart.js';
import { excitationChartSpec } from './excitation-chart.js';
import { normalizationChartSpec } from './normalization-chart.js';
import { renderSvg, SvgRenderer } from './render-svg.js';
import { runTrendChartSpec, type RunTrendPoint } from './run-trend-chart.js';
import { spectrumChartData, spectrumChartSpec } from './spectrum-chart.js';
import { summarizeBudget } from '../uncertainty-budget.js';

async function chart(id: string, caption: string, spec: object | null): Promise<RenderedChart | null> {
  return spec === null ? null : { id, caption, svg: await renderSvg(spec) };
}

/** Renders every chart of the summary page (vega-lite → SVG in Node). */
export async function renderCharts(x: Omit<SummaryInput, 'charts'>): Promise<RenderedCharts> {
  const excitation: RenderedChart[] = [];
  for (const p of x.config.peaks) {
    const rows = x.rows.filter((r) => r.peak === p.label);
    const lab = await chart(`excitation-lab:${p.label}`, `${p.label}: dσ/dΩ (lab) against beam energy, per detector`, excitationChartSpec(rows, 'lab'));
    const ratio = await chart(`excitation-ratio:${p.label}`, `${p.label}: σ/σ_R against beam energy, per detector`, excitationChartSpec(rows, 'ratio'));
    for (const c of [ratio, lab]) if (c) excitation.push(c);
  }
  const energies = angularEnergies(x.rows, x.settings.max_angular_energies);
  const angularChart = await chart('angular', 'dσ/dΩ (CM) against θ (CM), per beam energy', angularChartSpec(x.rows, energies.shown));
  const nominal = new Map(x.config.detectors.map((d) => [d.id, d.solid_angle_msr]));
  const order = new Map(x.runs.map((r) => [r.run, r.index]));
  const seen = new Map<string, number>();
  for (const q of x.qc) if (!seen.has(q.run)) seen.set(q.run, order.get(q.run) ?? seen.size);
  const reduced = x.qc.filter((q) => q.status === 'reduced');
  const trend = (f: (q: (typeof reduced)[number]) => number): RunTrendPoint[] => reduced.map((q) => ({ order: seen.get(q.run)!, run: q.run, detector: q.detector, value: f(q) }));
  const deadTime = await chart('dead-time', 'Dead time per run: 1 − live fraction (%), per detector', runTrendChartSpec(trend((q) => 100 * (1 - q.liveFraction)), 'dead time (%)'));
  const drift = await chart('gain-drift', 'Centroid shift of the strongest measured peak from its expected energy (gain drift), per detector', runTrendChartSpec(trend((q) => q.peakShiftKeV), 'centroid shift (keV)'));
  const budget = await chart('budget', 'Uncertainty budget: median relative uncertainty of dσ/dΩ by component', budgetChartSpec(summarizeBudget(x.budgets)));
  const spectra: RenderedCharts['spectra'] = [];
  const renderers = new Map<boolean, SvgRenderer>();
  const yieldsOf = new Map<string, typeof x.yields[number][]>();
  for (const y of x.yields) {
    const k = `${y.run}\u0000${y.detector}`;
    const list = yieldsOf.get(k);
    if (list) list.push(y);
    else yieldsOf.set(k, [y]);
  }
  try {
    for (const s of x.spectra) {
      const energyAxis = s.calibration !== undefined;
      let r = renderers.get(energyAxis);
      if (r === undefined) renderers.set(energyAxis, (r = new SvgRenderer(spectrumChartSpec(energyAxis))));
      const svg = await r.render(spectrumChartData(s, yieldsOf.get(`${s.run}\u0000${s.detector}`) ?? []));
      spectra.push({ run: s.run, detector: s.detector, svg });
    }
  } finally {
    for (const r of renderers.values()) r.finalize();
  }
  return { excitation, angular: { chart: angularChart, shown: energies.shown.length, total: energies.total }, normalization: await chart('normalization', 'Effective solid angle per reference run, per detector, over time', normalizationChartSpec(x.points, nominal)), deadTime, drift, budget, spectra };
}
