import type { Diagnostic } from '../diagnostics/diagnostic.js';
import type { ReferenceLine } from './merge-unresolved-lines.js';

/**
 * Assigns found peaks (centroid channels) to known lines (keV) through a trial linear calibration
 * E = a + b·ch (common practice for source calibrations): every pair of peaks is tried against
 * every pair of lines in the same order (b > 0, and inside the allowed gain and offset ranges);
 * each trial maps all peaks to energies and matches them one-to-one to the nearest lines within
 * `toleranceKeV`; the matched pairs are refitted (unweighted straight line) and matched again.
 * Candidates are ranked by the number of matched lines, then by the rms deviation (keV).
 *
 * The assignment is accepted only if it is unambiguous: at least 3 lines matched (two points fix a
 * line and test nothing), and the runner-up (a different set of pairs) matches fewer lines, or the
 * same number with an rms at least `ambiguityFactor` (default 3) times larger. Otherwise the result
 * says why, with a diagnostic.
 */
export interface PeakPosition {
  centroidChannel: number;
}

export interface AssignmentOptions {
  toleranceKeV: number;
  gainRangeKeVPerChannel?: [number, number];
  offsetRangeKeV?: [number, number];
  ambiguityFactor?: number;
}

export interface AssignedPair {
  peakIndex: number;
  lineIndex: number;
  channel: number;
  energyKeV: number;
  label: string;
}

export interface AssignmentCandidate {
  pairs: AssignedPair[];
  offsetKeV: number;
  gainKeVPerChannel: number;
  rmsKeV: number;
}

export type LineAssignment =
  | ({ ok: true; runnerUp: AssignmentCandidate | null } & AssignmentCandidate)
  | { ok: false; reason: string; best: AssignmentCandidate | null; runnerUp: AssignmentCandidate | null; diagnostic: Diagnostic };

export function assignLines(peaks: readonly PeakPosition[], lines: readonly ReferenceLine[], options: AssignmentOptions): LineAssignment {
  const tol = options.toleranceKeV;
  const [gMin, gMax] = options.gainRangeKeVPerChannel ?? [0, Number.POSITIVE_INFINITY];
  const [aMin, aMax] = options.offsetRangeKeV ?? [Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY];
  const factor = options.ambiguityFactor ?? 3;
  const seen = new Map<string, AssignmentCandidate>();
  for (let i = 0; i < peaks.length; i++) {
    for (let j = 0; j < peaks.length; j++) {
      const ci = peaks[i]!.centroidChannel;
      const cj = peaks[j]!.centroidChannel;
      if (!(cj > ci)) continue;
      for (let k = 0; k < lines.length; k++) {
        for (let l = k + 1; l < lines.length; l++) {
          const b = (lines[l]!.energyKeV - lines[k]!.energyKeV) / (cj - ci);
          const a = lines[k]!.energyKeV - b * ci;
          if (!(b > gMin && b < gMax && a >= aMin && a <= aMax)) continue;
          let cand = match(a, b);
          if (cand === null) continue;
          const refit = cand.pairs.length >= 2 ? straightLine(cand.pairs) : null;
          if (refit !== null) cand = match(refit.a, refit.b) ?? cand;
          const key = cand.pairs.map((p) => `${p.peakIndex}:${p.lineIndex}`).join(',');
          if (!seen.has(key)) seen.set(key, cand);
        }
      }
    }
  }
  const ranked = [...seen.values()].sort((x, y) => y.pairs.length - x.pairs.length || x.rmsKeV - y.rmsKeV);
  const best = ranked[0] ?? null;
  const runnerUp = ranked[1] ?? null;
  const fail = (reason: string): LineAssignment => ({
    ok: false, reason, best, runnerUp,
    diagnostic: { severity: 'error', stage: 'calibrate', rule: 'calibration-assignment-ambiguous', message: `line assignment failed: ${reason}`, hint: 'check the expected gain range, the source lines named for the run, and the search threshold' },
  });
  if (best === null || best.pairs.length < 3) return fail(`only ${best?.pairs.length ?? 0} of ${lines.length} lines matched within ${tol} keV; at least 3 are needed`);
  if (runnerUp !== null && runnerUp.pairs.length === best.pairs.length && runnerUp.rmsKeV <= factor * best.rmsKeV) {
    return fail(`two assignments match ${best.pairs.length} lines each with rms ${best.rmsKeV.toFixed(2)} and ${runnerUp.rmsKeV.toFixed(2)} keV (needs a factor ${factor} between them)`);
  }
  return { ok: true, ...best, runnerUp };

  function match(a: number, b: number): AssignmentCandidate | null {
    // Greedy one-to-one by increasing distance.
    const options2: { p: number; l: number; d: number }[] = [];
    peaks.forEach((pk, p) => lines.forEach((ln, l) => {
      const d = Math.abs(a + b * pk.centroidChannel - ln.energyKeV);
      if (d <= tol) options2.push({ p, l, d });
    }));
    options2.sort((x, y) => x.d - y.d);
    const usedP = new Set<number>();
    const usedL = new Set<number>();
    const pairs: AssignedPair[] = [];
    for (const o of options2) {
      if (usedP.has(o.p) || usedL.has(o.l)) continue;
      usedP.add(o.p);
      usedL.add(o.l);
      pairs.push({ peakIndex: o.p, lineIndex: o.l, channel: peaks[o.p]!.centroidChannel, energyKeV: lines[o.l]!.energyKeV, label: lines[o.l]!.label });
    }
    if (pairs.length === 0) return null;
    pairs.sort((x, y) => x.lineIndex - y.lineIndex);
    const rms = Math.sqrt(pairs.reduce((s, q) => s + (a + b * q.channel - q.energyKeV) ** 2, 0) / pairs.length);
    return { pairs, offsetKeV: a, gainKeVPerChannel: b, rmsKeV: rms };
  }
}

function straightLine(pairs: readonly AssignedPair[]): { a: number; b: number } | null {
  const n = pairs.length;
  const mx = pairs.reduce((s, p) => s + p.channel, 0) / n;
  const my = pairs.reduce((s, p) => s + p.energyKeV, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (const p of pairs) {
    sxx += (p.channel - mx) ** 2;
    sxy += (p.channel - mx) * (p.energyKeV - my);
  }
  if (!(sxx > 0)) return null;
  const b = sxy / sxx;
  return { a: my - b * mx, b };
}
