import { Inject, Injectable, type OnModuleDestroy } from '@nestjs/common';
import nodemailer, { type Transporter } from 'nodemailer';
import { ENV, type Env } from '../config/env.js';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
  /** Stable id of what this message is about; repeated sends of one key are the caller's to avoid. */
  headers?: Record<string, string>;
}

/** Mail goes out over SMTP through nodemailer; in development the catcher keeps it locally. */
@Injectable()
export class MailService implements OnModuleDestroy {
  private readonly transport: Transporter;

  constructor(@Inject(ENV) private readonly env: Env) {
    this.transport = nodemailer.createTransport({
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: false,
      ignoreTLS: env.SMTP_HOST === '127.0.0.1' || env.SMTP_HOST === 'localhost',
      connectionTimeout: 3000,
      greetingTimeout: 3000,
      socketTimeout: 10000,
    });
  }

  async isUp(): Promise<boolean> {
    try {
      await this.transport.verify();
      return true;
    } catch {
      return false;
    }
  }

  async send(mail: OutgoingMail): Promise<string> {
    const info = await this.transport.sendMail({ from: this.env.MAIL_FROM, ...mail });
    return info.messageId;
  }

  onModuleDestroy(): void {
    this.transport.close();
  }
}
