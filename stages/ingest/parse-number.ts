import type { Diagnostic } from '../../pipeline/core/diagnostics/diagnostic.js';
import type { CsvCell } from '../../pipeline/core/formats/csv-reader.js';

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export interface NumberRule {
  column: string;
  min?: number;
  /** Strictly greater than. */
  gt?: number;
  integer?: boolean;
  unit?: string;
  /** Accept a decimal comma (`4,12`): files whose delimiter is `;` or a tab, as locales with a decimal comma write them. */
  decimalComma?: boolean;
}

/** Reads a CSV cell as a number, or explains why it is not one (quoting it). */
export function parseNumberCell(cell: CsvCell, rule: NumberRule, file: string, run: string | undefined): { value: number } | { error: Diagnostic } {
  const text = rule.decimalComma && /^[+-]?\d+,\d+([eE][+-]?\d+)?$/.test(cell.text) ? cell.text.replace(',', '.') : cell.text;
  const where = { file, line: cell.line, column: cell.column, run, stage: 'ingest' as const };
  const unit = rule.unit ? ` ${rule.unit}` : '';
  const range = rule.gt !== undefined ? `a number > ${rule.gt}${unit}` : rule.min !== undefined ? `a number ≥ ${rule.min}${unit}` : `a number${unit}`;
  if (!NUMBER.test(text)) {
    const hint = /^\d+,\d+$/.test(text)
      ? 'use a decimal point, not a comma (and quote fields that hold commas)'
      : text === ''
        ? `fill in ${rule.column}`
        : undefined;
    return {
      error: { severity: 'error', rule: 'runlog-not-a-number', message: `${rule.column} is not a number: "${text}"`, expected: range, actual: JSON.stringify(text), ...(hint ? { hint } : {}), ...where },
    };
  }
  const value = Number(text);
  const bad =
    (rule.gt !== undefined && !(value > rule.gt)) || (rule.min !== undefined && !(value >= rule.min)) || (rule.integer === true && !Number.isInteger(value));
  if (bad) {
    return {
      error: { severity: 'error', rule: 'runlog-out-of-range', message: `${rule.column} = ${text} is out of range`, expected: rule.integer ? `an integer, ${range}` : range, actual: text, ...where },
    };
  }
  return { value };
}
