import { escapeHtml as h } from '../../../pipeline/core/text/escape-html.js';
import { htmlTable } from '../html/html-table.js';
import type { ReportChanges } from './report-changes.js';

const QUANTITY_LABEL: Record<string, string> = { cross_section_lab: 'dσ/dΩ lab', cross_section_cm: 'dσ/dΩ CM', ratio_to_rutherford: 'σ/σ_R' };
const label = (q: string | null) => (q === null ? '—' : (QUANTITY_LABEL[q] ?? q));
const num = (v: number | null) => (v === null || !Number.isFinite(v) ? '—' : Number(v.toPrecision(5)).toString());
const sigma = (v: number | null) => (v === null || !Number.isFinite(v) ? '—' : `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(2)}σ`);

/**
 * The "Changes since previous version" section: `undefined` — a plain reduction, not an archive
 * version; `null` — the first version of the series; else the counts, rows beyond 1σ and 3σ and
 * the largest shifts (diff of cross_sections.arrow, README "Operating guide"). Every string escaped.
 */
export function changesSection(c: ReportChanges | null | undefined): string {
  const head = '<section id="changes"><h2>Changes since previous version</h2>';
  if (c === undefined) return `${head}<p class="note" id="changes-none">Not an archive version (written by <code>xsred reduce</code>): there is no previous version to compare with. Versions written by <code>xsred nightly</code> and <code>xsred rereduce</code> show here what changed.</p></section>`;
  if (c === null) return `${head}<p class="note" id="changes-none">The first version of this series: no previous version to compare with.</p></section>`;
  const counts = htmlTable(
    ['from', 'to', 'rows before', 'rows now', 'matched', 'moved', 'relabelled', 'added', 'removed', 'moved beyond 1σ', 'beyond 3σ'],
    [[h(c.from ?? '—'), h(c.to ?? '—'), ...[c.rowsFrom, c.rowsTo, c.matched, c.moved, c.relabelled, c.added, c.removed, c.beyond1Sigma, c.beyond3Sigma].map((n) => h(String(n)))]],
    2,
  );
  const big = c.largest
    ? `<p id="changes-largest">Largest shift: run ${h(c.largest.run)}, detector ${h(c.largest.detector)}, peak ${h(c.largest.peak)}, ${h(label(c.largest.quantity))} moved ${h(sigma(c.largest.shiftSigma))}.</p>`
    : '<p id="changes-largest">No row moved.</p>';
  const listed = c.top;
  const top = listed.length
    ? htmlTable(
        ['run', 'detector', 'peak', 'change', 'quantity', 'before', 'now', 'shift'],
        listed.map((t) => [h(t.run), h(t.detector), h(t.peak), h(t.change), h(label(t.quantity)), h(num(t.from)), h(num(t.to)), h(sigma(t.shiftSigma))]),
        5,
      )
    : '';
  return `${head}
<p class="note">Compared with the previous version row by row (run, detector, peak). A shift is (new − old)/√(u_old² + u_new²), u the total standard uncertainty (stat ⊕ sys) of each version: the two versions are treated as independent, so the scale is conservative. <code>xsred diff</code> lists every row; changes.json beside this page holds this summary.</p>
${counts}
${big}
${top ? `<details open><summary>Largest shifts (${listed.length})</summary>${top}</details>` : ''}
</section>`;
}
