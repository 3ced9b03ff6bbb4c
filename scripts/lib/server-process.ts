import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';

/** A port on 127.0.0.1 that nothing listens on now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

/**
 * Starts the server as a process of its own (the built bundle when there is one, the sources
 * otherwise) and waits until it answers /health.
 */
export async function startServerProcess(
  dataDir: string,
  port: number,
  env: Record<string, string> = {},
  nodeArgs: string[] = [],
): Promise<ChildProcess> {
  const entry =
    fs.existsSync('apps/server/dist/server.js') && !env.FROM_SOURCES
      ? ['apps/server/dist/server.js']
      : ['--import', 'tsx', 'apps/server/src/server.ts'];
  const child = spawn(process.execPath, [...nodeArgs, ...entry], {
    env: {
      ...process.env,
      PORT: String(port),
      DATA_DIR: dataDir,
      LOG_LEVEL: 'error',
      BCRYPT_COST: '10',
      DEMO: '1',
      DEMO_IMAGES: '0',
      NODE_ENV: 'production',
      ...env,
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  for (let attempt = 0; attempt < 300; attempt += 1) {
    try {
      if ((await fetch(`http://127.0.0.1:${port}/api/v1/health`)).ok) return child;
    } catch {
      // not up yet
    }
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  child.kill('SIGKILL');
  throw new Error('the server did not start');
}

/** Signs in through the API and returns the session cookie ("name=value"). */
export async function signInCookie(
  base: string,
  email: string,
  password = 'emberline-demo',
): Promise<string> {
  const response = await fetch(`${base}/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (!response.ok) throw new Error(`sign-in of ${email} answered ${response.status}`);
  return (response.headers.get('set-cookie') ?? '').split(';')[0]!;
}

/**
 * Opens a draft inspection of one blade row through the API (for the fault tests and the
 * benchmarks) and returns its id; by default on the demo's VT3-D0103 at its current cycles.
 */
export async function openInspectionOverHttp(
  base: string,
  cookie: string,
  particulars: { inspectorName: string; engineId?: string; csn?: number; tsn?: number },
): Promise<string> {
  const { inspectorName, engineId = 'engine-d0103', csn = 9455, tsn = 13237 } = particulars;
  const response = await fetch(`${base}/inspections`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', cookie },
    body: JSON.stringify({
      engineId,
      date: new Date().toISOString().slice(0, 10),
      reason: 'scheduled',
      csn,
      tsn,
      inspectorName,
      qualificationRef: 'Q-1',
      qualificationExpiresOn: '2099-01-01',
      probe: 'P-1',
      probeCalibrationDueOn: '2099-01-01',
      rows: ['hpt1-blade'],
    }),
  });
  if (response.status !== 201)
    throw new Error(`opening an inspection answered ${response.status}: ${await response.text()}`);
  return ((await response.json()) as { id: string }).id;
}

/**
 * Runs one of the project's commands (pnpm backup, restore, migrate-storage…) from its sources
 * against a data directory, and gives its exit code and everything it printed.
 */
export function runCommand(
  script: string,
  args: string[],
  dataDir: string,
  env: Record<string, string> = {},
): Promise<{ code: number | null; output: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', script, ...args], {
      env: { ...process.env, DATA_DIR: dataDir, LOG_LEVEL: 'error', ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout!.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr!.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.once('exit', (code) => resolve({ code, output }));
  });
}
