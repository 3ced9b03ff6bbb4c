// Starts the built server for the end-to-end tests on a fresh, empty data directory, so that
// every run begins from the demo scenario.
import { spawn } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const dataDir = mkdtempSync(path.join(tmpdir(), 'emberline-e2e-'));
const child = spawn(process.execPath, ['apps/server/dist/server.js'], {
  stdio: 'inherit',
  env: {
    ...process.env,
    DATA_DIR: dataDir,
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn',
    BCRYPT_COST: '10',
    DEMO: '1',
  },
});
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
child.on('exit', (code) => process.exit(code ?? 0));
