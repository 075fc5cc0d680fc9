import { Inject, Injectable } from '@nestjs/common';
import nodemailer, { type Transporter } from 'nodemailer';
import { appConfig, type AppConfig } from '../config/configuration.js';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  attachments: { filename: string; content: Buffer; contentType: string }[];
}

/** Sends e-mail through the configured SMTP server, or the local SMTP fake. */
@Injectable()
export class MailService {
  private readonly transport: Transporter;

  constructor(@Inject(appConfig.KEY) private readonly config: AppConfig) {
    this.transport = config.smtpUrl
      ? nodemailer.createTransport(config.smtpUrl)
      : nodemailer.createTransport({
          host: '127.0.0.1',
          port: config.smtpFakePort,
          secure: false,
          ignoreTLS: true,
          connectionTimeout: 5000,
          greetingTimeout: 5000,
        });
  }

  /** Resolves with the message id once the server accepted the message; rejects with its error. */
  async send(mail: OutgoingMail): Promise<string> {
    const info = await this.transport.sendMail({ from: this.config.mailFrom, ...mail });
    return info.messageId;
  }
}
