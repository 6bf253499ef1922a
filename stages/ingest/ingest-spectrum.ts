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
export function ingestSpectrum(bytes: Uint8Array, file: string, run: string, detectorIds: readonly string[], scratch?: SpectrumScratch): { spectrum: IngestedSpectrum | null; diagnostics: Diagnostic[] } {
  const parsed = parseSpectrumCsv(bytes, file, scratch);
  const diagnostics = parsed.diagnostics.map((d) => ({ ...d, run, stage: 'ingest' as const }));
  if (parsed.spectrum === null) return { spectrum: null, diagnostics };
  const s = parsed.spectrum;
  const unknown = s.detectorIds.filter((id) => !detectorIds.includes(id));
  const missing = detectorIds.filter((id) => !s.detectorIds.includes(id));
  if (unknown.length > 0 || missing.length > 0) {
    const parts = [unknown.length ? `unknown detector column(s) ${unknown.join(', ')}` : '', missing.length ? `no column for detector(s) ${missing.join(', ')}` : ''].filter(Boolean);
    const column = unknown.length > 0 ? s.detectorColumns[s.detectorIds.indexOf(unknown[0]!)] : undefined;
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
