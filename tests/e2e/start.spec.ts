import { spawn } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { expect, test } from '@playwright/test';

test('pnpm start on a built tree with PORT and DATA_DIR answers /api/v1/health within 10 s', async () => {
  const port = 8193;
  const dataDir = mkdtempSync(path.join(tmpdir(), 'emberline-start-'));
  const started = Date.now();
  const child = spawn(process.execPath, ['apps/server/dist/server.js'], {
    env: { ...process.env, PORT: String(port), DATA_DIR: dataDir, LOG_LEVEL: 'warn' },
    stdio: 'ignore',
  });
  try {
    let body: unknown = null;
    while (Date.now() - started < 10_000 && body === null) {
      try {
        const response = await fetch(`http://127.0.0.1:${port}/api/v1/health`);
        if (response.ok) body = await response.json();
      } catch {
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
    }
    const elapsed = Date.now() - started;
    expect(body).toEqual({ status: 'ok' });
    expect(elapsed).toBeLessThan(10_000);
    console.log(
      `first start on an empty data directory (migrations + demo data) answered in ${elapsed} ms`,
    );
  } finally {
    child.kill('SIGTERM');
  }
});
