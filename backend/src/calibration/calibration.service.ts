import { ConflictException, Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import {
  DEFAULT_CALIBRATION_SETTINGS,
  calibrationFindings,
  type CalibrationSettings,
  type ChamberCalibrationView,
  type RunSheetCalibration,
} from '@quietglass/shared/calibration';
import type { DiagnosisSummary } from '@quietglass/shared/calculations';
import { AuditService } from '../audit/audit.service.js';
import { CalculationsService } from '../calculations/calculations.service.js';
import type { Chamber } from '../chambers/chamber.entity.js';
import { ChambersService } from '../chambers/chambers.service.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import { MaterialsService } from '../materials/materials.service.js';
import { RunsService } from '../runs/runs.service.js';
import type { User } from '../users/user.entity.js';
import { materialSeries, runCauses, suggestion, type DiagnosedRun } from './calibration-history.js';
import { CalibrationDecision, CalibrationSettingsRecord, toDecisionView } from './calibration.entity.js';
import type {
  CalibrationDecisionInput,
  CalibrationSettingsInput,
} from '@quietglass/shared/schemas/calibration';

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
  async updateSettings(dto: CalibrationSettingsInput, user: User): Promise<CalibrationSettingsRecord> {
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
    const causes = runCauses(diagnosed, settings.thresholdPercent);
    const series = chamber.materials.map((m) =>
      materialSeries(m, names.get(m.materialId) ?? `material ${m.materialId}`, diagnosed, decided, causes),
    );
    const findings = calibrationFindings(
      series.flatMap((s) =>
        s.estimate
          ? [{ materialId: s.materialId, runs: s.estimate.runs, correction: s.estimate.correction }]
          : [],
      ),
      settings,
      diagnosed.slice(-settings.minRuns).map((d) => causes.get(d.run.id) ?? 'none'),
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

  /**
   * Accepts or rejects the suggestion `dto.key` exactly as shown: it must still be the current
   * suggestion (no new run, no changed tooling factor since), else 409. An accepted material
   * suggestion sets the chamber's tooling factor in the same transaction; every decision is audited
   * with its comment. Run sheets made afterwards use the new factor; printed ones keep theirs.
   */
  async decide(chamberId: number, dto: CalibrationDecisionInput, user: User) {
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
    if (materialId === undefined) throw new Error(`calibration suggestion ${s.key} names no material`);
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
