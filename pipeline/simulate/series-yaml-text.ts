import type { FoilConfig } from '../core/config/series-schema.js';
import type { SimulationSpec } from './simulation-spec.js';
import { yamlFlow, yamlScalar } from './yaml-flow.js';

/**
 * series.yaml of a simulated series: what the experimenter would write. Detectors carry the
 * nominal solid angle only; cross-section truths, true solid angles and every other
 * simulation-only value stay out (they are in truth.csv and the spec).
 */
const foil = (f: FoilConfig) => ({ composition: f.composition, areal_density_1e15_per_cm2: f.areal_density_1e15_per_cm2, areal_density_ug_per_cm2: f.areal_density_ug_per_cm2, stopping_material: f.stopping_material });

export function seriesYamlText(spec: SimulationSpec): string {
  const lines: string[] = [
    `# Run series simulated by xsred from a simulation spec (seed ${spec.seed}); the truth is in truth.csv.`,
    `series: ${yamlScalar(spec.series)}`,
    `title: ${yamlScalar(spec.title)}`,
    `beam: ${yamlFlow({ projectile: spec.beam.projectile, charge_state: spec.beam.charge_state })}`,
    'detectors:',
    ...spec.detectors.map((d) => `  - ${yamlFlow({
      id: d.id, angle_deg: d.angle_deg, angle_unc_deg: d.angle_unc_deg, resolution_fwhm_keV: d.resolution_fwhm_keV, solid_angle_msr: d.solid_angle_msr,
      half_aperture_deg: d.half_aperture_deg === 0 ? undefined : d.half_aperture_deg,
      dead_layer: d.dead_layer === undefined ? undefined : foil(d.dead_layer),
      absorber: d.absorber.length === 0 ? undefined : d.absorber.map(foil),
    })}`),
    'targets:',
  ];
  for (const t of spec.targets) {
    lines.push(`  - id: ${yamlScalar(t.id)}`);
    if (t.tilt_deg !== 0) lines.push(`    tilt_deg: ${yamlScalar(t.tilt_deg)}`);
    if (t.exit_angle_mode !== 'reflection') lines.push(`    exit_angle_mode: ${yamlScalar(t.exit_angle_mode)}`);
    lines.push('    layers:');
    for (const l of t.layers) {
      lines.push(`      - ${yamlFlow({
        composition: l.composition,
        areal_density_1e15_per_cm2: l.areal_density_1e15_per_cm2,
        areal_density_ug_per_cm2: l.areal_density_ug_per_cm2,
        areal_density_unc_rel: l.areal_density_unc_rel,
        stopping_material: l.stopping_material,
        role: l.role,
      })}`);
    }
  }
  lines.push('peaks:');
  for (const p of spec.peaks) {
    lines.push(`  - ${yamlFlow({ label: p.label, target_nuclide: p.target_nuclide, excitation_keV: p.excitation_keV, q_value_keV: p.q_value_keV, ejectile: p.ejectile, detect: p.detect === 'ejectile' ? undefined : p.detect, method: p.method, fit_group: p.fit_group })}`);
  }
  if (spec.physics.energy_loss !== 'none') lines.push(`physics: ${yamlFlow({ energy_loss: spec.physics.energy_loss })}`);
  lines.push(`normalization: ${yamlFlow(spec.normalization as Record<string, string | number | undefined>)}`);
  if (spec.calibration_runs !== undefined) lines.push(`calibration_sources: [${yamlFlow({ id: spec.calibration_runs.source_id, lines_from: spec.calibration_runs.lines_from })}]`);
  return `${lines.join('\n')}\n`;
}
