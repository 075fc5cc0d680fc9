import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository, type EntityManager } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import type { User } from '../users/user.entity.js';
import { MaterialsService } from '../materials/materials.service.js';
import type { ProcessSetting, ProcessSettingsView } from '@quietglass/shared/chambers';
import { Chamber } from './chamber.entity.js';
import type { ChamberInput, ChamberUpdate } from '@quietglass/shared/schemas/chambers';
import type { ProcessSettingsInput } from '@quietglass/shared/schemas/process-settings';
import { ChamberProcessSettings } from './process-settings.entity.js';

@Injectable()
export class ChambersService {
  constructor(
    @InjectRepository(Chamber) private readonly chambers: Repository<Chamber>,
    @InjectRepository(ChamberProcessSettings)
    private readonly processSettings: Repository<ChamberProcessSettings>,
    private readonly materials: MaterialsService,
    private readonly audit: AuditService,
  ) {}

  list(): Promise<Chamber[]> {
    return this.chambers.find({ order: { name: 'ASC' } });
  }

  async get(id: number): Promise<Chamber> {
    const chamber = await this.chambers.findOneBy({ id });
    if (!chamber) throw new NotFoundException(`Chamber ${id} does not exist`);
    return chamber;
  }

  async create(dto: ChamberInput, user: User): Promise<Chamber> {
    await this.check(dto);
    return this.unique(dto.name, () =>
      this.chambers.manager.transaction(async (tx) => {
        const saved = await tx.getRepository(Chamber).save(tx.getRepository(Chamber).create(fields(dto)));
        await this.audit.record(tx, {
          actor: user,
          entity: 'chamber',
          entityId: saved.id,
          action: 'created',
          summary: `chamber "${saved.name}" created`,
          details: { ...fields(dto) },
        });
        return saved;
      }),
    );
  }

  /** Tooling factors and rates change run sheets: one locked UPDATE, with before and after on the record. */
  async update(id: number, dto: ChamberUpdate, user: User): Promise<Chamber> {
    const before = await this.get(id);
    await this.check(dto);
    await this.unique(dto.name, () =>
      this.chambers.manager.transaction(async (tx) => {
        await updateIfVersion(
          tx,
          Chamber,
          { id, expectedVersion: dto.version, set: fields(dto) },
          async () => {
            const now = await this.get(id);
            return new ConflictException(
              `Chamber "${now.name}" was changed by someone else (now version ${now.version}); reload it and apply your edit again`,
            );
          },
        );
        await this.audit.record(tx, {
          actor: user,
          entity: 'chamber',
          entityId: id,
          action: 'edited',
          summary: `chamber "${dto.name}" edited (version ${dto.version} → ${dto.version + 1})`,
          details: {
            before: { ...fields(before) },
            after: { ...fields(dto) },
          },
        });
      }),
    );
    return this.get(id);
  }

  /**
   * Sets one material's tooling factor inside the caller's transaction (an accepted calibration),
   * only while the chamber is still at `expectedVersion`; the audit entry has before and after.
   */
  async applyToolingFactor(
    tx: EntityManager,
    change: {
      id: number;
      expectedVersion: number;
      materialId: number;
      toolingFactor: number;
      reason: string;
    },
    user: User,
  ): Promise<void> {
    const before = await this.get(change.id);
    const materials = before.materials.map((m) =>
      m.materialId === change.materialId ? { ...m, toolingFactor: change.toolingFactor } : m,
    );
    const old = before.materials.find((m) => m.materialId === change.materialId);
    if (!old)
      throw new BadRequestException(
        `Chamber "${before.name}" has no setting for material ${change.materialId}`,
      );
    await updateIfVersion(
      tx,
      Chamber,
      { id: change.id, expectedVersion: change.expectedVersion, set: { materials } },
      () =>
        new ConflictException(
          `Chamber "${before.name}" was changed by someone else (now version ${before.version}); reload it`,
        ),
    );
    await this.audit.record(tx, {
      actor: user,
      entity: 'chamber',
      entityId: change.id,
      action: 'edited',
      summary: `chamber "${before.name}" tooling factor of material ${change.materialId}: ${old.toolingFactor} → ${change.toolingFactor} (${change.reason})`,
      details: { before: { materials: before.materials }, after: { materials } },
    });
  }

  /** A chamber's process settings per material; an empty set at version 0 before the first save. */
  async getProcessSettings(chamberId: number): Promise<ProcessSettingsView> {
    await this.get(chamberId);
    const row = await this.processSettings.findOneBy({ chamberId });
    return {
      chamberId,
      settings: row?.settings ?? [],
      version: row?.version ?? 0,
      updatedAt: row?.updatedAt.toISOString() ?? null,
    };
  }

  /**
   * Replaces the whole set in one locked write: only while it is still at the version the editor
   * read, with before and after on the audit trail. Each material must be one of the chamber's (the
   * shared schema has checked the values and refused a material listed twice).
   */
  async saveProcessSettings(
    chamberId: number,
    dto: ProcessSettingsInput,
    user: User,
  ): Promise<ProcessSettingsView> {
    const chamber = await this.get(chamberId);
    const before = await this.getProcessSettings(chamberId);
    const listed = new Set(chamber.materials.map((m) => m.materialId));
    const problems = dto.settings.flatMap((s, i) =>
      listed.has(s.materialId)
        ? []
        : [
            `settings.${i}.materialId: material ${s.materialId} is not in the material list of chamber "${chamber.name}"`,
          ],
    );
    if (problems.length > 0) throw new BadRequestException({ message: problems });
    const settings: ProcessSetting[] = dto.settings;
    await this.chambers.manager.transaction(async (tx) => {
      const json = JSON.stringify(settings);
      const rows =
        dto.version === 0
          ? await tx.query<unknown[]>(
              `INSERT INTO chamber_process_settings (chamber_id, settings, version, updated_at)
               VALUES ($1, $2::jsonb, 1, now()) ON CONFLICT (chamber_id) DO NOTHING RETURNING version`,
              [chamberId, json],
            )
          : (
              await tx.query<[unknown[], number]>(
                `UPDATE chamber_process_settings SET settings = $2::jsonb, version = version + 1, updated_at = now()
               WHERE chamber_id = $1 AND version = $3 RETURNING version`,
                [chamberId, json, dto.version],
              )
            )[0]; // UPDATE … RETURNING comes back as [rows, count] from the pg driver.
      if (rows.length !== 1) {
        const now = await this.getProcessSettings(chamberId);
        throw new ConflictException(
          `The process settings of chamber "${chamber.name}" were changed by someone else (now version ${now.version}); reload them and apply your edit again`,
        );
      }
      await this.audit.record(tx, {
        actor: user,
        entity: 'chamber',
        entityId: chamberId,
        action: 'process settings edited',
        summary: `process settings of chamber "${chamber.name}" edited (version ${dto.version} → ${dto.version + 1})`,
        details: { before: before.settings, after: settings },
      });
    });
    return this.getProcessSettings(chamberId);
  }

  /** Materials must exist (the shared schema has refused a material listed twice). */
  private async check(dto: ChamberInput): Promise<void> {
    const ids = [dto.monitorChipMaterialId, ...dto.materials.map((m) => m.materialId)];
    const found = new Set((await this.materials.findByIds(ids)).map((m) => m.id));
    const problems: string[] = [];
    if (!found.has(dto.monitorChipMaterialId)) {
      problems.push(`monitorChipMaterialId: material ${dto.monitorChipMaterialId} does not exist`);
    }
    dto.materials.forEach((m, i) => {
      if (!found.has(m.materialId))
        problems.push(`materials.${i}.materialId: material ${m.materialId} does not exist`);
    });
    if (problems.length > 0) throw new BadRequestException({ message: problems });
  }

  private async unique<T>(name: string, write: () => Promise<T>): Promise<T> {
    try {
      return await write();
    } catch (err) {
      if (isUniqueViolation(err)) throw new ConflictException(`A chamber named "${name}" already exists`);
      throw err;
    }
  }
}

function fields(dto: ChamberInput): Partial<Chamber> {
  return {
    name: dto.name,
    monitorWavelengthsNm: dto.monitorWavelengthsNm,
    monitorChipMaterialId: dto.monitorChipMaterialId,
    materials: dto.materials.map((m) => ({
      materialId: m.materialId,
      toolingFactor: m.toolingFactor,
      rateNmPerS: m.rateNmPerS,
    })),
    notes: dto.notes,
  };
}
