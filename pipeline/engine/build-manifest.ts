import { createHash } from 'node:crypto';
import type { SeriesConfig } from '../core/config/series-schema.js';
import { CODATA2018 } from '../core/physics/codata2018.js';
import { ABUNDANCE_EDITION, MASS_TABLE_EDITION } from '../core/physics/nuclides.js';
import { canonicalJson } from './canonical-json.js';
import { SOFTWARE } from './software.js';

export interface ManifestInput {
  config: SeriesConfig;
  seriesDir: string;
  commandLine: string[];
  startedAt: Date;
  /** sha256 of the metadata files, by path relative to the series folder. */
  metadataHashes: ReadonlyMap<string, string>;
  spectrumHashes: readonly (readonly [string, string])[];
  calibrationVersions: string[];
  counts: Record<string, number>;
  exitCode: number;
}

/**
 * manifest.json: what reproduces a reduction — software version, the sha256 of every input
 * file and of all of them together (a `sha256sum`-style listing hashed), the sha256 of the
 * parsed configuration (canonical JSON), calibration versions, editions of constants and
 * tables, command line and times.
 */
export function buildManifest(x: ManifestInput) {
  const inputFiles = Object.fromEntries([...x.metadataHashes, ...x.spectrumHashes].sort(([a], [b]) => a.localeCompare(b)));
  const listing = Object.entries(inputFiles).map(([f, h]) => `${h}  ${f}\n`).join('');
  return {
    software: SOFTWARE,
    series: x.config.series,
    series_dir: x.seriesDir,
    command_line: x.commandLine,
    started_at: x.startedAt.toISOString(),
    finished_at: new Date().toISOString(),
    node: process.version,
    config_sha256: createHash('sha256').update(canonicalJson(x.config)).digest('hex'),
    inputs_sha256: createHash('sha256').update(listing).digest('hex'),
    input_files: inputFiles,
    calibration_versions: x.calibrationVersions,
    editions: { constants: CODATA2018.edition, masses: MASS_TABLE_EDITION, abundances: ABUNDANCE_EDITION, screening: x.config.normalization.screening },
    counts: x.counts,
    exit_code: x.exitCode,
  };
}
