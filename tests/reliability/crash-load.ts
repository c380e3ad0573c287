import { HASTINGS_POWELL_BENCHMARK, UPLAND_DEMO } from '@tropline/core';
import { KeysService } from '../../server/keys/keys-service';
import { SERVER_SCOPES } from '../../server/keys/key-scopes';
import { periodOf, QuotasService } from '../../server/quotas/quotas-service';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { databaseFacts, prepareDatabase, send, spawnApi, type LiveServer } from './live-server';

/** A scenario's content as the scenario routes take it (invented upland site). */
export const SCENARIO_CONTENT = {
  name: 'Skelwith Fell, grazing trial',
  location: 'Skelwith Fell (invented)',
  model: UPLAND_DEMO.model,
  initial: UPLAND_DEMO.initial,
  horizon: 40,
};

/** Every write the server acknowledged to a client (2xx), which must survive any crash. */
export interface Acknowledged {
  units: number;
  readonly issued: Map<string, string>; // key id → token
  readonly revoked: Map<string, string>;
  /**
   * Keys whose revocation was sent when the process died, unanswered: it may have committed
   * or not, so either answer is right for them.
   */
  readonly revoking: Set<string>;
  readonly versions: { scenarioId: string; version: number; note: string }[];
}

/** What one crash cycle did and what it found after the restart. */
export interface CycleReport {
  readonly requests: number;
  readonly acknowledged: number;
  readonly fiveHundreds: number;
  /** Acknowledged writes missing (or revocations undone) after the restart. */
  readonly lost: string[];
  readonly integrity: string;
}

/** Prepares a database with one key that may compute, manage keys and save scenarios. */
export async function prepareCrashDatabase(file: string): Promise<{ admin: string }> {
  return prepareDatabase(file, async ({ db }) => {
    const keys = new KeysService(db);
    const issued = await keys.issue(
      { tenantId: DEMO_TENANT.id, kind: 'server', scopes: [...SERVER_SCOPES], perMinute: 1e6 },
      'test',
    );
    await new QuotasService(db).setPlan(DEMO_TENANT.id, { monthlyUnits: 10_000_000 }, 'test');
    return { admin: issued.token };
  });
}

let serial = 0;

/** One writer: usage, key issue and revoke, scenario saves, round robin until the crash. */
async function writer(
  server: LiveServer,
  admin: string,
  scenarioId: string,
  ack: Acknowledged,
  tally: { requests: number; fiveHundreds: number },
  stopped: () => boolean,
): Promise<void> {
  const mine: string[] = [];
  for (let step = 0; !stopped(); step++) {
    const n = ++serial;
    try {
      if (step % 4 === 0) {
        const model = structuredClone(HASTINGS_POWELL_BENCHMARK.model);
        (model.levels[0] as { growthRate: number }).growthRate = 1 + n * 1e-6;
        tally.requests++;
        const a = await send(server.url, 'POST', '/equilibria', { key: admin, body: { model } });
        if (a.status === 200) ack.units += 1;
        if (a.status >= 500) tally.fiveHundreds++;
      } else if (step % 4 === 1 || (step % 4 === 2 && mine.length === 0)) {
        tally.requests++;
        const a = await send(server.url, 'POST', '/keys', {
          key: admin,
          body: { kind: 'server', name: `crash ${n}`, scopes: ['usage:read'] },
        });
        if (a.status === 201) {
          const key = a.json!.key as { id: string };
          ack.issued.set(key.id, a.json!.token as string);
          mine.push(key.id);
        }
        if (a.status >= 500) tally.fiveHundreds++;
      } else if (step % 4 === 2) {
        const id = mine.shift()!;
        tally.requests++;
        ack.revoking.add(id);
        const a = await send(server.url, 'DELETE', `/keys/${id}`, { key: admin });
        ack.revoking.delete(id);
        if (a.status === 204) ack.revoked.set(id, ack.issued.get(id)!);
        if (a.status >= 500) tally.fiveHundreds++;
      } else {
        const note = `crash save ${n}`;
        tally.requests++;
        const a = await send(server.url, 'POST', `/scenarios/${scenarioId}/versions`, {
          key: admin,
          body: { ...SCENARIO_CONTENT, changeNote: note },
        });
        if (a.status === 201) {
          const version = (a.json!.version as { version: number }).version;
          ack.versions.push({ scenarioId, version, note });
        }
        if (a.status >= 500) tally.fiveHundreds++;
      }
    } catch {
      // The connection died with the process: that write was never acknowledged.
      return;
    }
  }
}

/** Checks every acknowledged key and save against a restarted server; returns what is missing. */
async function missing(server: LiveServer, admin: string, ack: Acknowledged): Promise<string[]> {
  const lost: string[] = [];
  for (const [id, token] of ack.issued) {
    const a = await send(server.url, 'GET', '/usage', { key: token });
    const want = ack.revoked.has(id) ? [401] : ack.revoking.has(id) ? [200, 401] : [200];
    if (!want.includes(a.status)) {
      lost.push(`key ${id}: ${a.status}, acknowledged as answering ${want.join(' or ')}`);
    }
  }
  for (const v of ack.versions) {
    const path = `/scenarios/${v.scenarioId}/versions/${v.version}`;
    const a = await send(server.url, 'GET', path, { key: admin });
    if (a.status !== 200 || a.json?.changeNote !== v.note) lost.push(`${path}: ${a.status}`);
  }
  return lost;
}

/**
 * Runs `writers` concurrent writers against `server`, SIGKILLs it after `killAfterMs`, reads the
 * file as the crash left it (integrity, ledger against counter), restarts the API and checks
 * every acknowledged write of this cycle and of earlier ones (carried in `ack`). The restarted
 * server is handed back, so cycles chain with one start each.
 */
export async function crashCycle(
  server: LiveServer,
  file: string,
  admin: string,
  ack: Acknowledged,
  /** `killAfterMs` counts from the first dozen acknowledged writes. */
  opts: { writers: number; killAfterMs: number },
): Promise<{ report: CycleReport; restarted: LiveServer }> {
  const count = () => ack.issued.size + ack.revoked.size + ack.versions.length + ack.units;
  const before = count();
  const tally = { requests: 0, fiveHundreds: 0 };
  const created = await send(server.url, 'POST', '/scenarios', {
    key: admin,
    body: { ...SCENARIO_CONTENT, changeNote: 'Crash cycle base' },
  });
  if (created.status !== 201) throw new Error(`scenario not created: ${created.text}`);
  const scenarioId = (created.json!.scenario as { id: string }).id;
  let killed = false;
  const writers = Array.from({ length: opts.writers }, () =>
    writer(server, admin, scenarioId, ack, tally, () => killed),
  );
  // Kill mid-load whatever the machine's speed: once writes are flowing, then a while later.
  const flowing = Date.now() + 30_000;
  while (count() - before < 12 && Date.now() < flowing) await new Promise((r) => setTimeout(r, 20));
  await new Promise((r) => setTimeout(r, opts.killAfterMs));
  killed = true;
  await server.kill();
  await Promise.all(writers);
  const facts = databaseFacts(file, DEMO_TENANT.id, periodOf(Date.now()));
  const lost: string[] = [];
  if (facts.ledger < ack.units) lost.push(`ledger ${facts.ledger} < ${ack.units} acknowledged`);
  if (facts.used !== facts.ledger) lost.push(`counter ${facts.used} ≠ ledger ${facts.ledger}`);
  const restarted = await spawnApi(file);
  lost.push(...(await missing(restarted, admin, ack)));
  return {
    report: {
      requests: tally.requests,
      acknowledged: count() - before,
      fiveHundreds: tally.fiveHundreds,
      lost,
      integrity: facts.integrity,
    },
    restarted,
  };
}

/** An empty record of acknowledged writes. */
export function noAcknowledgements(): Acknowledged {
  return { units: 0, issued: new Map(), revoked: new Map(), revoking: new Set(), versions: [] };
}
