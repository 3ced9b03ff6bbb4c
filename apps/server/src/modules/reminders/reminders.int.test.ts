import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import type { EngineDue } from '@emberline/contracts/planning';
import { addDays } from '@emberline/domain/dates';
import { demoAccounts, startTestApp, TestClock, type TestApp } from '../../../test/test-app';

let t: TestApp | null = null;
afterEach(async () => {
  await t?.close();
  t = null;
});

const HOUR = 3_600_000;

/** The app on `dataDir` (a restart when it is the same), its clock at `at`, delivery by hand. */
async function start(at: string, dataDir?: string): Promise<TestApp> {
  await t?.close();
  t = await startTestApp({
    delivery: 'manual',
    clock: new TestClock(new Date(at)),
    ...(dataDir ? { dataDir } : {}),
  });
  return t;
}

async function reminders(app: TestApp) {
  const admin = await app.signIn(demoAccounts.admin);
  const response = await request(app.app)
    .get('/api/v1/outbox/messages')
    .query({ pageSize: 100 })
    .set('Cookie', admin);
  expect(response.status).toBe(200);
  const items = response.body.items as { id: string; kind: string; subject: string }[];
  return {
    digests: items.filter((item) => item.subject.startsWith('Emberline planning,')),
    overdue: items.filter((item) => item.subject.startsWith('Overdue: engine ')),
    text: async (id: string) =>
      (await request(app.app).get(`/api/v1/outbox/messages/${id}`).set('Cookie', admin)).body
        .text as string,
  };
}

describe('reminders (DESIGN §5.6): one digest a day, an e-mail the day an engine becomes overdue', () => {
  it('sends the digest once a day at the configured hour, across restarts', async () => {
    // 05:00 UTC on the day the demo loads: before the digest hour (REMINDER_HOUR, 7 by default).
    let app = await start('2026-06-01T05:00:00Z');
    const dataDir = app.dataDir;
    expect(app.runtime.reminders.tick()).toEqual({ overdueEmails: 0, digest: false });
    expect((await reminders(app)).digests).toHaveLength(0);

    app.clock.advance(2 * HOUR + 5 * 60_000); // 07:05
    expect(app.runtime.reminders.tick().digest).toBe(true);
    app.clock.advance(10 * 60_000);
    expect(app.runtime.reminders.tick().digest).toBe(false);
    const first = await reminders(app);
    expect(first.digests.map((item) => item.subject)).toEqual([
      'Emberline planning, 1 Jun 2026: 0 overdue',
    ]);
    const text = await first.text(first.digests[0]!.id);
    expect(text).toContain('Due within 14 days (1):');
    expect(text).toMatch(/• VT3-D0102 \(Corvid Regional Airways \(demo\)\): due \d+ \w+ 2026/);
    expect(text).toContain('Overdue or due soon, not booked (1):');

    // A restart the same day: the scheduler's first tick at start sends nothing again.
    app = await start('2026-06-01T09:00:00Z', dataDir);
    app.runtime.scheduler.start();
    app.runtime.scheduler.stop();
    expect((await reminders(app)).digests).toHaveLength(1);

    // Down across the next day's digest hour (06:50 to 07:30): the restart's first tick sends it.
    app = await start('2026-06-02T06:50:00Z', dataDir);
    expect(app.runtime.reminders.tick().digest).toBe(false);
    app = await start('2026-06-02T07:30:00Z', dataDir);
    app.runtime.scheduler.start();
    app.runtime.scheduler.stop();
    const second = await reminders(app);
    expect(second.digests.map((item) => item.subject)).toEqual([
      'Emberline planning, 2 Jun 2026: 0 overdue',
      'Emberline planning, 1 Jun 2026: 0 overdue',
    ]);
  });

  it('e-mails the planners once, the day after an engine falls due', async () => {
    let app = await start('2026-06-01T08:00:00Z');
    const dataDir = app.dataDir;
    const planner = await app.signIn(demoAccounts.planner);
    const due = (
      await request(app.app).get('/api/v1/engines/engine-d0102/due').set('Cookie', planner)
    ).body as EngineDue;
    const dueDate = due.nextInspection!.dueDate!;
    app.runtime.reminders.tick();

    // On its due date it is due soon, not overdue; the day after, it is overdue and mailed once.
    app = await start(`${dueDate}T08:00:00Z`, dataDir);
    expect(app.runtime.reminders.tick().overdueEmails).toBe(0);
    app = await start(`${addDays(dueDate, 1)}T00:10:00Z`, dataDir);
    expect(app.runtime.reminders.tick().overdueEmails).toBe(1);
    expect(app.runtime.reminders.tick().overdueEmails).toBeNull();
    app = await start(`${addDays(dueDate, 2)}T00:10:00Z`, dataDir);
    expect(app.runtime.reminders.tick().overdueEmails).toBe(0);

    const mail = await reminders(app);
    expect(mail.overdue.map((item) => item.subject)).toEqual(['Overdue: engine VT3-D0102']);
    const text = await mail.text(mail.overdue[0]!.id);
    expect(text).toContain('Engine VT3-D0102 (Corvid Regional Airways (demo)) is overdue');
    expect(text).toContain('It is not booked.');
  });
});
