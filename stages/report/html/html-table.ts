import { escapeHtml as h } from '../../../pipeline/core/text/escape-html.js';

/**
 * An HTML table. Headers are plain text (escaped here); body cells are HTML the caller has
 * already escaped. The first `textCols` columns are left-aligned (identifiers), the rest right.
 */
export function htmlTable(headers: readonly string[], body: readonly (readonly string[])[], textCols: number): string {
  const th = headers.map((x, i) => `<th${i < textCols ? ' class="t"' : ''}>${h(x)}</th>`).join('');
  const tr = body.map((r) => `<tr>${r.map((c, i) => `<td${i < textCols ? ' class="t"' : ''}>${c}</td>`).join('')}</tr>`).join('\n');
  return `<table><thead><tr>${th}</tr></thead><tbody>\n${tr}\n</tbody></table>`;
}

/** A figure holding one inline SVG chart, tagged so checks can find it (`data-chart`). */
export function chartFigure(chartId: string, caption: string, svg: string): string {
  return `<figure class="chart" data-chart="${h(chartId)}"><figcaption>${h(caption)}</figcaption>${svg}</figure>`;
}
