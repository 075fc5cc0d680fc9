import { Controller, Get, NotFoundException, Param, ParseIntPipe, StreamableFile } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
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

/** Content-Disposition for a download: an ASCII fallback name and the exact name (RFC 6266). */
export function attachmentDisposition(filename: string): string {
  const ascii = filename.replace(/[^\x20-\x7e]|["\\]/g, '_');
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`;
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
  ): Promise<StreamableFile> {
    const a = await this.db.getRepository(OutboxAttachment).findOne({
      where: { id: aid, message: { id } },
      select: { id: true, filename: true, contentType: true, content: true },
    });
    if (!a) throw new NotFoundException(`Message ${id} has no attachment ${aid}`);
    // Whatever a message carried, it is handed over as a download, never shown as a page of this
    // origin: a PDF keeps its type (the browser saves it), anything else is plain bytes.
    const type = a.contentType === 'application/pdf' ? 'application/pdf' : 'application/octet-stream';
    return new StreamableFile(a.content, { type, disposition: attachmentDisposition(a.filename) });
  }
}
