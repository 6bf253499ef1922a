import { describe, expect, it } from 'vitest';
import { parseSpectrumCsv } from '../../../pipeline/core/formats/spectrum-csv.js';
import { Xoshiro128StarStar } from '../../../pipeline/core/random/xoshiro128-star-star.js';

/** The project's seeded generator (the simulator's), as a function returning uniforms in [0, 1). */
const uniform = (seed: number): (() => number) => {
  const g = Xoshiro128StarStar.fromSeed(seed);
  return () => g.nextFloat64();
};

// Layout under test: DESIGN.md "Run-series layout" — header `channel,<detector ids…>`, then one row
// per channel 0…N−1 in order, non-negative integer counts.

const FILE = 'spectra/r001.csv';
const parse = (text: string) => parseSpectrumCsv(new TextEncoder().encode(text), FILE);
const where = (r: ReturnType<typeof parse>) => r.diagnostics.map((d) => [d.rule, d.line, d.column]);

function ok(text: string) {
  const r = parse(text);
  if (r.spectrum === null) throw new Error(r.diagnostics.map((d) => `${d.line}:${d.column} ${d.message}`).join('; '));
  return { ...r, spectrum: r.spectrum, values: r.spectrum.counts.map((c) => Array.from(c)) };
}


describe('accepted lab-machine variants (common practice)', () => {
  const plain = 'channel,d01,d02\n0,5,0\n1,17,3\n2,0,250\n';
  const want = [
    [5, 17, 0],
    [0, 3, 250],
  ];

  it('reads the plain layout', () => {
    const r = ok(plain);
    expect(r.diagnostics).toEqual([]);
    expect(r.spectrum.detectorIds).toEqual(['d01', 'd02']);
    expect(r.spectrum.channelCount).toBe(3);
    expect(r.spectrum.counts.every((c) => c instanceof Float64Array && c.length === 3)).toBe(true);
    expect(r.values).toEqual(want);
  });

  it('reads a BOM, CRLF, lone CR, no final newline and trailing blank lines alike', () => {
    const variants = [
      `\uFEFF${plain}`,
      plain.replace(/\n/g, '\r\n'),
      plain.replace(/\n/g, '\r'),
      plain.slice(0, -1),
      plain.replace(/\n/g, '\r\n').slice(0, -2),
      `${plain}\n\n  \n`,
      `${plain.replace(/\n/g, '\r\n')}\r\n\r\n`,
    ];
    for (const text of variants) {
      const r = ok(text);
      expect(r.diagnostics).toEqual([]);
      expect(r.values).toEqual(want);
    }
  });

  it('reads ; and tab delimiters, spaces or tabs around values, quoted header names, CHANNEL in capitals', () => {
    const variants = [
      'channel;d01;d02\n0;5;0\n1;17;3\n2;0;250\n',
      'channel\td01\td02\n0\t5\t0\n1 \t 17\t3\n2\t0\t250 \n',
      '"channel","d01","d02"\n0, 5 ,0\n1,\t17\t,3\n 2 ,0,  250\n',
      'CHANNEL, "d01" ,d02\n0,5,0\n1,17,3\n2,0,250\n',
    ];
    for (const text of variants) {
      const r = ok(text);
      expect(r.diagnostics).toEqual([]);
      expect(r.spectrum.detectorIds).toEqual(['d01', 'd02']);
      expect(r.values).toEqual(want);
    }
  });

  it('skips blank lines and # comment lines before the header', () => {
    const r = ok('# MCA export\n\n# live time 100 s\nchannel,d01,d02\n0,5,0\n1,17,3\n\n2,0,250\n');
    expect(r.values).toEqual(want);
  });

  it('reads integral decimals (12.0, 12., 12,0 under ;) with one info diagnostic at the first', () => {
    const r = ok('channel,d01,d02\n0,5,0\n1,17.0,3.\n2,0.000,250\n');
    expect(r.values).toEqual(want);
    expect(r.diagnostics.map((d) => [d.severity, d.rule, d.line, d.column, d.actual])).toEqual([['info', 'spectrum-decimal-counts', 3, 3, '"17.0"']]);
    const comma = ok('channel;d01;d02\n0;5;0\n1;17,0;3\n2;0;250,\n');
    expect(comma.values).toEqual(want);
    expect(where(comma)).toEqual([['spectrum-decimal-counts', 3, 3]]);
  });

  it('accepts a count of exactly 2^53 = 9007199254740992 (ECMA-262: Number.MAX_SAFE_INTEGER + 1)', () => {
    const r = ok('channel,d01,d02\n0,9007199254740992,9007199254740991\n1,000000000000000000042,1000000000\n');
    expect(r.values).toEqual([
      [9007199254740992, 42],
      [9007199254740991, 1000000000],
    ]);
  });

  it('reads a Node Buffer as it comes from readFileSync', () => {
    const r = parseSpectrumCsv(Buffer.from(plain, 'utf8'), FILE);
    expect(r.spectrum?.counts.map((c) => Array.from(c))).toEqual(want);
  });

  it('does not modify the caller’s bytes and reads a view into a larger buffer', () => {
    const whole = new TextEncoder().encode(`xxxx${plain.slice(0, -1)}yyyy`);
    const view = whole.subarray(4, whole.length - 4);
    const before = Array.from(whole);
    const r = parseSpectrumCsv(view, FILE);
    expect(r.spectrum?.counts.map((c) => Array.from(c))).toEqual(want);
    expect(Array.from(whole)).toEqual(before);
  });
});

describe('refusals: rule, line and 1-based column of the offending field', () => {
  it('first column not named channel', () => {
    const r = parse('chan,d01\n0,1\n');
    expect(r.spectrum).toBeNull();
    expect(where(r)).toEqual([['spectrum-first-column', 1, 1]]);
    expect(r.diagnostics[0].message).toContain('"chan"');
    expect(parse('0,1,2\n1,3,4\n').diagnostics[0].hint).toContain('seems to start with data');
  });

  it('no detector columns', () => {
    expect(where(parse('channel\n0\n'))).toEqual([['spectrum-no-detectors', 1, 8]]);
  });

  it('duplicate detector ids, and an empty id between two names', () => {
    expect(where(parse('channel,d01,d02,d01\n0,1,2,3\n'))).toEqual([['spectrum-duplicate-detector', 1, 17]]);
    expect(where(parse('channel,,d02\n0,1,2\n'))).toEqual([['spectrum-empty-detector-id', 1, 9]]);
  });

  it('a delimiter ending every line (spreadsheet export) is not an empty detector column (common practice)', () => {
    const r = parse('channel,d01,\n0,1,\n1,4,\n');
    expect(r.spectrum?.detectorIds).toEqual(['d01']);
    expect(r.spectrum?.counts.map((c) => [...c])).toEqual([[1, 4]]);
    expect(r.diagnostics.map((d) => [d.severity, d.rule])).toEqual([['info', 'spectrum-trailing-delimiter']]);
  });

  it('channels not 0…N−1 in order (spectrum-channel-order)', () => {
    const skipped = parse('channel,d01\n0,5\n2,6\n3,1\n');
    expect(skipped.spectrum).toBeNull();
    expect(where(skipped)).toEqual([['spectrum-channel-order', 3, 1]]);
    expect(skipped.diagnostics[0].message).toBe('channel "2" where channel 1 is expected');
    expect(where(parse('channel,d01\n0,5\n1,6\n1,7\n2,1\n'))).toEqual([['spectrum-channel-order', 4, 1]]);
    expect(where(parse('channel,d01\n1,5\n2,6\n'))).toEqual([['spectrum-channel-order', 2, 1]]);
    // last line's channel is far too small: the row estimate is wrong and the arrays must grow
    const rows = Array.from({ length: 40 }, (_, ch) => `${ch},${ch}`).join('\n');
    expect(where(parse(`channel,d01\n${rows}\n0,0\n`))).toEqual([['spectrum-channel-order', 42, 1]]);
  });

  it('too few or too many fields (spectrum-ragged-row)', () => {
    const few = parse('channel,d01,d02\n0,1,2\n1,3\n');
    expect(where(few)).toEqual([['spectrum-ragged-row', 3, 4]]);
    expect(few.diagnostics[0].message).toContain('no count for "d02"');
    const many = parse('channel,d01\n0,1,2\n');
    expect(where(many)).toEqual([['spectrum-ragged-row', 2, 5]]);
    expect(many.diagnostics[0].message).toContain('first extra field "2"');
    expect(where(parse('channel,d01\n0,1,\n'))).toEqual([['spectrum-ragged-row', 2, 5]]);
  });

  it('a negative count (spectrum-negative-count)', () => {
    const r = parse('channel,d01,d02\n0,1,-3\n');
    expect(where(r)).toEqual([['spectrum-negative-count', 2, 5]]);
    expect(r.diagnostics[0].actual).toBe('"-3"');
  });

  it('non-integer and non-numeric counts, quoting the text (spectrum-not-integer)', () => {
    for (const [text, column] of [
      ['12.5', 3],
      ['1e3', 3],
      ['abc', 3],
      ['"12"', 3],
      ['+4', 3],
      ['12 13', 3],
      ['NaN', 3],
    ] as const) {
      const r = parse(`channel,d01,d02\n0,${text},1\n`);
      expect(where(r)).toEqual([['spectrum-not-integer', 2, column]]);
      expect(r.diagnostics[0].message).toContain(JSON.stringify(text));
    }
    const wrongDelimiter = parse('channel,d01,d02\n0;1;2\n');
    expect(where(wrongDelimiter)).toEqual([
      ['spectrum-not-integer', 2, 1],
      ['spectrum-ragged-row', 2, 6],
    ]);
    expect(wrongDelimiter.diagnostics[0].hint).toContain('";"');
  });

  it('a bad channel number is called a channel number, not a count', () => {
    const r = parse('channel,d01\nabc,1\n');
    expect(where(r)).toEqual([['spectrum-not-integer', 2, 1]]);
    expect(r.diagnostics[0].message).toBe('channel number "abc" is not a non-negative integer');
  });

  it('an empty field (spectrum-empty-field)', () => {
    expect(where(parse('channel,d01,d02\n0,,2\n'))).toEqual([['spectrum-empty-field', 2, 3]]);
    expect(where(parse('channel,d01,d02\n0, \t ,2\n'))).toEqual([['spectrum-empty-field', 2, 6]]);
    expect(where(parse('channel\td01\td02\n0\t\t2\n'))).toEqual([['spectrum-empty-field', 2, 3]]);
  });

  it('zero data rows (spectrum-empty) and an empty file (spectrum-no-header)', () => {
    expect(where(parse('channel,d01\n'))).toEqual([['spectrum-empty', 1, 1]]);
    expect(where(parse('channel,d01'))).toEqual([['spectrum-empty', 1, 1]]);
    expect(where(parse('# x\nchannel,d01\n\n\n'))).toEqual([['spectrum-empty', 2, 1]]);
    expect(where(parse(''))).toEqual([['spectrum-no-header', 1, 1]]);
    expect(where(parse('\n\n'))).toEqual([['spectrum-no-header', 1, 1]]);
  });

  it('a count above 2^53 (spectrum-count-too-large)', () => {
    const r = parse('channel,d01\n0,9007199254740993\n');
    expect(where(r)).toEqual([['spectrum-count-too-large', 2, 3]]);
    expect(r.diagnostics[0].message).toContain('"9007199254740993"');
  });

  it('an unterminated quote in the header', () => {
    expect(where(parse('channel,"d01\n0,1\n'))).toEqual([['csv-unterminated-quote', 1, 9]]);
  });

  it('columns are counted in characters on lines with multi-byte text', () => {
    expect(where(parse('channel,d01,d02\n0,é,x\n'))).toEqual([
      ['spectrum-not-integer', 2, 3],
      ['spectrum-not-integer', 2, 5],
    ]);
  });

  it('reports 10 problems, then one summary of the rest', () => {
    const rows = Array.from({ length: 15 }, (_, ch) => `${ch},-1`).join('\n');
    const r = parse(`channel,d01\n${rows}\n`);
    expect(r.spectrum).toBeNull();
    expect(r.diagnostics).toHaveLength(11);
    expect(r.diagnostics.slice(0, 10).map((d) => d.line)).toEqual([2, 3, 4, 5, 6, 7, 8, 9, 10, 11]);
    expect(r.diagnostics[10]).toMatchObject({ severity: 'error', rule: 'spectrum-more-problems', message: '…and 5 more problems in this file', file: FILE });
  });
});

describe('exact values', () => {
  it('round-trips a seeded random spectrum written as CSV text (exact comparison)', () => {
    const random = uniform(7);
    const detectors = 7;
    const channels = 1500;
    const truth = Array.from({ length: detectors }, () =>
      Array.from({ length: channels }, () => {
        const magnitude = Math.floor(random() * 16); // up to 15 decimal digits, all below 2^53
        return Math.floor(random() * 10 ** magnitude);
      }),
    );
    truth[0][0] = 0;
    truth[1][1] = 2 ** 53;
    const lines = [`channel,${truth.map((_, k) => `det-${k}`).join(',')}`];
    for (let ch = 0; ch < channels; ch++) lines.push([ch, ...truth.map((col) => col[ch])].join(','));
    const r = ok(`${lines.join('\n')}\n`);
    expect(r.diagnostics).toEqual([]);
    expect(r.spectrum.channelCount).toBe(channels);
    expect(r.values).toEqual(truth);
  });

  it('round-trips the same spectrum with random lab-machine padding, decimals and CRLF', () => {
    const random = uniform(11);
    const truth = Array.from({ length: 4 }, () => Array.from({ length: 300 }, () => Math.floor(random() * 100000)));
    const field = (v: number): string => {
      const pad = [' ', '\t', '', ''][Math.floor(random() * 4)];
      const written = random() < 0.2 ? `${v}.0` : `${v}`;
      return `${pad}${written}${pad}`;
    };
    const lines = ['channel;a;b;c;d'];
    for (let ch = 0; ch < 300; ch++) lines.push([field(ch), ...truth.map((col) => field(col[ch]))].join(';'));
    const r = ok(`\uFEFF${lines.join('\r\n')}`);
    expect(r.values).toEqual(truth);
    expect(r.diagnostics.map((d) => d.severity)).toEqual(['info']);
  });

  it('reads a 4,096-channel × 16-detector spectrum exactly', () => {
    const value = (k: number, ch: number) => (ch * 2654435761 + k * 40503 + ((ch * k) % 977)) % 1000003;
    const ids = Array.from({ length: 16 }, (_, k) => `d${String(k + 1).padStart(2, '0')}`);
    const lines = [`channel,${ids.join(',')}`];
    for (let ch = 0; ch < 4096; ch++) lines.push([ch, ...ids.map((_, k) => value(k, ch))].join(','));
    const r = ok(`${lines.join('\n')}\n`);
    expect(r.spectrum.channelCount).toBe(4096);
    expect(r.spectrum.detectorIds).toEqual(ids);
    let mismatches = 0;
    for (let k = 0; k < 16; k++) {
      expect(r.spectrum.counts[k].length).toBe(4096);
      for (let ch = 0; ch < 4096; ch++) if (r.spectrum.counts[k][ch] !== value(k, ch)) mismatches++;
    }
    expect(mismatches).toBe(0);
    expect(r.spectrum.counts[15][4095]).toBe(value(15, 4095));
  });
});
