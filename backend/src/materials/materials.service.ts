import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, Repository, type EntityManager } from 'typeorm';
import {
  evaluateIndex,
  validateMaterialModel,
  type MaterialModel,
} from '@quietglass/shared/optics/dispersion';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { AuditService } from '../audit/audit.service.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { stableStringify } from '../common/stable-json.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import type { User } from '../users/user.entity.js';
import { Material, MaterialRevision } from './material.entity.js';
import type {
  ImportMaterialCsvDto,
  MaterialDto,
  ProvenanceDto,
  UpdateMaterialDto,
} from './dto/material.dto.js';
import { parseNkCsv } from './nk-csv.js';

/** Points at which a model is checked across its stated range (poles, n ≤ 0, k < 0). */
const RANGE_CHECK_POINTS = 201;

@Injectable()
export class MaterialsService {
  constructor(
    @InjectRepository(Material) private readonly materials: Repository<Material>,
    private readonly audit: AuditService,
  ) {}

  list(): Promise<Material[]> {
    return this.materials.find({ order: { name: 'ASC' } });
  }

  /**
   * The materials with these ids (those that exist; callers name the missing ones). With
   * `lockForShare` inside a transaction the rows are read FOR SHARE, so an edit waits for it.
   */
  findByIds(ids: readonly number[], manager?: EntityManager, lockForShare = false): Promise<Material[]> {
    return (manager ?? this.materials.manager).getRepository(Material).find({
      where: { id: In([...ids]) },
      ...(lockForShare ? { lock: { mode: 'pessimistic_read' as const } } : {}),
    });
  }

  async get(id: number): Promise<Material> {
    const material = await this.materials.findOneBy({ id });
    if (!material) throw new NotFoundException(`Material ${id} does not exist`);
    return material;
  }

  async create(dto: MaterialDto, user: User): Promise<Material> {
    const model = checkedModel(dto.model, dto.rangeNm);
    return this.save(this.materials.create({ ...fields(dto), model }), user, 'created');
  }

  /**
   * Replaces a material; a save based on an older version gets 409 and changes nothing. A material
   * that submitted, approved or released versions use is not changed in place: its content so far
   * is kept as a numbered revision (readable through `revisions`) and the edit becomes the next
   * revision; those versions keep the models frozen in their snapshot. The audit trail keeps before
   * and after.
   */
  async update(id: number, dto: UpdateMaterialDto, user: User): Promise<Material> {
    await this.get(id);
    const model = checkedModel(dto.model, dto.rangeNm);
    const set: Partial<Material> = { ...fields(dto), model };
    await this.materials.manager
      .transaction(async (tx) => {
        // The row lock orders this edit with a submit freezing the material (it reads FOR SHARE).
        const before = await tx
          .getRepository(Material)
          .findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
        if (!before) throw new NotFoundException(`Material ${id} does not exist`);
        if (before.version !== dto.version) throw staleMaterial(before);
        const frozenIn = await frozenVersions(tx, id);
        const revised = frozenIn.length > 0 && contentChanged(before, set);
        if (revised) {
          await tx.getRepository(MaterialRevision).insert({
            materialId: id,
            revision: before.revision,
            name: before.name,
            model: before.model,
            rangeFromNm: before.rangeFromNm,
            rangeToNm: before.rangeToNm,
            typical: before.typical,
            source: before.source,
            sourceDate: before.sourceDate,
            processNotes: before.processNotes,
            supersededBy: { id: user.id } as User,
          });
          set.revision = before.revision + 1;
        }
        await updateIfVersion(tx, Material, { id, expectedVersion: dto.version, set }, async () =>
          staleMaterial(await this.get(id)),
        );
        await this.audit.record(tx, {
          actor: user,
          entity: 'material',
          entityId: id,
          action: revised ? 'revised' : 'edited',
          summary: revised
            ? `material "${dto.name}" revised: revision ${before.revision} → ${before.revision + 1}; ${frozenIn.length} submitted, approved or released version(s) keep revision ${before.revision}`
            : `material "${dto.name}" edited (version ${dto.version} → ${dto.version + 1})`,
          details: {
            before: {
              name: before.name,
              model: before.model,
              rangeNm: [before.rangeFromNm, before.rangeToNm],
              revision: before.revision,
            },
            after: {
              name: dto.name,
              model,
              rangeNm: [dto.rangeNm.from, dto.rangeNm.to],
              revision: set.revision ?? before.revision,
            },
            ...(revised ? { frozenIn } : {}),
          },
        });
      })
      .catch((err: unknown) => {
        if (isUniqueViolation(err))
          throw new ConflictException(`A material named "${dto.name}" already exists`);
        throw err;
      });
    return this.get(id);
  }

  /**
   * Records that a design version froze these materials in its snapshot (inside the submit's
   * transaction, after `findByIds` read them FOR SHARE): from then on an edit of any of them makes
   * its next revision instead of changing it in place.
   */
  async recordUses(
    ids: readonly number[],
    version: { designId: number; number: number },
    tx: EntityManager,
  ): Promise<void> {
    if (ids.length === 0) return;
    await tx.query(
      `INSERT INTO material_uses (material_id, design_id, version_number)
       SELECT unnest($1::int[]), $2::int, $3::int ON CONFLICT DO NOTHING`,
      [[...new Set(ids)], version.designId, version.number],
    );
  }

  /** Earlier revisions of a material, newest first (the current one is the material itself). */
  async revisions(id: number): Promise<MaterialRevision[]> {
    await this.get(id);
    return this.materials.manager
      .getRepository(MaterialRevision)
      .find({ where: { materialId: id }, order: { revision: 'DESC' } });
  }

  /** Creates a tabulated material from CSV text; any bad row rejects the whole file. */
  async importCsv(dto: ImportMaterialCsvDto, user: User): Promise<Material> {
    const parsed = parseNkCsv(dto.csv, dto.unit);
    if (!parsed.ok) {
      const details = parsed.problems.map((p) => (p.row > 0 ? `row ${p.row}: ${p.reason}` : p.reason));
      throw new BadRequestException({ message: details });
    }
    const { wavelengths, n, k } = parsed.table;
    const rangeNm = { from: wavelengths[0], to: wavelengths[wavelengths.length - 1] };
    const model = checkedModel(
      { model: 'table', wavelengths, n, k, interpolation: dto.interpolation ?? 'linear' },
      rangeNm,
    );
    return this.save(
      this.materials.create({
        ...fields({ name: dto.name, rangeNm, typical: dto.typical, provenance: dto.provenance }),
        model,
      }),
      user,
      'imported from CSV',
    );
  }

  private async save(material: Material, user: User, action: string): Promise<Material> {
    try {
      return await this.materials.manager.transaction(async (tx) => {
        const saved = await tx.getRepository(Material).save(material);
        await this.audit.record(tx, {
          actor: user,
          entity: 'material',
          entityId: saved.id,
          action,
          summary: `material "${saved.name}" ${action}`,
          details: {
            model: saved.model,
            rangeNm: [saved.rangeFromNm, saved.rangeToNm],
            source: saved.source,
          },
        });
        return saved;
      });
    } catch (err) {
      if (isUniqueViolation(err))
        throw new ConflictException(`A material named "${material.name}" already exists`);
      throw err;
    }
  }
}

/** The design versions recorded as holding the material in their frozen snapshot. */
async function frozenVersions(
  tx: EntityManager,
  materialId: number,
): Promise<{ designId: number; number: number }[]> {
  return tx.query<{ designId: number; number: number }[]>(
    `SELECT design_id AS "designId", version_number AS number FROM material_uses
     WHERE material_id = $1 ORDER BY design_id, version_number`,
    [materialId],
  );
}

/** Whether an edit changes what a frozen version's snapshot holds (name, model or range). */
function contentChanged(before: Material, set: Partial<Material>): boolean {
  return (
    before.name !== set.name ||
    before.rangeFromNm !== set.rangeFromNm ||
    before.rangeToNm !== set.rangeToNm ||
    stableStringify(before.model) !== stableStringify(set.model)
  );
}

function staleMaterial(current: Material): ConflictException {
  return new ConflictException(
    `Material "${current.name}" was changed by someone else (now version ${current.version}); reload it and apply your edit again`,
  );
}

function fields(dto: {
  name: string;
  rangeNm: { from: number; to: number };
  typical?: boolean;
  provenance?: ProvenanceDto;
}): Partial<Material> {
  return {
    name: dto.name,
    rangeFromNm: dto.rangeNm.from,
    rangeToNm: dto.rangeNm.to,
    typical: dto.typical ?? false,
    source: dto.provenance?.source ?? '',
    sourceDate: dto.provenance?.date ?? null,
    processNotes: dto.provenance?.notes ?? '',
  };
}

/**
 * The engine validates the model; then the model must give a physical index across the whole
 * stated range (this catches Sellmeier poles and Cauchy fits that go negative).
 */
export function checkedModel(raw: unknown, rangeNm: { from: number; to: number }): MaterialModel {
  if (!(rangeNm.from > 0) || !(rangeNm.to > rangeNm.from)) {
    throw new BadRequestException({
      message: [`rangeNm: from (${rangeNm.from}) must be > 0 and below to (${rangeNm.to})`],
    });
  }
  try {
    const model = validateMaterialModel(raw, 'model');
    if (model.model === 'table' && !model.clamp) {
      const lo = model.wavelengths[0];
      const hi = model.wavelengths[model.wavelengths.length - 1];
      if (rangeNm.from < lo || rangeNm.to > hi) {
        throw new OpticsInputError(
          'rangeNm',
          `the range ${rangeNm.from}–${rangeNm.to} nm reaches beyond the table (${lo}–${hi} nm)`,
        );
      }
    }
    const grid = new Float64Array(RANGE_CHECK_POINTS);
    for (let i = 0; i < grid.length; i++)
      grid[i] = rangeNm.from + ((rangeNm.to - rangeNm.from) * i) / (grid.length - 1);
    evaluateIndex(
      { n: new Float64Array(grid.length), k: new Float64Array(grid.length) },
      model,
      grid,
      'model',
    );
    return model;
  } catch (err) {
    if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
    throw err;
  }
}
