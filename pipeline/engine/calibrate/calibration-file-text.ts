import type { CalibrationFit } from '../../core/spectrum/fit-calibration.js';

export interface FittedDetector {
  id: string;
  fit: CalibrationFit;
  /** Point labels, for the comment block. */
  labels: string[];
}

/** A number as YAML writes it back exactly (shortest round-trip form). */
const num = (v: number) => (Object.is(v, -0) ? '0' : String(v));

/**
 * `calibrations/<version>.yaml` in the format ingest reads (configs/calibration.schema.json):
 * version, validity by run id (open-ended when validToRun is undefined), supersedes, and per
 * detector offset, gain (quadratic for degree 2) and the covariance, order [offset, gain(, quadratic)].
 * Comments record the source run and each detector's residuals; they are not data.
 */
export function calibrationFileText(o: { version: string; fromRun: string; validToRun: string | undefined; supersedes: readonly string[]; source: string; detectors: readonly FittedDetector[] }): string {
  const lines = [
    `# Energy calibration fitted by xsred calibrate from calibration run ${o.fromRun} (source ${o.source}).`,
    '# E(ch) = offset_keV + gain_keV_per_channel*ch (+ quadratic_keV_per_channel2*ch^2) at the centre of channel ch.',
    `version: ${o.version}`,
    `valid_from_run: ${o.fromRun}`,
  ];
  if (o.validToRun !== undefined) lines.push(`valid_to_run: ${o.validToRun}`);
  lines.push(`supersedes: [${o.supersedes.join(', ')}]`, 'detectors:');
  for (const d of o.detectors) {
    const f = d.fit;
    lines.push(`  # ${d.id}: ${d.labels.length} lines, chi2 = ${f.chiSquare.toPrecision(4)} for ${f.dof} dof; residuals keV: ${d.labels.map((l, i) => `${l} ${f.residualsKeV[i]!.toFixed(3)}`).join(', ')}`);
    lines.push(`  - id: ${d.id}`, `    offset_keV: ${num(f.offsetKeV)}`, `    gain_keV_per_channel: ${num(f.gainKeVPerChannel)}`);
    if (f.degree === 2) lines.push(`    quadratic_keV_per_channel2: ${num(f.quadraticKeVPerChannel2)}`);
    lines.push(`    covariance: [${f.covariance.map((row) => `[${row.map(num).join(', ')}]`).join(', ')}]`);
  }
  return `${lines.join('\n')}\n`;
}
