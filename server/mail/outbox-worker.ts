import type { Transporter } from 'nodemailer';
import { OutboxRepository, type OutboxEntry } from './outbox-repository';

/** First retry after 30 s, doubling, at most an hour apart. */
export function retryDelayMs(attempts: number): number {
  return Math.min(30_000 * 2 ** Math.max(0, attempts - 1), 3_600_000);
}

/** Work done before each delivery pass (the notice watcher queues key and quota notices). */
export type BeforePass = () => Promise<void>;

/** Outcome of one delivery pass. */
export interface PassOutcome {
  readonly sent: number;
  readonly failed: number;
}

/**
 * Delivers the outbox through one nodemailer transport. Passes never overlap: each `kick`
 * queues behind the previous one, so callers (a route after its commit, the timer, a test) can
 * simply await the pass they started.
 */
export class OutboxWorker {
  private chain: Promise<unknown> = Promise.resolve();
  private timer: NodeJS.Timeout | undefined;
  private closed = false;

  constructor(
    private readonly outbox: OutboxRepository,
    private readonly transport: () => Transporter,
    private readonly from: string,
    private readonly now: () => number,
    private readonly beforePass: BeforePass = async () => undefined,
    private readonly onError: (err: unknown) => void = () => undefined,
  ) {}

  /** Runs one pass after any pass already queued; resolves with what it did. */
  kick(): Promise<PassOutcome> {
    const pass = this.chain.then(() => this.pass());
    this.chain = pass.catch(() => undefined);
    return pass;
  }

  /** Polls every `intervalMs` (unref'd, so it never keeps a process alive). */
  start(intervalMs: number): void {
    this.timer = setInterval(() => void this.kick().catch(this.onError), intervalMs);
    this.timer.unref();
  }

  /** Stops polling and waits for the pass in flight. */
  async stop(): Promise<void> {
    this.closed = true;
    if (this.timer) clearInterval(this.timer);
    await this.chain;
  }

  private async pass(): Promise<PassOutcome> {
    if (this.closed) return { sent: 0, failed: 0 };
    await this.beforePass();
    let sent = 0;
    let failed = 0;
    for (const entry of await this.outbox.claimDue(this.now())) {
      if (await this.deliver(entry)) sent++;
      else failed++;
    }
    return { sent, failed };
  }

  private async deliver(entry: OutboxEntry): Promise<boolean> {
    try {
      await this.transport().sendMail({
        from: this.from,
        to: entry.to,
        subject: entry.subject,
        text: entry.text,
        html: entry.html,
        headers: { 'X-Tropline-Template': entry.template },
      });
      await this.outbox.markSent(entry.id, new Date(this.now()).toISOString());
      return true;
    } catch (err) {
      const next = new Date(this.now() + retryDelayMs(entry.attempts + 1)).toISOString();
      await this.outbox.markFailed(entry.id, (err as Error).message ?? String(err), next);
      this.onError(err);
      return false;
    }
  }
}
