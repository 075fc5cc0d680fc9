/*
 * Compliance reports as the API and the client exchange them. The PDF itself is fetched on its own.
 */

/** One limit band of a compliance report's summary: the worst point against its rule. */
export interface ReportBandRow {
  band: number;
  label: string;
  rule: string;
  angles: string;
  polarisation: string;
  evaluated: boolean;
  pass: boolean | null;
  /** Percentage points inside (+) or outside (−) the limit at the worst point. */
  worstMargin: number | null;
  worstAtNm: number | null;
  /** Angle of incidence of the worst point, degrees (absent in reports made before it was kept). */
  worstAtDeg?: number | null;
  valuePercent: number | null;
  /** Why a band was not evaluated (measured spectra cover one angle and quantity). */
  reason?: string;
}

/** The verdict of a compliance report, stored with it. */
export interface ReportSummary {
  source: 'designed' | 'measured';
  pass: boolean | null;
  worstMargin: number | null;
  bands: ReportBandRow[];
  colour: { L: number; a: number; b: number; Rv: number } | null;
}

/** A spec-compliance report as the API returns it. */
export interface ReportView {
  id: number;
  designId: number;
  versionNumber: number;
  specMaskId: number;
  hideLayers: boolean;
  runId: number | null;
  spectrumId: number | null;
  summary: ReportSummary;
  /** Display name of who made it. */
  createdBy: string;
  createdAt: string;
}
