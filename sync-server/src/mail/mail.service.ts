import { Inject, Injectable, Logger } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import nodemailer, { type Transporter } from 'nodemailer';
import { Op } from 'sequelize';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';
import type { MailMessageDto } from './dto/mail-message.dto.js';
import { FakeSmtpServer } from './fake-smtp.server.js';
import { MailMessage } from './models/mail-message.model.js';
import type { RenderedMail } from './templates.js';

const SEND_TIMEOUT_MS = 10_000;

/** Sends mail over SMTP (nodemailer) and reads back what the fake server stored. */
@Injectable()
export class MailService {
  private readonly logger = new Logger('Mail');
  private transporter: Transporter | undefined;

  constructor(
    @Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig,
    private readonly fake: FakeSmtpServer,
    @InjectModel(MailMessage) private readonly messages: typeof MailMessage,
  ) {}

  /** A link into the app, e.g. link('/invitations/accept', { token }) → <public URL>/invitations/accept#token=… */
  link(path: string, fragment?: Record<string, string>): string {
    const hash = fragment ? `#${new URLSearchParams(fragment).toString()}` : '';
    return `${this.config.publicUrl}${path}${hash}`;
  }

  /**
   * Send one message; resolves false (and logs the recipient and subject, never the body) when the
   * SMTP server refuses or cannot be reached, so a failed e-mail never undoes the change behind it.
   */
  async send(to: string, mail: RenderedMail): Promise<boolean> {
    try {
      const info = await this.transport().sendMail({ from: this.config.mail.from, to, subject: mail.subject, text: mail.text, html: mail.html });
      this.logger.log(`sent "${mail.subject}" to ${to} (${info.messageId})`);
      return true;
    } catch (err) {
      this.logger.warn(`could not send "${mail.subject}" to ${to}: ${(err as Error).message}`);
      return false;
    }
  }

  async list(opts: { to?: string; limit: number }): Promise<MailMessageDto[]> {
    const rows = await this.messages.findAll({
      where: opts.to ? { mailTo: { [Op.like]: `%${opts.to.replace(/[\\%_]/g, (c) => `\\${c}`)}%` } } : {},
      order: [['id', 'DESC']],
      limit: opts.limit,
    });
    return rows.map((m) => ({
      id: m.id,
      from: m.mailFrom,
      to: m.mailTo,
      subject: m.subject,
      text: m.text,
      html: m.html,
      links: JSON.parse(m.links) as string[],
      receivedAt: m.receivedAt,
    }));
  }

  private transport(): Transporter {
    if (!this.transporter) {
      const port = this.fake.port ?? this.config.mail.smtpPort;
      this.transporter = nodemailer.createTransport({
        host: this.config.mail.smtpHost,
        port,
        secure: false,
        // The fake server offers no TLS; a real relay on another host may.
        ignoreTLS: this.fake.port !== undefined,
        connectionTimeout: SEND_TIMEOUT_MS,
        greetingTimeout: SEND_TIMEOUT_MS,
        socketTimeout: SEND_TIMEOUT_MS,
        logger: false,
      });
    }
    return this.transporter;
  }
}
