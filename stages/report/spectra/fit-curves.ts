import type { FitResidualRow } from '../fits-columns.js';
import type { ReportSpectrum, SpectrumCurve } from './report-spectrum.js';

/**
 * The fitted model and its background as curves over the embedded spectra, from the
 * fit_residuals.arrow rows (one per channel of each fit region). Each curve is binned like the
 * counts: bin b (channels [b·w, (b+1)·w − 1]) gets the mean over the region's channels in it, in
 * counts per channel, at the bin centre b·w + (w − 1)/2 — the chart multiplies by w, so where the
 * region covers a whole bin the curve is the model summed over that bin, as the counts are.
 * Spectra without a fitted region are returned unchanged; the others get a model curve per
 * fit group, and a background curve where the background is known.
 */
export function attachFitCurves(spectra: readonly ReportSpectrum[], residuals: readonly FitResidualRow[]): ReportSpectrum[] {
  if (residuals.length === 0 || spectra.length === 0) return [...spectra];
  const key = (run: string, detector: string) => `${run}\u0000${detector}`;
  const wanted = new Set(spectra.map((s) => key(s.run, s.detector)));
  const regions = new Map<string, Map<string, FitResidualRow[]>>();
  for (const r of residuals) {
    const k = key(r.run, r.detector);
    if (!wanted.has(k)) continue;
    let groups = regions.get(k);
    if (groups === undefined) regions.set(k, (groups = new Map()));
    const list = groups.get(r.group);
    if (list) list.push(r);
    else groups.set(r.group, [r]);
  }
  return spectra.map((s) => {
    const groups = regions.get(key(s.run, s.detector));
    if (groups === undefined) return s;
    const curves: SpectrumCurve[] = [...(s.curves ?? [])];
    for (const [group, rows] of groups) {
      curves.push(binnedCurve(`fit: ${group}`, 'model', rows, (r) => r.model, s.binWidthChannels));
      if (rows.every((r) => Number.isFinite(r.background ?? Number.NaN))) curves.push(binnedCurve(`background: ${group}`, 'background', rows, (r) => r.background!, s.binWidthChannels));
    }
    return { ...s, curves };
  });
}

function binnedCurve(label: string, role: SpectrumCurve['role'], rows: readonly FitResidualRow[], value: (r: FitResidualRow) => number, widthChannels: number): SpectrumCurve {
  const w = Math.max(1, widthChannels);
  const sums = new Map<number, { sum: number; n: number }>();
  for (const r of rows) {
    const b = Math.floor(r.channel / w);
    const acc = sums.get(b);
    if (acc) {
      acc.sum += value(r);
      acc.n++;
    } else sums.set(b, { sum: value(r), n: 1 });
  }
  const bins = [...sums.keys()].sort((a, b) => a - b);
  return {
    label,
    role,
    channel: Float64Array.from(bins, (b) => b * w + (w - 1) / 2),
    countsPerChannel: Float64Array.from(bins, (b) => sums.get(b)!.sum / sums.get(b)!.n),
  };
}
