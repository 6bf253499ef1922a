import type { DefectKind } from './simulation-spec.js';

export type SpectrumDefectKind = Extract<DefectKind, 'truncated-spectrum' | 'negative-count' | 'non-integer-count' | 'ragged-row' | 'unknown-detector-column'>;

export const SPECTRUM_DEFECTS: readonly SpectrumDefectKind[] = ['truncated-spectrum', 'negative-count', 'non-integer-count', 'ragged-row', 'unknown-detector-column'];

/**
 * Damages a well-formed spectrum file the way real files go wrong, for tests of ingest:
 *
 * - truncated-spectrum: the file ends part-way through the row of channel ⌊0.6 N⌋ (no final newline);
 * - negative-count: channel ⌊N/2⌋ of the column reads −max(1, count);
 * - non-integer-count: channel ⌊N/2⌋ of the column reads count + 0.5 (`17.5`);
 * - ragged-row: the row of channel ⌊N/3⌋ lacks the column's field;
 * - unknown-detector-column: an extra column (`aux1`, or the first free `auxK`) copies the column.
 * @param text the spectrum file as encodeSpectrumCsv writes it
 * @param field 1-based field index of the damaged detector column (0 is `channel`)
 */
export function damageSpectrumCsv(text: string, kind: SpectrumDefectKind, field: number): string {
  const lines = text.split('\n');
  if (lines[lines.length - 1] === '') lines.pop();
  const n = lines.length - 1;
  const header = lines[0]!.split(',');
  if (!(field >= 1 && field < header.length)) throw new RangeError(`field ${field} is not a detector column of ${header.join(',')}`);
  const editCell = (channel: number, edit: (count: number) => string) => {
    const cells = lines[1 + channel]!.split(',');
    cells[field] = edit(Number(cells[field]));
    lines[1 + channel] = cells.join(',');
  };
  switch (kind) {
    case 'truncated-spectrum': {
      const keep = Math.floor(0.6 * n);
      const partial = lines[1 + keep]!;
      return `${lines.slice(0, 1 + keep).join('\n')}\n${partial.slice(0, Math.max(1, Math.floor(partial.length / 2)))}`;
    }
    case 'negative-count':
      editCell(Math.floor(n / 2), (v) => `-${Math.max(1, v)}`);
      break;
    case 'non-integer-count':
      editCell(Math.floor(n / 2), (v) => `${v}.5`);
      break;
    case 'ragged-row': {
      const row = 1 + Math.floor(n / 3);
      const cells = lines[row]!.split(',');
      cells.splice(field, 1);
      lines[row] = cells.join(',');
      break;
    }
    case 'unknown-detector-column': {
      let k = 1;
      while (header.includes(`aux${k}`)) k++;
      lines[0] = `${lines[0]},aux${k}`;
      for (let i = 1; i < lines.length; i++) lines[i] = `${lines[i]},${lines[i]!.split(',')[field]}`;
      break;
    }
  }
  return `${lines.join('\n')}\n`;
}
