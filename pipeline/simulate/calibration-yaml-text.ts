import type { CalibrationVersionSpec } from './simulation-spec.js';
import { scientific } from './format-number.js';
import { yamlScalar } from './yaml-flow.js';

/**
 * `calibrations/<version>.yaml` (DESIGN.md): the version, its validity by run id (open-ended
 * when `validToRun` is undefined) and per detector the offset, gain and their covariance,
 * order [offset, gain]: σ_o = offset_unc_keV, σ_g = gain_unc_rel · gain, cov = ρ σ_o σ_g.
 * The coefficients are the ones the counts were generated with.
 */
export function calibrationYamlText(version: CalibrationVersionSpec, validFromRun: string, validToRun: string | undefined): string {
  const lines = [
    '# Energy calibration of a simulated series: E(ch) = offset_keV + gain_keV_per_channel * ch at the centre of channel ch.',
    `version: ${yamlScalar(version.version)}`,
    `valid_from_run: ${yamlScalar(validFromRun)}`,
  ];
  if (validToRun !== undefined) lines.push(`valid_to_run: ${yamlScalar(validToRun)}`);
  lines.push('detectors:');
  for (const d of version.detectors) {
    const so = version.offset_unc_keV;
    const sg = version.gain_unc_rel * d.gain_keV_per_channel;
    const cov = version.offset_gain_correlation * so * sg;
    lines.push(
      `  - id: ${yamlScalar(d.id)}`,
      `    offset_keV: ${yamlScalar(d.offset_keV)}`,
      `    gain_keV_per_channel: ${yamlScalar(d.gain_keV_per_channel)}`,
      `    covariance: [[${scientific(so * so, 4)}, ${scientific(cov, 4)}], [${scientific(cov, 4)}, ${scientific(sg * sg, 4)}]]`,
    );
  }
  return `${lines.join('\n')}\n`;
}
