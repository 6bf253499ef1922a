import { escapeHtml as h } from '../../pipeline/core/text/escape-html.js';
import type { RenderedChart, SummaryInput } from './summary-input.js';
import { DENSE_PANEL_POINTS } from './charts/chart-config.js';
import { chartFigure } from './html/html-table.js';
import { budgetTable, crossSectionTable, diagnosticsSection, normalizationTable, provenanceSection } from './html/data-sections.js';
import { overviewSection } from './html/overview-section.js';
import { PAGE_STYLE } from './html/page-style.js';
import { PICKER_SCRIPT_HASH } from './html/picker-script.js';
import { spectraSection } from './html/spectra-section.js';
import { calibrationDriftSection } from './html/calibration-drift-section.js';
import { changesSection } from './changes/changes-section.js';

const fig = (c: RenderedChart | null, none: string) => (c ? chartFigure(c.id, c.caption, c.svg) : `<p>${h(none)}</p>`);

/**
 * The self-contained HTML summary of one reduction: inline CSS and SVG, one inline script (the
 * spectrum picker, allowed by its hash in the page's Content-Security-Policy; nothing else can
 * run, and nothing is fetched). Every user-supplied string is escaped where it is written.
 */
export function summaryHtml(x: SummaryInput): string {
  const c = x.config;
  const ch = x.charts;
  const csp = `default-src 'none'; style-src 'unsafe-inline'; img-src data:; script-src ${PICKER_SCRIPT_HASH}; base-uri 'none'; form-action 'none'`;
  const angular = ch.angular.chart
    ? `${ch.angular.shown < ch.angular.total ? `<p class="note">${ch.angular.shown} of ${ch.angular.total} beam energies with two or more angles (report.max_angular_energies, spread evenly).</p>` : ''}${fig(ch.angular.chart, '')}`
    : '<p>No beam energy has cross sections at two or more angles.</p>';
  const toc = [
    ['overview', 'Overview'], ['changes', 'Changes'], ['excitation', 'Excitation functions'], ['angular', 'Angular distributions'], ['spectra', 'Spectra'],
    ['normalization', 'Normalization'], ['runs-qc', 'Dead time, drift and calibrations'], ['budget', 'Uncertainty budget'], ['cross-sections', 'Cross sections'],
    ['diagnostics', 'Diagnostics'], ['provenance', 'Provenance'], ['numbers', 'How numbers are shown'],
  ].map(([id, t]) => `<a href="#${id}">${t}</a>`).join('');
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="${h(csp)}">
<title>${h(c.series)} — xsred summary</title><style>${PAGE_STYLE}</style></head>
<body>
<header><h1>${h(c.series)}</h1>
<p id="series-title">${h(c.title)}</p></header>
<nav class="toc">${toc}</nav>
${overviewSection(x)}
${changesSection(x.changes)}
<section id="excitation"><h2>Excitation functions</h2>
<p class="note">Per peak, one panel per detector. Dark bars: statistical standard uncertainty; light bars: statistical and systematic combined in quadrature. A panel with more than ${DENSE_PANEL_POINTS} rows (more points than it is wide in pixels) is drawn as a line through every value with dark (statistical) and light (total) bands instead; its caption says so.</p>
${ch.excitation.length ? ch.excitation.map((e) => chartFigure(e.id, e.caption, e.svg)).join('\n') : '<p>No rows to plot.</p>'}
</section>
<section id="angular"><h2>Angular distributions</h2>
<p class="note">dσ/dΩ in the centre-of-mass frame against the CM angle, one panel per beam energy, one colour per peak; bars as above.</p>
${angular}
</section>
${spectraSection(x)}
<section id="normalization"><h2>Normalization</h2>
<p class="note">Effective solid angle implied by each reference run, per detector, over time; bars: the part independent between reference runs (counting, live time, beam energy); dashed: nominal solid angle.</p>
${fig(ch.normalization, 'No reference run gave an effective solid angle.')}
${normalizationTable(x)}
</section>
${calibrationDriftSection(x)}
<section id="budget"><h2>Uncertainty budget</h2>
<p class="note">Median over rows of each component's relative standard uncertainty of dσ/dΩ (lab; the same fractions hold in the CM frame). Components add in quadrature.</p>
${fig(ch.budget, 'No rows with uncertainties.')}
${budgetTable(x)}
</section>
${crossSectionTable(x)}
${diagnosticsSection(x)}
${provenanceSection(x)}
<section id="numbers"><h2>How numbers are shown</h2>
<p class="note">A value with an uncertainty is rounded by the rule of the Particle Data Group (R.L. Workman et al., Prog. Theor. Exp. Phys. 2022, 083C01, Introduction §5.3): the three highest digits of the uncertainty decide — 100 to 354: two significant digits; 355 to 949: one; 950 to 999: rounded up to 1000 with two — and the value is given to the same decimal place (1234.5 ± 23.1 is shown as 1235 ± 23). With a statistical and a systematic uncertainty the rule is applied to the smaller of the two, and all three numbers are given to that place. Energies and angles are given to the place their own uncertainty (beam energy, detector angle) sets. Relative uncertainties in percent have two significant digits. Arrow tables and exports keep full precision.</p>
<p class="note">These results need expert review before use; local practice and codes rule.</p>
</section>
</body></html>
`;
}
