import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../apps/server/src/app';
import { prepareRuntime } from '../../apps/server/src/bootstrap';
import { loadConfig } from '../../apps/server/src/config/env';
import { rawConnection } from '../../apps/server/src/db/client';
import { DEMO_MODEL_ID } from '../../apps/server/src/demo/demo-fleet';
import { DEMO_DRAFT_LIMIT_SET_ID } from '../../apps/server/src/demo/demo-limits';
import { createLogger } from '../../apps/server/src/lib/logger';
import {
  currentFindings,
  currentFindingsQuery,
} from '../../apps/server/src/modules/findings/findings.repository';
import { makeDataDir } from '../../apps/server/test/test-app';
import { seedFindings } from './seed-findings';

const FINDINGS = Number(process.env.BENCH_IMPACT_FINDINGS ?? 200_000);
const PER_INSPECTION = 20;
const RUNS = 5;

/**
 * 200,000 stored findings on the demo model's engines (one inspection of 20 findings per engine,
 * half of them released, each judged against D-1 as the product stores it), then the impact
 * preview of draft D-2 through HTTP, beside the 1 s budget (QUALITY §4) and the SQL read alone.
 */
export async function benchImpact() {
  const config = loadConfig({
    DEMO: '1',
    DATA_DIR: makeDataDir(),
    LOG_LEVEL: 'silent',
    BCRYPT_COST: '10',
    NODE_ENV: 'production',
    DEMO_IMAGES: '0',
  });
  const runtime = await prepareRuntime(config, createLogger('silent', false));
  const sqlite = rawConnection(runtime.ctx.db);
  const { engines } = seedFindings(sqlite, {
    findings: FINDINGS,
    perInspection: PER_INSPECTION,
    // Every other inspection released, the rest left as drafts (current all the same).
    otherwise: 'draft',
  });

  const server = http
    .createServer(createApp(runtime.ctx, { webDist: null }))
    .listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1`;
  const login = await fetch(`${origin}/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'engineer@demo.test', password: 'emberline-demo' }),
  });
  const cookie = (login.headers.get('set-cookie') ?? '').split(';')[0]!;
  const api: number[] = [];
  let judged = 0;
  let changed = 0;
  for (let run = 0; run < RUNS; run += 1) {
    const started = performance.now();
    const response = await fetch(`${origin}/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/impact`, {
      headers: { cookie },
    });
    const body = (await response.json()) as { findings: number; changedCount: number };
    api.push(performance.now() - started);
    if (response.status !== 200) throw new Error(`impact answered ${response.status}`);
    judged = body.findings;
    changed = body.changedCount;
  }
  const reads: number[] = [];
  for (let run = 0; run < RUNS; run += 1) {
    const started = performance.now();
    let read = 0;
    for (const { findings } of currentFindings(runtime.ctx.db, DEMO_MODEL_ID))
      read += findings.length;
    if (read < FINDINGS) throw new Error(`read ${read} findings`);
    reads.push(performance.now() - started);
  }
  // The floor under the read: better-sqlite3 stepping through the same query's rows as arrays
  // (an inspection's findings each, as SQLite's JSON text), making nothing of them.
  const { sql: text, params } = currentFindingsQuery(DEMO_MODEL_ID);
  const bare = sqlite.prepare(text).raw(true);
  const scans: number[] = [];
  for (let run = 0; run < RUNS; run += 1) {
    const started = performance.now();
    let read = 0;
    for (const _row of bare.iterate(...params)) read += 1;
    if (read < engines) throw new Error(`scanned ${read} inspections`);
    scans.push(performance.now() - started);
  }
  await new Promise((resolve) => server.close(resolve));
  await runtime.close();
  const median = (samples: number[]) => [...samples].sort((a, b) => a - b)[samples.length >> 1]!;
  const figure = median(api);
  const read = median(reads);
  const scan = median(scans);
  return [
    {
      name: `impact preview, ${(judged / 1000).toFixed(0)}k findings, ${changed} changes (median)`,
      figure: `${figure.toFixed(0)} ms`,
      ceiling: `1000 ms; ${(figure / read).toFixed(2)}× its read (1.5×)`,
      ok: figure < 1000 && figure <= 1.5 * read && judged >= FINDINGS,
    },
    {
      name: `impact preview's SQL read of ${(FINDINGS / 1000).toFixed(0)}k findings`,
      figure: `${read.toFixed(0)} ms`,
      ceiling: `${scan.toFixed(0)} ms raw scan × 3 (${(read / scan).toFixed(2)}×)`,
      ok: read <= 3 * scan,
    },
  ];
}
