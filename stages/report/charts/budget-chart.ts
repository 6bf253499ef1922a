import { CHART_CONFIG } from './chart-config.js';

export interface BudgetBar {
  peak: string;
  detector: string;
  component: string;
  /** Median relative standard uncertainty over the rows, in percent. */
  percent: number;
}

/** vega-lite specification of the uncertainty budget: median relative uncertainty by component, per detector, one panel per peak. */
export function budgetChartSpec(bars: readonly BudgetBar[]): object | null {
  const values = bars.filter((b) => Number.isFinite(b.percent));
  if (values.length === 0) return null;
  return {
    data: { values },
    facet: { field: 'peak', type: 'nominal', title: null },
    columns: 2,
    spec: {
      width: 330,
      height: 140,
      mark: { type: 'bar' },
      encoding: {
        x: { field: 'detector', type: 'nominal', title: 'detector' },
        xOffset: { field: 'component', type: 'nominal' },
        y: { field: 'percent', type: 'quantitative', title: 'median rel. uncertainty (%)' },
        color: { field: 'component', type: 'nominal', title: 'component' },
      },
    },
    config: CHART_CONFIG,
  };
}
