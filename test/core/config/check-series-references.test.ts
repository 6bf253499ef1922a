import { describe, expect, it } from 'vitest';
import { checkSeriesReferences, type SeriesReferences } from '../../../pipeline/core/config/check-series-references.js';
import { detectorSchema, peakSchema, targetSchema } from '../../../pipeline/core/config/series-schema.js';

// The series contract of DESIGN.md (ids, nuclide names, references): a fact of this project's contract.
const base = (): SeriesReferences => ({
  beam: { projectile: '4He', charge_state: 1 },
  detectors: [detectorSchema.parse({ id: 'd01', angle_deg: 150, angle_unc_deg: 0, resolution_fwhm_keV: 15, solid_angle_msr: 2 })],
  targets: [
    targetSchema.parse({ id: 'ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] }),
    targetSchema.parse({ id: 'c', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 100, areal_density_unc_rel: 0.05 }] }),
  ],
  peaks: [peakSchema.parse({ label: '12C elastic', target_nuclide: '12C', excitation_keV: 0, method: 'window' })],
  normalization: { reference_target: 'ref' },
});
const rules = (c: SeriesReferences) => checkSeriesReferences(c).map((i) => [i.severity, i.rule, i.path.join('.')]);

describe('checkSeriesReferences', () => {
  it('a consistent configuration has no issue', () => expect(rules(base())).toEqual([]));
  it('duplicate ids, unknown nuclides and elements, missing references', () => {
    const c = base();
    c.detectors.push({ ...c.detectors[0]! });
    c.targets[1]!.layers[0]!.composition = { Xx: 1, '300C': 1, Tc: 1 };
    c.peaks.push({ label: '28Si elastic', target_nuclide: '28Si', excitation_keV: 0, method: 'window', detect: 'ejectile' });
    c.normalization = { reference_target: 'ref', reference_element: 'Ag' };
    expect(rules(c)).toEqual([
      ['error', 'series-duplicate-id', 'detectors.1.id'],
      ['error', 'series-unknown-element', 'targets.1.layers.0.composition.Xx'],
      ['error', 'series-unknown-nuclide', 'targets.1.layers.0.composition.300C'],
      ['error', 'series-no-abundance', 'targets.1.layers.0.composition.Tc'],
      ['warning', 'series-peak-not-in-targets', 'peaks.0.target_nuclide'],
      ['warning', 'series-peak-not-in-targets', 'peaks.1.target_nuclide'],
      ['error', 'series-reference-element', 'normalization.reference_element'],
    ]);
    expect(rules({ ...base(), normalization: { reference_target: 'nowhere' } })).toEqual([['error', 'series-unknown-target', 'normalization.reference_target']]);
  });
  it('a calibration source must name a defined target (this project\'s contract, README "Calibration from calibration runs")', () => {
    const c = { ...base(), calibration_sources: [{ id: 'mixed', lines_from: ['241Am'] }, { id: 'film', target: 'no-such-film' }] };
    expect(rules(c)).toEqual([['error', 'series-unknown-target', 'calibration_sources.1.target']]);
    expect(rules({ ...base(), calibration_sources: [{ id: 'film', target: 'ref' }] })).toEqual([]);
  });
});
