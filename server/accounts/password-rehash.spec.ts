import { verify } from '@node-rs/argon2';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { PasswordHasher, PRODUCTION_COST, TEST_COST, type HashCost } from './password-hasher';
import { clockedApp, signInAs, type ClockedApp } from './testing/signed-in-agent';
import { UsersService } from './users-service';

// Cheaper than the cost the test app hashes with (TEST_COST: 1024 KiB, 1 pass), as an account
// hashed before the cost was raised would be.
const OLD_COST: HashCost = { memoryCost: 256, timeCost: 1, parallelism: 1 };

/** The m, t and p of a PHC argon2 string. */
function costOf(phc: string) {
  const [, m, t, p] = /\$m=(\d+),t=(\d+),p=(\d+)\$/.exec(phc)!;
  return { memoryCost: Number(m), timeCost: Number(t), parallelism: Number(p) };
}

describe('rehashing a password made with a lower cost', () => {
  let t: ClockedApp;
  beforeAll(async () => {
    t = await clockedApp();
  });
  afterAll(() => t.close());
  const row = (email: string) => t.app.locals.tropline.db('users').where({ email }).first();

  async function userHashedWith(cost: HashCost, email: string, password: string) {
    const { db } = t.app.locals.tropline;
    await new UsersService(db, new PasswordHasher(cost)).create(
      { email, name: 'Corin Alderholt', password, tenantId: DEMO_TENANT.id, role: 'viewer' },
      'test',
    );
    return row(email);
  }

  it('stores a hash of the current cost at the next good sign-in, and nothing else changes', async () => {
    const email = 'corin.alderholt@larchmere.example';
    const password = 'sedge-warbler-in-the-reeds';
    const before = await userHashedWith(OLD_COST, email, password);
    expect(costOf(before.password_hash)).toEqual(OLD_COST);

    // A wrong password proves nothing about the account: the old hash stays.
    await request(t.app)
      .post('/api/v1/session')
      .send({ email, password: 'not-the-password' })
      .expect(401);
    expect((await row(email)).password_hash).toBe(before.password_hash);

    const signedIn = await signInAs(t.app, email, password);
    const after = await row(email);
    expect(costOf(after.password_hash)).toEqual(TEST_COST);
    expect(after.password_hash).not.toBe(before.password_hash);
    expect(await verify(after.password_hash, password)).toBe(true);
    // Not a password change: sessions and the change date are untouched.
    expect(after.session_generation).toBe(before.session_generation);
    expect(after.password_changed_at).toBe(before.password_changed_at);
    await signedIn.agent.get('/api/v1/session').expect(200);

    // The next sign-in finds the current cost and writes nothing.
    await signInAs(t.app, email, password);
    expect((await row(email)).password_hash).toBe(after.password_hash);
  });

  it('keeps a hash made with a higher cost than the current one', async () => {
    const email = 'ilsa.brookmoor@larchmere.example';
    const password = 'curlew-calls-over-the-moor';
    const before = await userHashedWith(PRODUCTION_COST, email, password);
    await signInAs(t.app, email, password);
    expect((await row(email)).password_hash).toBe(before.password_hash);
  });

  it('asks for a rehash when the algorithm, version or any cost is lower, never when higher', async () => {
    const hasher = new PasswordHasher(TEST_COST);
    const phc = (head: string) => `${head}$c2FsdHNhbHRzYWx0$aGFzaGhhc2hoYXNoaGFzaA`;
    expect(hasher.needsRehash(phc('$argon2id$v=19$m=1024,t=1,p=1'))).toBe(false);
    expect(hasher.needsRehash(phc('$argon2id$v=19$m=65536,t=3,p=4'))).toBe(false);
    expect(hasher.needsRehash(phc('$argon2id$v=19$m=512,t=1,p=1'))).toBe(true);
    expect(hasher.needsRehash(phc('$argon2id$v=19$m=1024,t=0,p=1'))).toBe(true);
    expect(hasher.needsRehash(phc('$argon2i$v=19$m=1024,t=1,p=1'))).toBe(true);
    expect(hasher.needsRehash(phc('$argon2id$v=16$m=1024,t=1,p=1'))).toBe(true);
    expect(hasher.needsRehash('not a hash')).toBe(true);
    const production = new PasswordHasher(PRODUCTION_COST);
    expect(production.needsRehash(phc('$argon2id$v=19$m=1024,t=1,p=1'))).toBe(true);
  });
});
