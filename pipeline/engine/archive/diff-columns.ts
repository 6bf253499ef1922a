import type { ColumnSpec } from '../../core/tables/arrow-table.js';
import { DIFF_QUANTITIES, type DiffRow } from './diff-cross-sections.js';

/** Columns of diff.arrow: one row per added, removed or changed cross-section row. */
export const DIFF_COLUMNS: ColumnSpec<DiffRow>[] = [
  { name: 'run', type: 'utf8', description: 'run id', value: (r) => r.run },
  { name: 'detector', type: 'utf8', description: 'detector id', value: (r) => r.detector },
  { name: 'peak', type: 'utf8', description: 'peak label', value: (r) => r.peak },
  { name: 'change', type: 'utf8', description: 'added (only in the new version), removed (only in the old), moved (a number differs), relabelled (only flags or calibration version differ)', value: (r) => r.change },
  { name: 'changed_columns', type: 'utf8', description: 'columns of cross_sections.arrow whose value differs, joined by ";"', value: (r) => r.changedColumns.join(';') },
  ...DIFF_QUANTITIES.flatMap((q): ColumnSpec<DiffRow>[] => [
    { name: `${q.id}_from${q.suffix}`, type: 'float64', unit: q.unit, description: `${q.value} in the old version`, value: (r) => r.quantities[q.id].from },
    { name: `${q.id}_to${q.suffix}`, type: 'float64', unit: q.unit, description: `${q.value} in the new version`, value: (r) => r.quantities[q.id].to },
    { name: `${q.id}_unc_from${q.suffix}`, type: 'float64', unit: q.unit, description: `total standard uncertainty (stat ⊕ sys) of ${q.value}, old version`, value: (r) => r.quantities[q.id].uncFrom },
    { name: `${q.id}_unc_to${q.suffix}`, type: 'float64', unit: q.unit, description: `total standard uncertainty (stat ⊕ sys) of ${q.value}, new version`, value: (r) => r.quantities[q.id].uncTo },
    { name: `${q.id}_shift_sigma`, type: 'float64', unit: '1', description: `(new − old) / √(u_old² + u_new²) for ${q.value}`, value: (r) => r.quantities[q.id].shiftSigma },
  ]),
  { name: 'max_abs_shift_sigma', type: 'float64', unit: '1', description: 'largest |shift| of the three quantities, in combined standard uncertainties', value: (r) => r.maxAbsShiftSigma },
  { name: 'calibration_version_from', type: 'utf8', description: 'calibration version, old version', value: (r) => r.calibrationFrom },
  { name: 'calibration_version_to', type: 'utf8', description: 'calibration version, new version', value: (r) => r.calibrationTo },
  { name: 'flags_from', type: 'utf8', description: 'flags, old version', value: (r) => r.flagsFrom },
  { name: 'flags_to', type: 'utf8', description: 'flags, new version', value: (r) => r.flagsTo },
];
