/**
 * Reference lines as a detector of a given resolution sees them: lines of one nuclide closer than
 * `fwhmKeV` merge into one peak at their intensity-weighted mean energy (the centroid of the sum of
 * two equal-width Gaussians; common practice), with
 *   E = Σ I_k E_k / Σ I_k,   u(E)² = Σ (I_k/ΣI)² u(E_k)²   (member energies independent),
 * and groups weaker than `minRelativeIntensity` of the nuclide's strongest group are dropped.
 * Energies in keV, intensities in % per decay.
 */
import type { AlphaLine } from './alpha-source-lines.js';

export interface ReferenceLine {
  label: string;
  nuclide: string;
  energyKeV: number;
  energyUncKeV: number;
  intensityPercent: number;
  members: AlphaLine[];
}

export function mergeUnresolvedLines(lines: readonly AlphaLine[], fwhmKeV: number, minRelativeIntensity = 0.05): ReferenceLine[] {
  const byNuclide = new Map<string, AlphaLine[]>();
  for (const l of lines) byNuclide.set(l.nuclide, [...(byNuclide.get(l.nuclide) ?? []), l]);
  const out: ReferenceLine[] = [];
  for (const [nuclide, group] of byNuclide) {
    const sorted = [...group].sort((a, b) => a.energyKeV - b.energyKeV);
    const clusters: AlphaLine[][] = [];
    for (const l of sorted) {
      const last = clusters[clusters.length - 1];
      if (last !== undefined && l.energyKeV - last[last.length - 1]!.energyKeV < fwhmKeV) last.push(l);
      else clusters.push([l]);
    }
    const merged = clusters.map((members) => {
      const total = members.reduce((s, m) => s + m.intensityPercent, 0);
      const energyKeV = members.reduce((s, m) => s + m.intensityPercent * m.energyKeV, 0) / total;
      const energyUncKeV = Math.sqrt(members.reduce((s, m) => s + ((m.intensityPercent / total) * m.energyUncKeV) ** 2, 0));
      const label = `${nuclide} ${members.map((m) => m.energyKeV.toFixed(1)).join('+')}`;
      return { label, nuclide, energyKeV, energyUncKeV, intensityPercent: total, members };
    });
    const strongest = Math.max(...merged.map((m) => m.intensityPercent));
    out.push(...merged.filter((m) => m.intensityPercent >= minRelativeIntensity * strongest));
  }
  return out.sort((a, b) => a.energyKeV - b.energyKeV);
}
