import { ConflictException, Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import {
  DEFAULT_CALIBRATION_SETTINGS,
  IDENTIFIABLE_MAX_FACTOR_SIGMA,
  MIN_RUN_SIGMA,
  calibrationCause,
  calibrationFindings,
  suggestedToolingFactor,
  trackCalibration,
  weightedMean,
  type CalibrationFinding,
  type CalibrationLayerPoint,
  type CalibrationRunPoint,
  type CalibrationSeriesView,
  type CalibrationSettings,
  type CalibrationSuggestionView,
  type ChamberCalibrationView,
  type Measured,
  type RunSheetCalibration,
} from '@quietglass/shared/calibration';
import type { DiagnosisSummary } from '@quietglass/shared/calculations';
import { AuditService } from '../audit/audit.service.js';
import { CalculationsService } from '../calculations/calculations.service.js';
import type { Chamber } from '../chambers/chamber.entity.js';
import { ChambersService } from '../chambers/chambers.service.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import { MaterialsService } from '../materials/materials.service.js';
import type { ChamberRun } from '../runs/run.entity.js';
import { RunsService } from '../runs/runs.service.js';
import type { User } from '../users/user.entity.js';
import { CalibrationDecision, CalibrationSettingsRecord, toDecisionView } from './calibration.entity.js';
import type { CalibrationDecisionDto, CalibrationSettingsDto } from './dto/calibration.dto.js';

/** A run with its diagnosis, as the history reads it. */
interface DiagnosedRun {
  run: ChamberRun;
  calculationId: number;
  summary: DiagnosisSummary;
}

/**
 * Chamber calibration from the run history: per chamber and material, the tooling factor each
 * diagnosed run actually had, its robust running estimate (shared/calibration), suggestions when
 * it leaves the shop's threshold, and engineers' decisions on them. Run sheets read which
 * calibration their tooling factors come from.
 */
@Injectable()
export class CalibrationService {
  constructor(
    @InjectRepository(CalibrationDecision) private readonly decisions: Repository<CalibrationDecision>,
    @InjectRepository(CalibrationSettingsRecord)
    private readonly settingsRows: Repository<CalibrationSettingsRecord>,
    private readonly chambers: ChambersService,
    private readonly runs: RunsService,
    private readonly calculations: CalculationsService,
    private readonly materials: MaterialsService,
    private readonly audit: AuditService,
  ) {}

  async settingsRecord(): Promise<CalibrationSettingsRecord> {
    const row = await this.settingsRows.findOneBy({ id: 1 });
    if (!row) throw new Error('calibration_settings has no row (migrations not run?)');
    return row;
  }

  async settings(): Promise<CalibrationSettings> {
    const row = await this.settingsRecord();
    return { ...DEFAULT_CALIBRATION_SETTINGS, thresholdPercent: row.thresholdPercent, minRuns: row.minRuns };
  }

  /** The shop's threshold and minimum runs; admin only, audited. */
  async updateSettings(dto: CalibrationSettingsDto, user: User): Promise<CalibrationSettingsRecord> {
    const before = await this.settingsRecord();
    await this.settingsRows.manager.transaction(async (tx) => {
      await updateIfVersion(
        tx,
        CalibrationSettingsRecord,
        {
          id: 1,
          expectedVersion: dto.version,
          set: { thresholdPercent: dto.thresholdPercent, minRuns: dto.minRuns },
        },
        () => new ConflictException('The calibration settings were changed by someone else; reload them'),
      );
      await this.audit.record(tx, {
        actor: user,
        entity: 'calibration-settings',
        entityId: 1,
        action: 'edited',
        summary: `calibration threshold ${before.thresholdPercent} % → ${dto.thresholdPercent} %, minimum runs ${before.minRuns} → ${dto.minRuns}`,
        details: {
          before: { thresholdPercent: before.thresholdPercent, minRuns: before.minRuns },
          after: { thresholdPercent: dto.thresholdPercent, minRuns: dto.minRuns },
        },
      });
    });
    return this.settingsRecord();
  }

  /** History, estimates, pending suggestions and past decisions of a chamber. */
  async calibration(chamberId: number): Promise<ChamberCalibrationView> {
    return (await this.compute(chamberId)).view;
  }

  private async compute(chamberId: number): Promise<{ view: ChamberCalibrationView; chamber: Chamber }> {
    const chamber = await this.chambers.get(chamberId);
    const settings = await this.settings();
    const decided = await this.decisions.find({
      where: { chamberId },
      order: { decidedAt: 'ASC', id: 'ASC' },
    });
    const runs = await this.runs.listForChamber(chamberId);
    const diagnoses = await this.calculations.latestDiagnoses(runs.map((r) => r.id));
    const diagnosed: DiagnosedRun[] = [];
    for (const run of runs) {
      const calc = diagnoses.get(run.id);
      const summary = calc?.summary as DiagnosisSummary | null | undefined;
      if (calc && summary && Array.isArray(summary.layers))
        diagnosed.push({ run, calculationId: calc.id, summary });
    }
    const names = new Map(
      (await this.materials.findByIds(chamber.materials.map((m) => m.materialId))).map((m) => [m.id, m.name]),
    );
    // The cause of each run, over all its materials: the same factor everywhere, or one material.
    const causes = new Map(
      diagnosed.map((d) => {
        const perMaterial: Measured[] = [];
        for (const id of new Set(d.summary.layers.map((l) => l.materialId))) {
          const f = identified(d.summary.layers.filter((l) => l.materialId === id)).map((l) => ({
            value: l.factor,
            sigma: Math.max(l.factorSigma!, MIN_RUN_SIGMA),
          }));
          if (f.length > 0) perMaterial.push(weightedMean(f));
        }
        return [d.run.id, calibrationCause(perMaterial, settings.thresholdPercent)];
      }),
    );
    const series = chamber.materials.map((m) =>
      this.series(m, names.get(m.materialId) ?? `material ${m.materialId}`, diagnosed, decided, causes),
    );
    const findings = calibrationFindings(
      series.flatMap((s) =>
        s.estimate
          ? [{ materialId: s.materialId, runs: s.estimate.runs, correction: s.estimate.correction }]
          : [],
      ),
      settings,
    );
    const decidedKeys = new Set(decided.map((d) => d.suggestionKey));
    const suggestions = findings
      .map((f) => suggestion(f, series, diagnosed))
      .filter((s) => !decidedKeys.has(s.key));
    return {
      chamber,
      view: {
        chamberId,
        settings,
        series,
        suggestions,
        decisions: decided.map(toDecisionView).reverse(),
      },
    };
  }

  private series(
    setting: Chamber['materials'][number],
    materialName: string,
    diagnosed: DiagnosedRun[],
    decided: CalibrationDecision[],
    causes: Map<number, CalibrationRunPoint['cause']>,
  ): CalibrationSeriesView {
    const current = setting.toolingFactor;
    const points: CalibrationRunPoint[] = [];
    for (const d of diagnosed) {
      const own = d.summary.layers.filter((l) => l.materialId === setting.materialId);
      if (own.length === 0) continue;
      const inEffect = toolingFactorAt(decided, setting.materialId, d.run.createdAt) ?? current;
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
      const rates = layers
        .filter((l) => l.rateNmPerS !== null)
        .map((l) => l.rateNmPerS! / setting.rateNmPerS);
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
    withValue.forEach((p, i) => (p.tracked = tracked[i]));
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

  /**
   * Accepts or rejects the suggestion `dto.key` exactly as shown: it must still be the current
   * suggestion (no new run, no changed tooling factor since), else 409. An accepted material
   * suggestion sets the chamber's tooling factor in the same transaction; every decision is audited
   * with its comment. Run sheets made afterwards use the new factor; printed ones keep theirs.
   */
  async decide(chamberId: number, dto: CalibrationDecisionDto, user: User) {
    const { view, chamber } = await this.compute(chamberId);
    const s = view.suggestions.find((x) => x.key === dto.key);
    if (!s) {
      const done = await this.decisions.findOneBy({ chamberId, suggestionKey: dto.key });
      throw new ConflictException(
        done
          ? `This suggestion was already ${done.decision} by ${done.decidedBy.displayName}`
          : 'This suggestion is no longer current (a new run or a changed tooling factor); reload the calibration',
      );
    }
    const materialId = s.kind === 'material' ? s.materialIds[0] : null;
    const id = await this.decisions.manager.transaction(async (tx) => {
      if (dto.decision === 'accepted' && materialId !== null) {
        await this.chambers.applyToolingFactor(
          tx,
          {
            id: chamberId,
            expectedVersion: chamber.version,
            materialId,
            toolingFactor: s.proposedToolingFactor!,
            reason: `calibration accepted: ${dto.comment}`,
          },
          user,
        );
      }
      const repo = tx.getRepository(CalibrationDecision);
      const saved = await repo.save(
        repo.create({
          chamberId,
          suggestionKey: s.key,
          kind: s.kind,
          materialIds: s.materialIds,
          decision: dto.decision,
          previousToolingFactor: s.currentToolingFactor,
          newToolingFactor: dto.decision === 'accepted' ? s.proposedToolingFactor : null,
          correction: s.correction.value,
          correctionSigma: s.correction.sigma,
          lastRunId: s.lastRunId,
          comment: dto.comment,
          decidedBy: user,
        }),
      );
      await this.audit.record(tx, {
        actor: user,
        entity: 'chamber-calibration',
        entityId: saved.id,
        action: dto.decision,
        summary: `chamber "${chamber.name}" calibration suggestion ${dto.decision}: ${s.message} — ${dto.comment}`,
        details: { chamberId, key: s.key, suggestion: { ...s }, comment: dto.comment },
      });
      return saved.id;
    });
    return toDecisionView(await this.decisions.findOneByOrFail({ id }));
  }

  /**
   * Which calibration each tooling factor of a run sheet comes from: the latest accepted decision
   * that set the factor the chamber has now, or none (the chamber's own setting).
   */
  async forRunSheet(
    chamber: Chamber,
    materialNames: ReadonlyMap<number, string>,
  ): Promise<RunSheetCalibration> {
    const accepted = await this.decisions.find({
      where: { chamberId: chamber.id, decision: 'accepted', kind: 'material' },
      order: { decidedAt: 'DESC', id: 'DESC' },
    });
    return {
      chamberVersion: chamber.version,
      materials: chamber.materials
        .filter((m) => materialNames.has(m.materialId))
        .map((m) => {
          const d = accepted.find((a) => a.materialIds[0] === m.materialId);
          const applies = d && d.newToolingFactor === m.toolingFactor;
          return {
            material: materialNames.get(m.materialId)!,
            toolingFactor: m.toolingFactor,
            decision: applies
              ? { id: d.id, decidedAt: d.decidedAt.toISOString(), decidedBy: d.decidedBy.displayName }
              : null,
          };
        }),
    };
  }
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
function toolingFactorAt(decided: CalibrationDecision[], materialId: number, at: Date): number | null {
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

function suggestion(
  f: CalibrationFinding,
  series: CalibrationSeriesView[],
  diagnosed: DiagnosedRun[],
): CalibrationSuggestionView {
  const lastRunId = diagnosed[diagnosed.length - 1].run.id;
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
