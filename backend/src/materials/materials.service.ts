import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import {
  evaluateIndex,
  validateMaterialModel,
  type MaterialModel,
} from '@quietglass/shared/optics/dispersion';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { AuditService } from '../audit/audit.service.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import type { User } from '../users/user.entity.js';
import { Material } from './material.entity.js';
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
   * Replaces a material; a save based on an older version gets 409 and changes nothing. Versions
   * submitted earlier keep the models frozen in their snapshot; the audit trail keeps before and after.
   */
  async update(id: number, dto: UpdateMaterialDto, user: User): Promise<Material> {
    const before = await this.get(id);
    const model = checkedModel(dto.model, dto.rangeNm);
    const set = { ...fields(dto), model };
    await this.materials.manager
      .transaction(async (tx) => {
        await updateIfVersion(tx, Material, { id, expectedVersion: dto.version, set }, async () =>
          staleMaterial(await this.get(id)),
        );
        await this.audit.record(tx, {
          actor: user,
          entity: 'material',
          entityId: id,
          action: 'edited',
          summary: `material "${dto.name}" edited (version ${dto.version} → ${dto.version + 1})`,
          details: {
            before: {
              name: before.name,
              model: before.model,
              rangeNm: [before.rangeFromNm, before.rangeToNm],
            },
            after: { name: dto.name, model, rangeNm: [dto.rangeNm.from, dto.rangeNm.to] },
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
