import { Body, Controller, Get, Param, ParseIntPipe, Post, Put } from '@nestjs/common';
import type { QuoteView } from '@quietglass/shared/quotes';
import {
  attachReportsSchema,
  quoteDecisionSchema,
  quoteInputSchema,
  quoteUpdateSchema,
  type AttachReportsInput,
  type QuoteDecisionInput,
  type QuoteInput,
  type QuoteUpdate,
} from '@quietglass/shared/schemas/quotes';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import type { Quote } from './quote.entity.js';
import { effectiveStatus, QuotesService } from './quotes.service.js';

function view(q: Quote): QuoteView {
  const { customer, createdBy, createdAt, updatedAt, ...rest } = q;
  return {
    ...rest,
    status: effectiveStatus(q),
    customer: { id: customer.id, name: customer.name },
    createdBy: createdBy.displayName,
    createdAt: createdAt.toISOString(),
    updatedAt: updatedAt.toISOString(),
  };
}

/** Sales write and send quotes; engineers read them; operators never see prices. */
@Controller('quotes')
@Roles('admin', 'sales')
export class QuotesController {
  constructor(private readonly quotes: QuotesService) {}

  @Get()
  @Roles('admin', 'sales', 'engineer')
  async list(): Promise<QuoteView[]> {
    return (await this.quotes.list()).map(view);
  }

  @Get(':id')
  @Roles('admin', 'sales', 'engineer')
  async get(@Param('id', ParseIntPipe) id: number): Promise<QuoteView> {
    return view(await this.quotes.get(id));
  }

  @Post()
  @ZodBody(quoteInputSchema)
  async create(@Body() dto: QuoteInput, @CurrentUser() user: User): Promise<QuoteView> {
    return view(await this.quotes.create(dto, user));
  }

  @Put(':id')
  @ZodBody(quoteUpdateSchema)
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: QuoteUpdate,
    @CurrentUser() user: User,
  ): Promise<QuoteView> {
    return view(await this.quotes.update(id, dto, user));
  }

  @Post(':id/reports')
  @ZodBody(attachReportsSchema)
  async attach(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: AttachReportsInput,
    @CurrentUser() user: User,
  ): Promise<QuoteView> {
    return view(await this.quotes.attach(id, dto.reportIds, user));
  }

  @Post(':id/send')
  async send(@Param('id', ParseIntPipe) id: number, @CurrentUser() user: User): Promise<QuoteView> {
    return view(await this.quotes.send(id, user));
  }

  @Post(':id/decision')
  @ZodBody(quoteDecisionSchema)
  async decide(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: QuoteDecisionInput,
    @CurrentUser() user: User,
  ): Promise<QuoteView> {
    return view(await this.quotes.decide(id, dto, user));
  }
}
