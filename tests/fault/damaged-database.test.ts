import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { freePort, startServerProcess } from '../../scripts/lib/server-process';

describe('a database with a broken reference', () => {
  it('refuses to start, saying what is wrong and what to do', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-damaged-'));
    const port = await freePort();
    const first = await startServerProcess(dataDir, port, { FROM_SOURCES: '1' });
    await new Promise<void>((resolve) => {
      first.once('exit', () => resolve());
      first.kill('SIGTERM');
    });
    // A change made behind the product's back: a session of a person who does not exist.
    const file = path.join(dataDir, 'emberline.sqlite');
    const sqlite = new Database(file);
    sqlite.pragma('foreign_keys = OFF');
    sqlite
      .prepare(
        'INSERT INTO sessions (id, user_id, created_at, last_seen_at, expires_at) VALUES (?, ?, ?, ?, ?)',
      )
      .run('forged-session', 'nobody', Date.now(), Date.now(), Date.now() + 3_600_000);
    sqlite.close();

    const child = spawn(process.execPath, ['--import', 'tsx', 'apps/server/src/server.ts'], {
      env: { ...process.env, PORT: String(port), DATA_DIR: dataDir, LOG_LEVEL: 'error' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
    const code = await new Promise<number | null>((resolve) => child.once('exit', resolve));
    expect(code).toBe(1);
    expect(output).toMatch(/has 1 row whose reference points nowhere/);
    expect(output).toMatch(/row \d+ of sessions, which refers to a missing row of users/);
    expect(output).toMatch(/changed outside Emberline, or damaged/);
    expect(output).toMatch(/restore the latest backup \(pnpm restore\)/);
    expect(output).toMatch(/pnpm verify-records/);
    expect(output).not.toMatch(/a migration left/);
  }, 60_000);
});
