import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { Worker } from 'node:worker_threads';
import { createApp } from '../../apps/server/src/app';
import { prepareRuntime } from '../../apps/server/src/bootstrap';
import { loadConfig } from '../../apps/server/src/config/env';
import { createLogger } from '../../apps/server/src/lib/logger';
import { makeDataDir } from '../../apps/server/test/test-app';

const REQUESTS = 5000;
const CONCURRENCY = 8;

// The load runs in a worker thread, on the other core, so it does not take the server's CPU.
const loadGenerator = `
const http = require('node:http');
const { parentPort, workerData } = require('node:worker_threads');
const { port, headers, requests, concurrency } = workerData;
const agent = new http.Agent({ keepAlive: true, maxSockets: concurrency });
let sent = 0;
const one = () => new Promise((resolve, reject) => {
  const req = http.get({ host: '127.0.0.1', port, path: '/api/v1/auth/me', agent, headers }, (res) => {
    res.resume();
    res.on('end', () => (res.statusCode === 200 ? resolve() : reject(new Error('status ' + res.statusCode))));
  });
  req.on('error', reject);
});
const worker = async () => { while (sent < requests) { sent += 1; await one(); } };
const started = performance.now();
Promise.all(Array.from({ length: concurrency }, worker)).then(() => {
  agent.destroy();
  parentPort.postMessage(requests / ((performance.now() - started) / 1000));
});
`;

function hammer(port: number, headers: Record<string, string>): Promise<number> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(loadGenerator, {
      eval: true,
      workerData: { port, headers, requests: REQUESTS, concurrency: CONCURRENCY },
    });
    worker.once('message', resolve);
    worker.once('error', reject);
  });
}

/**
 * Signed-in request throughput: GET /auth/me through the whole stack (helmet, logging, cookie,
 * JWT verify, session and user lookups) against a bare Node HTTP server answering the same JSON
 * on the same machine in the same run. The bar is ours: at least 0.15 × the bare server (runs here
 * gave 0.18 to 0.27), so that authentication is not what limits the API.
 */
export async function benchSessionCheck() {
  const config = loadConfig({
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

  // Best of three runs each, after a warm-up: the figures are throughputs, and noise only lowers them.
  await hammer(barePort, {});
  await hammer(port, { cookie });
  let ceiling = 0;
  let figure = 0;
  for (let round = 0; round < 3; round += 1) {
    ceiling = Math.max(ceiling, await hammer(barePort, {}));
    figure = Math.max(figure, await hammer(port, { cookie }));
  }

  await new Promise((resolve) => bare.close(resolve));
  await new Promise((resolve) => server.close(resolve));
  await runtime.close();
  return {
    name: 'signed-in GET /auth/me (req/s)',
    figure: `${Math.round(figure)} req/s`,
    ceiling: `${Math.round(ceiling)} (bare)`,
    ok: figure >= 0.15 * ceiling,
  };
}
