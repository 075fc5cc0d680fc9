import { Controller, Get, NotFoundException, Param, ParseIntPipe, Res, StreamableFile } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Response } from 'express';
import type { OutboxMessageView } from '@quietglass/shared/outbox';
import { DataSource } from 'typeorm';
import { Roles } from '../auth/roles.decorator.js';
import { OutboxAttachment, OutboxMessage } from './outbox.entity.js';

function view(m: OutboxMessage): OutboxMessageView {
  return {
    id: m.id,
    from: m.from,
    to: m.to,
    subject: m.subject,
    text: m.text,
    receivedAt: m.receivedAt.toISOString(),
    attachments: (m.attachments ?? []).map((a) => ({
      id: a.id,
      filename: a.filename,
      contentType: a.contentType,
      size: a.size,
    })),
  };
}

/** What the local SMTP fake received: for admins. */
@Controller('outbox')
@Roles('admin')
export class OutboxController {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

  @Get()
  async list(): Promise<OutboxMessageView[]> {
    const messages = await this.db
      .getRepository(OutboxMessage)
      .find({ relations: { attachments: true }, order: { id: 'DESC' }, take: 200 });
    return messages.map(view);
  }

  @Get(':id')
  async get(@Param('id', ParseIntPipe) id: number): Promise<OutboxMessageView> {
    const m = await this.db
      .getRepository(OutboxMessage)
      .findOne({ where: { id }, relations: { attachments: true } });
    if (!m) throw new NotFoundException(`Outbox message ${id} does not exist`);
    return view(m);
  }

  @Get(':id/attachments/:aid')
  async attachment(
    @Param('id', ParseIntPipe) id: number,
    @Param('aid', ParseIntPipe) aid: number,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const a = await this.db.getRepository(OutboxAttachment).findOne({
      where: { id: aid, message: { id } },
      select: { id: true, filename: true, contentType: true, content: true },
    });
    if (!a) throw new NotFoundException(`Message ${id} has no attachment ${aid}`);
    res.setHeader('Content-Disposition', `inline; filename="${a.filename.replace(/["\\\r\n]/g, '_')}"`);
    return new StreamableFile(a.content, { type: a.contentType });
  }
}
