import http from 'node:http';
import type { AddressInfo } from 'node:net';
import {
  findingSearchQuerySchema,
  type FindingSearchResponse,
} from '../../packages/contracts/src/fleet-findings';
import { createApp } from '../../apps/server/src/app';
import { prepareRuntime, type Runtime } from '../../apps/server/src/bootstrap';
import { loadConfig } from '../../apps/server/src/config/env';
import { rawConnection } from '../../apps/server/src/db/client';
import { createLogger } from '../../apps/server/src/lib/logger';
import {
  detailsStatement,
  searchStatements,
} from '../../apps/server/src/modules/fleet-findings/fleet-findings.repository';
import { makeDataDir } from '../../apps/server/test/test-app';
import { seedFindings } from './seed-findings';

const FINDINGS = Number(process.env.BENCH_SEARCH_FINDINGS ?? 200_000);
const WARM_UP = 20;
// Enough requests that the p95 is not one stray pause of a machine shared with other work.
const REQUESTS = 200;

// What engineers ask of the fleet: the newest first, one kind of damage by size, the worst
// verdicts, the undecided, one engine's history.
const searches = [
  { name: 'newest first', query: '' },
  {
    name: 'HPT 1 blade cracks by length',
    query: 'row=hpt1-blade&damage=crack&sort=lengthMm&order=desc',
  },
  { name: 'beyond limits, worst first', query: 'category=beyond-limits&sort=category' },
  { name: 'no decision yet', query: 'decision=none' },
  { name: 'one engine', query: 'engineId=bench-engine-4242' },
];

const p95 = (samples: number[]) =>
  [...samples].sort((a, b) => a - b)[Math.ceil(samples.length * 0.95) - 1]!;

/**
 * The fleet findings search over `FINDINGS` recorded findings (one inspection of 20 per engine,
 * submitted or released): each search's p95 through HTTP beside the same statements (the count
 * and the page) run straight on better-sqlite3, the raw-SQL ceiling.
 */
export async function benchFindingsSearch() {
  const config = benchConfig(makeDataDir());
  const runtime = await prepareRuntime(config, createLogger('silent', false));
  const sqlite = rawConnection(runtime.ctx.db);
  seedFindings(sqlite, { findings: FINDINGS, otherwise: 'submitted' });
  sqlite.pragma('optimize');
  const results = await measureSearches(runtime, {
    label: `${FINDINGS / 1000}k`,
    warmUp: WARM_UP,
    requests: REQUESTS,
    budget: FINDINGS > 200_000 ? null : 10,
  });
  await runtime.close();
  return results;
}

export const benchConfig = (dataDir: string) =>
  loadConfig({
    DEMO: '1',
    DATA_DIR: dataDir,
    LOG_LEVEL: 'silent',
    BCRYPT_COST: '10',
    NODE_ENV: 'production',
    DEMO_IMAGES: '0',
  });

/**
 * Each search of `searches` through HTTP as an engineer, `requests` times after `warmUp`, beside
 * its statements (the count, the page and the page's details) on better-sqlite3, and beside the
 * app's own floor: a signed-in GET /auth/me, which reads nothing but the session. `budget` null
 * records the figure without a ceiling.
 */
export async function measureSearches(
  runtime: Runtime,
  options: { label: string; warmUp: number; requests: number; budget: number | null },
) {
  const sqlite = rawConnection(runtime.ctx.db);
  const server = http.createServer(createApp(runtime.ctx, { webDist: null }));
  // The raw-SQL rounds between searches leave the client's connection idle for seconds: kept open,
  // so that the next search is not sent on a socket the server has just closed.
  server.keepAliveTimeout = 600_000;
  server.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1`;
  const login = await fetch(`${origin}/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'engineer@demo.test', password: 'emberline-demo' }),
  });
  const cookie = (login.headers.get('set-cookie') ?? '').split(';')[0]!;
  const timed = async (path: string) => {
    const samples: number[] = [];
    let body: unknown;
    for (let index = 0; index < options.warmUp + options.requests; index += 1) {
      const started = performance.now();
      const response = await fetch(`${origin}${path}`, { headers: { cookie } });
      body = await response.json();
      if (response.status !== 200) throw new Error(`GET ${path} answered ${response.status}`);
      if (index >= options.warmUp) samples.push(performance.now() - started);
    }
    return { p95: p95(samples), body };
  };

  const results = [];
  for (const search of searches) {
    const floor = await timed('/auth/me');
    const api = await timed(`/findings?${search.query}`);
    const { total, items } = api.body as FindingSearchResponse;
    const { page, pageSize, ...selection } = findingSearchQuerySchema.parse(
      Object.fromEntries(new URLSearchParams(search.query)),
    );
    const scope = { organisationId: null, releasedOnly: false };
    const statements = searchStatements(runtime.ctx.db, scope, selection);
    // What the search runs for its first page: the count, the page, the page's details.
    const first = { offset: (page - 1) * pageSize, limit: pageSize };
    const ids = items.map((item) => item.id);
    const raw = [
      statements.count.toSQL(),
      statements.sorted(first).toSQL(),
      detailsStatement(runtime.ctx.db, scope, ids).toSQL(),
    ].map((query) => ({ statement: sqlite.prepare(query.sql).raw(true), params: query.params }));
    const sql: number[] = [];
    for (let index = 0; index < options.warmUp + options.requests; index += 1) {
      const started = performance.now();
      for (const { statement, params } of raw) statement.all(...params);
      if (index >= options.warmUp) sql.push(performance.now() - started);
    }
    results.push({
      name: `findings search, ${search.name}, at ${options.label} (p95, ${total} match)`,
      figure: `${api.p95.toFixed(1)} ms`,
      ceiling: `${options.budget === null ? 'recorded' : `${options.budget} ms`}; raw SQL ${p95(sql).toFixed(1)}, GET /auth/me ${floor.p95.toFixed(1)}`,
      ok: options.budget === null || api.p95 <= options.budget,
    });
  }
  await new Promise((resolve) => server.close(resolve));
  return results;
}
