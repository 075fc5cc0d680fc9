import type { Response } from 'express';
import type { CalculationView } from '@quietglass/shared/calculations';
import type { Calculation } from './calculation.entity.js';

/** A calculation as the API shows it (also to the run routes of the runs folder). */
export function toCalculationView(c: Calculation): CalculationView {
  return {
    id: c.id,
    kind: c.kind,
    status: c.status,
    progress: c.progress,
    error: c.error,
    designId: c.designId,
    versionNumber: c.versionNumber,
    request:
      'request' in c.input
        ? c.input.request
        : 'options' in c.input
          ? c.input.options
          : { factorRange: c.input.factorRange },
    summary: c.summary,
    live: c.live,
    runId: c.runId,
    createdBy: c.createdBy.displayName,
    createdAt: c.createdAt.toISOString(),
    startedAt: c.startedAt?.toISOString() ?? null,
    finishedAt: c.finishedAt?.toISOString() ?? null,
    computeMs: c.computeMs,
    processedBy: c.processedBy,
    attempts: c.attempts,
  };
}

/**
 * The answer to a submitted job: 201 with the new queued calculation, or 200 with the identical
 * one already queued or done (`reused`).
 */
export function queuedReply(
  res: Response,
  r: { calculation: Calculation; reused: boolean },
): CalculationView & { reused: boolean } {
  res.status(r.reused ? 200 : 201);
  return { ...toCalculationView(r.calculation), reused: r.reused };
}
