/**
 * The rows the stages hand to the report: plain data, one interface per output table.
 * They live in the core so the report can read what normalize and extract produce without
 * importing another stage.
 */

/** One reference run × detector: the effective solid angle it implies, with its uncertainty parts. */
export interface ReferencePoint {
  run: string;
  detector: string;
  startedAtMs: number;
  beamEnergyKeV: number;
  /** Cross-section-weighted reaction energy of the reference isotopes (= beam energy for a thin target), keV. */
  reactionEnergyKeV: number;
  chargeUC: number;
  netCounts: number;
  netCountsUnc: number;
  liveFraction: number;
  liveFractionUnc: number;
  /** Σ_i n_i σ_i / n: the element's isotope-averaged screened Rutherford cross section, mb/sr. */
  rutherfordMbPerSr: number;
  screeningFactor: number;
  /** Effective solid angle, msr (null when the peak could not be measured). */
  solidAngleMsr: number | null;
  /** Relative standard uncertainties that belong to this run alone. */
  relCounting: number;
  relLive: number;
  relEnergy: number;
  /** ∂ln σ_ref/∂θ, 1/deg (signed; the angle error is shared by every run of this detector). */
  dLnSigmaDThetaPerDeg: number;
  /** Relative uncertainty of the reference layer's areal density (shared by every reference run). */
  relAreal: number;
  flags: string[];
}

/** The normalization a sample run × detector uses, with its uncertainty parts (relative). */
export interface AppliedNormalization {
  solidAngleMsr: number;
  referenceRuns: string[];
  weights: number[];
  /** Reference counting, live time and beam energy: independent per reference run, combined with the weights. */
  relCounting: number;
  relLive: number;
  relEnergy: number;
  /** Reference areal density: one film, fully correlated between reference runs. */
  relAreal: number;
  /** Weighted ∂ln σ_ref/∂θ, 1/deg (signed): the detector angle error, shared. */
  dLnSigmaDThetaPerDeg: number;
  flags: string[];
}

export interface DetectorNormalization {
  detector: string;
  nominalMsr: number;
  /** Weighted mean over usable reference runs (run-independent parts as weights), msr. */
  meanMsr: number | null;
  chi2: number;
  ndf: number;
}


/** One sample run × detector × peak (cross_sections.arrow). NaN marks a value that could not be computed. */
export interface CrossSectionRow {
  run: string;
  detector: string;
  peak: string;
  target: string;
  targetNuclide: string;
  beamEnergyKeV: number;
  beamEnergyUncKeV: number;
  /** Energy at which the cross section is quoted: the beam energy, or mid-depth of the layer with energy loss, keV. */
  reactionEnergyKeV: number;
  /** Standard deviation of the reaction energy over the layer (depth and beam straggling), keV. */
  reactionEnergySpreadKeV: number;
  /** The particle the detector sees (nuclide name). */
  detectedNuclide: string;
  angleLabDeg: number;
  angleLabUncDeg: number;
  angleCmDeg: number;
  /** Lab energy of the detected particle where it is made, keV. */
  peakEnergyKeV: number;
  /** Expected energy deposited in the detector (after exit path, foils, dead layer): the peak position, keV. */
  detectedEnergyKeV: number;
  qValueKeV: number;
  grossCounts: number;
  backgroundCounts: number;
  netCounts: number;
  netCountsUnc: number;
  liveFraction: number;
  liveFractionUnc: number;
  chargeUC: number;
  /** Atoms of the target nuclide per cm², in 1e15/cm². */
  nuclideArealDensity1e15PerCm2: number;
  solidAngleMsr: number;
  /** Relative uncertainty of the normalization from reference counting and live time (part of sys). */
  normalizationCountingRelUnc: number;
  referenceRuns: string;
  crossSectionLabMbPerSr: number;
  crossSectionLabStatMbPerSr: number;
  crossSectionLabSysMbPerSr: number;
  jacobianLabPerCm: number;
  crossSectionCmMbPerSr: number;
  crossSectionCmStatMbPerSr: number;
  crossSectionCmSysMbPerSr: number;
  rutherfordLabMbPerSr: number;
  screeningFactor: number;
  /** lecuyer | andersen | none, where a Rutherford cross section was computed; '' otherwise. */
  screeningModel: string;
  /** σ/σ_R (elastic peaks only; NaN otherwise). */
  ratioToRutherford: number;
  ratioToRutherfordStat: number;
  ratioToRutherfordSys: number;
  calibrationVersion: string;
  flags: string[];
}

/** One measured peak window (yields.arrow): reference peaks and sample peaks alike. */
export interface YieldRow {
  run: string;
  kind: string;
  detector: string;
  peak: string;
  expectedEnergyKeV: number;
  expectedChannel: number;
  /** Standard uncertainty of the energy at the expected channel from the calibration covariance, keV. */
  calibrationEnergyUncKeV: number;
  fwhmKeV: number;
  peakLo: number;
  peakHi: number;
  leftLo: number;
  leftHi: number;
  rightLo: number;
  rightHi: number;
  grossCounts: number;
  backgroundCounts: number;
  backgroundUnc: number;
  netCounts: number;
  netCountsUnc: number;
  centroidShiftKeV: number;
  flags: string[];
}

/** One run × detector (qc.arrow): what happened to it, and the figures an auditor checks. */
export interface QcRow {
  run: string;
  kind: string;
  detector: string;
  status: 'reduced' | 'set-aside' | 'not-reduced';
  reason: string;
  rule: string;
  calibrationVersion: string;
  liveFraction: number;
  liveFractionUnc: number;
  liveSource: string;
  totalCounts: number;
  channelCount: number;
  /** Centroid shift of the strongest measured peak from its expected energy, keV. */
  peakShiftKeV: number;
  flags: string[];
}
