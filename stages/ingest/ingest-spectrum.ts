import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import { parseSpectrumCsv, type SpectrumScratch } from '../../pipeline/core/formats/spectrum-csv.js';

export interface IngestedSpectrum {
  channelCount: number;
  /** Counts per detector, in the order of `detectorIds` asked for. */
  counts: Float64Array[];
}

/**
 * Reads one run's spectrum file and checks its columns against the series' detectors.
 * Any error sets the run aside (a spectrum with an unknown or a missing detector column
 * cannot be trusted to be this series' data).
 */
export function ingestSpectrum(raw: Uint8Array, file: string, run: string, detectorIds: readonly string[], scratch?: SpectrumScratch): { spectrum: IngestedSpectrum | null; diagnostics: Diagnostic[] } {
  const trailing = trailingDelimiter(raw);
  // Spreadsheet exports may end every line with the delimiter; drop it (field columns are unchanged).
  const bytes = trailing === null ? raw : stripTrailingDelimiters(raw, trailing);
  const parsed = parseSpectrumCsv(bytes, file, scratch);
  const diagnostics = parsed.diagnostics.map((d) => ({ ...d, run, stage: 'ingest' as const }));
  if (trailing !== null) diagnostics.push({ severity: 'info', rule: 'spectrum-trailing-delimiter', file, line: 1, run, stage: 'ingest', message: 'lines end with a delimiter; the empty last field is ignored' });
  if (parsed.spectrum === null) {
    const last = bytes[bytes.length - 1];
    const cut = diagnostics.find((d) => d.rule === 'spectrum-ragged-row' || d.rule === 'spectrum-empty-field');
    if (cut !== undefined && last !== 10 && last !== 13 && cut.line !== undefined && cut.line === lastLineNumber(bytes)) {
      diagnostics.push({ severity: 'error', rule: 'spectrum-truncated', file, line: cut.line, run, stage: 'ingest', message: `the file ends inside the row on line ${cut.line}: it looks truncated`, hint: 'was it copied while the acquisition was still writing it? copy it again once the run has ended' });
    }
    return { spectrum: null, diagnostics };
  }
  const s = parsed.spectrum;
  const unknown = s.detectorIds.filter((id) => !detectorIds.includes(id));
  const missing = detectorIds.filter((id) => !s.detectorIds.includes(id));
  if (unknown.length > 0 || missing.length > 0) {
    const parts = [unknown.length ? `unknown detector column(s) ${unknown.join(', ')}` : '', missing.length ? `no column for detector(s) ${missing.join(', ')}` : ''].filter(Boolean);
    const column = unknown.length > 0 ? headerColumn(bytes, unknown[0]!) : undefined;
    diagnostics.push({
      severity: 'error',
      rule: 'spectrum-detector-columns',
      ...(column !== undefined ? { column } : {}),
      message: `spectrum header does not match series.yaml: ${parts.join('; ')}`,
      file,
      line: 1,
      run,
      stage: 'ingest',
      expected: `channel,${detectorIds.join(',')}`,
      actual: `channel,${s.detectorIds.join(',')}`,
    });
    return { spectrum: null, diagnostics };
  }
  return { spectrum: { channelCount: s.channelCount, counts: detectorIds.map((id) => s.counts[s.detectorIds.indexOf(id)]!) }, diagnostics };
}

/** 1-based line number of the file's last line. */
function lastLineNumber(bytes: Uint8Array): number {
  let lines = 1;
  for (let i = 0; i < bytes.length - 1; i++) {
    const c = bytes[i];
    if (c === 10 || (c === 13 && bytes[i + 1] !== 10)) lines++;
  }
  return lines;
}

/** 1-based column of a header field's name in the first line (for diagnostics). */
function headerColumn(bytes: Uint8Array, id: string): number | undefined {
  let end = bytes.indexOf(10);
  if (end < 0) end = bytes.length;
  let text = new TextDecoder().decode(bytes.subarray(0, Math.min(end, 65536)));
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  const escaped = id.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const m = new RegExp(`(^|[,;\\t])([ \\t]*"?)${escaped}"?[ \\t]*(?=[,;\\t\\r]|$)`).exec(text);
  return m === null ? undefined : m.index + m[1]!.length + m[2]!.length + 1;
}

/** The delimiter byte the header line ends with (`,` `;` or tab before its line break), or null. */
function trailingDelimiter(bytes: Uint8Array): number | null {
  let end = 0;
  while (end < bytes.length && bytes[end] !== 10 && bytes[end] !== 13) end++;
  let last = end - 1;
  while (last >= 0 && bytes[last] === 32) last--;
  const c = last >= 0 ? bytes[last]! : -1;
  return c === 44 || c === 59 || c === 9 ? c : null;
}

/** A copy of the bytes without one delimiter (and the spaces after it) right before each line break or the end. */
function stripTrailingDelimiters(bytes: Uint8Array, delim: number): Uint8Array {
  const out = new Uint8Array(bytes.length);
  let o = 0;
  let pending = -1; // output position of a delimiter that may be trailing
  for (let i = 0; i < bytes.length; i++) {
    const c = bytes[i]!;
    if (c === 10 || c === 13) {
      if (pending >= 0) o = pending;
      pending = -1;
      out[o++] = c;
      continue;
    }
    if (c === delim) pending = o;
    else if (c !== 32) pending = -1;
    out[o++] = c;
  }
  if (pending >= 0) o = pending;
  return out.subarray(0, o);
}
