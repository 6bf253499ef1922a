import { describe, expect, it } from 'vitest';
import * as physics from '../../../pipeline/core/physics/index.js';

describe('physics index', () => {
  it('re-exports the agreed API under its agreed names', () => {
    const functions = [
      'degToRad', 'radToDeg', 'microCoulombToParticles', 'arealDensityUgPerCm2ToAtomsPerCm2', 'arealDensityAtomsPerCm2ToUgPerCm2',
      'parseNuclideName', 'nuclide', 'elementZ', 'elementSymbol', 'naturalIsotopes', 'standardAtomicWeight', 'molarMassGPerMol',
      'nuclearMassMeV', 'elasticKinematicFactor', 'ejectileEnergiesNonRelKeV', 'qValueKeV', 'cmVelocityRatio',
      'labToCmAngleDeg', 'cmToLabAngleDeg', 'solidAngleJacobianLabPerCm', 'rutherfordCmMbPerSr', 'rutherfordLabMbPerSr',
      'rutherfordLabLogDerivatives', 'lecuyerScreeningFactor', 'lecuyerScreeningLogDerivativePerKeV',
      'UnknownNuclideError', 'UnknownElementError',
    ] as const;
    for (const name of functions) expect(typeof physics[name], name).toBe('function');
    expect(physics.FM2_TO_MB).toBe(10);
    expect(physics.MB_TO_CM2).toBe(1e-27);
    expect(physics.MASS_TABLE_EDITION).toBe('AME2020');
    expect(physics.ABUNDANCE_EDITION).toBe('IUPAC CIAAW 2013');
    expect(physics.CODATA2018.atomicMassUnitMeV).toBe(931.49410242);
    // the same binding through both re-export paths
    expect(physics.elementZ('Au')).toBe(79);
  });
});
