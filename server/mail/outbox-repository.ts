import type { Knex } from 'knex';
import type { MailMessage } from './mail-message';

/** A message waiting in (or sent from) the outbox. */
export interface OutboxEntry extends MailMessage {
  readonly id: number;
  readonly attempts: number;
  readonly createdAt: string;
  readonly nextAttemptAt: string;
  readonly sentAt: string | null;
  readonly lastError: string | null;
}

/** How long a claimed message stays reserved for the process that claimed it. */
const CLAIM_MS = 60_000;

interface OutboxRow {
  id: number;
  template: string;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string;
  created_at: string;
  attempts: number;
  next_attempt_at: string;
  sent_at: string | null;
  last_error: string | null;
}

function toEntry(r: OutboxRow): OutboxEntry {
  return {
    id: Number(r.id),
    template: r.template,
    to: r.to_address,
    subject: r.subject,
    text: r.text_body,
    html: r.html_body,
    attempts: Number(r.attempts),
    createdAt: r.created_at,
    nextAttemptAt: r.next_attempt_at,
    sentAt: r.sent_at,
    lastError: r.last_error,
  };
}

/**
 * The mail outbox. Messages are written in the caller's transaction, so a rolled-back action
 * sends nothing and a committed one cannot lose its mail. Claims are conditional updates, so
 * several API processes on one database never send a message twice at once.
 */
export class OutboxRepository {
  constructor(private readonly db: Knex) {}

  /** Queues messages inside `trx` (or on their own). */
  async enqueue(messages: readonly MailMessage[], at: string, trx?: Knex.Transaction) {
    if (messages.length === 0) return;
    await (trx ?? this.db)('mail_outbox').insert(
      messages.map((m) => ({
        template: m.template,
        to_address: m.to,
        subject: m.subject,
        text_body: m.text,
        html_body: m.html,
        created_at: at,
        attempts: 0,
        next_attempt_at: at,
      })),
    );
  }

  /** Reserves up to `limit` due messages for this process and returns them. */
  async claimDue(nowMs: number, limit = 20): Promise<OutboxEntry[]> {
    const now = new Date(nowMs).toISOString();
    const free = (q: Knex.QueryBuilder) =>
      q.whereNull('locked_until').orWhere('locked_until', '<', now);
    const candidates = (await this.db('mail_outbox')
      .whereNull('sent_at')
      .where('next_attempt_at', '<=', now)
      .where(free)
      .orderBy('id')
      .limit(limit)) as OutboxRow[];
    const claimed: OutboxEntry[] = [];
    const until = new Date(nowMs + CLAIM_MS).toISOString();
    for (const row of candidates) {
      const n = await this.db('mail_outbox')
        .where({ id: row.id })
        .whereNull('sent_at')
        .where(free)
        .update({ locked_until: until });
      if (n === 1) claimed.push(toEntry(row));
    }
    return claimed;
  }

  /** Marks a message delivered. */
  async markSent(id: number, at: string): Promise<void> {
    await this.db('mail_outbox')
      .where({ id })
      .update({ sent_at: at, locked_until: null, attempts: this.db.raw('attempts + 1') });
  }

  /** Records a failed attempt and when to try again. */
  async markFailed(id: number, error: string, nextAttemptAt: string): Promise<void> {
    await this.db('mail_outbox')
      .where({ id })
      .update({
        last_error: error.slice(0, 500),
        next_attempt_at: nextAttemptAt,
        locked_until: null,
        attempts: this.db.raw('attempts + 1'),
      });
  }

  /** Messages not yet delivered, oldest first. */
  async pending(): Promise<OutboxEntry[]> {
    const rows = (await this.db('mail_outbox').whereNull('sent_at').orderBy('id')) as OutboxRow[];
    return rows.map(toEntry);
  }

  /** One message by id, sent or not. */
  async find(id: number): Promise<OutboxEntry | undefined> {
    const row = (await this.db('mail_outbox').where({ id }).first()) as OutboxRow | undefined;
    return row ? toEntry(row) : undefined;
  }
}
