import { describe, expect, it } from 'vitest';
import { columnIndex, readCsv, requireColumns } from '../../../pipeline/core/formats/csv-reader.js';

const texts = (t: { rows: { cells: { text: string }[] }[] }) => t.rows.map((r) => r.cells.map((c) => c.text));

function mustRead(text: string) {
  const { table, diagnostics } = readCsv(text, 'runlog.csv');
  if (table === null) throw new Error(`no table: ${diagnostics.map((d) => d.message).join('; ')}`);
  return { table, diagnostics };
}

// RFC 4180 (Shafranovich 2005), section 2, "Definition of the CSV Format": the examples of rules 1-7.
// Our reader treats the first record as the header, so each example's first line is the header.
describe('RFC 4180 §2 examples', () => {
  it('rule 1: records on separate lines delimited by CRLF (aaa,bbb,ccc CRLF zzz,yyy,xxx CRLF)', () => {
    const { table, diagnostics } = mustRead('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n');
    expect(diagnostics).toEqual([]);
    expect(table.header.map((c) => c.text)).toEqual(['aaa', 'bbb', 'ccc']);
    expect(texts(table)).toEqual([['zzz', 'yyy', 'xxx']]);
    expect(table.rows[0].line).toBe(2);
  });

  it('rule 2: the last record may lack a line break (aaa,bbb,ccc CRLF zzz,yyy,xxx)', () => {
    const { table, diagnostics } = mustRead('aaa,bbb,ccc\r\nzzz,yyy,xxx');
    expect(diagnostics).toEqual([]);
    expect(texts(table)).toEqual([['zzz', 'yyy', 'xxx']]);
  });

  it('rule 3: the header example field_name,field_name,field_name is refused here as duplicate names (stricter than the RFC)', () => {
    const { table, diagnostics } = mustRead('field_name,field_name,field_name\r\naaa,bbb,ccc\r\nzzz,yyy,xxx\r\n');
    expect(texts(table)).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
    expect(diagnostics.map((d) => [d.rule, d.line, d.column])).toEqual([
      ['csv-duplicate-column', 1, 12],
      ['csv-duplicate-column', 1, 23],
    ]);
    expect(diagnostics[0].message).toContain('"field_name"');
  });

  it('rule 4: fields separated by commas; spaces inside quotes are kept (unquoted padding is trimmed: lab practice, not RFC)', () => {
    const { table } = mustRead('a,b,c\r\n" aaa ", bbb ,ccc\r\n');
    expect(texts(table)).toEqual([[' aaa ', 'bbb', 'ccc']]);
    expect(table.rows[0].cells.map((c) => c.column)).toEqual([1, 10, 15]);
  });

  it('rule 5: fields may be enclosed in double quotes ("aaa","bbb","ccc" CRLF zzz,yyy,xxx)', () => {
    const { table, diagnostics } = mustRead('"aaa","bbb","ccc"\r\nzzz,yyy,xxx');
    expect(diagnostics).toEqual([]);
    expect(table.header.map((c) => c.text)).toEqual(['aaa', 'bbb', 'ccc']);
    expect(table.header.map((c) => c.column)).toEqual([1, 7, 13]);
  });

  it('rule 6: a line break inside quotes belongs to the field ("aaa","b CRLF bb","ccc" CRLF zzz,yyy,xxx)', () => {
    const { table, diagnostics } = mustRead('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx');
    expect(diagnostics).toEqual([]);
    expect(table.header.map((c) => c.text)).toEqual(['aaa', 'b\r\nbb', 'ccc']);
    // "ccc" opens on line 2 after `bb",`: column 5.
    expect([table.header[2].line, table.header[2].column]).toEqual([2, 5]);
    expect(table.rows[0].line).toBe(3);
  });

  it('rule 7: a quote inside a quoted field is doubled ("aaa","b""bb","ccc")', () => {
    const { table } = mustRead('"aaa","b""bb","ccc"\r\n1,2,3');
    expect(table.header.map((c) => c.text)).toEqual(['aaa', 'b"bb', 'ccc']);
    expect(texts(table)).toEqual([['1', '2', '3']]);
  });

  it('rule 5: a quote inside an unquoted field is refused with its position', () => {
    const { diagnostics } = mustRead('a,b\n1,12" wafer\n');
    expect(diagnostics.map((d) => [d.rule, d.line, d.column])).toEqual([['csv-bare-quote', 2, 5]]);
  });
});

describe('what lab computers write (common practice)', () => {
  const expected = [
    ['r001', '12.5'],
    ['r002', '13.0'],
  ];

  it('reads a UTF-8 BOM, LF, CRLF and lone-CR line ends alike', () => {
    for (const eol of ['\n', '\r\n', '\r']) {
      const { table, diagnostics } = mustRead(`\uFEFFrun,charge_uC${eol}r001,12.5${eol}r002,13.0${eol}`);
      expect(diagnostics).toEqual([]);
      expect(table.header[0]).toEqual({ text: 'run', line: 1, column: 1 });
      expect(texts(table)).toEqual(expected);
      expect(table.rows.map((r) => r.line)).toEqual([2, 3]);
    }
  });

  it('skips blank lines (also with only spaces), trailing blank lines and # comments before the header', () => {
    const { table, diagnostics } = mustRead('# exported by DAQ\n\n  \nrun,charge_uC\nr001,12.5\n\n  \t\nr002,13.0\n\n\n');
    expect(diagnostics).toEqual([]);
    expect(table.header[0].line).toBe(4);
    expect(texts(table)).toEqual(expected);
    expect(table.rows.map((r) => r.line)).toEqual([5, 8]);
  });

  it('keeps a # line after the header as data', () => {
    const { table } = mustRead('run,note\n#r1,x\n');
    expect(texts(table)).toEqual([['#r1', 'x']]);
  });

  it('detects ; and tab delimiters from the header line, and trims spaces around fields', () => {
    const semicolon = mustRead('run ; charge_uC\r\nr001 ; 12,5\r\n').table;
    expect(semicolon.delimiter).toBe(';');
    expect(texts(semicolon)).toEqual([['r001', '12,5']]);
    const tab = mustRead('run\tcharge_uC\nr001\t 12.5 \n').table;
    expect(tab.delimiter).toBe('\t');
    expect(texts(tab)).toEqual([['r001', '12.5']]);
    expect(tab.rows[0].cells[1].column).toBe(7);
  });

  it('unquotes quoted header names', () => {
    const { table } = mustRead('"run","charge_uC"\nr001,1\n');
    expect(columnIndex(table, 'charge_uC')).toBe(1);
    expect(columnIndex(table, 'beam_energy_keV')).toBe(-1);
  });

  it('counts columns in characters, not bytes', () => {
    const { table } = mustRead('run,note\nr001,Größe,x\n');
    const d = readCsv('run,note\nr001,Größe,x\n', 'runlog.csv').diagnostics[0];
    expect(table.rows[0].cells[2].column).toBe(12);
    expect([d.rule, d.line, d.column]).toEqual(['csv-ragged-row', 2, 12]);
  });
});

describe('refusals', () => {
  it('an empty file, and a file of only comments, has no header', () => {
    for (const text of ['', '\uFEFF', '# nothing\n\n']) {
      const { table, diagnostics } = readCsv(text, 'scalers.csv');
      expect(table).toBeNull();
      expect(diagnostics.map((d) => [d.rule, d.file, d.line, d.column])).toEqual([['csv-empty', 'scalers.csv', 1, 1]]);
    }
  });

  it('an unterminated quote is reported where it opened', () => {
    const { table, diagnostics } = readCsv('run,note\nr001,"started\nr002,x\n', 'runlog.csv');
    expect(table).toBeNull();
    expect(diagnostics.map((d) => [d.rule, d.line, d.column])).toEqual([['csv-unterminated-quote', 2, 6]]);
    expect(diagnostics[0].message).toContain('"\\"started');
  });

  it('a ragged row is reported with line and column and still returned', () => {
    const { table, diagnostics } = readCsv('run,kind,note\nr001,sample\nr002,sample,x,y\n', 'runlog.csv');
    expect(texts(table!)).toEqual([
      ['r001', 'sample'],
      ['r002', 'sample', 'x', 'y'],
    ]);
    expect(diagnostics.map((d) => [d.rule, d.line, d.column, d.expected, d.actual])).toEqual([
      ['csv-ragged-row', 2, 12, '3 fields', '2 fields'],
      ['csv-ragged-row', 3, 15, '3 fields', '4 fields'],
    ]);
    expect(diagnostics[0].message).toContain('missing "note"');
    expect(diagnostics[1].message).toContain('"y"');
  });

  it('text after a closing quote and an unnamed column are refused', () => {
    const { diagnostics } = readCsv('run,,note\nr001,"a"b,x\n', 'runlog.csv');
    expect(diagnostics.map((d) => [d.rule, d.line, d.column])).toEqual([
      ['csv-text-after-quote', 2, 9],
      ['csv-empty-column-name', 1, 5],
    ]);
  });
});

describe('requireColumns', () => {
  it('lists the missing name, what exists, and a case-only near miss', () => {
    const { table } = mustRead('Run,kind\nr001,sample\n');
    const d = requireColumns(table, ['run', 'kind', 'charge_uC']);
    expect(d.map((x) => [x.rule, x.line, x.column])).toEqual([
      ['csv-missing-column', 1, 1],
      ['csv-missing-column', 1, 1],
    ]);
    expect(d[0].message).toBe('missing column "run"; the header has "Run", "kind"');
    expect(d[0].hint).toContain('rename column "Run" to "run"');
    expect(requireColumns(table, ['kind'], 'runlog-missing-column')).toEqual([]);
    expect(requireColumns(table, ['x'], 'runlog-missing-column')[0].rule).toBe('runlog-missing-column');
  });
});
