import type { SummaryInput, RenderedChart, RenderedCharts } from '../summary-input.js';
import { angularChartSpec, angularEnergies } from './angular-chart.js';
import { budgetChartSpec } from './budget-chart.js';
import { densePanelsSvg } from './dense-panels-svg.js';
import { EXCITATION_X_TITLE, excitationChartSpec, excitationPoints, excitationYTitle, isDense, maxPanelPoints, type ExcitationQuantity } from './excitation-chart.js';
import { DENSE_PANEL_POINTS } from './chart-config.js';
import { normalizationChartSpec } from './normalization-chart.js';
import { renderSvg, SvgRenderer } from './render-svg.js';
import { runTrendChartSpec, type RunTrendPoint } from './run-trend-chart.js';
import { spectrumChartData, spectrumChartSpec } from './spectrum-chart.js';
import { summarizeBudget } from '../uncertainty-budget.js';
import { driftRows } from '../html/drift-rows.js';

async function chart(id: string, caption: string, spec: object | null): Promise<RenderedChart | null> {
  return spec === null ? null : { id, caption, svg: await renderSvg(spec) };
}

/**
 * The excitation functions, two charts per peak (σ/σ_R, dσ/dΩ lab): one compiled vega view per
 * quantity, fed each peak's points (compiling is most of what a small chart costs); data sets
 * with more points a panel than pixels are drawn directly (densePanelsSvg).
 */
async function excitationCharts(x: Omit<SummaryInput, 'charts'>): Promise<RenderedChart[]> {
  const renderers = new Map<string, SvgRenderer>();
  const out: RenderedChart[] = [];
  const what = { ratio: 'σ/σ_R', lab: 'dσ/dΩ (lab)' } as const;
  try {
    for (const p of x.config.peaks) {
      const rows = x.rows.filter((r) => r.peak === p.label);
      for (const quantity of ['ratio', 'lab'] as ExcitationQuantity[]) {
        const points = excitationPoints(rows, quantity);
        if (points.length === 0) continue;
        if (isDense(points)) {
          const form = ` (up to ${maxPanelPoints(points)} rows a panel, more than ${DENSE_PANEL_POINTS}: a line through every value with shaded statistical and total uncertainty bands in place of points and bars)`;
          out.push({ id: `excitation-${quantity}:${p.label}`, caption: `${p.label}: ${what[quantity]} against beam energy, per detector${form}`, svg: densePanelsSvg(points, EXCITATION_X_TITLE, excitationYTitle(quantity)) });
          continue;
        }
        let r = renderers.get(quantity);
        if (r === undefined) renderers.set(quantity, (r = new SvgRenderer(excitationChartSpec(quantity))));
        out.push({ id: `excitation-${quantity}:${p.label}`, caption: `${p.label}: ${what[quantity]} against beam energy, per detector`, svg: await r.render({ points }) });
      }
    }
  } finally {
    for (const r of renderers.values()) r.finalize();
  }
  return out;
}

/** Renders every chart of the summary page (vega-lite → SVG in Node). */
export async function renderCharts(x: Omit<SummaryInput, 'charts'>): Promise<RenderedCharts> {
  const excitation = await excitationCharts(x);
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
  const driftTracking = await chart('drift-tracking', `Gain drift: tracking-peak centroid minus its predicted energy per run and detector, ±1 standard uncertainty; shaded: ±${x.config.drift.tolerance_keV} keV tolerance (drift.tolerance_keV), red: beyond it`, driftTrackingSpec(x, seen));
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
  return { excitation, angular: { chart: angularChart, shown: energies.shown.length, total: energies.total }, normalization: await chart('normalization', 'Effective solid angle per reference run, per detector, over time', normalizationChartSpec(x.points, nominal)), deadTime, drift, driftTracking, budget, spectra };
}

/** The drift-tracking shift chart (qc rows with drift columns, drift.mode track or correct), or null. */
function driftTrackingSpec(x: Omit<SummaryInput, 'charts'>, order: ReadonlyMap<string, number>): object | null {
  const rows = driftRows(x.qc);
  if (rows.length === 0) return null;
  const tol = x.config.drift.tolerance_keV;
  return runTrendChartSpec(rows.map((q) => ({ order: order.get(q.run)!, run: q.run, detector: q.detector, value: q.driftShiftKeV, unc: q.driftShiftUncKeV })), 'tracking-peak shift (keV)', { lo: -tol, hi: tol });
}
