import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { hashCostFor, PasswordHasher } from '../server/accounts/password-hasher';
import { DEMO_TENANT } from './01-demo-tenant';

/** A demo sign-in: invented person, documented development password. */
export interface DemoUser {
  readonly email: string;
  readonly name: string;
  /** Role in the demo tenant, or `operator` for the platform operator (no tenant role). */
  readonly role: 'owner' | 'admin' | 'analyst' | 'viewer' | 'operator';
  readonly password: string;
}

/**
 * One demo user per role. The passwords are public knowledge (README, `npm start`), which is
 * why seeds never run in production and this seed refuses to.
 */
export const DEMO_USERS: readonly DemoUser[] = [
  {
    email: 'maren.oakhollow@larchmere.example',
    name: 'Maren Oakhollow',
    role: 'owner',
    password: 'larchmere-owner-demo',
  },
  {
    email: 'tobias.fenwright@larchmere.example',
    name: 'Tobias Fenwright',
    role: 'admin',
    password: 'larchmere-admin-demo',
  },
  {
    email: 'priya.calder@larchmere.example',
    name: 'Priya Calder',
    role: 'analyst',
    password: 'larchmere-analyst-demo',
  },
  {
    email: 'jonas.reedmere@larchmere.example',
    name: 'Jonas Reedmere',
    role: 'viewer',
    password: 'larchmere-viewer-demo',
  },
  {
    email: 'ada.kestrel@operator.example',
    name: 'Ada Kestrel',
    role: 'operator',
    password: 'tropline-operator-demo',
  },
];

export async function seed(knex: Knex): Promise<void> {
  if (process.env.NODE_ENV === 'production') {
    throw new Error('demo users are never created in production');
  }
  const hasher = new PasswordHasher(hashCostFor(process.env.NODE_ENV));
  const at = new Date().toISOString();
  for (const demo of DEMO_USERS) {
    const id = randomUUID();
    await knex('users').insert({
      id,
      email: demo.email,
      name: demo.name,
      password_hash: await hasher.hash(demo.password),
      is_operator: demo.role === 'operator',
      session_generation: 0,
      created_at: at,
      password_changed_at: at,
    });
    if (demo.role !== 'operator') {
      await knex('memberships').insert({
        user_id: id,
        tenant_id: DEMO_TENANT.id,
        role: demo.role,
        created_at: at,
      });
    }
  }
}
