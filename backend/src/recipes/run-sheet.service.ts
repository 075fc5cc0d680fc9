import { BadRequestException, Injectable } from '@nestjs/common';
import { buildRunSheet, sidesOfDesign, type RunSheetView } from '@quietglass/shared/runsheet';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { CalibrationService } from '../calibration/calibration.service.js';
import { ChambersService } from '../chambers/chambers.service.js';
import { RecipesService } from '../designs/recipes.service.js';
import { MaterialsService } from '../materials/materials.service.js';
import { ShopSettingsService } from '../shop-settings/shop-settings.service.js';
import type { RunSheetQuery } from '@quietglass/shared/schemas/run-sheet';
import { renderRunSheetPdf } from './run-sheet-pdf.js';
import { elementAt } from '@quietglass/shared/checked';

/** Run sheets for released recipes on a chosen chamber: JSON for the page, PDF for the floor. */
@Injectable()
export class RunSheetService {
  constructor(
    private readonly recipes: RecipesService,
    private readonly chambers: ChambersService,
    private readonly materials: MaterialsService,
    private readonly calibration: CalibrationService,
    private readonly shop: ShopSettingsService,
  ) {}

  async build(designId: number, number: number, query: RunSheetQuery): Promise<RunSheetView> {
    const version = await this.recipes.releasedRecipe(designId, number);
    const chamber = await this.chambers.get(query.chamberId);
    const lambda =
      query.monitorWavelengthNm ??
      elementAt(chamber.monitorWavelengthsNm, 0, "the chamber's monitor wavelengths");
    const designSides = sidesOfDesign(version.backSurface);
    if (query.sides !== undefined && query.sides !== designSides) {
      throw new BadRequestException({
        message: [
          designSides === 'both'
            ? 'sides: this design carries the same coating on its back surface; its run sheet coats both sides'
            : 'sides: this design leaves the back surface uncoated; coating both sides would not be the approved design',
        ],
      });
    }
    // A released version computes with the material models frozen at submission.
    const snapshot = version.materialsSnapshot ?? {};
    const ids = [
      chamber.monitorChipMaterialId,
      version.substrateMaterialId,
      ...chamber.materials.map((m) => m.materialId),
    ];
    const library = new Map((await this.materials.findByIds(ids)).map((m) => [m.id, m]));
    const chip = library.get(chamber.monitorChipMaterialId);
    if (!chip)
      throw new BadRequestException(
        `The monitor chip material of chamber "${chamber.name}" no longer exists`,
      );
    const calibration = await this.calibration.forRunSheet(
      chamber,
      new Map([...library.values()].map((m) => [m.id, m.name])),
    );
    const substrate =
      snapshot[String(version.substrateMaterialId)]?.name ?? library.get(version.substrateMaterialId)?.name;
    const settings: Record<string, { toolingFactor: number; rateNmPerS: number }> = {};
    for (const m of chamber.materials) {
      const name = library.get(m.materialId)?.name;
      if (name) settings[name] = { toolingFactor: m.toolingFactor, rateNmPerS: m.rateNmPerS };
    }
    const process = new Map(
      (await this.chambers.getProcessSettings(chamber.id)).settings.map((s) => [s.materialId, s]),
    );
    const shop = await this.shop.get();
    try {
      const sheet = buildRunSheet({
        layers: version.layers.map((l, i) => {
          const material = snapshot[String(l.materialId)];
          if (!material)
            throw new OpticsInputError(`layers[${i}]`, `material ${l.materialId} is missing from the recipe`);
          return { material: material.name, model: material.model, thicknessNm: l.thicknessNm };
        }),
        monitorChip: chip.model,
        chamber: { monitorWavelengthNm: lambda, materials: settings },
      });
      return {
        ...sheet,
        layers: sheet.layers.map((l) => ({
          ...l,
          process:
            process.get(elementAt(version.layers, l.designLayer - 1, 'the recipe layers').materialId) ?? null,
        })),
        recipe: { designId, number, name: version.design.name, customer: version.design.customer.name },
        chamber: { id: chamber.id, name: chamber.name },
        calibration,
        shop: { name: shop.shopName, hasLogo: shop.logo !== null },
        substrate: {
          material: substrate ?? `material ${version.substrateMaterialId}`,
          thicknessMm: query.substrateThicknessMm ?? version.substrateThicknessMm,
          designThicknessMm: version.substrateThicknessMm,
        },
        job: { part: query.part ?? '', quantity: query.quantity ?? null, sides: designSides },
      };
    } catch (err) {
      if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
      throw err;
    }
  }

  /** The printable PDF, with the shop's logo in the header when one was uploaded. */
  async pdf(sheet: RunSheetView): Promise<Buffer> {
    const { logo } = await this.shop.header();
    return renderRunSheetPdf(sheet, { logo, printedOn: new Date().toISOString().slice(0, 10) });
  }
}
