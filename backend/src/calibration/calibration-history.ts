/*
 * The calibration history of a chamber, computed from its diagnosed runs: pure functions of the
 * runs, their Run diagnoses and the decisions made, so the service and the tests share them.
 */
import {
  IDENTIFIABLE_MAX_FACTOR_SIGMA,
  MIN_RUN_SIGMA,
  calibrationCause,
  suggestedToolingFactor,
  trackCalibration,
  weightedMean,
  type CalibrationCause,
  type CalibrationFinding,
  type CalibrationLayerPoint,
  type CalibrationRunPoint,
  type CalibrationSeriesView,
  type CalibrationSuggestionView,
  type Measured,
} from '@quietglass/shared/calibration';
import type { DiagnosisSummary } from '@quietglass/shared/calculations';
import {
  keptToolingFactor,
  type ChamberMaterialSetting,
  type ToolingFactorsKept,
} from '@quietglass/shared/chambers';
import type { LayerReading } from '@quietglass/shared/runs';
import { elementAt } from '@quietglass/shared/checked';

/** A run with its diagnosis, as the history reads it. */
export interface DiagnosedRun {
  run: {
    id: number;
    lotNumber: string;
    runDate: string;
    createdAt: Date;
    layerReadings: LayerReading[];
    /** Material id → the chamber's tooling factor when the run was logged (null on older runs). */
    toolingFactors?: ToolingFactorsKept | null;
  };
  calculationId: number;
  summary: DiagnosisSummary;
}

/** What the history needs of a decision already made. */
export interface PastDecision {
  kind: 'material' | 'common';
  materialIds: number[];
  decision: 'accepted' | 'rejected';
  previousToolingFactor: number | null;
  decidedAt: Date;
}

/** The cause of each run, over all its materials: the same factor everywhere, or one material. */
export function runCauses(
  diagnosed: DiagnosedRun[],
  thresholdPercent: number,
): Map<number, CalibrationCause> {
  return new Map(
    diagnosed.map((d) => {
      const perMaterial: Measured[] = [];
      for (const id of new Set(d.summary.layers.map((l) => l.materialId))) {
        const f = identified(d.summary.layers.filter((l) => l.materialId === id)).map((l) => ({
          value: l.factor,
          sigma: Math.max(l.factorSigma!, MIN_RUN_SIGMA),
        }));
        if (f.length > 0) perMaterial.push(weightedMean(f));
      }
      return [d.run.id, calibrationCause(perMaterial, thresholdPercent)];
    }),
  );
}

/** The causes of the last `count` runs of a series. */
export function recentCauses(runs: readonly CalibrationRunPoint[], count: number): CalibrationCause[] {
  return runs.slice(-count).map((r) => r.cause);
}

/** The history and estimate of one material of a chamber (runs oldest first). */
export function materialSeries(
  setting: ChamberMaterialSetting,
  materialName: string,
  diagnosed: DiagnosedRun[],
  decided: PastDecision[],
  causes: Map<number, CalibrationCause>,
): CalibrationSeriesView {
  const current = setting.toolingFactor;
  const points: CalibrationRunPoint[] = [];
  for (const d of diagnosed) {
    const own = d.summary.layers.filter((l) => l.materialId === setting.materialId);
    if (own.length === 0) continue;
    // The factor kept with the run (also right after a manual edit of the chamber); for runs
    // logged before it was kept, the one the calibration decisions imply.
    const inEffect =
      keptToolingFactor(d.run.toolingFactors, setting.materialId) ??
      toolingFactorAt(decided, setting.materialId, d.run.createdAt) ??
      current;
    const count = d.summary.layers.length;
    const layers: CalibrationLayerPoint[] = own
      .map((l) => {
        const step = count - l.layer + 1;
        const reading = d.run.layerReadings.find((r) => r.step === step);
        const monitor = reading?.monitorThicknessNm ?? null;
        const ok = isIdentified(l);
        return {
          layer: l.layer,
          step,
          designNm: l.designNm,
          fittedNm: l.fittedNm,
          factor: l.factor,
          factorSigma: l.factorSigma ?? null,
          fitFactorSigma: l.fitFactorSigma ?? l.factorSigma ?? null,
          correlatedWith: l.correlatedWith ?? null,
          identified: ok,
          monitorThicknessNm: monitor,
          rateNmPerS: reading?.rateNmPerS ?? null,
          // On the part ÷ on the monitor where the operator entered the monitor reading; else the
          // run followed the sheet, so the actual factor is the one in effect × fitted ÷ design.
          impliedToolingFactor: ok ? (monitor ? l.fittedNm / monitor : inEffect * l.factor) : null,
        };
      })
      .sort((a, b) => a.step - b.step);
    const used = layers.filter((l) => l.identified);
    const correction =
      used.length === 0
        ? null
        : weightedMean(
            used.map((l) => {
              const perFactor = l.monitorThicknessNm ? l.designNm / l.monitorThicknessNm : inEffect;
              return {
                value: l.impliedToolingFactor! / current,
                sigma: Math.max((l.factorSigma! * perFactor) / current, MIN_RUN_SIGMA),
              };
            }),
          );
    const rates = layers.filter((l) => l.rateNmPerS !== null).map((l) => l.rateNmPerS! / setting.rateNmPerS);
    points.push({
      runId: d.run.id,
      lotNumber: d.run.lotNumber,
      runDate: d.run.runDate,
      calculationId: d.calculationId,
      toolingFactorInEffect: inEffect,
      layers,
      correction,
      rateRatio: rates.length ? rates.reduce((a, b) => a + b, 0) / rates.length : null,
      cause: causes.get(d.run.id) ?? 'none',
      tracked: null,
    });
  }
  const withValue = points.filter((p) => p.correction !== null);
  const tracked = trackCalibration(withValue.map((p) => p.correction!));
  withValue.forEach((p, i) => (p.tracked = elementAt(tracked, i, 'the tracked corrections')));
  const last = tracked[tracked.length - 1];
  const withRate = points.filter((p) => p.rateRatio !== null);
  const rateTracked = trackCalibration(withRate.map((p) => ({ value: p.rateRatio!, sigma: 0 })));
  const lastRate = rateTracked[rateTracked.length - 1];
  return {
    materialId: setting.materialId,
    materialName,
    currentToolingFactor: current,
    runs: points,
    estimate: last
      ? {
          correction: { value: last.estimate, sigma: last.estimateSigma },
          driftPercentPerRun: { value: last.driftPerRun * 100, sigma: last.driftSigma * 100 },
          suggestedToolingFactor: suggestedToolingFactor(current, last.estimate),
          runs: tracked.length,
        }
      : null,
    rate: lastRate
      ? {
          ratio: { value: lastRate.estimate, sigma: lastRate.estimateSigma },
          driftPercentPerRun: { value: lastRate.driftPerRun * 100, sigma: lastRate.driftSigma * 100 },
          runs: rateTracked.length,
        }
      : null,
  };
}

type DiagnosedLayer = DiagnosisSummary['layers'][number];

function isIdentified(l: DiagnosedLayer): boolean {
  return (
    l.identified === true &&
    typeof l.factorSigma === 'number' &&
    l.factorSigma > 0 &&
    l.factorSigma <= IDENTIFIABLE_MAX_FACTOR_SIGMA
  );
}

function identified(layers: DiagnosedLayer[]): DiagnosedLayer[] {
  return layers.filter(isIdentified);
}

/**
 * The tooling factor a material had at `at`: the factor before the first accepted calibration of
 * that material made after `at`, or null when none was made since (the chamber's current one).
 */
function toolingFactorAt(decided: PastDecision[], materialId: number, at: Date): number | null {
  const later = decided.find(
    (d) =>
      d.decision === 'accepted' &&
      d.kind === 'material' &&
      d.materialIds[0] === materialId &&
      d.decidedAt.getTime() > at.getTime(),
  );
  return later?.previousToolingFactor ?? null;
}

function percent(m: Measured): string {
  return `${((m.value - 1) * 100).toFixed(2)} % ± ${(m.sigma * 100).toFixed(2)} %`;
}

export function suggestion(
  f: CalibrationFinding,
  series: CalibrationSeriesView[],
  diagnosed: DiagnosedRun[],
): CalibrationSuggestionView {
  const lastRunId = diagnosed.at(-1)?.run.id;
  if (lastRunId === undefined) throw new Error('a calibration suggestion needs at least one diagnosed run');
  if (f.kind === 'common') {
    const names = series.filter((s) => f.materialIds.includes(s.materialId)).map((s) => s.materialName);
    return {
      key: `common|${f.materialIds.join(',')}|run${lastRunId}|c${f.correction.value.toFixed(4)}`,
      kind: 'common',
      materialIds: f.materialIds,
      correction: f.correction,
      currentToolingFactor: null,
      proposedToolingFactor: null,
      lastRunId,
      message: `${names.join(', ')} are all off by the same ${percent(f.correction)}: look for a monitor or geometry cause (crystal, monitor chip, fixture, source position) before changing per-material tooling factors`,
    };
  }
  const s = series.find((x) => x.materialId === f.materialId)!;
  const proposed = suggestedToolingFactor(s.currentToolingFactor, f.correction.value);
  return {
    key: `material|${f.materialId}|run${lastRunId}|tf${s.currentToolingFactor}->${proposed}`,
    kind: 'material',
    materialIds: [f.materialId],
    correction: f.correction,
    currentToolingFactor: s.currentToolingFactor,
    proposedToolingFactor: proposed,
    lastRunId,
    message: `${s.materialName} layers come out ${f.correction.value > 1 ? 'thick' : 'thin'} by ${percent(f.correction)} over ${s.estimate?.runs ?? 0} runs: tooling factor ${s.currentToolingFactor} → ${proposed}`,
  };
}
