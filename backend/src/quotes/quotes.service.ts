import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { isApprovedForCustomers } from '@quietglass/shared/designs';
import { todayUtc, type QuoteStatus } from '@quietglass/shared/quotes';
import type { QuoteDecisionInput, QuoteInput, QuoteUpdate } from '@quietglass/shared/schemas/quotes';
import { AuditService } from '../audit/audit.service.js';
import { orNull } from '../common/not-found.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import { CustomersService } from '../customers/customers.service.js';
import { internalMaskProblem } from '../spec-masks/spec-masks.service.js';
import { isCustomerSpecification } from '@quietglass/shared/customers';
import { DesignsService } from '../designs/designs.service.js';
import { MailService } from '../mail/mail.service.js';
import { ReportsService } from '../reports/reports.service.js';
import { SpecMasksService } from '../spec-masks/spec-masks.service.js';
import type { User } from '../users/user.entity.js';
import { Quote } from './quote.entity.js';

/** A sent quote past its validity is expired; the status is derived so it is never stale. */
export function effectiveStatus(q: Pick<Quote, 'status' | 'validUntil'>): QuoteStatus {
  return q.status === 'sent' && q.validUntil < todayUtc() ? 'expired' : q.status;
}

@Injectable()
export class QuotesService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly customers: CustomersService,
    private readonly reports: ReportsService,
    private readonly designs: DesignsService,
    private readonly masks: SpecMasksService,
    private readonly mail: MailService,
    private readonly audit: AuditService,
  ) {}

  list(): Promise<Quote[]> {
    return this.db.getRepository(Quote).find({ order: { id: 'DESC' }, take: 500 });
  }

  /** One customer's quotes, newest change first. */
  forCustomer(customerId: number): Promise<Quote[]> {
    return this.db
      .getRepository(Quote)
      .find({ where: { customer: { id: customerId } }, order: { updatedAt: 'DESC', id: 'DESC' } });
  }

  async get(id: number): Promise<Quote> {
    const q = await this.db.getRepository(Quote).findOneBy({ id });
    if (!q) throw new NotFoundException(`Quote ${id} does not exist`);
    return q;
  }

  async create(dto: QuoteInput, user: User): Promise<Quote> {
    const fields = await this.checked(dto);
    // Archived customers keep their quotes but get no new ones.
    if (fields.customer?.archivedAt) await this.customers.active(fields.customer.id);
    const id = await this.db.transaction(async (tx) => {
      const repo = tx.getRepository(Quote);
      const saved = await repo.save(
        repo.create({
          ...fields,
          status: 'draft',
          reportIds: [],
          history: [event(user, 'created')],
          createdBy: user,
        }),
      );
      await this.masks.markInUse(saved.specMaskId, tx);
      await this.audit.record(tx, {
        actor: user,
        entity: 'quote',
        entityId: saved.id,
        action: 'created',
        summary: `quote Q-${saved.id} for ${fields.customer?.name ?? ''}: ${saved.partDescription}`,
        details: { designId: saved.designId, versionNumber: saved.versionNumber },
      });
      return saved.id;
    });
    return this.get(id);
  }

  async update(id: number, dto: QuoteUpdate, user: User): Promise<Quote> {
    const quote = await this.get(id);
    if (quote.status !== 'draft')
      throw new ConflictException(`Quote ${id} is ${quote.status}; only a draft can be edited`);
    const fields = await this.checked(dto);
    await this.db.transaction(async (tx) => {
      await updateIfVersion(
        tx,
        Quote,
        {
          id,
          expectedVersion: dto.version,
          set: { ...fields, history: [...quote.history, event(user, 'edited')] },
          where: "status = 'draft'",
        },
        async () => staleQuote(await this.get(id)),
      );
      if (fields.specMaskId !== undefined) await this.masks.markInUse(fields.specMaskId, tx);
      await this.audit.record(tx, {
        actor: user,
        entity: 'quote',
        entityId: id,
        action: 'edited',
        summary: `quote Q-${id} edited`,
        details: { fromVersion: dto.version },
      });
    });
    return this.get(id);
  }

  /** Attaches compliance reports of the quote's own design version and mask. */
  async attach(id: number, reportIds: number[], user: User): Promise<Quote> {
    const quote = await this.get(id);
    if (quote.status !== 'draft')
      throw new ConflictException(`Quote ${id} is ${quote.status}; attach reports to a draft`);
    const found = await this.reports.summaries(reportIds);
    const problems = reportIds.flatMap((rid) => {
      const r = found.find((x) => x.id === rid);
      if (!r) return [`report ${rid} does not exist`];
      if (r.designId !== quote.designId || r.versionNumber !== quote.versionNumber) {
        return [`report ${rid} is of another design version than the quote`];
      }
      return [];
    });
    if (problems.length > 0) throw new BadRequestException({ message: problems });
    const list = reportIds.map((r) => `#${r}`).join(', ');
    await this.db.transaction(async (tx) => {
      // Based on the quote as read above: a concurrent change makes this one a 409, never a lost update.
      await updateIfVersion(
        tx,
        Quote,
        {
          id,
          expectedVersion: quote.version,
          set: {
            reportIds: [...new Set([...quote.reportIds, ...reportIds])],
            history: [...quote.history, event(user, 'reports attached', list)],
          },
          where: "status = 'draft'",
        },
        async () => staleQuote(await this.get(id)),
      );
      await this.audit.record(tx, {
        actor: user,
        entity: 'quote',
        entityId: id,
        action: 'reports attached',
        summary: `reports ${list} attached to Q-${id}`,
        details: { reportIds },
      });
    });
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
    if (quote.validUntil < todayUtc()) {
      throw new BadRequestException({
        message: ['validUntil is in the past: set a new validity date before sending'],
      });
    }
    // Exactly once: the draft is claimed by one conditional UPDATE before any e-mail leaves, so of
    // concurrent sends one delivers and the others get 409.
    await updateIfVersion(
      this.db.manager,
      Quote,
      { id, expectedVersion: quote.version, set: { status: 'sent' }, where: "status = 'draft'" },
      async () => {
        const now = await this.get(id);
        return now.status === 'draft'
          ? staleQuote(now)
          : new ConflictException(`Quote ${id} is ${now.status}; it was sent already`);
      },
    );
    const design = await this.designs.get(quote.designId);
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
      await this.db.transaction(async (tx) => {
        await tx.getRepository(Quote).update(id, {
          status: 'draft',
          lastSendError: message,
          history: [...quote.history, event(user, 'send failed', message)],
        });
        await this.audit.record(tx, {
          actor: user,
          entity: 'quote',
          entityId: id,
          action: 'send failed',
          summary: `Q-${id} to ${quote.contactEmail}: ${message}`,
          details: { to: quote.contactEmail, error: message },
        });
      });
      throw new BadRequestException(`The e-mail could not be sent; the quote stays a draft: ${message}`);
    }
    await this.db.transaction(async (tx) => {
      await tx.getRepository(Quote).update(id, {
        lastSendError: null,
        history: [...quote.history, event(user, 'sent', quote.contactEmail)],
      });
      await this.audit.record(tx, {
        actor: user,
        entity: 'quote',
        entityId: id,
        action: 'sent',
        summary: `Q-${id} e-mailed to ${quote.contactEmail} with ${pdfs.length} report(s)`,
        details: { to: quote.contactEmail, reportIds: quote.reportIds },
      });
    });
    return this.get(id);
  }

  async decide(id: number, dto: QuoteDecisionInput, user: User): Promise<Quote> {
    const quote = await this.get(id);
    if (effectiveStatus(quote) !== 'sent') {
      throw new ConflictException(
        `Quote ${id} is ${effectiveStatus(quote)}; only a sent quote can be accepted or declined`,
      );
    }
    await this.db.transaction(async (tx) => {
      await updateIfVersion(
        tx,
        Quote,
        {
          id,
          expectedVersion: quote.version,
          set: { status: dto.status, history: [...quote.history, event(user, dto.status, dto.note)] },
          where: "status = 'sent'",
        },
        async () => {
          const now = await this.get(id);
          return new ConflictException(`Quote ${id} is ${effectiveStatus(now)}; it was decided meanwhile`);
        },
      );
      await this.audit.record(tx, {
        actor: user,
        entity: 'quote',
        entityId: id,
        action: dto.status,
        summary: `Q-${id} ${dto.status} by the customer${dto.note ? `: ${dto.note}` : ''}`,
        details: { status: dto.status, note: dto.note ?? '' },
      });
    });
    return this.get(id);
  }

  /** Checks what the quote refers to (the shared schema has checked its values); errors name the field. */
  private async checked(dto: QuoteInput): Promise<Partial<Quote>> {
    const problems: string[] = [];
    const customer = await orNull(this.customers.get(dto.customerId));
    if (!customer) problems.push(`customerId: customer ${dto.customerId} does not exist`);
    const version = await orNull(this.designs.findVersion(dto.designId, dto.versionNumber));
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
      const mask = await orNull(this.masks.get(maskId));
      if (!mask) problems.push(`specMaskId: spec mask ${maskId} does not exist`);
      else if (customer && mask.customer.id !== customer.id)
        problems.push(`specMaskId: spec mask ${maskId} belongs to another customer`);
      else if (!isCustomerSpecification(mask))
        problems.push(internalMaskProblem(mask, dto.specMaskId === undefined));
    }
    if (problems.length > 0) throw new BadRequestException({ message: problems });
    return {
      customer: customer as NonNullable<typeof customer>,
      contactEmail: dto.contactEmail,
      designId: dto.designId,
      versionNumber: dto.versionNumber,
      specMaskId: maskId as number,
      partDescription: dto.partDescription,
      quantityBreaks: dto.quantityBreaks,
      currency: dto.currency,
      leadTimeDays: dto.leadTimeDays,
      validUntil: dto.validUntil,
      terms: dto.terms,
    };
  }
}

function staleQuote(now: Quote): ConflictException {
  return new ConflictException(
    `Quote ${now.id} was changed by someone else (now version ${now.version}); reload it and apply your edit again`,
  );
}

function event(user: User, action: string, detail?: string) {
  return { at: new Date().toISOString(), actor: user.displayName, action, ...(detail ? { detail } : {}) };
}
