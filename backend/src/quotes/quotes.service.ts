import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import { isApprovedForCustomers } from '@quietglass/shared/designs';
import type { QuoteStatus } from '@quietglass/shared/quotes';
import { CustomersService } from '../customers/customers.service.js';
import { Design } from '../designs/design.entity.js';
import { DesignVersion } from '../designs/design-version.entity.js';
import { MailService } from '../mail/mail.service.js';
import { ComplianceReport } from '../reports/report.entity.js';
import { ReportsService } from '../reports/reports.service.js';
import { SpecMaskRecord } from '../spec-masks/spec-mask.entity.js';
import type { User } from '../users/user.entity.js';
import type { QuoteDecisionDto, QuoteDto, UpdateQuoteDto } from './dto/quote.dto.js';
import { Quote } from './quote.entity.js';

/** Today in the shop's calendar (UTC), YYYY-MM-DD. */
const today = () => new Date().toISOString().slice(0, 10);

/** A sent quote past its validity is expired; the status is derived so it is never stale. */
export function effectiveStatus(q: Pick<Quote, 'status' | 'validUntil'>): QuoteStatus {
  return q.status === 'sent' && q.validUntil < today() ? 'expired' : q.status;
}

@Injectable()
export class QuotesService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly customers: CustomersService,
    private readonly reports: ReportsService,
    private readonly mail: MailService,
  ) {}

  list(): Promise<Quote[]> {
    return this.db.getRepository(Quote).find({ order: { id: 'DESC' }, take: 500 });
  }

  async get(id: number): Promise<Quote> {
    const q = await this.db.getRepository(Quote).findOneBy({ id });
    if (!q) throw new NotFoundException(`Quote ${id} does not exist`);
    return q;
  }

  async create(dto: QuoteDto, user: User): Promise<Quote> {
    const fields = await this.checked(dto);
    const repo = this.db.getRepository(Quote);
    const saved = await repo.save(
      repo.create({
        ...fields,
        status: 'draft',
        reportIds: [],
        history: [event(user, 'created')],
        createdBy: user,
      }),
    );
    return this.get(saved.id);
  }

  async update(id: number, dto: UpdateQuoteDto, user: User): Promise<Quote> {
    const quote = await this.get(id);
    if (quote.status !== 'draft')
      throw new ConflictException(`Quote ${id} is ${quote.status}; only a draft can be edited`);
    if (quote.version !== dto.version) {
      throw new ConflictException(
        `Quote ${id} was changed by someone else (now version ${quote.version}); reload it and apply your edit again`,
      );
    }
    Object.assign(quote, await this.checked(dto));
    quote.history = [...quote.history, event(user, 'edited')];
    await this.db.getRepository(Quote).save(quote);
    return this.get(id);
  }

  /** Attaches compliance reports of the quote's own design version and mask. */
  async attach(id: number, reportIds: number[], user: User): Promise<Quote> {
    const quote = await this.get(id);
    if (quote.status !== 'draft')
      throw new ConflictException(`Quote ${id} is ${quote.status}; attach reports to a draft`);
    const found = await this.db.getRepository(ComplianceReport).findBy({ id: In(reportIds) });
    const problems = reportIds.flatMap((rid) => {
      const r = found.find((x) => x.id === rid);
      if (!r) return [`report ${rid} does not exist`];
      if (r.designId !== quote.designId || r.versionNumber !== quote.versionNumber) {
        return [`report ${rid} is of another design version than the quote`];
      }
      return [];
    });
    if (problems.length > 0) throw new BadRequestException({ message: problems });
    quote.reportIds = [...new Set([...quote.reportIds, ...reportIds])];
    quote.history = [
      ...quote.history,
      event(user, 'reports attached', reportIds.map((r) => `#${r}`).join(', ')),
    ];
    await this.db.getRepository(Quote).save(quote);
    return this.get(id);
  }

  /**
   * E-mails the quote with its reports attached. Only an accepted hand-over to the SMTP server marks
   * it sent; a failure leaves it a draft with the error recorded and reported.
   */
  async send(id: number, user: User): Promise<Quote> {
    const quote = await this.get(id);
    if (quote.status !== 'draft')
      throw new ConflictException(`Quote ${id} is ${quote.status}; it was sent already`);
    if (quote.validUntil < today()) {
      throw new BadRequestException({
        message: ['validUntil is in the past: set a new validity date before sending'],
      });
    }
    const design = await this.db.getRepository(Design).findOneByOrFail({ id: quote.designId });
    const pdfs = await this.reports.pdfs(quote.reportIds);
    const lines = [
      `Dear ${quote.customer.name},`,
      '',
      `please find our quote Q-${quote.id} for ${quote.partDescription}, coated to design "${design.name}" version ${quote.versionNumber}.`,
      '',
      ...quote.quantityBreaks.map(
        (b) => `  from ${b.minQuantity} pcs: ${b.unitPrice.toFixed(2)} ${quote.currency} per part`,
      ),
      '',
      `Lead time: ${quote.leadTimeDays} days. Valid until ${quote.validUntil}.`,
      quote.terms ? `\n${quote.terms}` : '',
      pdfs.length > 0 ? `\nAttached: ${pdfs.length} spec-compliance report(s).` : '',
    ];
    try {
      await this.mail.send({
        to: quote.contactEmail,
        subject: `Quote Q-${quote.id}: ${quote.partDescription}`,
        text: lines.join('\n'),
        attachments: pdfs.map((p) => ({
          filename: `compliance-report-${p.id}.pdf`,
          content: p.pdf,
          contentType: 'application/pdf',
        })),
      });
    } catch (err) {
      const message = err instanceof Error ? err.message : String(err);
      await this.db.getRepository(Quote).update(id, {
        lastSendError: message,
        history: [...quote.history, event(user, 'send failed', message)],
      });
      throw new BadRequestException(`The e-mail could not be sent; the quote stays a draft: ${message}`);
    }
    await this.db.getRepository(Quote).update(id, {
      status: 'sent',
      lastSendError: null,
      history: [...quote.history, event(user, 'sent', quote.contactEmail)],
    });
    return this.get(id);
  }

  async decide(id: number, dto: QuoteDecisionDto, user: User): Promise<Quote> {
    const quote = await this.get(id);
    if (effectiveStatus(quote) !== 'sent') {
      throw new ConflictException(
        `Quote ${id} is ${effectiveStatus(quote)}; only a sent quote can be accepted or declined`,
      );
    }
    quote.status = dto.status;
    quote.history = [...quote.history, event(user, dto.status, dto.note)];
    await this.db.getRepository(Quote).save(quote);
    return this.get(id);
  }

  /** Validates the references and dates of a quote; errors name the field. */
  private async checked(dto: QuoteDto): Promise<Partial<Quote>> {
    const problems: string[] = [];
    const customer = await this.customers.get(dto.customerId).catch(() => null);
    if (!customer) problems.push(`customerId: customer ${dto.customerId} does not exist`);
    const version = await this.db
      .getRepository(DesignVersion)
      .findOne({ where: { designId: dto.designId, number: dto.versionNumber }, relations: { design: true } });
    if (!version) problems.push(`versionNumber: design ${dto.designId} has no version ${dto.versionNumber}`);
    else if (!isApprovedForCustomers(version.status)) {
      problems.push(
        `versionNumber: version ${dto.versionNumber} is ${version.status}; quotes need an approved version`,
      );
    } else if (customer && version.design.customer.id !== customer.id) {
      problems.push(`designId: design ${dto.designId} belongs to another customer`);
    }
    const maskId = dto.specMaskId ?? version?.design.specMaskId ?? null;
    if (maskId === null) problems.push('specMaskId: choose the spec mask the quote refers to');
    else {
      const mask = await this.db.getRepository(SpecMaskRecord).findOneBy({ id: maskId });
      if (!mask) problems.push(`specMaskId: spec mask ${maskId} does not exist`);
      else if (customer && mask.customer.id !== customer.id)
        problems.push(`specMaskId: spec mask ${maskId} belongs to another customer`);
    }
    if (dto.validUntil <= today()) problems.push(`validUntil: must be in the future (after ${today()})`);
    const quantities = dto.quantityBreaks.map((b) => b.minQuantity);
    if (quantities.some((q, i) => i > 0 && q <= quantities[i - 1])) {
      problems.push('quantityBreaks: minQuantity must increase from one break to the next');
    }
    if (problems.length > 0) throw new BadRequestException({ message: problems });
    return {
      customer: customer as NonNullable<typeof customer>,
      contactEmail: dto.contactEmail,
      designId: dto.designId,
      versionNumber: dto.versionNumber,
      specMaskId: maskId as number,
      partDescription: dto.partDescription,
      quantityBreaks: dto.quantityBreaks.map((b) => ({ minQuantity: b.minQuantity, unitPrice: b.unitPrice })),
      currency: dto.currency,
      leadTimeDays: dto.leadTimeDays,
      validUntil: dto.validUntil,
      terms: dto.terms ?? '',
    };
  }
}

function event(user: User, action: string, detail?: string) {
  return { at: new Date().toISOString(), actor: user.displayName, action, ...(detail ? { detail } : {}) };
}
