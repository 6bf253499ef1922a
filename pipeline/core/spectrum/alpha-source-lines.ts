// Alpha emission energies and probabilities: DDEP, Decay Data Evaluation Project, LNHB "Table de Radionucléides" (M.-M. Bé et al., Monographie BIPM-5, BIPM 2004–2016); ENSDF where noted.
/**
 * Main alpha lines of common calibration sources: energy E_α (keV, kinetic energy of the alpha
 * particle), emission probability I_α (% per decay), their standard uncertainties, and the daughter
 * level fed (keV above its ground state).
 *
 * VALUES FROM MEMORY: typed from memory of the DDEP recommended data (LNHB tables), not copied from
 * a downloaded file; no reference copy of those tables is in the repository. Energies are believed
 * right to ~0.1 keV and intensities to ~0.5 % absolute; check against the current LNHB tables
 * before a calibration is used for anything that needs better. The test
 * (test/core/spectrum/alpha-source-lines.test.ts) checks every line independently against Q-values
 * from AME2020 masses, which catches a wrong digit at the 1 keV level.
 * Lines below 1 % are left out except where they shape a calibration peak.
 */
export interface AlphaLine {
  nuclide: string;
  energyKeV: number;
  energyUncKeV: number;
  intensityPercent: number;
  intensityUncPercent: number;
  /** Level of the daughter fed by this line, keV (0 = ground state). */
  daughterLevelKeV: number;
}

const line = (nuclide: string, energyKeV: number, energyUncKeV: number, intensityPercent: number, intensityUncPercent: number, daughterLevelKeV: number): AlphaLine =>
  ({ nuclide, energyKeV, energyUncKeV, intensityPercent, intensityUncPercent, daughterLevelKeV });

export const ALPHA_SOURCE_LINES: Readonly<Record<string, readonly AlphaLine[]>> = {
  '148Gd': [line('148Gd', 3182.69, 0.02, 100, 0, 0)],
  '210Po': [line('210Po', 5304.33, 0.07, 99.9988, 0.0002, 0)],
  '238Pu': [line('238Pu', 5499.03, 0.20, 70.91, 0.10, 0), line('238Pu', 5456.3, 0.3, 28.98, 0.10, 43.50)],
  '239Pu': [line('239Pu', 5156.59, 0.14, 70.77, 0.14, 0.08), line('239Pu', 5144.3, 0.8, 17.11, 0.14, 13.04), line('239Pu', 5105.5, 0.8, 11.94, 0.07, 51.70)],
  '241Am': [line('241Am', 5485.56, 0.12, 84.45, 0.10, 59.54), line('241Am', 5442.80, 0.13, 13.23, 0.10, 102.96), line('241Am', 5388.23, 0.13, 1.66, 0.02, 158.50)],
  '244Cm': [line('244Cm', 5804.77, 0.05, 76.90, 0.10, 0), line('244Cm', 5762.64, 0.03, 23.10, 0.10, 42.82)],
};

export const ALPHA_SOURCE_LINES_EDITION = 'DDEP/LNHB recommended data, typed from memory (see alpha-source-lines.ts)';

/** The lines of the named nuclides (e.g. ['239Pu', '241Am', '244Cm']), sorted by energy; throws on a nuclide not in the table. */
export function alphaSourceLines(nuclides: readonly string[]): AlphaLine[] {
  const out: AlphaLine[] = [];
  for (const n of nuclides) {
    const lines = ALPHA_SOURCE_LINES[n];
    if (lines === undefined) throw new RangeError(`no alpha lines for ${n}; the table has ${Object.keys(ALPHA_SOURCE_LINES).join(', ')}`);
    out.push(...lines);
  }
  return out.sort((a, b) => a.energyKeV - b.energyKeV);
}
