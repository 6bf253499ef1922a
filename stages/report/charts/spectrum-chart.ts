import type { ReportSpectrum } from '../spectra/report-spectrum.js';
import type { YieldRow } from '../../../pipeline/core/model/result-rows.js';
import { CHART_CONFIG } from './chart-config.js';

/**
 * One spectrum chart compiled once and fed each spectrum's data sets: `counts` (bin centre,
 * counts per bin, step line on a log axis, empty bins at EMPTY_BIN), `windows` (peak windows and background
 * windows, shaded) and `curves` (fitted model solid, its background dashed, one line per curve label,
 * rescaled to counts per bin).
 */
export function spectrumChartSpec(energyAxis: boolean): object {
  const xTitle = energyAxis ? 'energy (keV)' : 'channel';
  const x = { field: 'x', type: 'quantitative', title: xTitle, scale: { zero: false, nice: false } };
  return {
    width: 440,
    height: 150,
    layer: [
      {
        data: { name: 'windows' },
        mark: { type: 'rect', opacity: 0.28 },
        encoding: {
          x: { field: 'lo', type: 'quantitative' },
          x2: { field: 'hi' },
          color: { field: 'role', type: 'nominal', title: 'window', scale: { domain: ['peak', 'background'], range: ['#e76f51', '#2a9d8f'] } },
        },
      },
      { data: { name: 'counts' }, mark: { type: 'line', interpolate: 'step', strokeWidth: 1, color: '#222' }, encoding: { x, y: { field: 'c', type: 'quantitative', title: 'counts per bin', scale: { type: 'log', domainMin: EMPTY_BIN, clamp: true }, axis: { tickCount: 5, grid: false, format: '~s' } } } },
      {
        name: 'fit_curves',
        data: { name: 'curves' },
        mark: { type: 'line', strokeWidth: 1.3, color: '#b5179e' },
        encoding: {
          x,
          y: { field: 'c', type: 'quantitative' },
          detail: { field: 'curve', type: 'nominal' },
          strokeDash: { field: 'role', type: 'nominal', legend: null, scale: { domain: ['model', 'background'], range: [[1, 0], [4, 2]] } },
        },
      },
    ],
    resolve: { scale: { color: 'independent' } },
    config: { ...CHART_CONFIG, legend: { ...CHART_CONFIG.legend, orient: 'bottom', direction: 'horizontal' } },
  };
}

/** Where an empty bin is drawn on the log axis (counts per bin). */
export const EMPTY_BIN = 0.5;

const energyOf = (s: ReportSpectrum) => {
  const c = s.calibration;
  return c ? (ch: number) => c.offsetKeV + ch * (c.gainKeVPerChannel + ch * c.quadraticKeVPerChannel2) : (ch: number) => ch;
};

/** The data sets of `spectrumChartSpec` for one spectrum and the yields rows of its run and detector. */
export function spectrumChartData(s: ReportSpectrum, yields: readonly YieldRow[]): { counts: object[]; windows: object[]; curves: object[] } {
  const e = energyOf(s);
  const w = s.binWidthChannels;
  const counts: object[] = [];
  for (let i = 0; i < s.counts.length; i++) counts.push({ x: e(i * w + (w - 1) / 2), c: Math.max(EMPTY_BIN, s.counts[i]!) });
  const windows: object[] = [];
  for (const y of yields) {
    if (Number.isFinite(y.peakLo)) windows.push({ role: 'peak', peak: y.peak, lo: e(y.peakLo - 0.5), hi: e(y.peakHi + 0.5) });
    if (Number.isFinite(y.leftLo)) windows.push({ role: 'background', peak: y.peak, lo: e(y.leftLo - 0.5), hi: e(y.leftHi + 0.5) });
    if (Number.isFinite(y.rightLo)) windows.push({ role: 'background', peak: y.peak, lo: e(y.rightLo - 0.5), hi: e(y.rightHi + 0.5) });
  }
  const curves: object[] = [];
  for (const c of s.curves ?? []) for (let i = 0; i < c.channel.length; i++) curves.push({ curve: c.label, role: c.role, x: e(c.channel[i]!), c: Math.max(EMPTY_BIN, c.countsPerChannel[i]! * w) });
  return { counts, windows, curves };
}
