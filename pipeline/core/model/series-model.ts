import type { Diagnostic } from '../diagnostics/diagnostic.js';
import type { SeriesConfig } from '../config/series-schema.js';
import type { EnergyCalibration } from '../calibration/energy-calibration.js';
import type { UserStoppingTables } from '../physics/stopping/user-stopping-table.js';

/** The domain model after ingest: typed, validated, with every problem recorded as data. */

export type RunKind = 'reference' | 'sample' | 'calibration' | 'background';
export const RUN_KINDS: readonly RunKind[] = ['reference', 'sample', 'calibration', 'background'];

export interface RunRecord {
  run: string;
  /** 0-based position in runlog.csv; calibration validity and "order" use this, not string order. */
  index: number;
  /** Line of the row in runlog.csv. */
  line: number;
  startedAt: string;
  /** started_at as milliseconds since the epoch (a time without an offset is read as UTC). */
  startedAtMs: number;
  kind: RunKind;
  target: string;
  beamEnergyKeV: number;
  beamEnergyUncKeV: number;
  chargeUC: number;
  realTimeS: number;
  note: string;
  /** 1-based column of the target cell in runlog.csv (for diagnostics). */
  targetColumn?: number;
}

export type LiveScaler =
  | { mode: 'live-time'; liveTimeS: number; line: number }
  | { mode: 'pulser'; pulserSent: number; pulserCounted: number; line: number };

export interface CalibrationVersion {
  version: string;
  file: string;
  /** Inclusive run-index range (runlog positions); undefined = open. */
  fromIndex?: number;
  toIndex?: number;
  /** Inclusive time range in ms since the epoch; undefined = open. */
  fromMs?: number;
  toMs?: number;
  supersedes: string[];
  detectors: Map<string, EnergyCalibration>;
}

export interface IngestedSeries {
  seriesDir: string;
  config: SeriesConfig;
  /** Every run row that could be read, in runlog order (set-aside ones included). */
  runs: RunRecord[];
  scalers: Map<string, Map<string, LiveScaler>> | null;
  calibrations: CalibrationVersion[];
  /** Run → spectrum file path relative to the series folder. */
  spectrumFiles: Map<string, string>;
  /** Run → the errors that set it aside. */
  setAside: Map<string, Diagnostic[]>;
  diagnostics: Diagnostic[];
  /** User stopping tables (physics.stopping_tables), material → tables; undefined when none. */
  stoppingTables?: UserStoppingTables | undefined;
}

export interface ResolvedNuclide {
  nuclide: string;
  element: string;
  /** Layer index (0 = beam side) the nuclide sits in. */
  layer: number;
  /** Atoms of this nuclide per cm^2. */
  atomsPerCm2: number;
  /** Relative standard uncertainty of atomsPerCm2 (from the layer's areal density). */
  relUnc: number;
}
