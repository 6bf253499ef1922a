import type { FitParameter } from './fit-model.js';
import { fixedTie, parameterTie, type LinearTie } from './linear-tie.js';
import type { PeakComponent, SpectrumModelSpec } from './spectrum-model.js';
import { startAmplitudes } from './start-amplitudes.js';

/**
 * Builds the model of a region holding one or more peaks (a multiplet) from what the caller knows
 * before fitting: each line's expected centroid channel (kinematics through the calibration) and
 * the predicted width σ₀ (the detector resolution). Nothing here is tuned by hand: areas and
 * background start from a linear least-squares solve with those shapes (start-amplitudes.ts).
 *
 * positions: `free` — one centroid parameter per line;
 *   `tied` — c_i = c₀ + g·(E_i − E₀), c₀ and g (channels/keV) fitted (kinematics fixes the energy
 *   differences, the calibration their scale); `tied-fixed-gain` — the same with g held fixed.
 * widths: `shared` — σ_i = s_i·σ₀ with s_i = widthScale (1 when absent), one σ₀ parameter;
 *   `free` — one σ per line.
 * tail: fraction η and length τ (channels), `fixed` at the given values, `shared` (one η, one τ) or
 *   `free` (per line); absent = pure Gaussian.
 * Bounds (safety boxes, common practice): A >= 0; centroids inside the region; σ within
 * [σ₀/10, 10σ₀]; g within a factor 2 of its start; η in [0, 1]; τ in [σ₀/20, region length];
 * step heights >= 0.
 */
export interface MultipletLine {
  label: string;
  /** Expected centroid, channels. */
  expectedChannel: number;
  /** Line energy, keV (needed for tied positions). */
  energyKeV?: number;
  /** σ_i/σ₀ for shared widths scaled with energy; 1 when absent. */
  widthScale?: number;
}

export interface MultipletOptions {
  firstChannel: number;
  channelCount: number;
  lines: readonly MultipletLine[];
  /** Predicted σ₀ of the first line, channels. */
  sigmaChannels: number;
  positions?: 'free' | 'tied' | 'tied-fixed-gain';
  /** Channels per keV at the region (1/gain of the calibration); needed for tied positions. */
  channelsPerKeV?: number;
  widths?: 'shared' | 'free';
  tail?: { mode: 'fixed' | 'shared' | 'free'; fraction: number; lengthChannels: number };
  step?: boolean;
  background?: 'none' | 'constant' | 'linear' | 'quadratic';
}

export function multipletSpec(counts: ArrayLike<number>, o: MultipletOptions): SpectrumModelSpec {
  const params: FitParameter[] = [];
  const add = (q: FitParameter) => params.push(q) - 1;
  const first = o.firstChannel;
  const last = o.firstChannel + o.channelCount - 1;
  const s0 = o.sigmaChannels;
  const positions = o.positions ?? 'free';
  if (positions !== 'free' && !(o.channelsPerKeV! > 0)) throw new RangeError('tied positions need channelsPerKeV > 0');
  if (positions !== 'free' && o.lines.some((l) => l.energyKeV === undefined)) throw new RangeError('tied positions need every line energy (energyKeV)');
  const ref = o.lines[0]!;
  const cRef = positions === 'free' ? -1 : add({ name: 'centroid', start: ref.expectedChannel, lower: first - 0.5, upper: last + 0.5 });
  const gain = positions === 'free' ? -1 : add({ name: 'channels_per_keV', start: o.channelsPerKeV!, lower: 0.5 * o.channelsPerKeV!, upper: 2 * o.channelsPerKeV!, fixed: positions === 'tied-fixed-gain' });
  const sShared = o.widths === 'free' ? -1 : add({ name: 'sigma', start: s0, lower: s0 / 10, upper: 10 * s0 });
  const tail = o.tail;
  const tailBounds = { fraction: [0, 1], length: [s0 / 20, o.channelCount] } as const;
  let sharedTail: { fraction: LinearTie; length: LinearTie } | undefined;
  if (tail !== undefined && tail.mode !== 'free') {
    sharedTail = tail.mode === 'fixed'
      ? { fraction: fixedTie(tail.fraction), length: fixedTie(tail.lengthChannels) }
      : {
        fraction: parameterTie(add({ name: 'tail_fraction', start: tail.fraction, lower: tailBounds.fraction[0], upper: tailBounds.fraction[1] })),
        length: parameterTie(add({ name: 'tail_length', start: tail.lengthChannels, lower: tailBounds.length[0], upper: tailBounds.length[1] })),
      };
  }
  const peaks: PeakComponent[] = o.lines.map((line) => {
    const area = add({ name: `area ${line.label}`, start: 0, lower: 0 });
    const centroid: LinearTie = positions === 'free'
      ? parameterTie(add({ name: `centroid ${line.label}`, start: line.expectedChannel, lower: first - 0.5, upper: last + 0.5 }))
      : { terms: [{ param: cRef, coef: 1 }, { param: gain, coef: line.energyKeV! - ref.energyKeV! }] };
    const scale = line.widthScale ?? 1;
    const sigma: LinearTie = sShared >= 0
      ? { terms: [{ param: sShared, coef: scale }] }
      : parameterTie(add({ name: `sigma ${line.label}`, start: s0 * scale, lower: (s0 * scale) / 10, upper: 10 * s0 * scale }));
    let peakTail = sharedTail;
    if (tail !== undefined && tail.mode === 'free') {
      peakTail = {
        fraction: parameterTie(add({ name: `tail_fraction ${line.label}`, start: tail.fraction, lower: tailBounds.fraction[0], upper: tailBounds.fraction[1] })),
        length: parameterTie(add({ name: `tail_length ${line.label}`, start: tail.lengthChannels, lower: tailBounds.length[0], upper: tailBounds.length[1] })),
      };
    }
    const step = o.step ? parameterTie(add({ name: `step ${line.label}`, start: 0, lower: 0 })) : undefined;
    return { label: line.label, area, centroid, sigma, ...(peakTail ? { tail: peakTail } : {}), ...(step ? { step } : {}) };
  });
  const degree = { none: -1, constant: 0, linear: 1, quadratic: 2 }[o.background ?? 'linear'];
  const bgParams: number[] = [];
  for (let d = 0; d <= degree; d++) bgParams.push(add({ name: `background_b${d}`, start: 0, ...(degree === 0 ? { lower: 0 } : {}) }));
  const spec: SpectrumModelSpec = {
    firstChannel: first,
    channelCount: o.channelCount,
    parameters: params,
    peaks,
    ...(degree >= 0 ? { background: { params: bgParams, referenceChannel: 0.5 * (first + last) } } : {}),
  };
  return startAmplitudes(counts, spec);
}
