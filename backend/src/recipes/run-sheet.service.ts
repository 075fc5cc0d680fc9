import { BadRequestException, Injectable } from '@nestjs/common';
import PDFDocument from 'pdfkit';
import { runSheetCalibrationLine } from '@quietglass/shared/calibration';
import { buildRunSheet, type RunSheetView } from '@quietglass/shared/runsheet';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { CalibrationService } from '../calibration/calibration.service.js';
import { ChambersService } from '../chambers/chambers.service.js';
import { RecipesService } from '../designs/recipes.service.js';
import { MaterialsService } from '../materials/materials.service.js';

/** Run sheets for released recipes on a chosen chamber: JSON for the page, PDF for the floor. */
@Injectable()
export class RunSheetService {
  constructor(
    private readonly recipes: RecipesService,
    private readonly chambers: ChambersService,
    private readonly materials: MaterialsService,
    private readonly calibration: CalibrationService,
  ) {}

  async build(
    designId: number,
    number: number,
    chamberId: number,
    monitorWavelengthNm?: number,
  ): Promise<RunSheetView> {
    const version = await this.recipes.releasedRecipe(designId, number);
    const chamber = await this.chambers.get(chamberId);
    const lambda = monitorWavelengthNm ?? chamber.monitorWavelengthsNm[0];
    // A released version computes with the material models frozen at submission.
    const snapshot = version.materialsSnapshot ?? {};
    const ids = [chamber.monitorChipMaterialId, ...chamber.materials.map((m) => m.materialId)];
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
    const settings: Record<string, { toolingFactor: number; rateNmPerS: number }> = {};
    for (const m of chamber.materials) {
      const name = library.get(m.materialId)?.name;
      if (name) settings[name] = { toolingFactor: m.toolingFactor, rateNmPerS: m.rateNmPerS };
    }
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
        recipe: { designId, number, name: version.design.name, customer: version.design.customer.name },
        chamber: { id: chamber.id, name: chamber.name },
        calibration,
      };
    } catch (err) {
      if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
      throw err;
    }
  }

  /** A printable PDF of the run sheet: title block, cautions, the layer table, totals. */
  async pdf(sheet: RunSheetView): Promise<Buffer> {
    const doc = new PDFDocument({
      size: 'A4',
      margin: 40,
      info: { Title: `Run sheet ${sheet.recipe.name} v${sheet.recipe.number}` },
    });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
    doc
      .font('Helvetica-Bold')
      .fontSize(16)
      .text(`Run sheet — ${sheet.recipe.name}, version ${sheet.recipe.number}`);
    doc.font('Helvetica').fontSize(10);
    doc.text(
      `Customer: ${sheet.recipe.customer}    Chamber: ${sheet.chamber.name}    Monitor wavelength: ${sheet.monitorWavelengthNm} nm`,
    );
    doc.text(sheet.convention);
    doc.text(
      runSheetCalibrationLine(
        sheet.calibration,
        sheet.layers.map((l) => l.material),
      ),
    );
    doc.moveDown(0.5);
    doc.font('Helvetica-Bold').text('Safety');
    doc.font('Helvetica').fontSize(8);
    for (const c of sheet.cautions) doc.text(`• ${c}`);
    doc.moveDown(0.5).fontSize(9);
    const cols = [40, 75, 150, 215, 265, 330, 385, 440, 495];
    const header = [
      'Step',
      'Material',
      'Part nm',
      'Tooling',
      'Monitor nm',
      'QWOT',
      'Rate nm/s',
      'Time s',
      'Turns (nm)',
    ];
    let y = doc.y;
    doc.font('Helvetica-Bold');
    header.forEach((h, i) => doc.text(h, cols[i], y, { lineBreak: false }));
    doc.font('Helvetica');
    y += 14;
    for (const l of sheet.layers) {
      if (y > 780) {
        doc.addPage();
        y = 40;
      }
      const row = [
        String(l.step),
        l.material,
        l.partThicknessNm.toFixed(2),
        l.toolingFactor.toFixed(3),
        l.monitorThicknessNm.toFixed(2),
        l.qwotAtMonitor.toFixed(3),
        l.rateNmPerS.toFixed(2),
        l.timeS.toFixed(0),
        l.turningPointsNm.map((t) => t.toFixed(1)).join(', ') || '—',
      ];
      row.forEach((v, i) => doc.text(v, cols[i], y, { lineBreak: false }));
      y += 13;
    }
    doc
      .font('Helvetica-Bold')
      .text(
        `Totals: ${sheet.totals.partThicknessNm.toFixed(1)} nm on the part, ${sheet.totals.monitorThicknessNm.toFixed(1)} nm on the monitor, ${(sheet.totals.timeS / 60).toFixed(1)} min deposition`,
        40,
        y + 8,
      );
    doc.end();
    return done;
  }
}
