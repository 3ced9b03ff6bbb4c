import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../apps/server/src/app';
import { prepareRuntime } from '../../apps/server/src/bootstrap';
import { loadConfig } from '../../apps/server/src/config/env';
import { rawConnection } from '../../apps/server/src/db/client';
import { engines } from '../../apps/server/src/db/schema';
import { createLogger } from '../../apps/server/src/lib/logger';
import { engineListQueries } from '../../apps/server/src/modules/engines/engines.repository';
import { makeDataDir } from '../../apps/server/test/test-app';
import { engineListQuerySchema } from '../../packages/contracts/src/fleet';

const ENGINES = 2000;
const REQUESTS = 400;
const PATH = '/api/v1/engines?page=1&pageSize=50&status=installed&sort=csn&order=desc';

function p95(samples: number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length * 0.95)]!;
}

function get(port: number, cookie: string, agent: http.Agent): Promise<void> {
  return new Promise((resolve, reject) => {
    http
      .get({ host: '127.0.0.1', port, path: PATH, headers: { cookie }, agent }, (res) => {
        res.resume();
        res.on('end', () =>
          res.statusCode === 200 ? resolve() : reject(new Error(`status ${res.statusCode}`)),
        );
      })
      .on('error', reject);
  });
}

/**
 * The fleet list over 2,000 engines (a filter and a sort), through the whole HTTP stack, beside
 * the raw SQL of the same two queries (page and count) on the same database in the same run.
 */
export async function benchEngineList() {
  const config = loadConfig({
    DEMO: '1',
    DATA_DIR: makeDataDir(),
    LOG_LEVEL: 'silent',
    BCRYPT_COST: '10',
    NODE_ENV: 'production',
  });
  const runtime = await prepareRuntime(config, createLogger('silent', false));
  const { db } = runtime.ctx;
  const statuses = ['installed', 'installed', 'installed', 'in-shop', 'removed'] as const;
  db.insert(engines)
    .values(
      Array.from({ length: ENGINES }, (_, index) => ({
        id: `bench-${index}`,
        serialNumber: `VT3-B${String(index).padStart(5, '0')}`,
        modelId: 'model-vt300-v1',
        organisationId: index % 2 ? 'org-corvid' : 'org-pellucid',
        tsn: 1000 + index * 3.5,
        csn: (index * 7919) % 30_000,
        tsnCsnAsOf: '2026-11-30',
        status: statuses[index % statuses.length]!,
        createdAt: new Date(),
      })),
    )
    .run();

  const server = http
    .createServer(createApp(runtime.ctx, { webDist: null }))
    .listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const port = (server.address() as AddressInfo).port;
  const login = await fetch(`http://127.0.0.1:${port}/api/v1/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'planner@demo.test', password: 'emberline-demo' }),
  });
  const cookie = (login.headers.get('set-cookie') ?? '').split(';')[0]!;
  const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
  const api: number[] = [];
  for (let index = 0; index < REQUESTS + 50; index += 1) {
    const started = performance.now();
    await get(port, cookie, agent);
    if (index >= 50) api.push(performance.now() - started);
  }
  agent.destroy();

  const query = engineListQuerySchema.parse(
    Object.fromEntries(new URL(PATH, 'http://x').searchParams),
  );
  const { page, total } = engineListQueries(db, query, { status: query.status });
  const sqlite = rawConnection(db);
  const pageSql = page.toSQL();
  const totalSql = total.toSQL();
  const pageStatement = sqlite.prepare(pageSql.sql);
  const totalStatement = sqlite.prepare(totalSql.sql);
  const raw: number[] = [];
  for (let index = 0; index < REQUESTS + 50; index += 1) {
    const started = performance.now();
    pageStatement.all(...pageSql.params);
    totalStatement.get(...totalSql.params);
    if (index >= 50) raw.push(performance.now() - started);
  }

  await new Promise((resolve) => server.close(resolve));
  await runtime.close();
  const figure = p95(api);
  return {
    name: `GET /engines, 2k engines, filter + sort (p95)`,
    figure: `${figure.toFixed(2)} ms`,
    ceiling: `${p95(raw).toFixed(2)} ms (raw SQL)`,
    ok: figure < 20,
  };
}
