/** The page's CSS: system fonts only, readable on a laptop, printable (sections do not split figures). */
export const PAGE_STYLE = `body{font:14px/1.45 system-ui,sans-serif;margin:2rem auto;max-width:1180px;padding:0 1rem;color:#222}
h1{font-size:1.5rem;margin-bottom:.2rem}h2{font-size:1.15rem;margin-top:2rem;border-bottom:1px solid #ddd}h3{font-size:1rem;margin:1.2rem 0 .3rem}
table{border-collapse:collapse;font-size:12px;margin:.5rem 0}td,th{border:1px solid #ddd;padding:2px 6px;text-align:right;vertical-align:top}
th{background:#f3f3f3}td.t,th.t{text-align:left}.note{color:#555;font-size:12px}pre{white-space:pre-wrap;font-size:12px;background:#f7f7f7;padding:.5rem}
.warn{color:#8a5300}.err{color:#a00}figure{margin:1rem 0}figcaption{font-size:12px;color:#444;margin-bottom:.2rem}svg{max-width:100%;height:auto}
nav.toc{font-size:12px;margin:.5rem 0 1rem}nav.toc a{margin-right:.8rem}
.spectra{display:flex;flex-wrap:wrap;gap:.5rem 1rem}.spectra figure.spectrum{margin:.3rem 0;width:560px;max-width:100%}
form.picker{margin:.5rem 0;font-size:13px}form.picker label{margin-right:1rem}
.badge{display:inline-block;padding:0 .4rem;border-radius:3px;background:#eee;font-size:12px}
@media print{body{margin:0;max-width:none;font-size:11px}nav.toc,form.picker{display:none}h2{break-after:avoid}figure,table{break-inside:avoid}.spectra figure.spectrum[hidden]{display:block}}`;
