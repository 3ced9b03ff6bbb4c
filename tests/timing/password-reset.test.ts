import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { freePort, signInCookie, startServerProcess } from '../../scripts/lib/server-process';
import { median, shift } from './timing-stats';

// Timed after every other test project has finished (vite.config.ts, sequence.groupOrder), so
// that the machine is quiet: a timing compared within 20 % must not share the CPU with the suite.
const demoAccounts = {
  admin: 'admin@demo.test',
  inspector: 'inspector@demo.test',
  engineer: 'engineer@demo.test',
  planner: 'planner@demo.test',
  customer: 'customer@demo.test',
};
const makeDataDir = () => fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-timing-'));

describe('password reset requests', () => {
  it('answer within the same time for an unknown and a known address (thirty of each, shifted less than 20 % or 1 ms)', async () => {
    // Timed over HTTP against a server in its own process, as anyone probing addresses would.
    const port = await freePort();
    const server = await startServerProcess(makeDataDir(), port, { FROM_SOURCES: '1' });
    try {
      const base = `http://127.0.0.1:${port}/api/v1`;
      const time = async (email: string) => {
        const started = process.hrtime.bigint();
        const response = await fetch(`${base}/auth/password-reset`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json' },
          body: JSON.stringify({ email }),
        });
        const elapsed = Number(process.hrtime.bigint() - started) / 1e6;
        expect(response.status).toBe(202);
        expect(await response.json()).toEqual({ status: 'sent-if-known' });
        // Let the server finish what it does after answering before the next request comes.
        await new Promise((resolve) => setTimeout(resolve, 25));
        return elapsed;
      };
      for (let warm = 0; warm < 5; warm += 1) await time(`warm-up-${warm}@demo.test`);
      // Thirty of each, interleaved: a median of ten moved by ±20 % between quiet runs. Six
      // requests per account, so the sixth meets the limit of five links an hour, as a prober's would.
      const accounts = [
        demoAccounts.admin,
        demoAccounts.inspector,
        demoAccounts.engineer,
        demoAccounts.planner,
        demoAccounts.customer,
      ];
      const known: number[] = [];
      const unknown: number[] = [];
      for (let round = 0; round < 30; round += 1) {
        known.push(await time(accounts[round % accounts.length]!));
        unknown.push(await time(`nobody-${round}@demo.test`));
      }
      // The shift between the two sets (timing-stats.ts). Allowed: 20 % of the typical answer,
      // and never less than 1 ms, which is the spread of the median itself between quiet runs here; a link issued before answering (a token, an audit
      // row and a rendered e-mail) or an SMTP wait costs more than that.
      const moved = shift(known, unknown);
      const allowed = Math.max(1, 0.2 * median(unknown));
      console.warn(
        `reset answers: known ${median(known).toFixed(2)} ms, unknown ${median(unknown).toFixed(2)} ms, ` +
          `shift ${moved.toFixed(2)} ms, allowed ±${allowed.toFixed(2)} ms (30 of each)`,
      );
      expect(Math.abs(moved)).toBeLessThan(allowed);

      const cookie = await signInCookie(base, demoAccounts.admin);
      const outbox = await fetch(`${base}/outbox/messages?pageSize=100`, { headers: { cookie } });
      const items = ((await outbox.json()) as { items: { kind: string }[] }).items;
      expect(items.filter((item) => item.kind === 'password-reset')).toHaveLength(25);
    } finally {
      await new Promise<void>((resolve) => {
        server.once('exit', () => resolve());
        server.kill('SIGKILL');
      });
    }
  }, 60_000);
});
