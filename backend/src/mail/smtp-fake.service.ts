import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { AddressInfo } from 'node:net';
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

function sameSecret(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

/**
 * The local SMTP fake: when no SMTP_URL is configured, the API listens on 127.0.0.1 and stores
 * every message it is sent (with attachments) in the outbox, where admins can read it. Nothing
 * leaves the machine. It accepts mail only from this API process: the sender must log in with a
 * secret made afresh at each start. With QG_SMTP_PORT it listens there (and the API refuses to
 * start when the port is taken, rather than hand its mail to whoever holds it); without, on a free
 * port the system picks.
 */
@Injectable()
export class SmtpFakeService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('SmtpFake');
  private server: SMTPServer | null = null;
  /** Where the fake listens and how to log in; null until started (or with a real SMTP server). */
  private endpoint: { port: number; user: string; pass: string } | null = null;

  constructor(
    @Inject(appConfig.KEY) private readonly config: AppConfig,
    @InjectDataSource() private readonly db: DataSource,
  ) {}

  async onModuleInit(): Promise<void> {
    if (this.config.smtpUrl) return;
    const user = 'quietglass-api';
    const pass = randomBytes(24).toString('base64url');
    const server = new SMTPServer({
      authOptional: false,
      authMethods: ['PLAIN', 'LOGIN'],
      // Loopback only, and the secret never leaves this process: TLS would add nothing here.
      allowInsecureAuth: true,
      disabledCommands: ['STARTTLS'],
      banner: 'Quietglass local SMTP fake',
      size: 25 * 1024 * 1024,
      onAuth: (auth, _session, callback) => {
        if (auth.username === user && sameSecret(auth.password ?? '', pass)) {
          callback(null, { user });
        } else {
          callback(new Error('Invalid username or password'));
        }
      },
      onData: (stream, _session, callback) => {
        simpleParser(stream)
          .then((mail) => this.store(mail))
          .then(() => callback())
          .catch((err: Error) => callback(err));
      },
    });
    server.on('error', (err) => this.logger.warn(`SMTP fake: ${err.message}`));
    const wanted = this.config.smtpFakePort ?? 0;
    await new Promise<void>((resolve, reject) => {
      server.server.once('error', (err: NodeJS.ErrnoException) => {
        reject(
          new Error(
            `The local SMTP fake cannot listen on 127.0.0.1:${wanted} (${err.code ?? err.message}); ` +
              'set QG_SMTP_PORT to a free port, or leave it unset to pick one',
          ),
        );
      });
      server.listen(wanted, '127.0.0.1', () => resolve());
    });
    this.server = server;
    this.endpoint = { port: (server.server.address() as AddressInfo).port, user, pass };
  }

  /** How MailService reaches the fake; throws when it is not running. */
  connection(): { port: number; user: string; pass: string } {
    if (!this.endpoint) throw new Error('The local SMTP fake is not running');
    return this.endpoint;
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
