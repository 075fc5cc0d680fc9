import { Inject, Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { DataSource } from 'typeorm';
import { appConfig, type AppConfig } from '../config/configuration.js';
import { OutboxAttachment, OutboxMessage } from './outbox.entity.js';

function addresses(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

/**
 * The local SMTP fake: when no SMTP_URL is configured, the API listens on 127.0.0.1 and stores
 * every message it is sent (with attachments) in the outbox, where admins can read it. Nothing
 * leaves the machine.
 */
@Injectable()
export class SmtpFakeService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('SmtpFake');
  private server: SMTPServer | null = null;

  constructor(
    @Inject(appConfig.KEY) private readonly config: AppConfig,
    @InjectDataSource() private readonly db: DataSource,
  ) {}

  async onModuleInit(): Promise<void> {
    if (this.config.smtpUrl) return;
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      banner: 'Quietglass local SMTP fake',
      size: 25 * 1024 * 1024,
      onData: (stream, _session, callback) => {
        simpleParser(stream)
          .then((mail) => this.store(mail))
          .then(() => callback())
          .catch((err: Error) => callback(err));
      },
    });
    server.on('error', (err) => this.logger.warn(`SMTP fake: ${err.message}`));
    await new Promise<void>((resolve) => {
      server.listen(this.config.smtpFakePort, '127.0.0.1', () => resolve());
      server.server.once('error', (err: NodeJS.ErrnoException) => {
        // Another API process on this machine already runs the fake; it stores to the same outbox.
        this.logger.warn(
          `SMTP fake not started on port ${this.config.smtpFakePort}: ${err.code ?? err.message}`,
        );
        resolve();
      });
    });
    this.server = server;
  }

  async onModuleDestroy(): Promise<void> {
    const server = this.server;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  private async store(mail: Awaited<ReturnType<typeof simpleParser>>): Promise<void> {
    await this.db.transaction(async (tx) => {
      const message = await tx.getRepository(OutboxMessage).save(
        tx.getRepository(OutboxMessage).create({
          messageId: mail.messageId ?? '',
          from: addresses(mail.from),
          to: addresses(mail.to),
          subject: mail.subject ?? '',
          text: mail.text ?? '',
        }),
      );
      for (const a of mail.attachments) {
        await tx.getRepository(OutboxAttachment).insert({
          message,
          filename: a.filename ?? 'attachment',
          contentType: a.contentType,
          size: a.size,
          content: a.content,
        });
      }
    });
  }
}
