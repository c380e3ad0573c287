import request, { type Test } from 'supertest';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { testConfig, type Config } from '../../server/config';
import { createApp, type AppOptions, type TroplineApp } from '../../server/create-app';
import type { DemoKeys } from '../../server/keys/demo-keys';
import { conformsToContract } from './openapi-contract';

/** A clock the test moves by hand (expiry, rotation overlap, rate windows, months). */
export class TestClock {
  constructor(public t = Date.parse('2026-12-15T12:00:30.000Z')) {}
  readonly now = (): number => this.t;
  advance(ms: number): void {
    this.t += ms;
  }
}

/** What a test drives: the app, its clock, the demo keys and a contract-checked client. */
export interface Harness {
  readonly app: TroplineApp;
  readonly clock: TestClock;
  readonly demo: DemoKeys;
  /** A request with a bearer key (and Origin), checked against openapi.yaml on its way back. */
  call(
    method: 'get' | 'post' | 'delete' | 'options',
    path: string,
    key?: string,
    origin?: string,
  ): Test;
  close(): Promise<void>;
}

/** Starts an app on a fresh in-memory database (or the given file) with a hand-moved clock. */
export async function startHarness(
  overrides: Partial<Config> = {},
  options: Omit<AppOptions, 'now'> = {},
): Promise<Harness> {
  const clock = new TestClock();
  const app = createApp(testConfig(overrides), { ...options, now: clock.now });
  await app.locals.tropline.ready;
  const demo = app.locals.tropline.demoKeys;
  if (!demo) throw new Error('the test database was not seeded with demo keys');
  return {
    app,
    clock,
    demo,
    call(method, path, key, origin) {
      let test = request(app)[method](`/api/v1${path}`);
      if (key) test = test.set('Authorization', `Bearer ${key}`);
      if (origin) test = test.set('Origin', origin);
      return test.expect(conformsToContract);
    },
    close: () => app.locals.tropline.close(),
  };
}

/** The demo portal's origin in tests (testConfig's PUBLIC_URL). */
export const DEMO_ORIGIN = 'http://localhost:3000';

/** A benchmark projection body: horizon and samples as given. */
export function benchmarkProjection(horizon = 50, samples = 51) {
  return {
    model: HASTINGS_POWELL_BENCHMARK.model,
    initial: HASTINGS_POWELL_BENCHMARK.initial,
    horizon,
    samples,
  };
}
