import type { Knex } from 'knex';
import { UsersRepository } from '../accounts/users-repository';
import { keyLabel, type KeyKind } from '../keys/key-token';
import { nextPeriodStart, periodOf } from '../quotas/quotas-service';
import { keyNoticeMail, quotaAlertMail } from './mail-templates';
import type { MailMessage } from './mail-message';
import { OutboxRepository } from './outbox-repository';

const KEY_ACTIONS = {
  'key.issue': 'issue',
  'key.rotate': 'rotate',
  'key.revoke': 'revoke',
} as const;

/** Quota thresholds that send an alert, in percent of the monthly units. */
export const QUOTA_THRESHOLDS = [80, 100] as const;

/**
 * Turns committed facts into notices: key changes read from the audit trail (whoever made
 * them: console, server key or CLI) and quota thresholds read from the usage counters (mailed
 * to owners, admins and the tenant's contact address). Each
 * notice is queued in the same transaction that records it as seen, so none is sent twice and
 * none is lost.
 */
export class NoticeWatcher {
  private readonly outbox: OutboxRepository;

  constructor(
    private readonly db: Knex,
    private readonly now: () => number,
    private readonly consoleUrl: string,
  ) {
    this.outbox = new OutboxRepository(db);
  }

  /** Starts the key-notice cursor at the end of the trail, so past events are never mailed. */
  async prime(): Promise<void> {
    await this.db.transaction(async (trx) => {
      if (await trx('mail_cursors').where({ name: 'key-notices' }).first()) return;
      const last = await trx('audit_events').max({ id: 'id' }).first();
      await trx('mail_cursors').insert({ name: 'key-notices', last_id: Number(last?.id ?? 0) });
    });
  }

  /** One scan of both sources. */
  async run(): Promise<void> {
    await this.keyNotices();
    await this.quotaAlerts();
  }

  private async keyNotices(): Promise<void> {
    await this.db.transaction(async (trx) => {
      const cursor = await trx('mail_cursors').where({ name: 'key-notices' }).first();
      if (!cursor) return; // not primed yet (start() primes it)
      const events = await trx('audit_events')
        .where('id', '>', cursor.last_id)
        .whereIn('action', Object.keys(KEY_ACTIONS))
        .orderBy('id')
        .limit(100);
      const users = new UsersRepository(trx);
      const messages: MailMessage[] = [];
      for (const e of events) {
        // Demo keys are issued by the first-start seed; nobody needs telling.
        if (e.actor === 'seed' || !e.tenant_id) continue;
        const key = await trx('api_keys').where({ id: e.target }).first('kind', 'rotated_to');
        // A rotation also issues its successor; the rotation notice covers both.
        if (e.action === 'key.issue' && (await this.isSuccessor(trx, e.target))) continue;
        const tenant = await trx('tenants').where({ id: e.tenant_id }).first('name');
        const actor = await this.describeActor(trx, e.actor as string);
        for (const to of await users.adminEmails(e.tenant_id)) {
          messages.push(
            keyNoticeMail({
              to,
              tenantName: tenant?.name ?? 'your tenant',
              change: KEY_ACTIONS[e.action as keyof typeof KEY_ACTIONS],
              keyLabel: key ? keyLabel(key.kind as KeyKind, e.target) : e.target,
              actor,
              at: e.at,
              consoleUrl: `${this.consoleUrl}/keys`,
            }),
          );
        }
      }
      if (events.length) {
        const last = Number(events[events.length - 1].id);
        await trx('mail_cursors').where({ name: 'key-notices' }).update({ last_id: last });
      }
      await this.outbox.enqueue(messages, new Date(this.now()).toISOString(), trx);
    });
  }

  private async isSuccessor(trx: Knex.Transaction, keyId: string): Promise<boolean> {
    return (await trx('api_keys').where({ rotated_to: keyId }).first('id')) !== undefined;
  }

  private async describeActor(trx: Knex.Transaction, actor: string): Promise<string> {
    if (actor.startsWith('user:')) {
      const user = await trx('users')
        .where({ id: actor.slice(5) })
        .first('name', 'email');
      if (user) return `${user.name} <${user.email}>`;
    }
    if (actor.startsWith('key:')) return `the API key ${actor.slice(4)}`;
    if (actor === 'cli') return 'an operator (command line)';
    return actor;
  }

  private async quotaAlerts(): Promise<void> {
    const nowMs = this.now();
    const period = periodOf(nowMs);
    for (const threshold of QUOTA_THRESHOLDS) {
      // used/limit >= threshold%, written without division so it is exact in any SQL.
      const crossed = await this.db('usage_counters as u')
        .join('quota_plans as p', 'p.tenant_id', 'u.tenant_id')
        .join('tenants as t', 't.id', 'u.tenant_id')
        .leftJoin('quota_alerts as a', (j) =>
          j
            .on('a.tenant_id', '=', 'u.tenant_id')
            .andOn('a.period', '=', 'u.period')
            .andOnVal('a.threshold', '=', threshold),
        )
        .where('u.period', period)
        .where('p.monthly_units', '>', 0)
        .whereRaw('u.used * 100 >= p.monthly_units * ?', [threshold])
        .whereNull('a.tenant_id')
        .select('u.tenant_id', 'u.used', 'p.monthly_units', 't.name', 't.contact_email');
      for (const row of crossed) {
        const at = new Date(nowMs).toISOString();
        try {
          await this.db.transaction(async (trx) => {
            // The primary key lets only one process record (and so mail) each threshold.
            await trx('quota_alerts').insert({ tenant_id: row.tenant_id, period, threshold, at });
            const members = await new UsersRepository(trx).adminEmails(row.tenant_id);
            const recipients = members.map((to) => ({ to, asContact: false }));
            // The tenant's contact address hears too, once, unless a member already has it.
            const contact = row.contact_email as string | null;
            if (contact && !members.includes(contact))
              recipients.push({ to: contact, asContact: true });
            const messages = recipients.map(({ to, asContact }) =>
              quotaAlertMail({
                to,
                tenantName: row.name,
                threshold,
                used: Number(row.used),
                limit: Number(row.monthly_units),
                period,
                resetsAt: new Date(nextPeriodStart(nowMs)).toISOString(),
                consoleUrl: `${this.consoleUrl}/usage`,
                asContact,
              }),
            );
            await this.outbox.enqueue(messages, at, trx);
          });
        } catch (err) {
          const sent = await this.db('quota_alerts')
            .where({ tenant_id: row.tenant_id, period, threshold })
            .first('at');
          if (!sent) throw err; // not a lost race with another process
        }
      }
    }
  }
}
