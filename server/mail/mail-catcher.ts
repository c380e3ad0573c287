import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** A message the catcher received, parsed. */
export interface CaughtMail {
  readonly id: number;
  readonly from: string;
  readonly to: string[];
  readonly subject: string;
  readonly text: string;
  readonly html: string;
  /** The `X-Tropline-Template` header, when present. */
  readonly template: string | undefined;
  readonly receivedAt: string;
}

/** How many messages the dev mailbox keeps (oldest dropped first). */
const KEEP = 500;

/**
 * The local SMTP catcher for development and tests: a real SMTP server on 127.0.0.1 that
 * accepts every message, parses it and keeps it in memory for the development mailbox. It
 * accepts no authentication and offers no TLS: it must never face a network.
 */
export class MailCatcher {
  private server: SMTPServer | undefined;
  private boundPort: number;
  private nextId = 1;
  private readonly messages: CaughtMail[] = [];

  /** @param port the port to bind; 0 picks a free one (kept across stop/start). */
  constructor(port = 0) {
    this.boundPort = port;
  }

  /** The port it listens (or last listened) on. */
  get port(): number {
    return this.boundPort;
  }

  /** Whether it is accepting mail now. */
  get running(): boolean {
    return this.server !== undefined;
  }

  /** Starts listening on 127.0.0.1. */
  async start(): Promise<void> {
    if (this.server) return;
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      banner: 'Tropline development mail catcher',
      logger: false,
      // Shutdown should not wait the default 30 s for an idle client to say QUIT.
      closeTimeout: 2000,
      onData: (stream, session, callback) => {
        simpleParser(stream)
          .then((parsed) => {
            this.keep({
              id: this.nextId++,
              // The From header as a mail client shows it; the envelope sender otherwise.
              from:
                parsed.from?.value
                  .map((a) => (a.name ? `${a.name} <${a.address}>` : (a.address ?? '')))
                  .join(', ') ||
                (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
              to: session.envelope.rcptTo.map((r) => r.address),
              subject: parsed.subject ?? '',
              text: parsed.text ?? '',
              html: typeof parsed.html === 'string' ? parsed.html : '',
              template: parsed.headers.get('x-tropline-template')?.toString(),
              receivedAt: new Date().toISOString(),
            });
            callback();
          })
          .catch((err: Error) => callback(err));
      },
    });
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(this.boundPort, '127.0.0.1', () => {
        server.off('error', reject);
        resolve();
      });
    });
    this.boundPort = (server.server.address() as AddressInfo).port;
    this.server = server;
  }

  /** Stops listening; kept messages stay readable. */
  async stop(): Promise<void> {
    const server = this.server;
    if (!server) return;
    this.server = undefined;
    await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  /** Received messages, newest first. */
  list(): readonly CaughtMail[] {
    return [...this.messages].reverse();
  }

  /** One message by id. */
  find(id: number): CaughtMail | undefined {
    return this.messages.find((m) => m.id === id);
  }

  /** Empties the mailbox. */
  clear(): void {
    this.messages.length = 0;
  }

  private keep(mail: CaughtMail): void {
    this.messages.push(mail);
    if (this.messages.length > KEEP) this.messages.shift();
  }
}
