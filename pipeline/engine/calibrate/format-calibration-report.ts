import type { CalibratedRun } from '../calibrate-command.js';

/** The residual report `xsred calibrate` prints: per run and detector, coefficients with uncertainties, χ²/ν and every point's residual. */
export function formatCalibrationReport(runs: readonly CalibratedRun[], dryRun: boolean): string {
  const out: string[] = [];
  for (const r of runs) {
    const state = dryRun ? 'not written (--dry-run)' : r.written ? 'written' : 'NOT written';
    out.push(`${r.run} (${r.source}) -> ${r.file} [${state}], valid ${r.run}..${r.validToRun ?? '(open)'}${r.supersedes.length ? `, supersedes ${r.supersedes.join(', ')}` : ''}`);
    for (const d of r.detectors) {
      const f = d.fit;
      const u = (i: number) => Math.sqrt(f.covariance[i]![i]!);
      const coef = `offset ${f.offsetKeV.toFixed(3)} ± ${u(0).toFixed(3)} keV, gain ${f.gainKeVPerChannel.toFixed(6)} ± ${u(1).toFixed(6)} keV/ch${f.degree === 2 ? `, quadratic ${f.quadraticKeVPerChannel2.toExponential(4)} ± ${u(2).toExponential(2)} keV/ch²` : ''}`;
      out.push(`  ${d.id}: ${coef}; chi2/dof = ${f.chiSquare.toFixed(2)}/${f.dof}`);
      d.labels.forEach((l, i) => out.push(`    ${l.padEnd(28)} residual ${f.residualsKeV[i]!.toFixed(3).padStart(8)} keV  (${f.normalizedResiduals[i]!.toFixed(2).padStart(6)} σ)`));
    }
  }
  return `${out.join('\n')}\n`;
}
