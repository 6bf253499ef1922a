import { escapeHtml as h } from '../../pipeline/core/text/escape-html.js';
import { PAGE_STYLE } from './html/page-style.js';

/** One series of an archive index: its status and the (relative, URL-encoded) link to its summary. */
export interface ArchiveEntry {
  series: string;
  status: string;
  /** Link relative to the index page, already percent-encoded per path segment; null: no summary. */
  href: string | null;
  version?: string;
}

const statusClass = (s: string) => (/^(ok|reduced|current)$/i.test(s) ? 'ok' : /fail|error/i.test(s) ? 'err' : /aside|warn|stale/i.test(s) ? 'warn' : '');

/**
 * The archive index page: every series with its status, version and a link to its summary.
 * Self-contained like the summaries (no script at all: its CSP allows none), every string escaped.
 */
export function archiveIndexHtml(entries: readonly ArchiveEntry[]): string {
  const sorted = [...entries].sort((a, b) => (a.series < b.series ? -1 : a.series > b.series ? 1 : 0));
  const rows = sorted
    .map(
      (e) =>
        `<tr><td class="t">${e.href === null ? h(e.series) : `<a href="${h(e.href)}">${h(e.series)}</a>`}</td><td class="t"><span class="${statusClass(e.status)}">${h(e.status)}</span></td><td class="t">${h(e.version ?? '')}</td></tr>`,
    )
    .join('\n');
  const csp = "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; form-action 'none'";
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="${h(csp)}">
<title>xsred archive</title><style>${PAGE_STYLE}.ok{color:#176b2c}</style></head>
<body><h1>xsred archive</h1>
<p class="note">${sorted.length} series. Each link opens the summary of the series' current version.</p>
<table><thead><tr><th class="t">series</th><th class="t">status</th><th class="t">version</th></tr></thead><tbody>
${rows}
</tbody></table>
</body></html>
`;
}
