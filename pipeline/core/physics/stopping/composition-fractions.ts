import { elementZ, molarMassGPerMol, parseNuclideName } from '../nuclides.js';
import { stoppingFailure, type StoppingFailure } from './stopping-result.js';

export interface CompositionPart {
  /** The composition key as written: an element (`Si`, natural isotopic mix) or a nuclide (`13C`). */
  key: string;
  element: string;
  z: number;
  /** Atom fraction of this key in the material. */
  atomFraction: number;
  /** Atomic mass in u of this key (natural atomic weight for an element). */
  massU: number;
}

/**
 * Atom fractions of a composition given as atom ratios ({ C: 10, H: 8, O: 4 }), with each key's
 * element. Fails (rule `stopping-unknown-element` or `stopping-bad-input`) on an unknown key, a
 * ratio that is not a positive finite number, or an empty composition.
 */
export function compositionFractions(composition: Readonly<Record<string, number>>): { ok: true; parts: CompositionPart[]; elementFractions: Map<string, number> } | StoppingFailure {
  const entries = Object.entries(composition);
  if (entries.length === 0) return stoppingFailure('stopping-bad-input', 'the composition is empty; give atom ratios such as { Si: 1, O: 2 }');
  const parts: CompositionPart[] = [];
  let total = 0;
  for (const [key, ratio] of entries) {
    if (!(Number.isFinite(ratio) && ratio > 0)) return stoppingFailure('stopping-bad-input', `composition ratio of ${JSON.stringify(key)} is ${ratio}; expected a positive number`);
    const nuclide = parseNuclideName(key);
    const element = nuclide !== null ? nuclide.symbol : key;
    const z = elementZ(element);
    let massU: number;
    try {
      massU = molarMassGPerMol(key);
    } catch {
      return stoppingFailure('stopping-unknown-element', `composition key ${JSON.stringify(key)} is neither an element with a natural isotopic composition nor a nuclide in AME2020; write an element symbol (Si) or a nuclide (28Si)`);
    }
    if (z === undefined || z === 0) return stoppingFailure('stopping-unknown-element', `composition key ${JSON.stringify(key)} is not an element or nuclide`);
    parts.push({ key, element, z, atomFraction: ratio, massU });
    total += ratio;
  }
  const elementFractions = new Map<string, number>();
  for (const p of parts) {
    p.atomFraction /= total;
    elementFractions.set(p.element, (elementFractions.get(p.element) ?? 0) + p.atomFraction);
  }
  return { ok: true, parts, elementFractions };
}
