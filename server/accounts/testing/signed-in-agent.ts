import request from 'supertest';
import { expect } from 'vitest';
import { testConfig, type Config } from '../../config';
import { createApp, type TroplineApp } from '../../create-app';
import { DEMO_USERS, type DemoUser } from '../../../seeds/03-demo-users';

/** A test app on a clock the test moves. */
export interface ClockedApp {
  readonly app: TroplineApp;
  /** Moves the app's clock forward. */
  advance(ms: number): void;
  close(): Promise<void>;
}

/** An app over an in-memory database, seeded, with its clock at a fixed instant. */
export async function clockedApp(overrides: Partial<Config> = {}): Promise<ClockedApp> {
  let now = Date.parse('2026-12-07T09:00:00.000Z');
  const app = createApp(testConfig({ publicUrl: 'http://tropline.test', ...overrides }), {
    now: () => now,
  });
  await app.locals.tropline.ready;
  return {
    app,
    advance: (ms) => {
      now += ms;
    },
    close: () => app.locals.tropline.close(),
  };
}

/** The demo user holding `role`. */
export function demoUser(role: DemoUser['role']): DemoUser {
  return DEMO_USERS.find((u) => u.role === role)!;
}

/** A cookie-keeping client signed in as someone, with the CSRF token of its session. */
export interface SignedInAgent {
  readonly agent: ReturnType<typeof request.agent>;
  readonly csrf: string;
  /** The sign-in answer's body. */
  readonly session: { user: { id: string; email: string }; tenants: unknown[] } & Record<
    string,
    unknown
  >;
  /** The `Set-Cookie` of the sign-in. */
  readonly cookies: string[];
}

/** Signs in with e-mail and password; fails the test unless it answers 200. */
export async function signInAs(
  app: TroplineApp,
  email: string,
  password: string,
): Promise<SignedInAgent> {
  const agent = request.agent(app);
  const res = await agent.post('/api/v1/session').send({ email, password });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  return { agent, csrf: res.body.csrfToken as string, session: res.body, cookies };
}

/** Signs in as the demo user holding `role`. */
export function signInDemo(app: TroplineApp, role: DemoUser['role']): Promise<SignedInAgent> {
  const user = demoUser(role);
  return signInAs(app, user.email, user.password);
}

/** The value of one cookie (`name=value`) from a `Set-Cookie` list. */
export function cookiePair(cookies: readonly string[], name: string): string | undefined {
  return cookies.map((c) => c.split(';')[0]!).find((c) => c.startsWith(`${name}=`));
}

/** The token in the first link of a mail's text part that carries `?token=`. */
export function tokenFromMail(text: string): string {
  const match = /[?&]token=([A-Za-z0-9_%-]+)/.exec(text);
  if (!match) throw new Error(`no token link in:\n${text}`);
  return decodeURIComponent(match[1]!);
}
