import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, Repository, type EntityManager } from 'typeorm';
import type { MaterialModel } from '@quietglass/shared/optics/dispersion';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { parseConstantsFile } from '@quietglass/shared/optics/constants-file';
import type { MaterialProvenance } from '@quietglass/shared/materials';
import {
  checkMaterialModel,
  type ImportConstantsFileInput,
  type ImportMaterialCsvInput,
  type MaterialInput,
  type MaterialUpdate,
  type NkCsvInput,
} from '@quietglass/shared/schemas/materials';
import { AuditService } from '../audit/audit.service.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { stableStringify } from '../common/stable-json.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import type { User } from '../users/user.entity.js';
import { Material, MaterialRevision } from './material.entity.js';
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

  /** The shared schema has checked the model against the range and completed the provenance. */
  async create(dto: MaterialInput, user: User): Promise<Material> {
    return this.save(this.materials.create(fields(dto)), user, 'created');
  }

  /**
   * Replaces a material; a save based on an older version gets 409 and changes nothing. A material
   * that submitted, approved or released versions use is not changed in place: its content so far
   * is kept as a numbered revision (readable through `revisions`) and the edit becomes the next
   * revision; those versions keep the models frozen in their snapshot. The audit trail keeps before
   * and after.
   */
  async update(id: number, dto: MaterialUpdate, user: User): Promise<Material> {
    await this.get(id);
    const { model } = dto;
    const set: Partial<Material> = fields(dto);
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
  previewCsv(dto: NkCsvInput): NkCsvPreview {
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
  async importCsv(dto: ImportMaterialCsvInput, user: User): Promise<Material> {
    const { table, rangeNm } = this.previewCsv(dto);
    const { wavelengths, n, k } = table;
    const model = checkedModel(
      { model: 'table', wavelengths, n, k, interpolation: dto.interpolation, clamp: dto.clamp },
      rangeNm,
    );
    return this.save(
      this.materials.create(fields({ name: dto.name, rangeNm, model, provenance: dto.provenance })),
      user,
      'imported from CSV',
      {
        fileName: dto.fileName || `${dto.name}.csv`,
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
  async importConstantsFile(dto: ImportConstantsFileInput, user: User): Promise<Material> {
    let parsed;
    try {
      parsed = parseConstantsFile(dto.text);
    } catch (err) {
      if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
      throw err;
    }
    const model = checkedModel(
      parsed.model.model === 'constant' ? parsed.model : { ...parsed.model, clamp: dto.clamp },
      parsed.rangeNm,
    );
    const source = parsed.doi ? `${parsed.reference}\nDOI: ${parsed.doi}` : parsed.reference;
    const notes = [parsed.notes, `Data: ${parsed.form}`, dto.notes].filter((line) => line !== '').join('\n');
    return this.save(
      this.materials.create(
        fields({
          name: dto.name,
          rangeNm: parsed.rangeNm,
          model,
          provenance: { kind: 'published', source, run: '', date: null, notes },
        }),
      ),
      user,
      'imported from a published constants file',
      {
        fileName: dto.fileName,
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

/** The stored fields of a material whose model and provenance are complete (checked by the shared schema). */
function fields(dto: {
  name: string;
  rangeNm: { from: number; to: number };
  model: MaterialModel;
  provenance: MaterialProvenance;
}): Partial<Material> {
  const { provenance } = dto;
  return {
    name: dto.name,
    model: dto.model,
    rangeFromNm: dto.rangeNm.from,
    rangeToNm: dto.rangeNm.to,
    typical: provenance.kind === 'typical',
    provenanceKind: provenance.kind,
    source: provenance.source,
    sourceDate: provenance.date,
    provenanceRun: provenance.run,
    processNotes: provenance.notes,
  };
}

/** A model the API built from an imported file, checked against its range as an entered one is. */
function checkedModel(raw: unknown, rangeNm: { from: number; to: number }): MaterialModel {
  try {
    return checkMaterialModel(raw, rangeNm);
  } catch (err) {
    if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
    throw err;
  }
}
