/*
 * Chamber runs, their measured spectra and the comparison of a spectrum with its design, as the API
 * and the client exchange them.
 */
import type { MeasuredMaskResult } from './measured.js';
import type { LimitBand } from './optics/mask.js';

/** The durability tests a run records; `other` for any further procedure. */
export const DURABILITY_TESTS = ['adhesion', 'abrasion', 'humidity', 'other'] as const;
export type DurabilityTest = (typeof DURABILITY_TESTS)[number];

/** What the monitor showed for one deposition step. */
export interface LayerReading {
  /** Deposition step (1 = next to the substrate), as on the run sheet. */
  step: number;
  /** What the monitor or crystal showed at the end of the layer, nm. */
  monitorThicknessNm?: number;
  rateNmPerS?: number;
  notes?: string;
}

export const DURABILITY_OUTCOMES = ['pass', 'fail'] as const;
export type DurabilityOutcome = (typeof DURABILITY_OUTCOMES)[number];

/** One durability test of the run's witness or part, with the procedure followed. */
export interface DurabilityResult {
  test: DurabilityTest;
  /** The procedure followed, e.g. "ISO 9211-4, tape adhesion". */
  method: string;
  result: DurabilityOutcome;
  notes?: string;
}

/** A remark on a run by anyone who reads it (the run record itself stays its operator's). */
export interface RunRemark {
  /** ISO time. */
  at: string;
  by: { id: number; displayName: string };
  text: string;
}

/** Longest remark, characters. */
export const RUN_REMARK_MAX_LENGTH = 2000;

/** Largest measured-spectrum file the API takes, bytes (the client checks it before sending). */
export const MAX_SPECTRUM_CSV_BYTES = 2_000_000;

/** Which quantity of a measured-spectrum file to read when it holds both R and T. */
export const SPECTRUM_QUANTITIES = ['R', 'T'] as const;
export type SpectrumQuantity = (typeof SPECTRUM_QUANTITIES)[number];

/** What a measured spectrum was taken on. */
export const SPECTRUM_SAMPLES = ['witness', 'part'] as const;
export type SpectrumSample = (typeof SPECTRUM_SAMPLES)[number];

/** A chamber run of a released recipe. */
export interface RunView {
  id: number;
  designId: number;
  versionNumber: number;
  chamberId: number;
  lotNumber: string;
  /** YYYY-MM-DD. */
  runDate: string;
  operator: { id: number; displayName: string };
  layerReadings: LayerReading[];
  durability: DurabilityResult[];
  notes: string;
  /** Remarks by others, oldest first; only ever appended. */
  remarks: RunRemark[];
  /** Row version: a change is saved only while the run is still at the version it was based on. */
  version: number;
  createdAt: string;
  updatedAt: string;
}

/** A measured spectrum of a run (the file itself is downloaded separately). */
export interface RunSpectrumView {
  id: number;
  runId: number;
  quantity: SpectrumQuantity;
  angleDeg: number;
  sample: SpectrumSample;
  filename: string;
  wavelengthsNm: number[];
  valuesPercent: number[];
  /** Display name of who uploaded it. */
  uploadedBy: string;
  uploadedAt: string;
}

/** A run with its measured spectra. */
export type RunDetailView = RunView & { spectra: RunSpectrumView[] };

/** Measured vs the released design (same angle, unpolarised) vs the design's spec mask. */
export interface SpectrumComparisonView {
  spectrumId: number;
  quantity: 'R' | 'T';
  angleDeg: number;
  measured: { wavelengthsNm: number[]; valuesPercent: number[] };
  /** The released design at the same angle, unpolarised, with the thick substrate as the design treats it. */
  design: { wavelengthsNm: number[]; valuesPercent: number[] };
  /**
   * Null when the design has no spec mask; `limits` are the mask's own bands, so a client can draw
   * them (operators cannot read spec masks), `bands` their results.
   */
  mask: (MeasuredMaskResult & { name: string; revision: string; limits: LimitBand[] }) | null;
}
