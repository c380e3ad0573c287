import type { Knex } from 'knex';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config';
import { MailCatcher } from './mail-catcher';
import type { MailMessage } from './mail-message';
import { NoticeWatcher } from './notice-watcher';
import { OutboxRepository } from './outbox-repository';
import { OutboxWorker, type PassOutcome } from './outbox-worker';

/** How often the outbox is polled outside tests (retries and notices). */
const POLL_MS = 5000;

/** Options for tests. */
export interface MailerOptions {
  /** Poll the outbox on a timer; off by default under `test`, where tests drive the passes. */
  readonly poll?: boolean;
}

/**
 * Outgoing mail: the outbox, its delivery worker, the notice watcher and, when no `SMTP_URL`
 * is configured outside production, the local SMTP catcher the mail goes to.
 */
export class Mailer {
  /** The dev catcher, or undefined when mail goes to `SMTP_URL`. */
  readonly catcher: MailCatcher | undefined;
  readonly outbox: OutboxRepository;
  private readonly worker: OutboxWorker;
  private readonly watcher: NoticeWatcher;
  private transporter: Transporter | undefined;

  constructor(
    db: Knex,
    private readonly config: Config,
    now: () => number,
    private readonly options: MailerOptions = {},
  ) {
    this.catcher =
      config.smtpUrl === undefined && config.nodeEnv !== 'production'
        ? new MailCatcher()
        : undefined;
    this.outbox = new OutboxRepository(db);
    const watcher = new NoticeWatcher(db, now, `${config.publicUrl}/console`);
    this.watcher = watcher;
    this.worker = new OutboxWorker(
      this.outbox,
      () => this.transport(),
      config.mailFrom,
      now,
      () => watcher.run(),
    );
  }

  /** Starts the catcher (if any) and, outside tests, the polling worker. */
  async start(): Promise<void> {
    await this.catcher?.start();
    await this.watcher.prime();
    if (this.options.poll ?? this.config.nodeEnv !== 'test') this.worker.start(POLL_MS);
  }

  /** Queues messages in the caller's transaction; call {@link afterCommit} once it commits. */
  enqueue(messages: readonly MailMessage[], at: string, trx?: Knex.Transaction): Promise<void> {
    return this.outbox.enqueue(messages, at, trx);
  }

  /**
   * Starts a delivery pass now that the transaction holding new mail has committed. Failures
   * stay in the outbox for the next pass, so the caller never waits for SMTP.
   */
  afterCommit(): void {
    void this.worker.kick().catch(() => undefined);
  }

  /** Runs one pass (notices, then due mail) after any in flight; tests await it. */
  flush(): Promise<PassOutcome> {
    return this.worker.kick();
  }

  /** Stops the worker, the transport and the catcher. */
  async close(): Promise<void> {
    await this.worker.stop();
    this.transporter?.close();
    await this.catcher?.stop();
  }

  private transport(): Transporter {
    if (!this.transporter) {
      const timeouts = {
        connectionTimeout: 10_000,
        greetingTimeout: 10_000,
        socketTimeout: 30_000,
      };
      this.transporter = this.catcher
        ? nodemailer.createTransport({
            host: '127.0.0.1',
            port: this.catcher.port,
            secure: false,
            ignoreTLS: true,
            ...timeouts,
          })
        : nodemailer.createTransport(this.config.smtpUrl!, timeouts);
    }
    return this.transporter;
  }
}
