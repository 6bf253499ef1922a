// Onset of non-Rutherford elastic backscattering: M. Bozoian, K.M. Hubbard, M. Nastasi, Nucl. Instrum. Methods B 51, 311 (1990); M. Bozoian, Nucl. Instrum. Methods B 58, 127 (1991).
import type { Nuclide } from './nuclides.js';

/**
 * Lab beam energy above which elastic backscattering of 1H or 4He from a nucleus of charge Z2
 * departs from the Rutherford cross section by more than a few per cent, as Bozoian's linear fits
 * in Z2 (from memory, as usually quoted; the papers' exact deviation criterion is not restated here):
 *
 *   1H:   E_NR = 0.12 Z2 − 0.5 MeV
 *   4He:  E_NR = 0.25 Z2 + 0.4 MeV
 *
 * for backscattering lab angles 160°–180°. At smaller angles the onset lies higher (the nuclear
 * contribution shrinks), so these values are conservative there. A formula value <= 0 (protons on
 * Z2 <= 4) means non-Rutherford at every energy: energyKeV is then 0. The later general form of
 * Bozoian, Nucl. Instrum. Methods B 82, 602 (1993), and fits for 2H, 3He and Li beams are not
 * implemented: their coefficients are not known here with enough certainty.
 */
export type OnsetResult =
  | {
    ok: true;
    /** Lab beam energy of the onset, keV (>= 0). */
    energyKeV: number;
    /** The linear form used, e.g. `0.25 Z2 + 0.4 MeV`. */
    formula: string;
    /** Lab backscattering angles the form applies to, degrees. */
    thetaLabRangeDeg: readonly [number, number];
    source: string;
  }
  | { ok: false; reason: string };

interface LinearForm { slopeMeV: number; interceptMeV: number; formula: string }

const FORMS: Record<string, LinearForm> = {
  '1H': { slopeMeV: 0.12, interceptMeV: -0.5, formula: '0.12 Z2 − 0.5 MeV' },
  '4He': { slopeMeV: 0.25, interceptMeV: 0.4, formula: '0.25 Z2 + 0.4 MeV' },
};

const SOURCE = 'Bozoian, Hubbard & Nastasi, Nucl. Instrum. Methods B 51, 311 (1990); Bozoian, Nucl. Instrum. Methods B 58, 127 (1991) (coefficients from memory)';
const THETA_LAB_RANGE_DEG = [160, 180] as const;

/**
 * Bozoian onset energy for `projectile` (1H or 4He) backscattered from `targetNuclide`, keV in the lab.
 * `{ ok: false, reason }` for other projectiles, and for a target not heavier than the projectile
 * (no backscattering, so the backscattering fits do not apply).
 */
export function onsetEnergyKeV(projectile: Nuclide, targetNuclide: Nuclide): OnsetResult {
  const form = Object.prototype.hasOwnProperty.call(FORMS, projectile.name) ? FORMS[projectile.name] : undefined;
  if (form === undefined) {
    return { ok: false, reason: `no published onset formula for a ${projectile.name} beam is implemented; Bozoian's linear forms cover 1H and 4He` };
  }
  if (!(targetNuclide.massU > projectile.massU)) {
    return { ok: false, reason: `${projectile.name} cannot backscatter from ${targetNuclide.name} (target not heavier than the projectile); the backscattering onset formula does not apply` };
  }
  const megaElectronVolts = form.slopeMeV * targetNuclide.z + form.interceptMeV;
  return { ok: true, energyKeV: Math.max(0, megaElectronVolts * 1000), formula: form.formula, thetaLabRangeDeg: THETA_LAB_RANGE_DEG, source: SOURCE };
}
