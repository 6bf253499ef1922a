// Monitor-detector normalization with the thin-target yield equation: W.-K. Chu, J.W. Mayer, M.-A. Nicolet, Backscattering Spectrometry (Academic Press, 1978), eq. 3.4, written for two detectors.
import type { LiveFraction } from '../../pipeline/core/counting/live-fraction.js';
import type { NetCounts } from '../../pipeline/core/counting/net-counts.js';
import type { RunRecord } from '../../pipeline/core/model/series-model.js';
import type { MeasurementModel } from '../../pipeline/core/normalization/measurement-model.js';
import type { RowNormalization } from '../../pipeline/core/normalization/row-normalization.js';
import type { ScalarOps } from '../../pipeline/core/normalization/scalar-ops.js';
import type { NormalizingNuclide, SharedUncertainties } from './reference-solid-angle-model.js';
import { referenceYieldExposure } from './reference-yield-exposure.js';
import type { RuleChoice } from './reference-rule.js';

export interface MonitorInput {
  run: RunRecord;
  /** The detector whose rows are normalized. */
  detector: string;
  monitor: {
    detector: string;
    angleUncDeg: number;
    /** Net counts of the reference element's elastic peak in the monitor's spectrum of this run. */
    peak: NetCounts;
    live: LiveFraction;
    /** The reference element's isotopes in the sample target, σ_R at the run's energy and the monitor's angle. */
    nuclides: NormalizingNuclide[];
  };
  /** Reference runs (by the reference rule) that give ΔΩ_d/ΔΩ_m, and each run's ΔΩ models. */
  choice: RuleChoice;
  detectorSolidAngles: ReadonlyMap<string, MeasurementModel>;
  monitorSolidAngles: ReadonlyMap<string, MeasurementModel>;
  shared: SharedUncertainties;
}

const ratios = new WeakMap<RuleChoice, Map<string, MeasurementModel>>();

/**
 * One monitor detector m sees the Rutherford yield of the reference element in every sample
 * run, which measures that run's N_beam·ΔΩ_m: Y_m = N_beam ΔΩ_m f_m Σ_i n_i σ_R,i(E, θ_m).
 * The other detectors' solid angles relative to the monitor come from the reference runs, where
 * the charge cancels: ρ_d = Σ_k w_k ΔΩ_d,k / ΔΩ_m,k. The exposure of detector d is then
 *
 *   L_d = Y_m / (f_m · Σ_i n_i σ_R,i · 10⁻²⁷) · ρ_d   (sr)
 *
 * so the charge integrator and the absolute solid angles cancel. Inputs: Y_m (reference_counting,
 * run class, key `<run>/<monitor>`), f_m, δE of the run, δθ of the monitor, δs, the thickness of
 * the layers holding the reference element (the same quantity as the sample nuclide's when they
 * share a layer — their ratio is then the composition and the thickness cancels), and through ρ_d
 * each reference run's counting, live time, energy and the two detectors' angles.
 */
export function monitorExposure(x: MonitorInput): RowNormalization {
  const m = x.monitor;
  let byDetector = ratios.get(x.choice);
  if (byDetector === undefined) ratios.set(x.choice, (byDetector = new Map()));
  let rho = byDetector.get(x.detector);
  if (rho === undefined) {
    const model = (map: ReadonlyMap<string, MeasurementModel>, r: string, who: string) => {
      const found = map.get(r);
      if (found === undefined) throw new RangeError(`reference run ${r} has no effective-solid-angle model for detector ${who}`);
      return found;
    };
    const parts = [...x.choice.referenceRuns.map((r) => model(x.detectorSolidAngles, r, x.detector)), ...x.choice.referenceRuns.map((r) => model(x.monitorSolidAngles, r, m.detector))];
    const w = x.choice.weights.slice();
    const k = w.length;
    rho = {
      inputs: [],
      parts,
      evaluate<T>(_v: readonly T[], p: readonly T[], ops: ScalarOps<T>): T {
        let s = ops.scale(ops.div(p[0]!, p[k]!), w[0]!);
        for (let j = 1; j < k; j++) s = ops.add(s, ops.scale(ops.div(p[j]!, p[k + j]!), w[j]!));
        return s;
      },
    };
    byDetector.set(x.detector, rho);
  }
  const y = referenceYieldExposure(x.run, m.detector, m.angleUncDeg, m.peak, m.live, m.nuclides, x.shared);
  const exposure: MeasurementModel = {
    inputs: y.inputs,
    parts: [rho],
    evaluate: (v, p, ops) => ops.mul(y.evaluate(v, ops), p[0]!),
  };
  const flags = [...x.choice.flags, ...(m.peak.net > 0 ? [] : ['monitor-net-not-positive'])];
  return { method: 'monitor', exposure, referenceRuns: x.choice.referenceRuns, weights: x.choice.weights, solidAngleMsr: Number.NaN, flags };
}
