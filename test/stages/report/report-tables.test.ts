import { describe, expect, it } from 'vitest';
import * as arrow from 'apache-arrow';
import { report, type ReportInput } from '../../../stages/report/index.js';
import { seriesSchema } from '../../../pipeline/core/config/series-schema.js';
import type { CrossSectionRow, DetectorNormalization, QcRow, ReferencePoint, YieldRow } from '../../../pipeline/core/model/result-rows.js';

// (Moved from test/stages/report.test.ts with the page's one inline script allowed.)
// The output contract checked here is this project's own (README, "Outputs" and the
// cross_sections.arrow column table); the file format is the Apache Arrow IPC file format,
// read back with the apache-arrow reader. The numbers in the rows are arbitrary test data.

const REQUIRED_CROSS_SECTION_COLUMNS = [
  'run', 'detector', 'peak', 'target', 'beam_energy_keV', 'angle_lab_deg', 'angle_cm_deg', 'net_counts', 'net_counts_unc',
  'live_fraction', 'cross_section_lab_mb_per_sr', 'cross_section_lab_stat_mb_per_sr', 'cross_section_lab_sys_mb_per_sr',
  'cross_section_cm_mb_per_sr', 'cross_section_cm_stat_mb_per_sr', 'cross_section_cm_sys_mb_per_sr', 'ratio_to_rutherford',
  'ratio_to_rutherford_stat', 'calibration_version', 'flags',
];

const XSS_TITLE = '<script>alert(1)</script>';

const config = seriesSchema.parse({
  series: 'report-test',
  title: XSS_TITLE,
  beam: { projectile: '4He', charge_state: 1 },
  detectors: [
    { id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
    { id: 'd02', angle_deg: 165, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
  ],
  targets: [
    { id: 'au-ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
    { id: 'c-foil', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }] },
  ],
  peaks: [
    { label: '12C elastic', target_nuclide: '12C' },
    { label: '12C <4.44>', target_nuclide: '12C', excitation_keV: 4439.8 },
  ],
  normalization: { reference_target: 'au-ref' },
});

function xsRow(o: Partial<CrossSectionRow>): CrossSectionRow {
  return {
    run: 'r002', detector: 'd01', peak: '12C elastic', target: 'c-foil', targetNuclide: '12C',
    beamEnergyKeV: 2000, beamEnergyUncKeV: 2, reactionEnergyKeV: 2000, reactionEnergySpreadKeV: 0, detectedNuclide: '4He', detectedEnergyKeV: 503.2, screeningModel: 'lecuyer', angleLabDeg: 150, angleLabUncDeg: 0.2, angleCmDeg: 159.6,
    peakEnergyKeV: 503.2, qValueKeV: 0, grossCounts: 5200, backgroundCounts: 200, netCounts: 5000, netCountsUnc: 73.1,
    liveFraction: 0.9, liveFractionUnc: 0.0021, chargeUC: 30, nuclideArealDensity1e15PerCm2: 148.395, solidAngleMsr: 2.45,
    normalizationCountingRelUnc: 0.0041, referenceRuns: 'r001+r004', crossSectionLabMbPerSr: 207.1,
    crossSectionLabStatMbPerSr: 3.1, crossSectionLabSysMbPerSr: 12.2, jacobianLabPerCm: 0.8121, crossSectionCmMbPerSr: 168.2,
    crossSectionCmStatMbPerSr: 2.5, crossSectionCmSysMbPerSr: 9.9, rutherfordLabMbPerSr: 190.5, screeningFactor: 0.9993,
    ratioToRutherford: 1.087, ratioToRutherfordStat: 0.016, ratioToRutherfordSys: 0.064, calibrationVersion: 'cal-a', flags: [],
    ...o,
  };
}

const ROWS: CrossSectionRow[] = [
  xsRow({}),
  xsRow({ run: 'r003', beamEnergyKeV: 2100, ratioToRutherford: 1.12, flags: ['no-live-time', 'reference-one-sided'] }),
  xsRow({ run: 'r003', detector: 'd02', angleLabDeg: 165, beamEnergyKeV: 2100 }),
  // an inelastic peak: no Rutherford ratio (NaN → null)
  xsRow({ run: 'r003', peak: '12C <4.44>', beamEnergyKeV: 10000, qValueKeV: -4439.8, rutherfordLabMbPerSr: Number.NaN, screeningFactor: Number.NaN, ratioToRutherford: Number.NaN, ratioToRutherfordStat: Number.NaN, ratioToRutherfordSys: Number.NaN }),
  // no normalization: no values, flag
  xsRow({ run: 'r005', crossSectionLabMbPerSr: Number.NaN, crossSectionLabStatMbPerSr: Number.NaN, crossSectionLabSysMbPerSr: Number.NaN, crossSectionCmMbPerSr: Number.NaN, crossSectionCmStatMbPerSr: Number.NaN, crossSectionCmSysMbPerSr: Number.NaN, ratioToRutherford: Number.NaN, ratioToRutherfordStat: Number.NaN, ratioToRutherfordSys: Number.NaN, solidAngleMsr: Number.NaN, referenceRuns: '', flags: ['no-normalization'] }),
];

const POINTS: ReferencePoint[] = [
  { run: 'r001', detector: 'd01', startedAtMs: 0, beamEnergyKeV: 2000, reactionEnergyKeV: 2000, chargeUC: 4, netCounts: 32000, netCountsUnc: 178.9, liveFraction: 0.95, liveFractionUnc: 0, rutherfordMbPerSr: 9127, screeningFactor: 0.983, solidAngleMsr: 2.464, relCounting: 0.0056, relLive: 0, relEnergy: 0.002, dLnSigmaDThetaPerDeg: 0.01, relAreal: 0.03, flags: [] },
  { run: 'r001', detector: 'd02', startedAtMs: 0, beamEnergyKeV: 2000, reactionEnergyKeV: 2000, chargeUC: 4, netCounts: Number.NaN, netCountsUnc: Number.NaN, liveFraction: 0.95, liveFractionUnc: 0, rutherfordMbPerSr: 8900, screeningFactor: 0.983, solidAngleMsr: null, relCounting: 0, relLive: 0, relEnergy: 0.002, dLnSigmaDThetaPerDeg: 0.005, relAreal: 0.03, flags: ['reference-not-measured'] },
];
const DETECTORS: DetectorNormalization[] = [
  { detector: 'd01', nominalMsr: 2.5, meanMsr: 2.464, chi2: 0, ndf: 0 },
  { detector: 'd02', nominalMsr: 2.5, meanMsr: null, chi2: 0, ndf: 0 },
];
const YIELDS: YieldRow[] = [
  { run: 'r002', kind: 'sample', detector: 'd01', peak: '12C elastic', expectedEnergyKeV: 503.2, expectedChannel: 251.6, calibrationEnergyUncKeV: 0.31, fwhmKeV: 15, peakLo: 240, peakHi: 263, leftLo: 224, leftHi: 235, rightLo: 267, rightHi: 278, grossCounts: 5200, backgroundCounts: 200, backgroundUnc: 12.2, netCounts: 5000, netCountsUnc: 73.1, centroidShiftKeV: 0.4, flags: [] },
  { run: 'r001', kind: 'reference', detector: 'd02', peak: 'reference Au', expectedEnergyKeV: 1850, expectedChannel: Number.NaN, calibrationEnergyUncKeV: Number.NaN, fwhmKeV: 15, peakLo: Number.NaN, peakHi: Number.NaN, leftLo: Number.NaN, leftHi: Number.NaN, rightLo: Number.NaN, rightHi: Number.NaN, grossCounts: Number.NaN, backgroundCounts: Number.NaN, backgroundUnc: Number.NaN, netCounts: Number.NaN, netCountsUnc: Number.NaN, centroidShiftKeV: Number.NaN, flags: ['peak-outside-spectrum'] },
];
const QC: QcRow[] = [
  { run: 'r002', kind: 'sample', detector: 'd01', status: 'reduced', reason: '', rule: '', calibrationVersion: 'cal-a', liveFraction: 0.9, liveFractionUnc: 0.0021, liveSource: 'pulser', totalCounts: 123456, channelCount: 1024, peakShiftKeV: 0.4, flags: [] },
  { run: 'r006', kind: 'sample', detector: 'd01', status: 'set-aside', reason: 'runlog.csv:7:48: charge_uC is not a number: "3,5"', rule: 'runlog-not-a-number', calibrationVersion: '', liveFraction: Number.NaN, liveFractionUnc: Number.NaN, liveSource: '', totalCounts: Number.NaN, channelCount: Number.NaN, peakShiftKeV: Number.NaN, flags: [] },
];

function input(o: Partial<ReportInput> = {}): ReportInput {
  return {
    config,
    rows: ROWS,
    referenceElement: 'Au',
    points: POINTS,
    detectors: DETECTORS,
    yields: YIELDS,
    qc: QC,
    diagnostics: [{ severity: 'error', rule: 'runlog-not-a-number', message: 'charge_uC is not a number: "<b>3,5</b>"', file: 'runlog.csv', line: 7, column: 48, run: 'r006', stage: 'ingest' }],
    manifest: {
      software: { name: 'xsred', version: '0.0.0-test' },
      config_sha256: 'a'.repeat(64),
      inputs_sha256: 'b'.repeat(64),
      editions: { constants: 'CODATA 2018', masses: 'AME2020' },
      calibration_versions: ['cal-a'],
    },
    html: false,
    ...o,
  };
}

const files = async (i: ReportInput) => new Map((await report(i)).files.map((f) => [f.name, f.bytes]));
const table = (bytes: Uint8Array | undefined) => arrow.tableFromIPC(bytes!);
const ARROW_FILES = ['cross_sections.arrow', 'normalization.arrow', 'yields.arrow', 'qc.arrow'];

describe('report: Arrow tables (README, "Outputs")', () => {
  it('writes the four tables, the diagnostics and the manifest, and no summary with html: false', async () => {
    const out = await files(input());
    expect([...out.keys()].sort()).toEqual([...ARROW_FILES, 'diagnostics.json', 'manifest.json'].sort());
    expect(JSON.parse(new TextDecoder().decode(out.get('diagnostics.json')!))).toEqual(input().diagnostics);
    const manifest = JSON.parse(new TextDecoder().decode(out.get('manifest.json')!));
    expect(manifest.software.version).toBe('0.0.0-test');
  });

  it('cross_sections.arrow has the required columns, one row per input row', async () => {
    const t = table((await files(input())).get('cross_sections.arrow'));
    const names = t.schema.fields.map((f) => f.name);
    for (const c of REQUIRED_CROSS_SECTION_COLUMNS) expect(names).toContain(c);
    expect(new Set(names).size).toBe(names.length);
    expect(t.numRows).toBe(ROWS.length);
  });

  it('every float field has a unit, every field a description; xsred.columns lists every column (README: "Every Arrow field carries unit and description")', async () => {
    const out = await files(input());
    for (const name of ARROW_FILES) {
      const t = table(out.get(name));
      for (const f of t.schema.fields) {
        expect(f.metadata.get('description'), `${name}: ${f.name}`).toMatch(/\S/);
        if (arrow.DataType.isFloat(f.type)) expect(f.metadata.get('unit'), `${name}: ${f.name}`).toMatch(/\S/);
      }
      const dictionary = JSON.parse(t.schema.metadata.get('xsred.columns')!) as { name: string; unit: string; description: string }[];
      expect(dictionary.map((c) => c.name)).toEqual(t.schema.fields.map((f) => f.name));
      for (const c of dictionary) expect(c.description).toBe(t.schema.fields.find((f) => f.name === c.name)!.metadata.get('description'));
      expect(t.schema.metadata.get('xsred.series')).toBe('report-test');
      expect(t.schema.metadata.get('xsred.version')).toBe('0.0.0-test');
      expect(t.schema.metadata.get('xsred.edition.masses')).toBe('AME2020');
    }
  });

  it('units of the cross-section columns are those their names say', async () => {
    const t = table((await files(input())).get('cross_sections.arrow'));
    const unit = (n: string) => t.schema.fields.find((f) => f.name === n)!.metadata.get('unit');
    expect(unit('beam_energy_keV')).toBe('keV');
    expect(unit('angle_cm_deg')).toBe('deg');
    expect(unit('cross_section_lab_mb_per_sr')).toBe('mb/sr');
    expect(unit('cross_section_cm_sys_mb_per_sr')).toBe('mb/sr');
    expect(unit('ratio_to_rutherford')).toBe('1');
  });

  it('values round-trip; NaN comes back as null; flags are joined by ";"', async () => {
    const t = table((await files(input())).get('cross_sections.arrow'));
    const col = (n: string) => t.getChild(n)!.toArray() as unknown[];
    const get = (n: string, i: number) => t.getChild(n)!.get(i);
    expect(col('run').slice(0, 5)).toEqual(['r002', 'r003', 'r003', 'r003', 'r005']);
    expect(get('cross_section_lab_mb_per_sr', 0)).toBe(207.1);
    expect(get('beam_energy_keV', 1)).toBe(2100);
    expect(get('flags', 1)).toBe('no-live-time;reference-one-sided');
    expect(get('flags', 0)).toBe('');
    expect(get('ratio_to_rutherford', 3)).toBeNull();
    expect(get('ratio_to_rutherford_stat', 3)).toBeNull();
    expect(get('cross_section_lab_mb_per_sr', 3)).toBe(207.1);
    expect(get('cross_section_lab_mb_per_sr', 4)).toBeNull();
    expect(get('cross_section_cm_sys_mb_per_sr', 4)).toBeNull();
    expect(get('reference_runs', 4)).toBe('');
    expect(t.getChild('ratio_to_rutherford')!.nullCount).toBe(2);
    expect(t.getChild('run')!.nullCount).toBe(0);
  });

  it('normalization.arrow: a reference point without a solid angle gives nulls, and its nominal value', async () => {
    const t = table((await files(input())).get('normalization.arrow'));
    expect(t.numRows).toBe(2);
    expect(t.getChild('effective_solid_angle_msr')!.get(0)).toBe(2.464);
    expect(t.getChild('effective_solid_angle_msr')!.get(1)).toBeNull();
    expect(t.getChild('effective_solid_angle_run_unc_msr')!.get(1)).toBeNull();
    expect(t.getChild('nominal_solid_angle_msr')!.get(1)).toBe(2.5);
    expect(t.getChild('reference_element')!.get(0)).toBe('Au');
    expect(t.getChild('flags')!.get(1)).toBe('reference-not-measured');
  });

  it('yields.arrow and qc.arrow: integer channels, NaN as null', async () => {
    const out = await files(input());
    const y = table(out.get('yields.arrow'));
    expect(arrow.DataType.isInt(y.schema.fields.find((f) => f.name === 'peak_first_channel')!.type)).toBe(true);
    expect(y.getChild('peak_first_channel')!.get(0)).toBe(240);
    expect(y.getChild('peak_first_channel')!.get(1)).toBeNull();
    const q = table(out.get('qc.arrow'));
    expect(q.getChild('status')!.toArray()).toEqual(['reduced', 'set-aside']);
    expect(q.getChild('channel_count')!.get(1)).toBeNull();
    expect(q.getChild('rule')!.get(1)).toBe('runlog-not-a-number');
  });

  it('the same input gives byte-identical files (README: "the same inputs and configuration give byte-identical tables")', async () => {
    const a = await files(input());
    const b = await files(input());
    for (const [name, bytes] of a) expect(Buffer.from(b.get(name)!).equals(Buffer.from(bytes)), name).toBe(true);
  });

  it('empty input (no rows anywhere) still writes valid tables with the full schema', async () => {
    const full = await files(input());
    const empty = await files(input({ rows: [], points: [], yields: [], qc: [], diagnostics: [], detectors: [] }));
    for (const name of ARROW_FILES) {
      const t = table(empty.get(name));
      expect(t.numRows, name).toBe(0);
      expect(t.schema.fields.map((f) => f.name), name).toEqual(table(full.get(name)).schema.fields.map((f) => f.name));
      expect(JSON.parse(t.schema.metadata.get('xsred.columns')!)).toHaveLength(t.schema.fields.length);
    }
  });
});

describe('report: summary.html (self-contained: inline CSS and SVG, one hashed inline script, no network)', () => {
  it('has only the picker script, an inline SVG chart, and escapes the title and other text', async () => {
    const out = await files(input({ html: true }));
    const html = new TextDecoder().decode(out.get('summary.html')!);
    expect(html.match(/<script/gi)?.length ?? 0).toBeLessThanOrEqual(1);
    expect(html).toContain('<svg');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).not.toContain(XSS_TITLE);
    // a peak label and a diagnostic message with markup characters are escaped too
    expect(html).toContain('12C &lt;4.44&gt;');
    expect(html).not.toContain('<b>3,5</b>');
    expect(html).toContain('<title>report-test');
  }, 60_000);

  it('holds no http:// or https:// address at all, the SVG namespace declarations included (HTML5 inline SVG needs none)', async () => {
    const out = await files(input({ html: true }));
    const html = new TextDecoder().decode(out.get('summary.html')!);
    expect(html.match(/.{0,30}https?:\/\/.{0,30}/g) ?? []).toEqual([]);
  }, 60_000);

  it('the page holds no clock time: two reports of the same input are byte-identical', async () => {
    const a = await files(input({ html: true }));
    const b = await files(input({ html: true }));
    expect(Buffer.from(a.get('summary.html')!).equals(Buffer.from(b.get('summary.html')!))).toBe(true);
  }, 60_000);

  it('with no rows the page still renders, saying there is nothing to plot', async () => {
    const out = await files(input({ html: true, rows: [], points: [], qc: [], diagnostics: [] }));
    const html = new TextDecoder().decode(out.get('summary.html')!);
    expect(html).toContain('No rows to plot.');
    expect(html).toContain('No spectrum embedded.');
  }, 60_000);
});
