import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../apps/server/src/app';
import { prepareRuntime } from '../../apps/server/src/bootstrap';
import { loadConfig } from '../../apps/server/src/config/env';
import { createLogger } from '../../apps/server/src/lib/logger';
import { makeDataDir } from '../../apps/server/test/test-app';

const REQUESTS = 2000;

function median(samples: number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

/** Median latency of one request after another on a kept-alive connection. */
async function latency(port: number, headers: Record<string, string>): Promise<number> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
  const samples: number[] = [];
  for (let index = 0; index < REQUESTS; index += 1) {
    const started = performance.now();
    await new Promise<void>((resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port, path: '/api/v1/auth/me', agent, headers }, (res) => {
          res.resume();
          res.on('end', () =>
            res.statusCode === 200 ? resolve() : reject(new Error(`status ${res.statusCode}`)),
          );
        })
        .on('error', reject);
    });
    if (index >= 200) samples.push(performance.now() - started);
  }
  agent.destroy();
  return median(samples);
}

/**
 * What signing in costs each request: the median latency of GET /auth/me through the whole stack
 * (helmet, logging, cookie, JWT verify, session and user lookups) beside a bare Node HTTP server
 * answering the same JSON on the same machine in the same run. The bar is ours: authentication
 * adds at most 1 ms to a request.
 */
export async function benchSessionCheck() {
  const config = loadConfig({
    DEMO: '1',
    DATA_DIR: makeDataDir(),
    LOG_LEVEL: 'silent',
    BCRYPT_COST: '10',
    NODE_ENV: 'production',
  });
  const runtime = await prepareRuntime(config, createLogger('silent', false));
  const server = http
    .createServer(createApp(runtime.ctx, { webDist: null }))
    .listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const port = (server.address() as AddressInfo).port;
  const login = await fetch(`http://127.0.0.1:${port}/api/v1/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'engineer@demo.test', password: 'emberline-demo' }),
  });
  const cookie = (login.headers.get('set-cookie') ?? '').split(';')[0]!;
  const body = JSON.stringify(
    await (await fetch(`http://127.0.0.1:${port}/api/v1/auth/me`, { headers: { cookie } })).json(),
  );

  const bare = http.createServer((_req, res) => {
    res.writeHead(200, { 'Content-Type': 'application/json' });
    res.end(body);
  });
  bare.listen(0, '127.0.0.1');
  await new Promise((resolve) => bare.once('listening', resolve));
  const barePort = (bare.address() as AddressInfo).port;

  const ceiling = await latency(barePort, {});
  const figure = await latency(port, { cookie });

  await new Promise((resolve) => bare.close(resolve));
  await new Promise((resolve) => server.close(resolve));
  await runtime.close();
  return {
    name: 'signed-in GET /auth/me (median latency)',
    figure: `${figure.toFixed(3)} ms`,
    ceiling: `${ceiling.toFixed(3)} ms (bare)`,
    ok: figure <= ceiling + 1,
  };
}
