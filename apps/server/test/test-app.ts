import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { Express } from 'express';
import { createApp } from '../src/app';
import { prepareRuntime, type Runtime } from '../src/bootstrap';
import { loadConfig } from '../src/config/env';
import { rawConnection } from '../src/db/client';
import { findingSearchDrift } from '../src/db/finding-search';
import { DEMO_PASSWORD } from '../src/demo/demo-scenario';
import { createLogger } from '../src/lib/logger';
import { serverLogCapture } from './server-log';

export { DEMO_PASSWORD };

/** A clock the test moves by hand. */
export class TestClock {
  constructor(private current = new Date('2026-06-01T08:00:00Z')) {}
  now = (): Date => new Date(this.current);
  advance(ms: number): void {
    this.current = new Date(this.current.getTime() + ms);
  }
}

export interface TestApp {
  app: Express;
  runtime: Runtime;
  dataDir: string;
  clock: TestClock;
  /** Delivers every message of the outbox that is due by the test clock; returns how many. */
  deliver(): Promise<number>;
  /** Signs in and returns the session cookie ("name=value"). */
  signIn(email: string, password?: string): Promise<string>;
  close(): Promise<void>;
}

export function makeDataDir(): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-test-'));
}

/**
 * The real app on a migrated SQLite file in a temporary directory, with the demo scenario and the
 * real in-process SMTP fake. Nothing is mocked.
 */
export async function startTestApp(
  options: {
    dataDir?: string;
    env?: Record<string, string>;
    clock?: TestClock;
    /** Load the demo scenario (DEMO=1); false starts as a real installation does by default. */
    demo?: boolean;
    /** `auto` (default): the outbox worker delivers every 20 ms; `manual`: only `t.deliver()`. */
    delivery?: 'auto' | 'manual';
  } = {},
): Promise<TestApp> {
  const dataDir = options.dataDir ?? makeDataDir();
  const clock = options.clock ?? new TestClock();
  const config = loadConfig({
    NODE_ENV: 'test',
    DATA_DIR: dataDir,
    LOG_LEVEL: 'error',
    BCRYPT_COST: '10',
    ...(options.demo === false ? {} : { DEMO: '1' }),
    // The demo's stills take seconds to render; tests that need the demo history ask for it.
    DEMO_IMAGES: '0',
    ...options.env,
  });
  const runtime = await prepareRuntime(
    config,
    createLogger('error', false, serverLogCapture),
    clock.now,
  );
  const app = createApp(runtime.ctx, { webDist: null });
  if (options.delivery !== 'manual') runtime.delivery.start(20);
  return {
    app,
    runtime,
    dataDir,
    clock,
    deliver: () => runtime.delivery.deliverDue(),
    async signIn(email, password = DEMO_PASSWORD) {
      const response = await request(app).post('/api/v1/auth/login').send({ email, password });
      if (response.status !== 200)
        throw new Error(
          `sign-in of ${email} answered ${response.status}: ${JSON.stringify(response.body)}`,
        );
      return sessionCookieOf(response.headers['set-cookie']);
    },
    async close() {
      const drift = projectionDrift(runtime);
      await runtime.close();
      if (drift) throw new Error(drift);
    },
  };
}

/**
 * Whether the fleet search's projection still agrees with the records it mirrors, checked as
 * every integration test closes its app: null when it does, else what differs.
 */
function projectionDrift(runtime: Runtime): string | null {
  const sqlite = rawConnection(runtime.ctx.db);
  if (!sqlite.open) return null;
  const drift = findingSearchDrift(sqlite);
  return drift.extra + drift.missing + drift.miscounted === 0
    ? null
    : `the findings search's projection disagrees with the records: ${JSON.stringify(drift)}`;
}

/** The "name=value" part of the session cookie in a Set-Cookie header. */
export function sessionCookieOf(setCookie: string | string[] | undefined): string {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const cookie = list.find((value) => value.startsWith('emberline_session='));
  if (!cookie) throw new Error('no session cookie was set');
  return cookie.split(';')[0] ?? '';
}

export const demoAccounts = {
  admin: 'admin@demo.test',
  inspector: 'inspector@demo.test',
  engineer: 'engineer@demo.test',
  engineer2: 'engineer2@demo.test',
  planner: 'planner@demo.test',
  customer: 'customer@demo.test',
  customer2: 'customer2@demo.test',
} as const;

/** Waits until the SMTP fake has caught a message to `to`, and returns it. */
export async function waitForMail(runtime: Runtime, to: string, timeoutMs = 5000) {
  const store = runtime.ctx.caughtMail;
  if (!store) throw new Error('the SMTP fake is not running');
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await store.list()).find((item) => item.to.includes(to));
    if (found) return (await store.read(found.id))!;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

export function linkToken(text: string): string {
  const match = /#token=([A-Za-z0-9_-]{43})/.exec(text);
  if (!match?.[1]) throw new Error('no link with a token in the message');
  return match[1];
}
