import { BadRequestException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import {
  designStackDescription,
  engineBackSurface,
  isApprovedForCustomers,
} from '@quietglass/shared/designs';
import { evaluateMaskOnMeasured } from '@quietglass/shared/measured';
import { validateSpecMask, type LimitBand } from '@quietglass/shared/optics/mask';
import { parseStack } from '@quietglass/shared/optics/stack';
import type { ReportBandRow, ReportSummary } from '@quietglass/shared/reports';
import type { CreateReportInput } from '@quietglass/shared/schemas/reports';
import { missingAsBadRequest, orNull } from '../common/not-found.js';
import { ApprovalsService } from '../designs/approvals.service.js';
import { DesignsService } from '../designs/designs.service.js';
import type { RunSpectrum } from '../runs/run.entity.js';
import { RunsService } from '../runs/runs.service.js';
import { internalMaskProblem, SpecMasksService } from '../spec-masks/spec-masks.service.js';
import { isCustomerSpecification } from '@quietglass/shared/customers';
import { ShopSettingsService } from '../shop-settings/shop-settings.service.js';
import type { User } from '../users/user.entity.js';
import { documentNumber, renderReportPdf, type PlotSeries } from './report-pdf.js';
import { ComplianceReport } from './report.entity.js';
import { bandDescription, colourOf, computeDesignedOffThread } from './report-compute.js';

@Injectable()
export class ReportsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly designs: DesignsService,
    private readonly approvals: ApprovalsService,
    private readonly masks: SpecMasksService,
    private readonly runs: RunsService,
    private readonly shop: ShopSettingsService,
  ) {}

  /** Computes the compliance of a version against a mask, renders the PDF and stores both. */
  async create(dto: CreateReportInput, user: User): Promise<ComplianceReport> {
    const version = await this.designs.findVersion(dto.designId, dto.versionNumber);
    if (!isApprovedForCustomers(version.status)) {
      throw new BadRequestException({
        message: [
          `version ${dto.versionNumber} is ${version.status}; compliance reports are for approved or released versions`,
        ],
      });
    }
    const design = version.design;
    const maskId = dto.specMaskId ?? design.specMaskId;
    if (!maskId)
      throw new BadRequestException({ message: ['specMaskId: the design has no spec mask; choose one'] });
    const mask = await missingAsBadRequest(
      this.masks.get(maskId),
      `specMaskId: spec mask ${maskId} does not exist`,
    );
    if (mask.customer.id !== design.customer.id) {
      throw new BadRequestException({
        message: [`specMaskId: spec mask ${maskId} belongs to another customer`],
      });
    }
    if (!isCustomerSpecification(mask)) {
      throw new BadRequestException({ message: [internalMaskProblem(mask, dto.specMaskId === undefined)] });
    }
    const snapshot = version.materialsSnapshot ?? {};
    const materials = new Map(Object.entries(snapshot).map(([k, v]) => [Number(k), v]));
    const description = designStackDescription(version, materials);
    const back = engineBackSurface(version.backSurface);
    const bands = validateSpecMask({ bands: mask.bands }).bands;

    // The shared schema has refused a run without its spectrum and a spectrum without its run.
    const measured =
      dto.runId !== undefined && dto.spectrumId !== undefined
        ? await this.measured(dto, dto.runId, dto.spectrumId)
        : null;
    let summary: ReportSummary;
    let plots: PlotSeries[];
    if (measured) {
      summary = this.measuredSummary(bands, measured);
      plots = this.measuredPlots(bands, measured);
      summary.colour = colourOf(parseStack(description), back);
    } else {
      // The designed spectrum on the mask's grid can be large: computed off the event loop.
      const designed = await computeDesignedOffThread({ bands, stack: description, back });
      summary = designed.summary;
      plots = designed.plots;
      summary.colour = designed.colour;
    }
    const date = new Date().toISOString().slice(0, 10);
    const statement = measured
      ? `Measured values: ${measured.sample} of run ${dto.runId}, lot ${measured.lot}, ${measured.quantity} at ${measured.angleDeg}° (file ${measured.filename}). Bands at other angles or quantities are not evaluated from this measurement.`
      : 'Designed values: computed from the approved design (characteristic-matrix method, unpolarised light unless a band says otherwise, thick substrate as the design specifies). They are not measurements of a coated part.';
    const approval = await this.approvals.lastApproval(dto.designId, dto.versionNumber);
    const layers = dto.hideLayers
      ? null
      : version.layers.map((l) => ({
          material: snapshot[String(l.materialId)]?.name ?? `#${l.materialId}`,
          thicknessNm: l.thicknessNm,
        }));
    // The document number comes from the report's id: the row is written first and its PDF added
    // in the same transaction, so no report is ever seen without one.
    const header = await this.shop.header();
    const id = await this.db.transaction(async (tx) => {
      const repo = tx.getRepository(ComplianceReport);
      const saved = await repo.save(
        repo.create({
          designId: dto.designId,
          versionNumber: dto.versionNumber,
          specMaskId: maskId,
          hideLayers: dto.hideLayers,
          runId: dto.runId ?? null,
          spectrumId: dto.spectrumId ?? null,
          summary,
          pdf: Buffer.alloc(0),
          createdBy: user,
        }),
      );
      await this.masks.markInUse(maskId, tx);
      const pdf = await renderReportPdf({
        shop: header.shopName,
        logo: header.logo,
        documentNumber: documentNumber(saved.id),
        customer: design.customer.name,
        part: design.name,
        version: version.number,
        approval: approval
          ? { by: approval.actor.displayName, on: approval.at.toISOString().slice(0, 10) }
          : null,
        mask: mask.name,
        maskRevision: mask.revision,
        date,
        statement,
        plots,
        summary,
        layers,
      });
      await repo.update(saved.id, { pdf });
      return saved.id;
    });
    return this.get(id);
  }

  list(designId?: number): Promise<ComplianceReport[]> {
    return this.db.getRepository(ComplianceReport).find({
      where: designId === undefined ? {} : { designId },
      order: { id: 'DESC' },
      take: 200,
    });
  }

  async get(id: number): Promise<ComplianceReport> {
    const r = await this.db.getRepository(ComplianceReport).findOneBy({ id });
    if (!r) throw new NotFoundException(`Compliance report ${id} does not exist`);
    return r;
  }

  async pdf(id: number): Promise<Buffer> {
    const r = await this.db
      .getRepository(ComplianceReport)
      .findOne({ where: { id }, select: { id: true, pdf: true } });
    if (!r) throw new NotFoundException(`Compliance report ${id} does not exist`);
    return r.pdf;
  }

  /** The reports with these ids that exist, without their PDFs. */
  summaries(ids: number[]): Promise<ComplianceReport[]> {
    if (ids.length === 0) return Promise.resolve([]);
    return this.db.getRepository(ComplianceReport).find({
      where: { id: In(ids) },
      select: { id: true, designId: true, versionNumber: true, specMaskId: true },
    });
  }

  /** The reports of these designs, newest first, without their PDFs. */
  forDesigns(designIds: number[]): Promise<ComplianceReport[]> {
    if (designIds.length === 0) return Promise.resolve([]);
    return this.db.getRepository(ComplianceReport).find({
      where: { designId: In(designIds) },
      order: { createdAt: 'DESC', id: 'DESC' },
    });
  }

  /** PDFs of several reports (for e-mail), all of which must exist. */
  async pdfs(ids: number[]): Promise<{ id: number; pdf: Buffer }[]> {
    if (ids.length === 0) return [];
    const rows = await this.db
      .getRepository(ComplianceReport)
      .find({ where: { id: In(ids) }, select: { id: true, pdf: true } });
    return rows.map((r) => ({ id: r.id, pdf: r.pdf }));
  }

  private async measured(dto: CreateReportInput, runId: number, spectrumId: number) {
    const run = await orNull(this.runs.get(runId));
    if (!run || run.designId !== dto.designId || run.versionNumber !== dto.versionNumber) {
      throw new BadRequestException({
        message: [`runId: run ${runId} did not build design ${dto.designId} version ${dto.versionNumber}`],
      });
    }
    const spectrum = await missingAsBadRequest(
      this.runs.spectrum(runId, spectrumId),
      `spectrumId: run ${runId} has no spectrum ${spectrumId}`,
    );
    return { ...spectrum, lot: run.lotNumber };
  }

  private measuredSummary(bands: LimitBand[], m: RunSpectrum): ReportSummary {
    const result = evaluateMaskOnMeasured({ bands }, m);
    const rows: ReportBandRow[] = result.bands.map((b, i) => ({
      ...bandDescription(bands, i),
      evaluated: b.evaluated,
      pass: b.pass ?? null,
      worstMargin: b.worstMargin ?? null,
      worstAtNm: b.worstAt?.wavelengthNm ?? null,
      worstAtDeg: b.worstAt ? m.angleDeg : null,
      valuePercent: b.worstAt?.valuePercent ?? null,
      ...(b.reason ? { reason: b.reason } : {}),
    }));
    return {
      source: 'measured',
      pass: result.pass,
      worstMargin: result.worstMargin,
      bands: rows,
      colour: null,
    };
  }

  private measuredPlots(bands: LimitBand[], m: RunSpectrum): PlotSeries[] {
    return [
      {
        title: `${m.quantity} measured at ${m.angleDeg}° (${m.sample})`,
        quantity: m.quantity,
        wavelengthsNm: m.wavelengthsNm,
        valuesPercent: m.valuesPercent,
        bands: bands.filter((b) => b.quantity === m.quantity),
      },
    ];
  }
}
