import { Inject, Injectable, Logger, OnModuleDestroy, OnModuleInit } from '@nestjs/common';
import { createTransport, Transporter } from 'nodemailer';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { FakeSmtpServer } from './fake-smtp-server';

export const MAIL_FROM = 'Gyre <no-reply@gyre.invalid>';

/**
 * nodemailer over SMTP to `SMTP_URL`; without it, to Gyre's local fake SMTP server, which is
 * started with the application and keeps messages under `data/mail/`.
 */
@Injectable()
export class MailTransportService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('Mail');
  private transporter: Promise<Transporter> | null = null;
  private fakeServer: FakeSmtpServer | null = null;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  async onModuleInit(): Promise<void> {
    await this.transporterOnce();
  }

  async send(message: {
    to: string;
    subject: string;
    text: string;
    messageId?: string;
  }): Promise<string> {
    const transporter = await this.transporterOnce();
    const info = (await transporter.sendMail({ from: MAIL_FROM, ...message })) as {
      messageId?: unknown;
    };
    return typeof info.messageId === 'string' ? info.messageId : '';
  }

  /** Where messages go, for the start-up log and the tests. */
  async describe(): Promise<{ kind: 'smtp' | 'local'; port: number | null }> {
    await this.transporterOnce();
    return this.fakeServer === null
      ? { kind: 'smtp', port: null }
      : { kind: 'local', port: this.fakeServer.listeningPort };
  }

  private transporterOnce(): Promise<Transporter> {
    this.transporter ??= this.createTransporter();
    return this.transporter;
  }

  private async createTransporter(): Promise<Transporter> {
    if (this.config.smtpUrl !== null) return createTransport(this.config.smtpUrl);
    this.fakeServer = new FakeSmtpServer(this.config.mailDir);
    const port = await this.fakeServer.start();
    this.logger.log(
      `No SMTP_URL: local mail catcher on 127.0.0.1:${port}, messages in ${this.config.mailDir}`,
    );
    return createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
  }

  async onModuleDestroy(): Promise<void> {
    const transporter = this.transporter;
    this.transporter = null;
    if (transporter !== null) (await transporter).close();
    await this.fakeServer?.stop();
    this.fakeServer = null;
  }
}
