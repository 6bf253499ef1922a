import type { PeakWindow } from '../../pipeline/core/counting/peak-window.js';

export interface KnownLine {
  name: string;
  energyKeV: number;
  /** Expected relative strength (atoms/cm² × Z², the Rutherford scaling); Infinity when unknown. */
  strength: number;
}

/** Lines expected weaker than this fraction of the peak itself are not flagged (common practice: below the counting precision of a window sum). */
export const INTERFERENCE_MIN_RELATIVE_STRENGTH = 0.01;

/**
 * Flags a window that another expected peak of the same spectrum falls into: within the peak
 * window (`overlap-in-peak:<name>`: the area would include it) or within a background window
 * (`overlap-in-background:<name>`: the background would be overestimated). A line counts when
 * its ±1 FWHM interval meets the window and it is expected at least 1 % as strong as the peak
 * (common practice).
 */
export function interferenceFlags(window: PeakWindow, own: string, ownStrength: number, lines: readonly KnownLine[]): string[] {
  const flags: string[] = [];
  const meets = (e: number, [lo, hi]: [number, number]) => e + window.fwhmKeV >= lo && e - window.fwhmKeV <= hi;
  for (const l of lines) {
    if (l.name === own || !Number.isFinite(l.energyKeV)) continue;
    if (l.strength < INTERFERENCE_MIN_RELATIVE_STRENGTH * ownStrength) continue;
    if (Math.abs(l.energyKeV - window.expectedEnergyKeV) < 1e-6) continue;
    if (meets(l.energyKeV, window.peakKeV)) flags.push(`overlap-in-peak:${l.name}`);
    else if (meets(l.energyKeV, window.leftKeV) || meets(l.energyKeV, window.rightKeV)) flags.push(`overlap-in-background:${l.name}`);
  }
  return flags;
}
