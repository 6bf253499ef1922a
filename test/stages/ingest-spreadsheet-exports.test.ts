import { describe, expect, it } from 'vitest';
import { readCsv } from '../../pipeline/core/formats/csv-reader.js';
import { readRunlog } from '../../stages/ingest/read-runlog.js';
import { ingestSpectrum } from '../../stages/ingest/ingest-spectrum.js';

// What spreadsheet programs routinely write when a lab saves "CSV" (common practice): a
// delimiter at the end of every line, and in decimal-comma locales `;` as the delimiter with
// `4,12` as the number. Each is read exactly as the plain form.
const plain = 'run,started_at,kind,target,beam_energy_keV,beam_energy_unc_keV,charge_uC,real_time_s,note\nr001,2026-03-02T08:30:00Z,reference,au,2000,2,4.12,500,\nr002,2026-03-02T08:42:20Z,sample,c,2000.5,2,30.9,1000,thin spot\n';

describe('spreadsheet CSV exports', () => {
  it('a delimiter ending every line is not a column (info csv-trailing-delimiter)', () => {
    const withTrailing = plain.replace(/\n/g, ',\n');
    const a = readCsv(plain, 'runlog.csv');
    const b = readCsv(withTrailing, 'runlog.csv');
    expect(b.table!.header.map((c) => c.text)).toEqual(a.table!.header.map((c) => c.text));
    expect(b.table!.rows.map((r) => r.cells.map((c) => c.text))).toEqual(a.table!.rows.map((r) => r.cells.map((c) => c.text)));
    expect(b.diagnostics.map((d) => [d.severity, d.rule])).toEqual([['info', 'csv-trailing-delimiter']]);
  });
  it('an unnamed last column that holds values is still an error', () => {
    const r = readCsv('a,b,\n1,2,3\n', 'x.csv');
    expect(r.diagnostics.some((d) => d.rule === 'csv-empty-column-name' && d.severity === 'error')).toBe(true);
  });
  it('`;`-delimited runlog with decimal commas reads the same numbers as the `,` form', () => {
    const semicolon = plain.replace(/,/g, ';').replace(/;(\d+)\.(\d+)/g, ';$1,$2');
    expect(semicolon).toContain(';4,12;');
    const a = readRunlog(plain, 'runlog.csv');
    const b = readRunlog(semicolon, 'runlog.csv');
    expect(b.rowErrors.size).toBe(0);
    expect(b.runs.map(({ line: _l, targetColumn: _c, ...r }) => r)).toEqual(a.runs.map(({ line: _l, targetColumn: _c, ...r }) => r));
    expect(b.runs[1]!.beamEnergyKeV).toBe(2000.5);
  });
  it('a decimal comma in a `,`-delimited file is still refused, with the hint', () => {
    const r = readRunlog(plain.replace('30.9', '"30,9"'), 'runlog.csv');
    const d = r.rowErrors.get('r002')![0]!;
    expect(d.rule).toBe('runlog-not-a-number');
    expect(d.hint).toContain('decimal point');
  });
  it('a spectrum whose lines end with the delimiter gives the same counts (info spectrum-trailing-delimiter)', () => {
    const text = 'channel,d01,d02\n0,5,0\n1,17,3\n2,0,250\n';
    const enc = (t: string) => new TextEncoder().encode(t);
    const a = ingestSpectrum(enc(text), 'spectra/r001.csv', 'r001', ['d01', 'd02']);
    const b = ingestSpectrum(enc(text.replace(/\n/g, ',\r\n')), 'spectra/r001.csv', 'r001', ['d01', 'd02']);
    expect(b.spectrum!.counts.map((c) => [...c])).toEqual(a.spectrum!.counts.map((c) => [...c]));
    expect(b.diagnostics.map((d) => d.rule)).toEqual(['spectrum-trailing-delimiter']);
  });
});
