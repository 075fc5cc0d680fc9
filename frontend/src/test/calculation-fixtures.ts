import type { AnalysisCalculationView } from '../features/calculations/api/get-calculation';

/** An analysis request of the invented test design (design 12, version 1). */
export const TEST_ANALYSIS_REQUEST = {
  fromNm: 400,
  toNm: 800,
  wavelengthCount: 401,
  angleFromDeg: 0,
  angleToDeg: 60,
  angleCount: 13,
};

/** A calculation of the compute queue for tests, queued unless told otherwise. */
export function testCalculation(overrides: Partial<AnalysisCalculationView> = {}): AnalysisCalculationView {
  return {
    id: 7,
    kind: 'analysis',
    status: 'queued',
    progress: 0,
    error: null,
    designId: 12,
    versionNumber: 1,
    request: TEST_ANALYSIS_REQUEST,
    summary: null,
    live: null,
    runId: null,
    createdBy: 'Tomas Reyne',
    createdAt: '2026-12-01T09:00:00.000Z',
    startedAt: null,
    finishedAt: null,
    computeMs: null,
    processedBy: null,
    attempts: 0,
    ...overrides,
  };
}
