import { Inject, Injectable } from '@nestjs/common';
import nodemailer, { type Transporter } from 'nodemailer';
import { appConfig, type AppConfig } from '../config/configuration.js';
import { SmtpFakeService } from './smtp-fake.service.js';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  attachments: { filename: string; content: Buffer; contentType: string }[];
}

/** Sends e-mail through the configured SMTP server, or the local SMTP fake. */
@Injectable()
export class MailService {
  private transport: Transporter | null = null;

  constructor(
    @Inject(appConfig.KEY) private readonly config: AppConfig,
    private readonly fake: SmtpFakeService,
  ) {}

  /** Made on first use: the local fake's port and secret exist only once it has started. */
  private transporter(): Transporter {
    if (this.transport) return this.transport;
    if (this.config.smtpUrl) {
      this.transport = nodemailer.createTransport(this.config.smtpUrl);
    } else {
      const fake = this.fake.connection();
      this.transport = nodemailer.createTransport({
        host: '127.0.0.1',
        port: fake.port,
        secure: false,
        ignoreTLS: true,
        auth: { user: fake.user, pass: fake.pass },
        connectionTimeout: 5000,
        greetingTimeout: 5000,
      });
    }
    return this.transport;
  }

  /** Resolves with the message id once the server accepted the message; rejects with its error. */
  async send(mail: OutgoingMail): Promise<string> {
    const info = await this.transporter().sendMail({ from: this.config.mailFrom, ...mail });
    return info.messageId;
  }
}
