import { Injectable } from '@nestjs/common';
import type { CustomerRecordLink, CustomerRecords } from '@quietglass/shared/customers';
import { CustomersService } from '../customers/customers.service.js';
import { DesignsService } from '../designs/designs.service.js';
import { QuotesService } from '../quotes/quotes.service.js';
import { ReportsService } from '../reports/reports.service.js';
import { SpecMasksService } from '../spec-masks/spec-masks.service.js';

const newestFirst = (a: CustomerRecordLink, b: CustomerRecordLink) => b.at.localeCompare(a.at) || b.id - a.id;

/** A customer's spec masks, designs, compliance reports and quotes, each asked of its own module. */
@Injectable()
export class CustomerRecordsService {
  constructor(
    private readonly customers: CustomersService,
    private readonly masks: SpecMasksService,
    private readonly designs: DesignsService,
    private readonly reports: ReportsService,
    private readonly quotes: QuotesService,
  ) {}

  /** Newest first in each list; 404 when the customer does not exist. */
  async forCustomer(id: number): Promise<CustomerRecords> {
    await this.customers.get(id);
    const [masks, designs, quotes] = await Promise.all([
      this.masks.list(id),
      this.designs.list(id),
      this.quotes.forCustomer(id),
    ]);
    const reports = await this.reports.forDesigns(designs.map((d) => d.id));
    const designName = new Map(designs.map((d) => [d.id, d.name]));
    const maskTitle = new Map(masks.map((m) => [m.id, `${m.name} rev ${m.revision}`]));
    return {
      masks: masks
        .map((m) => ({
          id: m.id,
          title: `${m.name} rev ${m.revision}`,
          status: m.kind,
          at: m.updatedAt.toISOString(),
        }))
        .sort(newestFirst),
      designs: designs.map((d) => ({
        id: d.id,
        title: d.name,
        status: d.latestVersion.status,
        at: d.latestVersion.updatedAt,
      })),
      // A report is always against a mask of the design's own customer (reports check it).
      reports: reports.map((r) => ({
        id: r.id,
        title: `${designName.get(r.designId) ?? `design ${r.designId}`} v${r.versionNumber} against ${maskTitle.get(r.specMaskId) ?? `spec mask ${r.specMaskId}`}`,
        status: r.runId === null ? 'design' : 'run',
        at: r.createdAt.toISOString(),
      })),
      quotes: quotes.map((q) => ({
        id: q.id,
        title: `Q-${q.id}: ${q.partDescription}`,
        status: q.status,
        at: q.updatedAt.toISOString(),
      })),
    };
  }
}
