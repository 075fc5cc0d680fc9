import {
  BadRequestException,
  ConflictException,
  ForbiddenException,
  Injectable,
  NotFoundException,
} from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { designStackDescription, engineBackSurface } from '@quietglass/shared/designs';
import { evaluateMaskOnMeasured } from '@quietglass/shared/measured';
import { calculateSpectrum } from '@quietglass/shared/optics/batch';
import { parseStack } from '@quietglass/shared/optics/stack';
import type { SpectrumComparisonView } from '@quietglass/shared/runs';
import { AuditService } from '../audit/audit.service.js';
import { problemDetails } from '../common/csv.js';
import { missingAsBadRequest, orNull } from '../common/not-found.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import { stableStringify } from '../common/stable-json.js';
import { ChambersService } from '../chambers/chambers.service.js';
import { RecipesService } from '../designs/recipes.service.js';
import type { DesignVersion } from '../designs/design-version.entity.js';
import { DesignsService } from '../designs/designs.service.js';
import { SpecMasksService } from '../spec-masks/spec-masks.service.js';
import type { User } from '../users/user.entity.js';
import type {
  RunRemarkInput,
  StartRunInput,
  UpdateRunInput,
  UploadSpectrumInput,
} from '@quietglass/shared/schemas/runs';
import { ChamberRun, RunSpectrum } from './run.entity.js';
import { parseSpectrumCsv } from './spectrum-csv.js';
import { keptToolingFactors } from '@quietglass/shared/chambers';

@Injectable()
export class RunsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly recipes: RecipesService,
    private readonly chambers: ChambersService,
    private readonly designs: DesignsService,
    private readonly masks: SpecMasksService,
    private readonly audit: AuditService,
  ) {}

  /** Starts a run of a released recipe; the signed-in user is its operator. */
  async start(dto: StartRunInput, operator: User): Promise<ChamberRun> {
    await missingAsBadRequest(
      this.recipes.releasedRecipe(dto.designId, dto.versionNumber),
      `design ${dto.designId} version ${dto.versionNumber} is not a released recipe`,
    );
    const chamber = await missingAsBadRequest(
      this.chambers.get(dto.chamberId),
      `chamberId: chamber ${dto.chamberId} does not exist`,
    );
    const toolingFactors = keptToolingFactors(chamber.materials);
    const id = await this.db.transaction(async (tx) => {
      const repo = tx.getRepository(ChamberRun);
      const saved = await repo.save(
        repo.create({
          ...dto,
          operator,
          layerReadings: [],
          durability: [],
          remarks: [],
          toolingFactors,
        }),
      );
      await this.audit.record(tx, {
        actor: operator,
        entity: 'run',
        entityId: saved.id,
        action: 'logged',
        summary: `run of lot ${saved.lotNumber} logged (design ${dto.designId} v${dto.versionNumber}, chamber ${dto.chamberId})`,
        details: { ...dto, toolingFactors },
      });
      return saved.id;
    });
    return this.get(id);
  }

  list(): Promise<ChamberRun[]> {
    return this.db.getRepository(ChamberRun).find({ order: { id: 'DESC' }, take: 200 });
  }

  /** Every run of a chamber, oldest first (by run date, then as entered). */
  listForChamber(chamberId: number): Promise<ChamberRun[]> {
    return this.db
      .getRepository(ChamberRun)
      .find({ where: { chamberId }, order: { runDate: 'ASC', id: 'ASC' } });
  }

  async get(id: number): Promise<ChamberRun> {
    const run = await this.db.getRepository(ChamberRun).findOneBy({ id });
    if (!run) throw new NotFoundException(`Chamber run ${id} does not exist`);
    return run;
  }

  /**
   * Changes readings, durability results or notes. The run record is its operator's: anybody else
   * gets 403 and can add a remark. The change applies only while the run is still at `dto.version`
   * (one conditional UPDATE), and the audit trail keeps before and after of what changed.
   */
  async update(id: number, dto: UpdateRunInput, user: User): Promise<ChamberRun> {
    const run = await this.get(id);
    if (run.operator.id !== user.id) {
      throw new ForbiddenException(
        `Run ${run.lotNumber} was logged by ${run.operator.displayName}; only they can change its readings, durability results and notes. Add a remark instead.`,
      );
    }
    const set: Partial<Pick<ChamberRun, 'layerReadings' | 'durability' | 'notes'>> = {};
    if (dto.layerReadings) {
      const layers = (await this.version(run)).layers.length;
      const bad = dto.layerReadings
        .map((r, i) => (r.step > layers ? `layerReadings.${i}.step: the recipe has ${layers} layers` : null))
        .filter((x): x is string => x !== null);
      if (bad.length > 0) throw new BadRequestException({ message: bad });
      set.layerReadings = dto.layerReadings.map((r) => ({ ...r }));
    }
    if (dto.durability) set.durability = dto.durability.map((d) => ({ ...d }));
    if (dto.notes !== undefined) set.notes = dto.notes;
    const changed = (Object.keys(set) as (keyof typeof set)[]).filter(
      // jsonb hands keys back in its own order: compare key-order-independent.
      (k) => stableStringify(set[k]) !== stableStringify(run[k]),
    );
    await this.db.transaction(async (tx) => {
      await updateIfVersion(tx, ChamberRun, { id, expectedVersion: dto.version, set }, async () => {
        const now = await this.get(id);
        return new ConflictException(
          `Run ${now.lotNumber} was changed meanwhile (now version ${now.version}, you started from version ${dto.version}); reload it and enter your change again`,
        );
      });
      await this.audit.record(tx, {
        actor: user,
        entity: 'run',
        entityId: id,
        action: 'edited',
        summary:
          changed.length === 0
            ? `run of lot ${run.lotNumber} saved without changes`
            : `run of lot ${run.lotNumber}: ${changed.map(fieldLabel).join(', ')} changed`,
        details: Object.fromEntries(changed.map((k) => [k, { before: run[k], after: set[k] }])),
      });
    });
    return this.get(id);
  }

  /** Appends a remark in one statement, so concurrent remarks and edits never overwrite each other. */
  async addRemark(id: number, dto: RunRemarkInput, user: User): Promise<ChamberRun> {
    const run = await this.get(id);
    const remark = {
      at: new Date().toISOString(),
      by: { id: user.id, displayName: user.displayName },
      text: dto.text,
    };
    await this.db.transaction(async (tx) => {
      await tx.query(`UPDATE chamber_runs SET remarks = remarks || $2::jsonb WHERE id = $1`, [
        id,
        JSON.stringify([remark]),
      ]);
      await this.audit.record(tx, {
        actor: user,
        entity: 'run',
        entityId: id,
        action: 'remark added',
        summary: `remark on run of lot ${run.lotNumber}`,
        details: { text: dto.text },
      });
    });
    return this.get(id);
  }

  spectra(runId: number): Promise<RunSpectrum[]> {
    return this.db.getRepository(RunSpectrum).find({ where: { runId }, order: { id: 'ASC' } });
  }

  /** Stores a measured spectrum with the file as uploaded; a bad row rejects the whole file. */
  async uploadSpectrum(runId: number, dto: UploadSpectrumInput, user: User): Promise<RunSpectrum> {
    await this.get(runId);
    const parsed = parseSpectrumCsv(dto.csv, { angleDeg: dto.angleDeg, quantity: dto.quantity });
    if (!parsed.ok) throw new BadRequestException({ message: problemDetails(parsed.problems) });
    const saved = await this.db.transaction(async (tx) => {
      const repo = tx.getRepository(RunSpectrum);
      const row = await repo.save(
        repo.create({
          runId,
          quantity: parsed.spectrum.quantity,
          angleDeg: dto.angleDeg,
          sample: dto.sample,
          filename: dto.filename,
          originalText: dto.csv,
          wavelengthsNm: parsed.spectrum.wavelengthsNm,
          valuesPercent: parsed.spectrum.valuesPercent,
          uploadedBy: user,
        }),
      );
      await this.audit.record(tx, {
        actor: user,
        entity: 'run',
        entityId: runId,
        action: 'spectrum uploaded',
        summary: `${dto.sample} ${parsed.spectrum.quantity} spectrum at ${dto.angleDeg}° uploaded (${dto.filename})`,
        details: { spectrumId: row.id, points: parsed.spectrum.wavelengthsNm.length },
      });
      return row;
    });
    return this.spectrum(runId, saved.id);
  }

  async spectrum(runId: number, spectrumId: number): Promise<RunSpectrum> {
    const s = await this.db.getRepository(RunSpectrum).findOneBy({ id: spectrumId, runId });
    if (!s) throw new NotFoundException(`Run ${runId} has no spectrum ${spectrumId}`);
    return s;
  }

  async original(runId: number, spectrumId: number): Promise<{ filename: string; text: string }> {
    const s = await this.db.getRepository(RunSpectrum).findOne({
      where: { id: spectrumId, runId },
      select: { id: true, filename: true, originalText: true },
    });
    if (!s) throw new NotFoundException(`Run ${runId} has no spectrum ${spectrumId}`);
    return { filename: s.filename, text: s.originalText };
  }

  /** Measured vs design vs the design's spec mask. */
  async compare(runId: number, spectrumId: number): Promise<SpectrumComparisonView> {
    const run = await this.get(runId);
    const measured = await this.spectrum(runId, spectrumId);
    const version = await this.version(run);
    const snapshot = version.materialsSnapshot ?? {};
    const materials = new Map(Object.entries(snapshot).map(([k, v]) => [Number(k), v]));
    const stack = parseStack(designStackDescription(version, materials));
    // The design curve where every material is valid and the scan has data.
    const ranges = [...materials.values()].map((m) => m.rangeNm ?? { from: 0, to: Infinity });
    const lo = Math.max(...ranges.map((r) => r.from));
    const hi = Math.min(...ranges.map((r) => r.to));
    const wavelengthsNm = measured.wavelengthsNm.filter((wl) => wl >= lo && wl <= hi);
    const design =
      wavelengthsNm.length === 0
        ? []
        : Array.from(
            (() => {
              const s = calculateSpectrum(
                stack,
                { wavelengthsNm, anglesDeg: [measured.angleDeg], polarisations: ['avg'] },
                { back: engineBackSurface(version.backSurface) },
              );
              return measured.quantity === 'R' ? s.R : s.T;
            })(),
            (v) => v * 100,
          );
    const maskRow = version.design.specMaskId ? await this.masks.get(version.design.specMaskId) : null;
    const mask = maskRow
      ? {
          name: maskRow.name,
          revision: maskRow.revision,
          limits: maskRow.bands,
          ...evaluateMaskOnMeasured(
            { bands: maskRow.bands },
            {
              quantity: measured.quantity,
              angleDeg: measured.angleDeg,
              wavelengthsNm: measured.wavelengthsNm,
              valuesPercent: measured.valuesPercent,
            },
          ),
        }
      : null;
    return {
      spectrumId,
      quantity: measured.quantity,
      angleDeg: measured.angleDeg,
      measured: { wavelengthsNm: measured.wavelengthsNm, valuesPercent: measured.valuesPercent },
      design: { wavelengthsNm, valuesPercent: design },
      mask,
    };
  }

  /** The recipe version a run built (released then, possibly retired since). */
  private async version(run: ChamberRun): Promise<DesignVersion> {
    const v = await orNull(this.designs.findVersion(run.designId, run.versionNumber));
    if (!v || (v.status !== 'released' && v.status !== 'retired'))
      throw new NotFoundException(`The recipe of run ${run.id} is no longer available`);
    return v;
  }
}

function fieldLabel(field: 'layerReadings' | 'durability' | 'notes'): string {
  return { layerReadings: 'layer readings', durability: 'durability results', notes: 'notes' }[field];
}
