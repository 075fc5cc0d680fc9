import { BadRequestException, ConflictException, Injectable } from '@nestjs/common';
import { grownLayerMaterialId } from '@quietglass/shared/calculations';
import type { DesignVersionView } from '@quietglass/shared/designs';
import { designStackDescription, engineBackSurface } from '@quietglass/shared/designs';
import { validateSpecMask, type LimitBand } from '@quietglass/shared/optics/mask';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import type { FitResult } from '@quietglass/shared/optimise/fit';
import type { GrowResult } from '@quietglass/shared/optimise/needle';
import { missingAsBadRequest } from '../common/not-found.js';
import { DesignsService } from '../designs/designs.service.js';
import { MaterialsService } from '../materials/materials.service.js';
import { RunsService } from '../runs/runs.service.js';
import { ShopSettingsService } from '../shop-settings/shop-settings.service.js';
import { SpecMasksService } from '../spec-masks/spec-masks.service.js';
import type { User } from '../users/user.entity.js';
import { CalculationsService } from './calculations.service.js';
import type {
  DiagnosisRequest,
  FitRequest,
  GrowRequest,
  YieldRequest,
} from '@quietglass/shared/schemas/optimise';
import { type DiagnosisInput, type FitInput, type GrowInput, type YieldInput } from './optimise-jobs.js';
import { elementAt } from '@quietglass/shared/checked';

/** Builds the inputs of Fit to mask, Grow layers, Yield forecast and Run diagnosis, and accepts results. */
@Injectable()
export class OptimiseService {
  constructor(
    private readonly designs: DesignsService,
    private readonly calculations: CalculationsService,
    private readonly materials: MaterialsService,
    private readonly runs: RunsService,
    private readonly masks: SpecMasksService,
    private readonly shop: ShopSettingsService,
  ) {}

  /** The margin asked for, else the shop's default. */
  private async targetMargin(asked: number | undefined): Promise<number> {
    return asked ?? (await this.shop.targetMarginPercent());
  }

  /** The request's bounds and limits are checked, and its defaults filled, by the shared schema. */
  async fit(designId: number, number: number, dto: FitRequest, user: User) {
    const base = await this.base(designId, number, dto.specMaskId);
    if (base.locked.every(Boolean)) {
      throw new BadRequestException({ message: ['every layer is locked: unlock at least one layer to fit'] });
    }
    const input: FitInput = {
      kind: 'fit',
      ...base.common,
      options: {
        locked: base.locked,
        minThicknessNm: dto.minThicknessNm,
        maxThicknessNm: dto.maxThicknessNm,
        maxIterations: dto.maxIterations,
        marginPercent: await this.targetMargin(dto.targetMarginPercent),
      },
    };
    return this.calculations.submitOptimisation('fit', input, user, { designId, versionNumber: number });
  }

  /** The shared schema has held the placement rules to the allowed materials. */
  async grow(designId: number, number: number, dto: GrowRequest, user: User) {
    const base = await this.base(designId, number, dto.specMaskId);
    const found = await this.materials.findByIds(dto.allowedMaterialIds);
    const missing = dto.allowedMaterialIds.filter((id) => !found.some((m) => m.id === id));
    if (missing.length > 0) {
      throw new BadRequestException({
        message: missing.map((id) => `allowedMaterialIds: material ${id} does not exist`),
      });
    }
    const nameOf = (ids: number[] | undefined): string[] | undefined =>
      ids?.map((id) => found.find((m) => m.id === id)?.name ?? String(id));
    const outermostOnly = nameOf(dto.outermostOnlyMaterialIds);
    const nextToSubstrate = nameOf(dto.nextToSubstrateMaterialIds);
    const input: GrowInput = {
      kind: 'grow',
      ...base.common,
      allowed: found.map((m) => ({ materialId: m.id, name: m.name, model: m.model })),
      options: {
        maxLayers: dto.maxLayers,
        maxTotalThicknessNm: dto.maxTotalThicknessNm,
        minThicknessNm: dto.minThicknessNm,
        maxSteps: dto.maxSteps,
        marginPercent: await this.targetMargin(dto.targetMarginPercent),
        growthMerit: dto.growthMerit,
        needlesPerStep: dto.needlesPerStep,
        ...(outermostOnly ? { outermostOnly } : {}),
        ...(nextToSubstrate ? { nextToSubstrate } : {}),
      },
    };
    return this.calculations.submitOptimisation('grow', input, user, { designId, versionNumber: number });
  }

  async yieldForecast(designId: number, number: number, dto: YieldRequest, user: User) {
    const base = await this.base(designId, number, dto.specMaskId);
    const names = [...new Set(base.layerNames)];
    const perMaterial = (percent: number | undefined) =>
      percent ? Object.fromEntries(names.map((n) => [n, { relativePercent: percent }])) : undefined;
    const input: YieldInput = {
      kind: 'yield',
      ...base.common,
      layerMaterials: base.layerNames,
      options: {
        trials: dto.trials,
        seed: dto.seed,
        thickness: dto.thickness,
        ...(dto.systematicPercent ? { systematic: perMaterial(dto.systematicPercent) } : {}),
        ...(dto.indexPercent ? { indexErrors: perMaterial(dto.indexPercent) } : {}),
      },
    };
    return this.calculations.submitOptimisation('yield', input, user, { designId, versionNumber: number });
  }

  /** Which layers of a run most likely deviated: thicknesses fitted to its measured spectrum. */
  async diagnosis(runId: number, spectrumId: number, dto: DiagnosisRequest, user: User) {
    const run = await missingAsBadRequest(this.runs.get(runId), `run ${runId} does not exist`);
    const spectrum = await missingAsBadRequest(
      this.runs.spectrum(runId, spectrumId),
      `run ${runId} has no spectrum ${spectrumId}`,
    );
    const { content, materials } = await this.designs.contentForCompute(run.designId, run.versionNumber);
    const lowest = Math.min(...spectrum.wavelengthsNm);
    const highest = Math.max(...spectrum.wavelengthsNm);
    const input: DiagnosisInput = {
      kind: 'diagnosis',
      stack: designStackDescription(content, materials),
      back: engineBackSurface(content.backSurface),
      // The fit follows the measurement; this band only keeps the merit defined (R or T ≤ 100 %).
      bands: [
        {
          from_nm: lowest,
          to_nm: highest,
          quantity: spectrum.quantity,
          max_percent: 100,
          weight: 1,
          step_nm: highest - lowest,
        },
      ],
      layerMaterialIds: content.layers.map((l) => l.materialId),
      measured: {
        quantity: spectrum.quantity,
        angleDeg: spectrum.angleDeg,
        wavelengthsNm: spectrum.wavelengthsNm,
        valuesPercent: spectrum.valuesPercent,
      },
      factorRange: dto.factorRange,
    };
    return this.calculations.submitOptimisation('diagnosis', input, user, {
      designId: run.designId,
      versionNumber: run.versionNumber,
      runId,
    });
  }

  /** A completed Fit to mask or Grow layers result becomes a new draft version of its design. */
  async accept(calculationId: number, step: number | undefined, user: User): Promise<DesignVersionView> {
    const calc = await missingAsBadRequest(
      this.calculations.get(calculationId),
      `calculation ${calculationId} does not exist`,
    );
    if (calc.kind !== 'fit' && calc.kind !== 'grow') {
      throw new BadRequestException({ message: [`a ${calc.kind} result does not make a new version`] });
    }
    if (
      calc.status !== 'completed' ||
      !calc.summary ||
      calc.designId === null ||
      calc.versionNumber === null
    ) {
      throw new ConflictException(
        `Calculation ${calculationId} is ${calc.status}; only a completed result can be accepted`,
      );
    }
    const from = await this.designs.getVersion(calc.designId, calc.versionNumber);
    let layers: DesignVersionView['layers'];
    if (calc.kind === 'fit') {
      const result = calc.summary as unknown as FitResult;
      layers = from.layers.map((l, i) => ({
        ...l,
        thicknessNm: elementAt(result.thicknessesNm, i, 'the fitted thicknesses'),
      }));
    } else {
      const result = calc.summary as unknown as GrowResult;
      const chosen = step === undefined ? result.final : result.steps.find((s) => s.step === step);
      if (!chosen) throw new BadRequestException({ message: [`step: the result has no step ${step}`] });
      const input = calc.input as GrowInput;
      const ids = new Map<string, number>(input.allowed.map((a) => [a.name, a.materialId]));
      const names = await this.materialNames(input.layerMaterialIds);
      names.forEach((id, name) => ids.set(name, id));
      layers = chosen.layers.map((l) => {
        const id = grownLayerMaterialId(String(l.material), input.layerMaterialIds, ids);
        if (id === undefined)
          throw new BadRequestException({
            message: [`material ${String(l.material)} is not in the library`],
          });
        return { materialId: id, thicknessNm: l.thicknessNm, locked: false, notes: '' };
      });
    }
    return this.designs.draftFrom(calc.designId, calc.versionNumber, layers, user);
  }

  private async materialNames(ids: number[]): Promise<Map<string, number>> {
    const rows = await this.materials.findByIds(ids);
    return new Map(rows.map((m) => [m.name, m.id]));
  }

  /** The version's stack, back surface, layers and the chosen (or the design's) spec mask. */
  private async base(designId: number, number: number, specMaskId: number | undefined) {
    const { content, materials } = await this.designs.contentForCompute(designId, number);
    if (content.layers.length === 0)
      throw new BadRequestException({ message: ['the version has no layers'] });
    const design = await this.designs.get(designId);
    const maskId = specMaskId ?? design.specMaskId;
    if (!maskId)
      throw new BadRequestException({ message: ['specMaskId: the design has no spec mask; choose one'] });
    const mask = await missingAsBadRequest(
      this.masks.get(maskId),
      `specMaskId: spec mask ${maskId} does not exist`,
    );
    let bands: LimitBand[];
    try {
      bands = validateSpecMask({ bands: mask.bands }).bands;
    } catch (err) {
      if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
      throw err;
    }
    return {
      locked: content.layers.map((l) => l.locked),
      layerNames: content.layers.map((l) => materials.get(l.materialId)?.name ?? `material ${l.materialId}`),
      common: {
        stack: designStackDescription(content, materials),
        back: engineBackSurface(content.backSurface),
        bands,
        layerMaterialIds: content.layers.map((l) => l.materialId),
      },
    };
  }
}
