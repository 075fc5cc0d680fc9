import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, Repository, type EntityManager } from 'typeorm';
import {
  evaluateIndex,
  validateMaterialModel,
  type MaterialModel,
} from '@quietglass/shared/optics/dispersion';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { parseConstantsFile } from '@quietglass/shared/optics/constants-file';
import { provenanceProblem, type ProvenanceKind } from '@quietglass/shared/materials';
import { AuditService } from '../audit/audit.service.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { stableStringify } from '../common/stable-json.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import type { User } from '../users/user.entity.js';
import { Material, MaterialRevision } from './material.entity.js';
import type {
  ImportConstantsFileDto,
  ImportMaterialCsvDto,
  MaterialDto,
  NkCsvDto,
  ProvenanceDto,
  UpdateMaterialDto,
} from './dto/material.dto.js';
import { parseNkCsv, type NkTable, type WavelengthUnit } from './nk-csv.js';
import { elementAt } from '@quietglass/shared/checked';

/** An uploaded file kept with the material it made. */
interface SourceFile {
  fileName: string;
  mediaType: string;
  content: Buffer;
}

/** What an n,k file reads as, shown before it is saved. */
export interface NkCsvPreview {
  table: NkTable;
  unit: WavelengthUnit;
  decimalComma: boolean;
  headerRow: boolean;
  rangeNm: { from: number; to: number };
}

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
            provenanceKind: before.provenanceKind,
            provenanceRun: before.provenanceRun,
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

  /** What an n,k file reads as (the same parser as the import), or 400 with every bad row. */
  previewCsv(dto: NkCsvDto): NkCsvPreview {
    const parsed = parseNkCsv(dto.csv, dto.unit ?? null);
    if (!parsed.ok) {
      const details = parsed.problems.map((p) => (p.row > 0 ? `row ${p.row}: ${p.reason}` : p.reason));
      throw new BadRequestException({ message: details });
    }
    const { table } = parsed;
    return {
      table,
      unit: parsed.unit,
      decimalComma: parsed.decimalComma,
      headerRow: parsed.headerRow,
      rangeNm: {
        from: elementAt(table.wavelengths, 0, 'the n,k table'),
        to: elementAt(table.wavelengths, table.wavelengths.length - 1, 'the n,k table'),
      },
    };
  }

  /** Creates a tabulated material from CSV text and keeps the file; any bad row rejects it all. */
  async importCsv(dto: ImportMaterialCsvDto, user: User): Promise<Material> {
    const { table, rangeNm } = this.previewCsv(dto);
    const { wavelengths, n, k } = table;
    const model = checkedModel(
      {
        model: 'table',
        wavelengths,
        n,
        k,
        interpolation: dto.interpolation ?? 'linear',
        clamp: dto.clamp ?? false,
      },
      rangeNm,
    );
    return this.save(
      this.materials.create({
        ...fields({ name: dto.name, rangeNm, typical: dto.typical, provenance: dto.provenance }),
        model,
      }),
      user,
      'imported from CSV',
      {
        fileName: dto.fileName?.trim() || `${dto.name}.csv`,
        mediaType: 'text/csv',
        content: Buffer.from(dto.csv, 'utf8'),
      },
    );
  }

  /**
   * Creates a material from a published optical-constants file: tabulated n,k, or the stated
   * formula with its range as the valid range. The file's reference (and DOI) is the provenance,
   * its comments and conditions the notes; the file is kept for download.
   */
  async importConstantsFile(dto: ImportConstantsFileDto, user: User): Promise<Material> {
    let parsed;
    try {
      parsed = parseConstantsFile(dto.text);
    } catch (err) {
      if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
      throw err;
    }
    const model = checkedModel(
      parsed.model.model === 'constant' ? parsed.model : { ...parsed.model, clamp: dto.clamp ?? false },
      parsed.rangeNm,
    );
    const source = parsed.doi ? `${parsed.reference}\nDOI: ${parsed.doi}` : parsed.reference;
    const notes = [parsed.notes, `Data: ${parsed.form}`, dto.notes?.trim() ?? '']
      .filter((line) => line !== '')
      .join('\n');
    return this.save(
      this.materials.create({
        ...fields({
          name: dto.name,
          rangeNm: parsed.rangeNm,
          provenance: { kind: 'published', source, notes },
        }),
        model,
      }),
      user,
      'imported from a published constants file',
      {
        fileName: dto.fileName.trim(),
        mediaType: 'application/yaml',
        content: Buffer.from(dto.text, 'utf8'),
      },
    );
  }

  /**
   * Retires (hides from pickers) or restores a material. Versions that use it keep it: their
   * snapshot holds its model and the library still lists it, marked retired.
   */
  async setRetired(id: number, retired: boolean, version: number, user: User): Promise<Material> {
    const before = await this.get(id);
    if (Boolean(before.retiredAt) === retired) {
      throw new ConflictException(
        `Material "${before.name}" is ${retired ? 'already retired' : 'not retired'}`,
      );
    }
    await this.materials.manager.transaction(async (tx) => {
      await updateIfVersion(
        tx,
        Material,
        { id, expectedVersion: version, set: { retiredAt: retired ? new Date() : null } },
        async () => staleMaterial(await this.get(id)),
      );
      await this.audit.record(tx, {
        actor: user,
        entity: 'material',
        entityId: id,
        action: retired ? 'retired' : 'restored',
        summary: retired
          ? `material "${before.name}" retired: hidden from pickers, kept for the versions that use it`
          : `material "${before.name}" restored to the pickers`,
        details: {},
      });
    });
    return this.get(id);
  }

  /** The file a material was imported from; 404 when it was entered by hand. */
  async sourceFile(id: number): Promise<SourceFile> {
    const material = await this.get(id);
    const [row] = await this.materials.manager.query<{ content: Buffer }[]>(
      'SELECT content FROM material_source_files WHERE material_id = $1',
      [id],
    );
    if (!row || material.sourceFileName === null) {
      throw new NotFoundException(`Material "${material.name}" was not imported from a file`);
    }
    return {
      fileName: material.sourceFileName,
      mediaType: material.sourceFileType ?? 'application/octet-stream',
      content: row.content,
    };
  }

  private async save(material: Material, user: User, action: string, file?: SourceFile): Promise<Material> {
    if (file) {
      material.sourceFileName = file.fileName;
      material.sourceFileType = file.mediaType;
      material.sourceFileBytes = file.content.length;
    }
    try {
      return await this.materials.manager.transaction(async (tx) => {
        const saved = await tx.getRepository(Material).save(material);
        if (file) {
          await tx.query('INSERT INTO material_source_files (material_id, content) VALUES ($1, $2)', [
            saved.id,
            file.content,
          ]);
        }
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
            provenance: saved.provenanceKind,
            ...(file ? { file: { name: file.fileName, bytes: file.content.length } } : {}),
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

/**
 * The stored fields of a material. Provenance is required: its kind (or `typical: true`), and for
 * a published reference the reference, for a measurement its date and run (shared rule).
 */
function fields(dto: {
  name: string;
  rangeNm: { from: number; to: number };
  typical?: boolean;
  provenance?: ProvenanceDto;
}): Partial<Material> {
  const stated = dto.provenance?.kind;
  if (stated && dto.typical !== undefined && dto.typical !== (stated === 'typical')) {
    throw new BadRequestException({
      message: [`typical (${dto.typical}) contradicts provenance.kind "${stated}"`],
    });
  }
  const kind: ProvenanceKind | undefined = stated ?? (dto.typical ? 'typical' : undefined);
  if (!kind) {
    throw new BadRequestException({
      message: [
        'provenance.kind is required: published (with its reference), measured (with date and run) or typical',
      ],
    });
  }
  const problem = provenanceProblem({ kind, ...dto.provenance });
  if (problem) throw new BadRequestException({ message: [`provenance: ${problem}`] });
  return {
    name: dto.name,
    rangeFromNm: dto.rangeNm.from,
    rangeToNm: dto.rangeNm.to,
    typical: kind === 'typical',
    provenanceKind: kind,
    source: dto.provenance?.source?.trim() ?? '',
    sourceDate: dto.provenance?.date ?? null,
    provenanceRun: dto.provenance?.run?.trim() ?? '',
    processNotes: dto.provenance?.notes ?? '',
  };
}

/**
 * The engine validates the model; then the model must give a physical index across the whole
 * stated range (this catches Sellmeier poles and Cauchy fits that go negative). A formula model
 * takes the stated range as its valid range, so the engine refuses it (or, with `clamp`, holds
 * the end values and warns) outside it, as it does for a table.
 */
export function checkedModel(raw: unknown, rangeNm: { from: number; to: number }): MaterialModel {
  if (!(rangeNm.from > 0) || !(rangeNm.to > rangeNm.from)) {
    throw new BadRequestException({
      message: [`rangeNm: from (${rangeNm.from}) must be > 0 and below to (${rangeNm.to})`],
    });
  }
  try {
    const formula =
      typeof raw === 'object' &&
      raw !== null &&
      ((raw as { model?: unknown }).model === 'cauchy' || (raw as { model?: unknown }).model === 'sellmeier');
    const model = validateMaterialModel(
      formula ? { ...raw, validNm: { from: rangeNm.from, to: rangeNm.to } } : raw,
      'model',
    );
    if (model.model === 'table' && !model.clamp) {
      const lo = elementAt(model.wavelengths, 0, 'the n,k table');
      const hi = elementAt(model.wavelengths, model.wavelengths.length - 1, 'the n,k table');
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
