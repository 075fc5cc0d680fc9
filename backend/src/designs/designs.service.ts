import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Repository, type EntityManager } from 'typeorm';
import type {
  DesignSummaryView,
  DesignVersionContent,
  DesignVersionView,
  DesignView,
  NamedModel,
} from '@quietglass/shared/designs';
import { AuditService } from '../audit/audit.service.js';
import { missingAsBadRequest } from '../common/not-found.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import { CustomersService } from '../customers/customers.service.js';
import { MaterialsService } from '../materials/materials.service.js';
import { SpecMasksService } from '../spec-masks/spec-masks.service.js';
import type { User } from '../users/user.entity.js';
import { Design } from './design.entity.js';
import { DesignVersion } from './design-version.entity.js';
import { VersionEvent } from './version-event.entity.js';
import type {
  CreateDesignInput,
  SaveVersionInput,
  UpdateDesignInput,
  VersionContentInput,
} from '@quietglass/shared/schemas/designs';

@Injectable()
export class DesignsService {
  constructor(
    @InjectRepository(Design) private readonly designs: Repository<Design>,
    @InjectRepository(DesignVersion) private readonly versions: Repository<DesignVersion>,
    @InjectDataSource() private readonly db: DataSource,
    private readonly customers: CustomersService,
    private readonly masks: SpecMasksService,
    private readonly materials: MaterialsService,
    private readonly audit: AuditService,
  ) {}

  /** Every design (or one customer's), newest first, with its latest version. */
  async list(customerId?: number): Promise<DesignSummaryView[]> {
    const designs = await this.designs.find({
      ...(customerId !== undefined ? { where: { customer: { id: customerId } } } : {}),
      order: { updatedAt: 'DESC', id: 'DESC' },
    });
    if (designs.length === 0) return [];
    const latest = await this.versions
      .createQueryBuilder('v')
      .select(['v.designId', 'v.number', 'v.status', 'v.updatedAt'])
      .where('v.design_id IN (:...ids)', { ids: designs.map((d) => d.id) })
      .andWhere('v.number = (SELECT max(w.number) FROM design_versions w WHERE w.design_id = v.design_id)')
      .getMany();
    const byDesign = new Map(latest.map((v) => [v.designId, v]));
    return designs.map((d) => {
      const v = byDesign.get(d.id);
      if (!v) throw new Error(`design ${d.id} has no version`);
      return {
        ...designHeader(d),
        latestVersion: { number: v.number, status: v.status, updatedAt: v.updatedAt.toISOString() },
      };
    });
  }

  async get(id: number): Promise<DesignView> {
    const design = await this.findDesign(id);
    const versions = await this.versions.find({ where: { designId: id }, order: { number: 'ASC' } });
    return {
      ...designHeader(design),
      versions: versions.map((v) => ({
        number: v.number,
        status: v.status,
        updatedAt: v.updatedAt.toISOString(),
        createdBy: v.createdBy.displayName,
      })),
    };
  }

  async getVersion(id: number, number: number): Promise<DesignVersionView> {
    const version = await this.findVersion(id, number);
    return toVersionView(version, await this.editors(version));
  }

  /**
   * Everyone who wrote or saved a version, author first: none of them may approve or release it.
   * Reads through `manager` so a transaction sees its own writes.
   */
  async editors(
    version: DesignVersion,
    manager: EntityManager = this.db.manager,
  ): Promise<{ id: number; displayName: string }[]> {
    const saves = await manager.getRepository(VersionEvent).find({
      where: { designId: version.designId, versionNumber: version.number, kind: 'saved' },
      order: { at: 'ASC', id: 'ASC' },
    });
    const people = new Map<number, string>([[version.createdBy.id, version.createdBy.displayName]]);
    for (const e of saves) if (!people.has(e.actor.id)) people.set(e.actor.id, e.actor.displayName);
    return [...people].map(([id, displayName]) => ({ id, displayName }));
  }

  /** A new design with its first version as a draft. */
  async create(dto: CreateDesignInput, author: User): Promise<DesignView> {
    const customer = await missingAsBadRequest(
      this.customers.get(dto.customerId),
      `customerId: customer ${dto.customerId} does not exist`,
    );
    await this.checkMaterials(dto, this.db.manager, false, new Set());
    await this.checkMask(dto.specMaskId ?? null, customer.id);
    const id = await this.db.transaction(async (tx) => {
      const design = await tx
        .getRepository(Design)
        .save(
          tx
            .getRepository(Design)
            .create({ name: dto.name, customer, specMaskId: dto.specMaskId ?? null, createdBy: author }),
        );
      await tx.getRepository(DesignVersion).save(newDraft(tx, design, 1, dto, author));
      await this.audit.record(tx, {
        actor: author,
        entity: 'design',
        entityId: design.id,
        action: 'created',
        summary: `created "${design.name}" for ${customer.name} with draft version 1`,
        details: { name: design.name, customerId: customer.id, specMaskId: design.specMaskId },
      });
      return design.id;
    });
    return this.get(id);
  }

  /**
   * Renames a design or points it at another spec mask of its customer. The change carries the
   * design's version token; both changes are written to the audit trail, a rename of a design with
   * customer-visible versions saying so.
   */
  async update(id: number, dto: UpdateDesignInput, actor: User): Promise<DesignView> {
    const design = await this.findDesign(id);
    const set: Partial<Design> = {};
    if (dto.name !== undefined && dto.name !== design.name) set.name = dto.name;
    if (dto.specMaskId !== undefined && dto.specMaskId !== design.specMaskId) {
      await this.checkMask(dto.specMaskId, design.customer.id);
      set.specMaskId = dto.specMaskId;
    }
    await this.db.transaction(async (tx) => {
      await updateIfVersion(tx, Design, { id, expectedVersion: dto.version, set }, async () =>
        staleDesign(await this.findDesign(id)),
      );
      const shown = await tx.getRepository(DesignVersion).find({
        where: { designId: id, status: In(['submitted', 'approved', 'released', 'retired']) },
        select: { number: true, status: true },
      });
      const released = shown.filter((v) => v.status === 'released').map((v) => v.number);
      // Submitted versions now stand against the new mask: it is in use from here on.
      if (set.specMaskId && shown.length > 0) await this.masks.markInUse(set.specMaskId, tx);
      if (set.name !== undefined) {
        await this.audit.record(tx, {
          actor,
          entity: 'design',
          entityId: id,
          action: 'renamed',
          summary: `renamed "${design.name}" to "${set.name}"${released.length > 0 ? ` (released version ${released.join(', ')})` : ''}`,
          details: { from: design.name, to: set.name, releasedVersions: released },
        });
      }
      if (set.specMaskId !== undefined) {
        await this.audit.record(tx, {
          actor,
          entity: 'design',
          entityId: id,
          action: 'spec mask changed',
          summary: `spec mask ${design.specMaskId ?? 'none'} → ${set.specMaskId ?? 'none'}`,
          details: { from: design.specMaskId, to: set.specMaskId },
        });
      }
    });
    return this.get(id);
  }

  /**
   * Saves a draft. The save carries the rowVersion it started from and applies only if the version
   * is still at it (one conditional UPDATE); otherwise 409 and nothing is written, so no layer is
   * ever silently lost. Every save records who made it.
   */
  async saveVersion(
    id: number,
    number: number,
    dto: SaveVersionInput,
    editor: User,
  ): Promise<DesignVersionView> {
    const version = await this.findVersion(id, number);
    if (!isEditable(version)) throw notEditable(version);
    // A retired material may stay where the draft already has it, but not be newly chosen.
    await this.checkMaterials(dto, this.db.manager, false, usedMaterialIds(version));
    await this.db.transaction(async (tx) => {
      const saved = await updateIfVersion(
        tx,
        DesignVersion,
        {
          id: version.id,
          expectedVersion: dto.rowVersion,
          set: content(dto),
          where: 'status IN (:...editable)',
          params: { editable: EDITABLE_STATUSES },
        },
        async () => {
          const now = await this.findVersion(id, number);
          return isEditable(now) ? this.staleVersion(now, dto.rowVersion) : notEditable(now);
        },
      );
      await tx.getRepository(VersionEvent).insert({
        designId: id,
        versionNumber: number,
        fromStatus: version.status,
        toStatus: version.status,
        actor: editor,
        comment: `saved as row version ${saved} (${dto.layers.length} layers)`,
        kind: 'saved',
      });
      await this.audit.record(tx, {
        actor: editor,
        entity: 'design',
        entityId: id,
        action: 'version saved',
        summary: `version ${number} saved (${dto.layers.length} layers, row version ${saved})`,
        details: { versionNumber: number, rowVersion: saved },
      });
      await tx.getRepository(Design).update(id, { updatedAt: new Date() });
    });
    return this.getVersion(id, number);
  }

  /** 409 for a save or submit based on an older row version: says who saved since, and when. */
  async staleVersion(now: DesignVersion, seen: number): Promise<ConflictException> {
    const last = await this.db.getRepository(VersionEvent).findOne({
      where: { designId: now.designId, versionNumber: now.number, kind: 'saved' },
      order: { at: 'DESC', id: 'DESC' },
    });
    const by = last ? ` by ${last.actor.displayName} at ${last.at.toISOString()}` : '';
    return new ConflictException(
      `Version ${now.number} was saved${by} since you opened it (you saw row version ${seen}, it is now ${now.rowVersion}); reload to see their changes (nothing of yours was saved)`,
    );
  }

  /** A new draft copied from an existing version (of any status). */
  async newVersion(
    id: number,
    request: { fromNumber: number; content?: VersionContentInput; sourceFile?: string },
    author: User,
  ): Promise<DesignVersionView> {
    const from = await this.findVersion(id, request.fromNumber);
    if (!request.content) return this.draftFrom(id, request.fromNumber, from.layers, author);
    return this.createDraft(
      id,
      request.fromNumber,
      content(request.content),
      author,
      `imported from ${request.sourceFile ? `stack file ${request.sourceFile}` : 'a stack file'}`,
    );
  }

  /** A new draft copied from a version with other layers (an accepted optimisation result). */
  async draftFrom(
    id: number,
    fromNumber: number,
    layers: DesignVersionContent['layers'],
    author: User,
  ): Promise<DesignVersionView> {
    const from = await this.findVersion(id, fromNumber);
    return this.createDraft(
      id,
      fromNumber,
      { ...content(from), layers },
      author,
      `started from version ${fromNumber}`,
    );
  }

  private async createDraft(
    id: number,
    fromNumber: number,
    draft: DesignVersionContent,
    author: User,
    source: string,
  ): Promise<DesignVersionView> {
    const from = await this.findVersion(id, fromNumber);
    await this.checkMaterials(draft);
    const number = await this.db.transaction(async (tx) => {
      await tx.query('SELECT id FROM designs WHERE id = $1 FOR UPDATE', [id]);
      const [{ max }] = await tx.query<[{ max: number }]>(
        'SELECT max(number) AS max FROM design_versions WHERE design_id = $1',
        [id],
      );
      const next = Number(max) + 1;
      await tx.getRepository(DesignVersion).save(newDraft(tx, from.design, next, draft, author));
      await this.audit.record(tx, {
        actor: author,
        entity: 'design',
        entityId: id,
        action: 'version created',
        summary: `draft version ${next} ${source}`,
        details: { versionNumber: next, fromNumber },
      });
      return next;
    });
    await this.designs.update(id, { updatedAt: new Date() });
    return this.getVersion(id, number);
  }

  /**
   * A version's content with the material models it uses: the frozen snapshot once submitted,
   * the library's current models while a draft.
   */
  async contentForCompute(
    id: number,
    number: number,
  ): Promise<{ content: DesignVersionContent; materials: Map<number, NamedModel> }> {
    const version = await this.findVersion(id, number);
    const materials = version.materialsSnapshot
      ? new Map(Object.entries(version.materialsSnapshot).map(([k, v]) => [Number(k), v]))
      : await this.checkMaterials(version);
    return { content: content(version), materials };
  }

  /** A design's spec mask must exist and belong to the design's customer. */
  private async checkMask(specMaskId: number | null, customerId: number): Promise<void> {
    if (specMaskId === null) return;
    const mask = await missingAsBadRequest(
      this.masks.get(specMaskId),
      `specMaskId: spec mask ${specMaskId} does not exist`,
    );
    if (mask.customer.id !== customerId) {
      throw new BadRequestException({
        message: [
          `specMaskId: spec mask ${specMaskId} belongs to ${mask.customer.name}, not to this design's customer`,
        ],
      });
    }
  }

  /** Every material the content names must exist; returns them by id. */
  /**
   * The materials a version names, as the engine needs them; 400 naming each missing one. With
   * `freeze` (inside the submit transaction) the rows are read FOR SHARE, so a concurrent material
   * edit waits for the submit and then finds the material in use (and makes a new revision).
   */
  async checkMaterials(
    c: DesignVersionContent | VersionContentInput,
    manager: EntityManager = this.db.manager,
    freeze = false,
    /** When given, a retired material is refused unless its id is in this set (new work). */
    retiredAllowed?: ReadonlySet<number>,
  ): Promise<Map<number, NamedModel>> {
    const wanted = new Set([
      c.incidentMaterialId,
      c.substrateMaterialId,
      ...c.layers.map((l) => l.materialId),
    ]);
    const found = await this.materials.findByIds([...wanted], manager, freeze);
    const byId = new Map(
      found.map((m) => [
        m.id,
        {
          name: m.name,
          model: m.model,
          rangeNm: { from: m.rangeFromNm, to: m.rangeToNm },
          revision: m.revision,
        },
      ]),
    );
    const problems: string[] = [];
    if (!byId.has(c.incidentMaterialId))
      problems.push(`incidentMaterialId: material ${c.incidentMaterialId} does not exist`);
    if (!byId.has(c.substrateMaterialId))
      problems.push(`substrateMaterialId: material ${c.substrateMaterialId} does not exist`);
    c.layers.forEach((l, i) => {
      if (!byId.has(l.materialId))
        problems.push(`layers.${i}.materialId: material ${l.materialId} does not exist`);
    });
    if (retiredAllowed) {
      for (const m of found) {
        if (m.retiredAt && !retiredAllowed.has(m.id))
          problems.push(`material "${m.name}" is retired; choose a current material or restore it first`);
      }
    }
    if (problems.length > 0) throw new BadRequestException({ message: problems });
    return byId;
  }

  private async findDesign(id: number): Promise<Design> {
    const design = await this.designs.findOneBy({ id });
    if (!design) throw new NotFoundException(`Design ${id} does not exist`);
    return design;
  }

  async findVersion(
    id: number,
    number: number,
    manager: EntityManager = this.db.manager,
  ): Promise<DesignVersion> {
    const version = await manager.getRepository(DesignVersion).findOne({
      where: { designId: id, number },
      relations: { design: true },
    });
    if (!version) {
      await this.findDesign(id);
      throw new NotFoundException(`Design ${id} has no version ${number}`);
    }
    return version;
  }
}

function content(c: DesignVersionContent | VersionContentInput): DesignVersionContent {
  return {
    incidentMaterialId: c.incidentMaterialId,
    substrateMaterialId: c.substrateMaterialId,
    substrateThicknessMm: c.substrateThicknessMm,
    backSurface: c.backSurface,
    referenceWavelengthNm: c.referenceWavelengthNm,
    notes: c.notes ?? '',
    layers: c.layers.map((l) => ({
      materialId: l.materialId,
      thicknessNm: l.thicknessNm,
      locked: l.locked ?? false,
      notes: l.notes ?? '',
    })),
  };
}

function newDraft(
  tx: EntityManager,
  design: Design,
  number: number,
  c: DesignVersionContent | VersionContentInput,
  author: User,
): DesignVersion {
  return tx.getRepository(DesignVersion).create({
    design,
    designId: design.id,
    number,
    status: 'draft',
    ...content(c),
    materialsSnapshot: null,
    rowVersion: 1,
    createdBy: author,
  });
}

/** Statuses in which a version's content may change: a draft, or one returned by its reviewer. */
export const EDITABLE_STATUSES = ['draft', 'returned'] as const;

export function isEditable(v: DesignVersion): boolean {
  return (EDITABLE_STATUSES as readonly string[]).includes(v.status);
}

export function notEditable(v: DesignVersion): ConflictException {
  return new ConflictException(
    `Version ${v.number} is ${v.status} and cannot change; start a new version from it to make changes`,
  );
}

function staleDesign(d: Design): ConflictException {
  return new ConflictException(
    `Design "${d.name}" was changed by someone else (now version ${d.version}); reload it and apply your change again`,
  );
}

function designHeader(d: Design): Omit<DesignSummaryView, 'latestVersion'> {
  return {
    id: d.id,
    name: d.name,
    customer: { id: d.customer.id, name: d.customer.name },
    specMaskId: d.specMaskId,
    createdBy: { id: d.createdBy.id, displayName: d.createdBy.displayName },
    createdAt: d.createdAt.toISOString(),
    version: d.version,
  };
}

export function toVersionView(
  v: DesignVersion,
  editors: { id: number; displayName: string }[],
): DesignVersionView {
  return {
    designId: v.designId,
    number: v.number,
    status: v.status,
    rowVersion: v.rowVersion,
    ...content(v),
    createdBy: { id: v.createdBy.id, displayName: v.createdBy.displayName },
    editors,
    createdAt: v.createdAt.toISOString(),
    updatedAt: v.updatedAt.toISOString(),
    materialsSnapshot: v.materialsSnapshot,
  };
}

/** The materials a version's content uses (incident, substrate, layers). */
function usedMaterialIds(c: DesignVersionContent): Set<number> {
  return new Set([c.incidentMaterialId, c.substrateMaterialId, ...c.layers.map((l) => l.materialId)]);
}
