import { Inject, Injectable, Logger, type OnApplicationShutdown, type OnModuleInit } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import { simpleParser } from 'mailparser';
import type { AddressInfo } from 'node:net';
import { SMTPServer, type SMTPServerAddress } from 'smtp-server';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';
import { MailMessage } from './models/mail-message.model.js';

const LOOPBACK = '127.0.0.1';
const MAX_MESSAGE_BYTES = 2 * 1024 * 1024;

/** Every http(s) address in a text (trailing punctuation dropped), once each, in order. */
export function findLinks(...texts: string[]): string[] {
  const links = new Set<string>();
  for (const text of texts) {
    for (const m of text.matchAll(/https?:\/\/[^\s"'<>]+/g)) links.add(m[0].replace(/[).,;:!?]+$/, '').replace(/&amp;/g, '&'));
  }
  return [...links];
}

/**
 * A fake SMTP server on loopback (smtp-server package) for development and tests: it accepts every
 * message without authentication and stores it in `mail_messages` instead of delivering it.
 * Started with the app when PW_SMTP_FAKE=1 (the default); PW_SMTP_PORT=0 picks a free port, and a
 * busy fixed port falls back to a free one (logged).
 */
@Injectable()
export class FakeSmtpServer implements OnModuleInit, OnApplicationShutdown {
  private readonly logger = new Logger('FakeSmtp');
  private server: SMTPServer | undefined;
  private boundPort: number | undefined;

  constructor(
    @Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig,
    @InjectModel(MailMessage) private readonly messages: typeof MailMessage,
  ) {}

  /** The port it listens on, once started (undefined when the fake server is off). */
  get port(): number | undefined {
    return this.boundPort;
  }

  async onModuleInit(): Promise<void> {
    if (!this.config.mail.fakeServer) return;
    try {
      this.boundPort = await this.listen(this.config.mail.smtpPort);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EADDRINUSE' || this.config.mail.smtpPort === 0) throw err;
      this.boundPort = await this.listen(0);
      this.logger.warn(`port ${this.config.mail.smtpPort} is busy; the fake SMTP server uses ${this.boundPort} instead`);
    }
    this.logger.log(`fake SMTP server on ${LOOPBACK}:${this.boundPort}; messages are stored (site admins: GET /api/admin/mail)`);
  }

  async onApplicationShutdown(): Promise<void> {
    const server = this.server;
    this.server = undefined;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  private listen(port: number): Promise<number> {
    const server = new SMTPServer({
      secure: false,
      disabledCommands: ['STARTTLS', 'AUTH'],
      authOptional: true,
      logger: false,
      size: MAX_MESSAGE_BYTES,
      banner: 'Phasewright fake SMTP (messages are stored, not delivered)',
      onData: (stream, session, callback) => {
        this.store(stream, session.envelope.mailFrom, session.envelope.rcptTo).then(
          () => callback(),
          (err: Error) => {
            this.logger.error(`could not store a received message: ${err.message}`);
            callback(new Error('could not store the message'));
          },
        );
      },
    });
    return new Promise((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, LOOPBACK, () => {
        server.off('error', reject);
        server.on('error', (err) => this.logger.error(`fake SMTP server: ${err.message}`));
        this.server = server;
        resolve((server.server.address() as AddressInfo).port);
      });
    });
  }

  private async store(stream: NodeJS.ReadableStream, from: SMTPServerAddress | false, to: SMTPServerAddress[]): Promise<void> {
    const parsed = await simpleParser(stream as unknown as Parameters<typeof simpleParser>[0]);
    const text = parsed.text ?? '';
    const html = typeof parsed.html === 'string' ? parsed.html : '';
    await this.messages.create({
      messageId: parsed.messageId ?? null,
      mailFrom: from ? from.address : '',
      mailTo: to.map((r) => r.address).join(', '),
      subject: parsed.subject ?? '',
      text,
      html,
      links: JSON.stringify(findLinks(text, html)),
      receivedAt: new Date(),
    });
  }
}
