import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { FitModel } from '../../../pipeline/core/fitting/fit-model.js';
import { fitLevenbergMarquardt } from '../../../pipeline/core/fitting/fit-levenberg-marquardt.js';

// NIST/ITL Statistical Reference Datasets, nonlinear regression, Gauss1–Gauss3 (B. Rust, NIST 1996).
// The .dat files are byte copies of the published ones (test/fixtures/nist-strd/); the test parses the
// start values, certified parameters, certified standard deviations and certified residual sum of
// squares from them, so every number checked comes from NIST, none is typed here.
interface StrdProblem {
  x: Float64Array;
  y: Float64Array;
  starts: [number[], number[]];
  certified: number[];
  certifiedSd: number[];
  certifiedRss: number;
}

function readStrd(name: string): StrdProblem {
  const lines = readFileSync(join(__dirname, '../../fixtures/nist-strd', name), 'utf8').split(/\r?\n/);
  const start1: number[] = [];
  const start2: number[] = [];
  const certified: number[] = [];
  const certifiedSd: number[] = [];
  let certifiedRss = Number.NaN;
  const xs: number[] = [];
  const ys: number[] = [];
  let inData = false;
  for (const line of lines) {
    const b = /^\s*b\d+\s*=\s*(\S+)\s+(\S+)\s+(\S+)\s+(\S+)/.exec(line);
    if (b) {
      start1.push(Number(b[1]));
      start2.push(Number(b[2]));
      certified.push(Number(b[3]));
      certifiedSd.push(Number(b[4]));
      continue;
    }
    const rss = /^Residual Sum of Squares:\s+(\S+)/.exec(line);
    if (rss) certifiedRss = Number(rss[1]);
    if (/^Data:\s+y\s+x/.test(line)) {
      inData = true;
      continue;
    }
    if (inData) {
      const v = line.trim().split(/\s+/);
      if (v.length === 2) {
        ys.push(Number(v[0]));
        xs.push(Number(v[1]));
      }
    }
  }
  return { x: Float64Array.from(xs), y: Float64Array.from(ys), starts: [start1, start2], certified, certifiedSd, certifiedRss };
}

/** The StRD Gauss model y = b1·exp(−b2·x) + b3·exp(−(x−b4)²/b5²) + b6·exp(−(x−b7)²/b8²), with its Jacobian. */
function gaussModel(x: Float64Array): FitModel {
  return {
    parameterCount: 8,
    pointCount: x.length,
    evaluate(b, mu, jac) {
      for (let i = 0; i < x.length; i++) {
        const xi = x[i]!;
        const e0 = Math.exp(-b[1]! * xi);
        const u1 = (xi - b[3]!) / b[4]!;
        const u2 = (xi - b[6]!) / b[7]!;
        const g1 = Math.exp(-u1 * u1);
        const g2 = Math.exp(-u2 * u2);
        mu[i] = b[0]! * e0 + b[2]! * g1 + b[5]! * g2;
        const r = i * 8;
        jac[r] = e0;
        jac[r + 1] = -b[0]! * xi * e0;
        jac[r + 2] = g1;
        jac[r + 3] = (b[2]! * g1 * 2 * u1) / b[4]!;
        jac[r + 4] = (b[2]! * g1 * 2 * u1 * u1) / b[4]!;
        jac[r + 5] = g2;
        jac[r + 6] = (b[5]! * g2 * 2 * u2) / b[7]!;
        jac[r + 7] = (b[5]! * g2 * 2 * u2 * u2) / b[7]!;
      }
    },
  };
}

/** Agreement in significant digits: −log10(|a − b|/|b|), LRE in the StRD's own terms (McCullough 1999, Am. Stat. 53, 149). */
const lre = (a: number, b: number) => (a === b ? 16 : -Math.log10(Math.abs(a - b) / Math.abs(b)));

describe('least squares on NIST StRD Gauss1, Gauss2, Gauss3 (certified values from the NIST files)', () => {
  for (const name of ['Gauss1.dat', 'Gauss2.dat', 'Gauss3.dat']) {
    const problem = readStrd(name);
    for (const s of [0, 1] as const) {
      it(`fits NIST StRD ${name.replace('.dat', '')} from start ${s + 1} to the certified parameters (>= 6 digits), RSS and standard deviations`, () => {
        expect(problem.x.length).toBe(250);
        expect(problem.certified.length).toBe(8);
        const fit = fitLevenbergMarquardt(gaussModel(problem.x), problem.y, problem.starts[s], { objective: 'least-squares' });
        expect(fit.converged).toBe(true);
        for (let j = 0; j < 8; j++) expect(lre(fit.params[j]!, problem.certified[j]!)).toBeGreaterThanOrEqual(6);
        expect(lre(fit.objective, problem.certifiedRss)).toBeGreaterThanOrEqual(6);
        // Certified standard deviations are sqrt(diag(s²(JᵀJ)⁻¹)), s² = RSS/(250 − 8): 4 digits is ample for a check of the covariance.
        for (let j = 0; j < 8; j++) expect(lre(Math.sqrt(fit.covariance[j * 9]!), problem.certifiedSd[j]!)).toBeGreaterThanOrEqual(4);
        expect(fit.dof).toBe(242);
      });
    }
  }
});
