import { describe, expect, it } from 'vitest';
import { DENSE_PANEL_POINTS } from '../../../stages/report/charts/chart-config.js';
import { densePanelsSvg, type BandPoint } from '../../../stages/report/charts/dense-panels-svg.js';
import { isDense, maxPanelPoints } from '../../../stages/report/charts/excitation-chart.js';
import { niceTicks, tickLabel } from '../../../stages/report/charts/nice-ticks.js';

// Dense excitation panels are drawn without vega: these checks pin the drawing to its definition
// (linear scales, 1-2-5 tick steps: common practice for chart axes) rather than to a picture.

const band = (detector: string, n: number, e0: number, de: number): BandPoint[] =>
  Array.from({ length: n }, (_, i) => {
    const v = 10 + Math.sin(i / 17);
    return { detector, e: e0 + de * (n - 1 - i), v, slo: v - 0.1, shi: v + 0.1, tlo: v - 0.3, thi: v + 0.3 };
  });

describe('round axis ticks (1, 2 or 5 × 10^k: common practice)', () => {
  it('covers 1500…3495 keV with steps of 500 and widens the domain to whole steps', () => {
    expect(niceTicks(1500, 3495, 4)).toEqual({ lo: 1500, hi: 3500, ticks: [1500, 2000, 2500, 3000, 3500] });
  });
  it('small and negative ranges: steps of 0.2 and 0.05, labels without float noise', () => {
    const t = niceTicks(-0.9, 0.1, 5);
    expect(t.ticks).toEqual([-1, -0.8, -0.6, -0.4, -0.2, 0, 0.2]);
    expect(niceTicks(0.98, 1.22, 5).ticks).toEqual([0.95, 1, 1.05, 1.1, 1.15, 1.2, 1.25]);
    expect(tickLabel(0.1 + 0.2, 0.1)).toBe('0.3');
    expect(tickLabel(2500, 500)).toBe('2500');
  });
  it('an empty or one-value range still gives an axis', () => {
    expect(niceTicks(5, 5, 5).lo).toBeLessThan(5);
    expect(niceTicks(5, 5, 5).hi).toBeGreaterThan(5);
    expect(niceTicks(Infinity, -Infinity).ticks).toEqual([0, 1]);
  });
});

describe('dense excitation panels drawn as SVG paths', () => {
  const points = [...band('d02 (150°)', 300, 1500, 5), ...band('d01 (<b>170°</b>)', 250, 1500, 6)];

  it('a panel is dense above DENSE_PANEL_POINTS points (more points than its 210 px)', () => {
    expect(DENSE_PANEL_POINTS).toBe(200);
    expect(maxPanelPoints(points)).toBe(300);
    expect(isDense(points)).toBe(true);
    expect(isDense(band('d01', DENSE_PANEL_POINTS, 1500, 5))).toBe(false);
  });

  it('one panel per detector (sorted), every value a vertex of the line, bands of 2n vertices, names escaped', () => {
    const svg = densePanelsSvg(points, 'beam energy (keV)', 'σ/σ_R');
    const panels = [...svg.matchAll(/<g class="panel"[^>]*><text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]);
    expect(panels).toEqual(['d01 (&lt;b&gt;170°&lt;/b&gt;)', 'd02 (150°)']);
    expect(svg).not.toContain('<b>');
    const lines = [...svg.matchAll(/<g class="mark-line role-mark"><path d="([^"]*)"/g)].map((m) => m[1]!.split('L').length);
    expect(lines).toEqual([250, 300]);
    const bands = [...svg.matchAll(/<g class="mark-area role-mark"><path d="([^"]*)"/g)].map((m) => m[1]!.split('L').length);
    expect(bands).toEqual([500, 600]);
  });

  it('x runs left to right over the rounded energy range: the lowest energy at 0 px, the highest at 210 px', () => {
    const one = band('d01', 300, 1500, 5); // 1500 … 2995 keV → axis 1500 … 3000
    const svg = densePanelsSvg(one, 'beam energy (keV)', 'σ/σ_R');
    const d = /<g class="mark-line role-mark"><path d="M([^"]*)"/.exec(svg)![1]!.split('L').map((p) => p.split(',').map(Number));
    expect(d[0]![0]).toBe(0);
    expect(d.at(-1)![0]).toBeCloseTo((210 * (2995 - 1500)) / (3000 - 1500), 1);
    for (let i = 1; i < d.length; i++) expect(d[i]![0]).toBeGreaterThanOrEqual(d[i - 1]![0]!);
    expect(svg).toContain('>3000</text>');
    expect(svg).toMatch(/^<svg [^>]*width="284" height="194"/);
  });
});
