import { escapeHtml as h } from '../../../pipeline/core/text/escape-html.js';
import type { SummaryInput } from '../summary-input.js';
import { PICKER_SCRIPT } from './picker-script.js';

/** Anchor id of a spectrum figure (run and detector ids are restricted to [A-Za-z0-9_.-]). */
export const spectrumAnchor = (run: string, detector: string) => `spectrum-${run}-${detector}`;

const MAX_LISTED = 40;

/**
 * Spectra behind the points: small multiples of the embedded run × detector spectra (log
 * counts, peak and background windows shaded), a run/detector picker that only the inline
 * script reveals, and an honest note of the spectra the cap left out.
 */
export function spectraSection(x: SummaryInput): string {
  const candidates = x.qc.filter((q) => q.status === 'reduced');
  const embedded = new Set(x.charts.spectra.map((s) => `${s.run}\u0000${s.detector}`));
  const leftOut = candidates.filter((q) => !embedded.has(`${q.run}\u0000${q.detector}`));
  const runsLeftOut = [...new Set(leftOut.map((q) => q.run))];
  const cap = x.settings.max_spectra;
  const note = leftOut.length
    ? `<p class="note" id="spectra-left-out">Embedded: ${embedded.size} of ${candidates.length} run × detector spectra (report.max_spectra = ${cap}, spread evenly over the series).
Not embedded: ${leftOut.length} spectra of ${runsLeftOut.length} runs${runsLeftOut.length <= MAX_LISTED ? ` (${h(runsLeftOut.join(', '))})` : ` (from ${h(runsLeftOut[0]!)} to ${h(runsLeftOut[runsLeftOut.length - 1]!)})`}. Raise report.max_spectra to embed more; every window sum is in yields.arrow.</p>`
    : `<p class="note">All ${embedded.size} run × detector spectra of the reduced runs are embedded.</p>`;
  if (x.charts.spectra.length === 0) return `<section id="spectra"><h2>Spectra</h2>${note}<p>No spectrum embedded.</p></section>`;
  const runs = [...new Set(x.charts.spectra.map((s) => s.run))];
  const dets = [...new Set(x.charts.spectra.map((s) => s.detector))];
  const option = (v: string) => `<option value="${h(v)}">${h(v)}</option>`;
  const kindOf = new Map(x.runs.map((r) => [r.run, r]));
  const angle = new Map(x.config.detectors.map((d) => [d.id, d.angle_deg]));
  const figures = x.charts.spectra
    .map((s) => {
      const r = kindOf.get(s.run);
      const what = r ? `${r.kind}, ${r.target}, ${r.beamEnergyKeV} keV` : '';
      return `<figure class="spectrum" id="${h(spectrumAnchor(s.run, s.detector))}" data-run="${h(s.run)}" data-detector="${h(s.detector)}"><figcaption>run <b>${h(s.run)}</b>${what ? ` (${h(what)})` : ''}, detector <b>${h(s.detector)}</b> at ${h(String(angle.get(s.detector) ?? ''))}°</figcaption>${s.svg}</figure>`;
    })
    .join('\n');
  return `<section id="spectra"><h2>Spectra</h2>
<p class="note">Counts per bin on a logarithmic axis (empty bins drawn at 0.5); peak windows shaded orange, background windows green; fitted curves, where a peak is fitted, in magenta.</p>
${note}
<form class="picker" id="spectrum-picker" hidden><label>run <select id="pick-run"><option value="*">all</option>${runs.map(option).join('')}</select></label>
<label>detector <select id="pick-detector"><option value="*">all</option>${dets.map(option).join('')}</select></label></form>
<p id="spectrum-none" class="note" hidden>No embedded spectrum for this run and detector.</p>
<div class="spectra" id="spectra-figures">
${figures}
</div>
<script>${PICKER_SCRIPT}</script>
</section>`;
}
