import path from 'node:path';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { retryMinutes } from '@emberline/contracts/outbox';
import { freePort } from '../../../../../scripts/lib/server-process';
import {
  demoAccounts,
  makeDataDir,
  startTestApp,
  TestClock,
  type TestApp,
} from '../../../test/test-app';
import { inTransaction, rawConnection } from '../../db/client';
import { AppError } from '../../http/app-error';
import { caughtMailStore } from '../../lib/email/caught-mail';
import { queueMail } from '../../lib/email/outbox';
import { startSmtpFake, type SmtpFake } from '../../lib/email/smtp-fake';

// A relay at a port where nothing listens until the test starts the SMTP server there: SMTP down,
// then back, exactly as a real relay would be. The server under test runs no SMTP fake of its own.
let apps: TestApp[] = [];
let smtp: SmtpFake | null = null;
afterEach(async () => {
  for (const app of apps) await app.close();
  apps = [];
  await smtp?.close();
  smtp = null;
});

async function withRelay(options: { dataDir?: string; clock?: TestClock; port: number }) {
  const t = await startTestApp({
    dataDir: options.dataDir,
    clock: options.clock,
    delivery: 'manual',
    env: { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(options.port) },
  });
  apps.push(t);
  return t;
}

const minutes = (n: number) => n * 60_000;

async function messages(t: TestApp, cookie: string, query = '') {
  const response = await request(t.app)
    .get(`/api/v1/outbox/messages${query}`)
    .set('Cookie', cookie);
  expect(response.status).toBe(200);
  return response.body.items as {
    id: string;
    kind: string;
    state: string;
    attempts: number;
    lastError: string | null;
    nextAttemptAt: string | null;
    recipients: { address: string; state: string; error: string | null }[];
    record: { type: string; id: string; label: string } | null;
  }[];
}

describe('mail that is never lost', () => {
  it('keeps an invitation and a reset through an SMTP outage and a restart, and delivers each once', async () => {
    const port = await freePort();
    const dataDir = makeDataDir();
    const clock = new TestClock();
    const first = await withRelay({ dataDir, clock, port });
    const admin = await first.signIn(demoAccounts.admin);

    const invited = await request(first.app).post('/api/v1/users').set('Cookie', admin).send({
      email: 'outage@demo.test',
      name: 'Ode Marsh',
      role: 'planner',
      organisationId: 'org-home',
    });
    expect(invited.status).toBe(201);
    const reset = await request(first.app)
      .post('/api/v1/auth/password-reset')
      .send({ email: demoAccounts.engineer });
    expect(reset.status).toBe(202);

    expect(await first.deliver()).toBe(2);
    const failed = await messages(first, admin, '?state=failed');
    expect(failed.map((item) => item.kind).sort()).toEqual(['invitation', 'password-reset']);
    for (const item of failed) {
      expect(item).toMatchObject({ attempts: 1, state: 'failed' });
      expect(item.lastError).toMatch(/ECONNREFUSED/);
      expect(item.nextAttemptAt).toBe(new Date(clock.now().getTime() + minutes(1)).toISOString());
    }
    expect(failed.find((item) => item.kind === 'invitation')?.record).toMatchObject({
      type: 'user',
      id: invited.body.user.id,
      label: 'Invitation of Ode Marsh',
    });

    // Not due before its minute is up; a second failure waits two minutes.
    clock.advance(30_000);
    expect(await first.deliver()).toBe(0);
    clock.advance(31_000);
    expect(await first.deliver()).toBe(2);
    for (const item of await messages(first, admin))
      expect(item).toMatchObject({ state: 'failed', attempts: 2 });

    // The server restarts while SMTP comes back: the queue resumes where it stopped.
    await first.close();
    apps = [];
    const mailDir = path.join(makeDataDir(), 'mail');
    smtp = await startSmtpFake(mailDir, port);
    const second = await withRelay({ dataDir, clock, port });
    expect(await second.deliver()).toBe(0);
    clock.advance(minutes(2));
    expect(await second.deliver()).toBe(2);
    const admin2 = await second.signIn(demoAccounts.admin);
    for (const item of await messages(second, admin2))
      expect(item).toMatchObject({ state: 'sent', attempts: 3, lastError: null });
    clock.advance(minutes(60));
    expect(await second.deliver()).toBe(0);

    const caught = await caughtMailStore(mailDir).list();
    expect(caught.filter((item) => item.to.includes('outage@demo.test'))).toHaveLength(1);
    expect(caught.filter((item) => item.to.includes(demoAccounts.engineer))).toHaveLength(1);
    expect(caught).toHaveLength(2);
  });

  it('walks the back-off of 1, 2, 4, 8, 16 and 32 minutes to "needs attention", and an admin sends it again', async () => {
    const port = await freePort();
    const clock = new TestClock();
    const t = await withRelay({ clock, port });
    const admin = await t.signIn(demoAccounts.admin);
    await request(t.app)
      .post('/api/v1/users')
      .set('Cookie', admin)
      .send({
        email: 'patient@demo.test',
        name: 'Pell Ash',
        role: 'planner',
        organisationId: 'org-home',
      })
      .expect(201);

    for (const [attempt, wait] of retryMinutes.entries()) {
      expect(await t.deliver()).toBe(1);
      const [message] = await messages(t, admin);
      expect(message).toMatchObject({ state: 'failed', attempts: attempt + 1 });
      expect(Date.parse(message!.nextAttemptAt!) - clock.now().getTime()).toBe(minutes(wait));
      clock.advance(minutes(wait));
    }
    expect(await t.deliver()).toBe(1);
    const [given] = await messages(t, admin);
    expect(given).toMatchObject({ state: 'needs-attention', attempts: 7, nextAttemptAt: null });
    const summary = await request(t.app).get('/api/v1/outbox/summary').set('Cookie', admin);
    expect(summary.body.counts).toMatchObject({ 'needs-attention': 1, sent: 0 });
    clock.advance(minutes(24 * 60));
    expect(await t.deliver()).toBe(0);
    const admin2 = await t.signIn(demoAccounts.admin);

    smtp = await startSmtpFake(path.join(makeDataDir(), 'mail'), port);
    const resent = await request(t.app)
      .post(`/api/v1/outbox/messages/${given!.id}/resend`)
      .set('Cookie', admin2);
    expect(resent.status).toBe(200);
    expect(resent.body).toMatchObject({ state: 'queued', attempts: 0 });
    expect(await t.deliver()).toBe(1);
    const detail = await request(t.app)
      .get(`/api/v1/outbox/messages/${given!.id}`)
      .set('Cookie', admin2);
    expect(detail.body).toMatchObject({ state: 'sent', attempts: 1 });
    expect(detail.body.text).toMatch(/accept-invitation#token=\(withheld/);
    expect(detail.body.text).not.toMatch(/#token=[A-Za-z0-9_-]{43}/);
    const again = await request(t.app)
      .post(`/api/v1/outbox/messages/${given!.id}/resend`)
      .set('Cookie', admin2);
    expect(again.status).toBe(409);
  });

  it('sends a failed message at once when an admin asks, without waiting out its back-off', async () => {
    const port = await freePort();
    const clock = new TestClock();
    const t = await withRelay({ clock, port });
    const admin = await t.signIn(demoAccounts.admin);
    await request(t.app)
      .post('/api/v1/auth/password-reset')
      .send({ email: demoAccounts.inspector })
      .expect(202);
    expect(await t.deliver()).toBe(1);
    const [failed] = await messages(t, admin);
    expect(failed).toMatchObject({ state: 'failed', attempts: 1 });

    // Still down: asked by hand, it fails again and the back-off goes on from two attempts.
    await request(t.app)
      .post(`/api/v1/outbox/messages/${failed!.id}/resend`)
      .set('Cookie', admin)
      .expect(200);
    expect(await t.deliver()).toBe(1);
    const [twice] = await messages(t, admin);
    expect(twice).toMatchObject({ state: 'failed', attempts: 2 });
    expect(Date.parse(twice!.nextAttemptAt!) - clock.now().getTime()).toBe(minutes(2));

    // Back: asked by hand, it goes at once.
    const mailDir = path.join(makeDataDir(), 'mail');
    smtp = await startSmtpFake(mailDir, port);
    await request(t.app)
      .post(`/api/v1/outbox/messages/${failed!.id}/resend`)
      .set('Cookie', admin)
      .expect(200);
    expect(await t.deliver()).toBe(1);
    const [sent] = await messages(t, admin);
    expect(sent).toMatchObject({ state: 'sent', attempts: 3 });
    expect(await caughtMailStore(mailDir).list()).toHaveLength(1);
  });

  it('marks the one recipient the server refuses, not the message, and sends no copy twice', async () => {
    const t = await startTestApp({ delivery: 'manual' });
    apps.push(t);
    const admin = await t.signIn(demoAccounts.admin);
    const { ctx } = t.runtime;
    const id = inTransaction(ctx.db, (tx) =>
      queueMail(ctx, tx, {
        kind: 'notice',
        to: ['records@corvid.demo.test', 'gone@corvid.invalid'],
        subject: 'A notice to two addresses',
        text: 'One of these addresses takes no mail.',
      }),
    );
    expect(await t.deliver()).toBe(1);
    const [message] = await messages(t, admin);
    expect(message).toMatchObject({ id, state: 'needs-attention' });
    expect(message!.recipients).toEqual([
      { address: 'records@corvid.demo.test', state: 'sent', error: null },
      { address: 'gone@corvid.invalid', state: 'refused', error: expect.stringMatching(/^550 /) },
    ]);
    expect(message!.lastError).toMatch(/gone@corvid\.invalid refused/);

    // Sent again by hand: only the refused address is tried, and it is refused again.
    await request(t.app)
      .post(`/api/v1/outbox/messages/${id}/resend`)
      .set('Cookie', admin)
      .expect(200);
    expect(await t.deliver()).toBe(1);
    const caught = await t.runtime.ctx.caughtMail!.list();
    expect(caught.filter((item) => item.subject === 'A notice to two addresses')).toEqual([
      expect.objectContaining({ to: ['records@corvid.demo.test', 'gone@corvid.invalid'] }),
    ]);
    const [after] = await messages(t, admin);
    expect(after).toMatchObject({ state: 'needs-attention', attempts: 1 });
  });

  it('refuses when queued a message without a valid recipient, or with attachments over the limit, and writes nothing', async () => {
    const t = await startTestApp({ delivery: 'manual', env: { MAIL_MAX_ATTACHMENTS_MB: '1' } });
    apps.push(t);
    const { ctx } = t.runtime;
    const queue = (mail: Parameters<typeof queueMail>[2]) =>
      inTransaction(ctx.db, (tx) => queueMail(ctx, tx, mail));
    const base = { kind: 'notice', subject: 'x', text: 'x' };
    const refusal = (work: () => unknown) => {
      try {
        work();
      } catch (error) {
        return error;
      }
      throw new Error('the message was queued');
    };
    const badAddress = refusal(() =>
      queue({ ...base, to: ['ops@corvid.demo.test', 'ops at corvid'] }),
    );
    expect(badAddress).toBeInstanceOf(AppError);
    expect(badAddress).toMatchObject({
      status: 422,
      message: expect.stringContaining('"ops at corvid"'),
    });
    expect(refusal(() => queue({ ...base, to: [] }))).toMatchObject({ status: 422 });
    const heavy = refusal(() =>
      queue({
        ...base,
        to: ['ops@corvid.demo.test'],
        attachments: [
          {
            filename: 'report.pdf',
            contentType: 'application/pdf',
            content: Buffer.alloc(1_600_000),
          },
        ],
      }),
    );
    expect(heavy).toMatchObject({
      status: 422,
      message: expect.stringMatching(/report\.pdf.*at most 1\.0 MB/),
    });
    expect(
      rawConnection(ctx.db).prepare('select count(*) as n from outbox_messages').get(),
    ).toEqual({
      n: 0,
    });
  });
});
