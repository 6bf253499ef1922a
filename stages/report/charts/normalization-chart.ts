import type { ReferencePoint } from '../../../pipeline/core/model/result-rows.js';
import { CHART_CONFIG } from './chart-config.js';

/**
 * vega-lite specification of the normalization over time: the effective solid angle each
 * reference run implies, per detector, with its run-to-run uncertainty (counting, live time,
 * beam energy) as error bars and the nominal solid angle as a dashed line.
 */
export function normalizationChartSpec(points: readonly ReferencePoint[], nominalMsr: ReadonlyMap<string, number>): object | null {
  const values = points
    .filter((p) => p.solidAngleMsr !== null && Number.isFinite(p.solidAngleMsr))
    .map((p) => {
      const v = p.solidAngleMsr!;
      const u = v * Math.hypot(p.relCounting, p.relLive, p.relEnergy);
      return { detector: p.detector, run: p.run, t: p.startedAtMs, v, lo: v - u, hi: v + u, nominal: nominalMsr.get(p.detector) ?? null };
    });
  if (values.length === 0) return null;
  const x = { field: 't', type: 'temporal', title: 'run start (UTC)', axis: { format: '%m-%d %H:%M', labelAngle: -30 } };
  return {
    data: { values },
    facet: { field: 'detector', type: 'nominal', title: null },
    columns: 4,
    spec: {
      width: 210,
      height: 130,
      layer: [
        { mark: { type: 'rule', strokeDash: [4, 3], color: '#888' }, encoding: { y: { aggregate: 'mean', field: 'nominal', type: 'quantitative' } } },
        { mark: { type: 'rule' }, encoding: { x, y: { field: 'lo', type: 'quantitative', scale: { zero: false }, title: 'Ω eff (msr)' }, y2: { field: 'hi' } } },
        { mark: { type: 'point', filled: true, size: 24 }, encoding: { x, y: { field: 'v', type: 'quantitative' }, tooltip: [{ field: 'run' }] } },
      ],
    },
    resolve: { scale: { y: 'independent' } },
    config: CHART_CONFIG,
  };
}
