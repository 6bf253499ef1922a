import { seriesSchema } from '../../../pipeline/core/config/series-schema.js';
import type { CrossSectionRow, QcRow, ReferencePoint, YieldRow } from '../../../pipeline/core/model/result-rows.js';
import type { ReportInput, ReportRun, ReportSpectrum } from '../../../stages/report/index.js';

/**
 * A small report input whose user-supplied strings (series title, peak labels, run notes, a
 * diagnostic's file name and message) hold markup: a <script> element, attribute-breaking
 * quotes and an event-handler image. Numbers are arbitrary test data, not results.
 */
export const HOSTILE = {
  title: `<script>window.__pwned = 1; alert('title')</script> "quoted" & 'single'`,
  peak: `12C "><img src=x onerror="alert('peak')">`,
  note: `</td></tr></table><script>alert('note')</script><b onmouseover=alert(1)>bold</b>`,
  file: `spectra/"><svg onload=alert('file')>.csv`,
} as const;

const config = seriesSchema.parse({
  series: 'hostile-strings',
  title: HOSTILE.title,
  beam: { projectile: '4He', charge_state: 1 },
  detectors: [
    { id: 'd01', angle_deg: 150, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
    { id: 'd02', angle_deg: 120, angle_unc_deg: 0.2, resolution_fwhm_keV: 15, solid_angle_msr: 2.5 },
  ],
  targets: [
    { id: 'au-ref', layers: [{ composition: { Au: 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
    { id: 'c-foil', layers: [{ composition: { C: 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 }] },
  ],
  peaks: [{ label: HOSTILE.peak, target_nuclide: '12C' }],
  normalization: { reference_target: 'au-ref' },
});

const runs: ReportRun[] = [
  { run: 'r001', index: 0, kind: 'reference', target: 'au-ref', beamEnergyKeV: 2000, beamEnergyUncKeV: 2, startedAt: '2026-03-02T08:00:00Z', note: '' },
  { run: 'r002', index: 1, kind: 'sample', target: 'c-foil', beamEnergyKeV: 2000, beamEnergyUncKeV: 2, startedAt: '2026-03-02T08:20:00Z', note: HOSTILE.note },
  { run: 'r003', index: 2, kind: 'sample', target: 'c-foil', beamEnergyKeV: 2100, beamEnergyUncKeV: 2, startedAt: '2026-03-02T08:40:00Z', note: 'plain note' },
  { run: 'r004', index: 3, kind: 'reference', target: 'au-ref', beamEnergyKeV: 2100, beamEnergyUncKeV: 2, startedAt: '2026-03-02T09:00:00Z', note: '' },
];

function row(run: string, detector: string, e: number, angle: number, v: number): CrossSectionRow {
  return {
    run, detector, peak: HOSTILE.peak, target: 'c-foil', targetNuclide: '12C', beamEnergyKeV: e, beamEnergyUncKeV: 2, reactionEnergyKeV: e, reactionEnergySpreadKeV: 0, detectedNuclide: '4He', detectedEnergyKeV: 500, screeningModel: 'lecuyer', angleLabDeg: angle, angleLabUncDeg: 0.2,
    angleCmDeg: angle + 8, peakEnergyKeV: 500, qValueKeV: 0, grossCounts: 5200, backgroundCounts: 200, netCounts: 5000, netCountsUnc: 73, liveFraction: 0.9,
    liveFractionUnc: 0.002, chargeUC: 30, nuclideArealDensity1e15PerCm2: 148, solidAngleMsr: 2.45, normalizationCountingRelUnc: 0.004, referenceRuns: 'r001+r004',
    crossSectionLabMbPerSr: v, crossSectionLabStatMbPerSr: v * 0.015, crossSectionLabSysMbPerSr: v * 0.06, jacobianLabPerCm: 0.8, crossSectionCmMbPerSr: v * 0.8,
    crossSectionCmStatMbPerSr: v * 0.012, crossSectionCmSysMbPerSr: v * 0.048, rutherfordLabMbPerSr: v / 1.1, screeningFactor: 0.999, ratioToRutherford: 1.1,
    ratioToRutherfordStat: 0.016, ratioToRutherfordSys: 0.06, calibrationVersion: 'cal-a', flags: [],
  };
}

const rows = [row('r002', 'd01', 2000, 150, 207), row('r002', 'd02', 2000, 120, 260), row('r003', 'd01', 2100, 150, 190), row('r003', 'd02', 2100, 120, 240)];

const point = (run: string, detector: string, ms: number, msr: number): ReferencePoint => ({
  run, detector, startedAtMs: ms, beamEnergyKeV: 2000, reactionEnergyKeV: 2000, chargeUC: 4, netCounts: 32000, netCountsUnc: 179, liveFraction: 0.95, liveFractionUnc: 0,
  rutherfordMbPerSr: 9127, screeningFactor: 0.983, solidAngleMsr: msr, relCounting: 0.0056, relLive: 0, relEnergy: 0.002, dLnSigmaDThetaPerDeg: 0.01, relAreal: 0.03, flags: [],
});
const points = [point('r001', 'd01', Date.UTC(2026, 2, 2, 8), 2.46), point('r001', 'd02', Date.UTC(2026, 2, 2, 8), 2.51), point('r004', 'd01', Date.UTC(2026, 2, 2, 9), 2.44), point('r004', 'd02', Date.UTC(2026, 2, 2, 9), 2.49)];

const qc: QcRow[] = runs.flatMap((r) => ['d01', 'd02'].map((d, i): QcRow => ({
  run: r.run, kind: r.kind, detector: d, status: 'reduced', reason: '', rule: '', calibrationVersion: 'cal-a', liveFraction: 0.9 - 0.01 * r.index - 0.02 * i,
  liveFractionUnc: 0.002, liveSource: 'pulser', totalCounts: 1e5, channelCount: 1024, peakShiftKeV: 0.1 * r.index - 0.05 * i, flags: [],
})));

/** A spectrum of 1024 channels: flat background and one Gaussian peak whose centre moves with the run and detector. */
function spectrum(run: string, detector: string, centre: number): ReportSpectrum {
  const counts = new Float64Array(256);
  for (let b = 0; b < 256; b++) {
    const ch = b * 4 + 1.5;
    counts[b] = Math.round(4 * (3 + 400 * Math.exp(-0.5 * ((ch - centre) / 6) ** 2)));
  }
  return { run, detector, channelCount: 1024, binWidthChannels: 4, counts, calibration: { offsetKeV: 20, gainKeVPerChannel: 2, quadraticKeVPerChannel2: 0 } };
}
const spectra = runs.flatMap((r, k) => ['d01', 'd02'].map((d, i) => spectrum(r.run, d, 300 + 60 * k + 25 * i)));

const yields: YieldRow[] = spectra.map((s, k) => {
  const c = 300 + 60 * Math.floor(k / 2) + 25 * (k % 2);
  return {
    run: s.run, kind: runs.find((r) => r.run === s.run)!.kind, detector: s.detector, peak: HOSTILE.peak, expectedEnergyKeV: 20 + 2 * c, expectedChannel: c,
    calibrationEnergyUncKeV: 0.3, fwhmKeV: 28, peakLo: c - 10, peakHi: c + 10, leftLo: c - 25, leftHi: c - 14, rightLo: c + 14, rightHi: c + 25,
    grossCounts: 5200, backgroundCounts: 200, backgroundUnc: 12, netCounts: 5000, netCountsUnc: 73, centroidShiftKeV: 0.1, flags: [],
  };
});

export function hostileReportInput(o: Partial<ReportInput> = {}): ReportInput {
  return {
    config, rows, referenceElement: 'Au', points,
    detectors: [{ detector: 'd01', nominalMsr: 2.5, meanMsr: 2.45, chi2: 0.4, ndf: 1 }, { detector: 'd02', nominalMsr: 2.5, meanMsr: 2.5, chi2: 0.2, ndf: 1 }],
    yields, qc, runs, spectra,
    diagnostics: [{ severity: 'warning', rule: 'test-hostile-file', stage: 'ingest', file: HOSTILE.file, line: 3, column: 1, run: 'r003', message: `odd value "<i>${HOSTILE.note}</i>"` }],
    manifest: {
      software: { name: 'xsred', version: '0.0.0-test' }, config_sha256: 'c'.repeat(64), inputs_sha256: 'd'.repeat(64),
      editions: { constants: 'CODATA 2018', masses: 'AME2020' }, calibration_versions: ['cal-a'],
      input_files: { [HOSTILE.file]: 'e'.repeat(64) }, command_line: ['xsred', 'reduce', HOSTILE.file],
    },
    html: true,
    ...o,
  };
}
