import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { EnergyCalibration } from '../../pipeline/core/calibration/energy-calibration.js';
import { fitPeaks } from '../../pipeline/core/fitting/fit-peaks.js';
import { multipletSpec } from '../../pipeline/core/fitting/multiplet-spec.js';
import { assignLines, type AssignmentCandidate } from '../../pipeline/core/spectrum/assign-lines.js';
import { fitCalibration, type CalibrationFit, type CalibrationPoint } from '../../pipeline/core/spectrum/fit-calibration.js';
import type { ReferenceLine } from '../../pipeline/core/spectrum/merge-unresolved-lines.js';
import { searchPeaks } from '../../pipeline/core/spectrum/peak-search.js';

/** FWHM = 2√(2 ln 2)·σ (common practice). */
const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

export interface DetectorCalibrationOptions {
  /** Detector resolution (FWHM), keV. */
  fwhmKeV: number;
  /** The calibration in force before (its gain sets the search range and the first width in channels). */
  prior: EnergyCalibration;
  degree: 1 | 2;
  searchThreshold: number;
  matchToleranceKeV: number;
  /** Trial gains within prior gain × (1 ± gainRangeRel). */
  gainRangeRel: number;
}

export interface DetectorCalibrationResult {
  ok: boolean;
  fit?: CalibrationFit;
  points: CalibrationPoint[];
  assignment?: AssignmentCandidate;
  candidates: number;
  diagnostics: Diagnostic[];
}

/**
 * Calibrates one detector from one calibration spectrum and the lines it must show:
 * 1. automatic peak search (Mariscotti's smoothed second differences, peak-search.ts) with the
 *    resolution in channels through the prior gain;
 * 2. assignment of the found peaks to the lines with the unambiguity check (assign-lines.ts);
 * 3. the peaks refitted by Poisson maximum likelihood, in clusters of peaks closer than 6 FWHM
 *    (so no region edge cuts a peak), each over ±3 FWHM beyond its outer peaks with a linear
 *    background: every member line of the cluster (and any found peak no line took) one Gaussian,
 *    one shared width, areas free, positions tied at the known energy differences through the
 *    gain (c_i = c₀ + (E_i − E₀)/b); c₀ of the strongest member is the cluster's point at that
 *    member's energy, u(c₀) from the Fisher information. Two passes: b from the assignment, then
 *    from the first weighted fit;
 * 4. a weighted linear or quadratic fit with Orear's effective variance (fit-calibration.ts).
 */
export function fitDetectorCalibration(counts: ArrayLike<number>, lines: readonly ReferenceLine[], o: DetectorCalibrationOptions): DetectorCalibrationResult {
  const fwhmChannels = o.fwhmKeV / o.prior.gainKeVPerChannel;
  const found = searchPeaks(counts, { fwhmChannels, threshold: o.searchThreshold });
  const g = o.prior.gainKeVPerChannel;
  const assigned = assignLines(found, lines, { toleranceKeV: o.matchToleranceKeV, gainRangeKeVPerChannel: [g * (1 - o.gainRangeRel), g * (1 + o.gainRangeRel)] });
  if (!assigned.ok) return { ok: false, points: [], candidates: found.length, diagnostics: [assigned.diagnostic] };
  const points: CalibrationPoint[] = [];
  const diagnostics: Diagnostic[] = [];
  const energyOf = (ch: number) => assigned.offsetKeV + assigned.gainKeVPerChannel * ch;
  // Every peak the spectrum shows: the members of the assigned lines (known energies) and the found
  // peaks no line took (energy through the trial calibration), unless within one FWHM of a member.
  const taken = new Set(assigned.pairs.map((q) => q.peakIndex));
  const components: { pair: number; intensity: number; energyKeV: number; energyUncKeV: number }[] = assigned.pairs.flatMap((q, k) => {
    const line = lines[q.lineIndex]!;
    return line.members.length > 0
      ? line.members.map((m) => ({ pair: k, intensity: m.intensityPercent, energyKeV: m.energyKeV, energyUncKeV: m.energyUncKeV }))
      : [{ pair: k, intensity: line.intensityPercent, energyKeV: line.energyKeV, energyUncKeV: line.energyUncKeV }];
  });
  found.forEach((f, i) => {
    const e = energyOf(f.centroidChannel);
    if (!taken.has(i) && !components.some((c) => Math.abs(c.energyKeV - e) < o.fwhmKeV)) components.push({ pair: -1, intensity: 0, energyKeV: e, energyUncKeV: 0 });
  });
  components.sort((a, b) => a.energyKeV - b.energyKeV);
  // Clusters of peaks closer than 6 FWHM, each fitted over ±3 FWHM beyond its outer peaks: no region edge cuts a peak.
  const reach = 3 * o.fwhmKeV;
  const clusters: (typeof components)[] = [];
  for (const c of components) {
    const last = clusters[clusters.length - 1];
    if (last !== undefined && c.energyKeV - last[last.length - 1]!.energyKeV < 2 * reach) last.push(c);
    else clusters.push([c]);
  }
  // Two passes: positions tied through the trial gain, then through the gain of the first calibration fit.
  let offset = assigned.offsetKeV;
  let gain = assigned.gainKeVPerChannel;
  for (let pass = 0; pass < 2; pass++) {
    points.length = 0;
    diagnostics.length = 0;
    const chOf = (eKeV: number) => (eKeV - offset) / gain;
    for (const cluster of clusters) {
      if (!cluster.some((c) => c.pair >= 0)) continue;
      const ordered = [...cluster].sort((a, b) => b.intensity - a.intensity);
      const ref = ordered[0]!;
      const lo = Math.max(0, Math.floor(chOf(cluster[0]!.energyKeV - reach)));
      const hi = Math.min(counts.length - 1, Math.ceil(chOf(cluster[cluster.length - 1]!.energyKeV + reach)));
      const spec = multipletSpec(counts, {
        firstChannel: lo,
        channelCount: hi - lo + 1,
        lines: ordered.map((c, k) => ({ label: `${c.energyKeV.toFixed(1)} keV #${k}`, expectedChannel: chOf(c.energyKeV), energyKeV: c.energyKeV })),
        sigmaChannels: o.fwhmKeV / FWHM_PER_SIGMA / gain,
        positions: ordered.length > 1 ? 'tied-fixed-gain' : 'free',
        channelsPerKeV: 1 / gain,
        background: 'linear',
      });
      const r = fitPeaks(counts, spec);
      const label = [...new Set(cluster.filter((c) => c.pair >= 0).map((c) => assigned.pairs[c.pair]!.label))].join(' & ');
      // At high counts the deviance's rounding error can exceed the optimiser's decrement threshold, so it stops
      // (no-decrease, iteration-limit) at an optimum it cannot certify: accepted when the deviance is acceptable.
      const atOptimum = r.converged || (r.stopReason !== 'invalid-start' && r.devianceUpperTailP >= 1e-3);
      const p = r.peaks[0]!;
      if (!atOptimum || !(p.centroidUncChannel > 0)) {
        diagnostics.push({ severity: 'warning', stage: 'calibrate', rule: 'calibration-peak-fit-failed', message: `lines ${label}: the peak fit over channels ${lo}…${hi} did not converge (${r.stopReason}, deviance/ν ${r.deviancePerDof.toFixed(2)}); left out` });
        continue;
      }
      points.push({ label: `${label} (${ref.energyKeV} keV)`, channel: p.centroidChannel, channelUnc: p.centroidUncChannel, energyKeV: ref.energyKeV, energyUncKeV: ref.energyUncKeV });
    }
    if (points.length < 2) break;
    const first = fitCalibration(points, 1);
    offset = first.offsetKeV;
    gain = first.gainKeVPerChannel;
  }
  if (points.length < o.degree + 2) {
    diagnostics.push({ severity: 'error', stage: 'calibrate', rule: 'calibration-too-few-points', message: `only ${points.length} calibration points; a degree-${o.degree} fit needs at least ${o.degree + 2} to be checked`, hint: 'use a source with more lines, lower calibrate.search_threshold, or degree 1' });
    return { ok: false, points, assignment: assigned, candidates: found.length, diagnostics };
  }
  const fit = fitCalibration(points, o.degree);
  return { ok: true, fit, points, assignment: assigned, candidates: found.length, diagnostics };
}
