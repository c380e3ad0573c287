import type { Knex } from 'knex';
import type { MailMessage } from '../mail/mail-message';

/**
 * What account services need from the mailer: queue in the caller's transaction, then start
 * delivery once it has committed (mail never leaves for a change that was rolled back).
 */
export interface MailQueue {
  enqueue(messages: readonly MailMessage[], at: string, trx?: Knex.Transaction): Promise<void>;
  afterCommit(): void;
}
