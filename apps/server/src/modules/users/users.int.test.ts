import request from 'supertest';
import { rawConnection } from '../../db/client';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  demoAccounts,
  DEMO_PASSWORD,
  linkToken,
  sessionCookieOf,
  startTestApp,
  waitForMail,
  type TestApp,
} from '../../../test/test-app';

let t: TestApp;
let admin: string;
beforeEach(async () => {
  t = await startTestApp();
  admin = await t.signIn(demoAccounts.admin);
});
afterEach(() => t.close());

const invite = (body: Record<string, unknown>) =>
  request(t.app).post('/api/v1/users').set('Cookie', admin).send(body);

describe('invitations', () => {
  it('invites a user by e-mail; the single-use link lets them choose a password and signs them in', async () => {
    const response = await invite({
      email: 'new.inspector@demo.test',
      name: 'Wren Tallis',
      role: 'inspector',
      organisationId: 'org-home',
    });
    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({
      mailId: expect.any(String),
      user: { email: 'new.inspector@demo.test', status: 'invited', role: 'inspector' },
    });

    const mail = await waitForMail(t.runtime, 'new.inspector@demo.test');
    expect(mail.subject).toBe('Your Emberline invitation');
    const token = linkToken(mail.text);

    const info = await request(t.app).post('/api/v1/auth/invitations/inspect').send({ token });
    expect(info.status).toBe(200);
    expect(info.body).toMatchObject({ email: 'new.inspector@demo.test', role: 'inspector' });

    const accept = await request(t.app)
      .post('/api/v1/auth/invitations/accept')
      .send({ token, name: 'Wren Tallis', password: 'borescope at dawn' });
    expect(accept.status).toBe(200);
    const cookie = sessionCookieOf(accept.headers['set-cookie']);
    const me = await request(t.app).get('/api/v1/auth/me').set('Cookie', cookie);
    expect(me.body.user).toMatchObject({ email: 'new.inspector@demo.test', role: 'inspector' });

    const replay = await request(t.app)
      .post('/api/v1/auth/invitations/accept')
      .send({ token, name: 'Someone Else', password: 'another passphrase' });
    expect(replay.status).toBe(410);
    const login = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: 'new.inspector@demo.test', password: 'borescope at dawn' });
    expect(login.status).toBe(200);
  });

  it('refuses an invitation link after 7 days', async () => {
    await invite({
      email: 'late@demo.test',
      name: 'Late Comer',
      role: 'planner',
      organisationId: 'org-home',
    });
    const token = linkToken((await waitForMail(t.runtime, 'late@demo.test')).text);
    t.clock.advance(7 * 24 * 3_600_000 + 1000);
    const accept = await request(t.app)
      .post('/api/v1/auth/invitations/accept')
      .send({ token, name: 'Late Comer', password: 'borescope at dusk' });
    expect(accept.status).toBe(410);
    expect(accept.body.error.message).toMatch(/expired/);
  });

  it('makes an earlier invitation link stop working when the invitation is resent', async () => {
    const first = await invite({
      email: 'twice@demo.test',
      name: 'Twice Asked',
      role: 'engineer',
      organisationId: 'org-home',
    });
    const oldToken = linkToken((await waitForMail(t.runtime, 'twice@demo.test')).text);
    const resend = await request(t.app)
      .post(`/api/v1/users/${first.body.user.id}/invitation`)
      .set('Cookie', admin)
      .send({});
    expect(resend.status).toBe(200);
    const inspect = await request(t.app)
      .post('/api/v1/auth/invitations/inspect')
      .send({ token: oldToken });
    expect(inspect.status).toBe(410);
  });

  it('refuses a customer in the home organisation and staff in a customer organisation', async () => {
    const customerAtHome = await invite({
      email: 'c@demo.test',
      name: 'C',
      role: 'customer',
      organisationId: 'org-home',
    });
    expect(customerAtHome.status).toBe(422);
    expect(customerAtHome.body.error.details.fields.organisationId[0]).toMatch(
      /customer organisation/,
    );
    const staffAtCustomer = await invite({
      email: 's@demo.test',
      name: 'S',
      role: 'engineer',
      organisationId: 'org-corvid',
    });
    expect(staffAtCustomer.status).toBe(422);
  });

  it('refuses an address that already has an account with 409 at the field', async () => {
    const response = await invite({
      email: 'ENGINEER@demo.test',
      name: 'Copy',
      role: 'engineer',
      organisationId: 'org-home',
    });
    expect(response.status).toBe(409);
    expect(response.body.error.details.fields.email).toBeDefined();
  });

  it('never lets a request set a password hash or other unknown fields', async () => {
    const response = await invite({
      email: 'x@demo.test',
      name: 'X',
      role: 'inspector',
      organisationId: 'org-home',
      passwordHash: '$2b$10$abc',
    });
    expect(response.status).toBe(400);
    const patch = await request(t.app)
      .patch('/api/v1/users/user-planner')
      .set('Cookie', admin)
      .send({ passwordHash: 'x' });
    expect(patch.status).toBe(400);
  });
});

describe('user administration', () => {
  it('lists users without any password hash', async () => {
    const response = await request(t.app).get('/api/v1/users').set('Cookie', admin);
    expect(response.status).toBe(200);
    expect(response.body.items).toHaveLength(8);
    expect(JSON.stringify(response.body)).not.toMatch(/\$2[aby]\$|passwordHash/);
  });

  it('changes a role, which takes effect on the next request', async () => {
    const planner = await t.signIn(demoAccounts.planner);
    const change = await request(t.app)
      .patch('/api/v1/users/user-planner')
      .set('Cookie', admin)
      .send({ role: 'engineer' });
    expect(change.status).toBe(200);
    const me = await request(t.app).get('/api/v1/auth/me').set('Cookie', planner);
    expect(me.body.user.role).toBe('engineer');
  });

  it('refuses to let an administrator disable themselves or change their own role', async () => {
    expect(
      (
        await request(t.app)
          .patch('/api/v1/users/user-admin')
          .set('Cookie', admin)
          .send({ disabled: true })
      ).status,
    ).toBe(422);
    expect(
      (
        await request(t.app)
          .patch('/api/v1/users/user-admin')
          .set('Cookie', admin)
          .send({ role: 'planner' })
      ).status,
    ).toBe(422);
  });

  it('ends every session of a user', async () => {
    const a = await t.signIn(demoAccounts.inspector);
    const b = await t.signIn(demoAccounts.inspector);
    const response = await request(t.app)
      .delete('/api/v1/users/user-inspector/sessions')
      .set('Cookie', admin);
    expect(response.body).toEqual({ ended: 2 });
    for (const cookie of [a, b])
      expect((await request(t.app).get('/api/v1/auth/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('answers 404 for a user that does not exist', async () => {
    const response = await request(t.app)
      .patch('/api/v1/users/nobody')
      .set('Cookie', admin)
      .send({ name: 'X' });
    expect(response.status).toBe(404);
  });

  it('writes every change to the audit log, which refuses edits and deletes', async () => {
    await request(t.app)
      .patch('/api/v1/users/user-planner')
      .set('Cookie', admin)
      .send({ name: 'Jonah W.' });
    const log = await request(t.app).get('/api/v1/audit-log').set('Cookie', admin);
    const entry = log.body.items.find((item: { action: string }) => item.action === 'user.updated');
    expect(entry).toMatchObject({
      actorEmail: 'admin@demo.test',
      entityId: 'user-planner',
      before: { name: 'Jonah Whitlaw' },
      after: { name: 'Jonah W.' },
    });
    const sqlite = rawConnection(t.runtime.ctx.db);
    expect(() => sqlite.prepare('UPDATE audit_log SET action = ?').run('edited')).toThrow(
      /append-only/,
    );
    expect(() => sqlite.prepare('DELETE FROM audit_log').run()).toThrow(/append-only/);
  });
});

describe('password reset', () => {
  it('mails a single-use link; using it sets the password and ends every session', async () => {
    const before = await t.signIn(demoAccounts.customer);
    const ask = await request(t.app)
      .post('/api/v1/auth/password-reset')
      .send({ email: demoAccounts.customer });
    expect(ask.status).toBe(202);
    const mail = await waitForMail(t.runtime, demoAccounts.customer);
    expect(mail.subject).toBe('Reset your Emberline password');
    const token = linkToken(mail.text);

    const confirm = await request(t.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: 'a fresh passphrase here' });
    expect(confirm.status).toBe(204);
    expect((await request(t.app).get('/api/v1/auth/me').set('Cookie', before)).status).toBe(401);
    expect(
      (
        await request(t.app)
          .post('/api/v1/auth/login')
          .send({ email: demoAccounts.customer, password: DEMO_PASSWORD })
      ).status,
    ).toBe(401);
    expect(
      (
        await request(t.app)
          .post('/api/v1/auth/login')
          .send({ email: demoAccounts.customer, password: 'a fresh passphrase here' })
      ).status,
    ).toBe(200);

    const replay = await request(t.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: 'yet another passphrase' });
    expect(replay.status).toBe(410);
  });

  it('expires the reset link after an hour', async () => {
    await request(t.app).post('/api/v1/auth/password-reset').send({ email: demoAccounts.planner });
    const token = linkToken((await waitForMail(t.runtime, demoAccounts.planner)).text);
    t.clock.advance(61 * 60_000);
    const confirm = await request(t.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: 'a fresh passphrase here' });
    expect(confirm.status).toBe(410);
  });

  it('answers the same for an unknown address and sends nothing', async () => {
    const ask = await request(t.app)
      .post('/api/v1/auth/password-reset')
      .send({ email: 'nobody@demo.test' });
    expect(ask.status).toBe(202);
    await t.deliver();
    const outbox = await request(t.app).get('/api/v1/outbox/messages').set('Cookie', admin);
    expect(outbox.status).toBe(200);
    expect(
      outbox.body.items.filter((item: { recipients: { address: string }[] }) =>
        item.recipients.some((recipient) => recipient.address === 'nobody@demo.test'),
      ),
    ).toEqual([]);
    const caught = await request(t.app).get('/api/v1/outbox/caught').set('Cookie', admin);
    expect(
      caught.body.items.filter((item: { to: string[] }) => item.to.includes('nobody@demo.test')),
    ).toEqual([]);
  });

  it('refuses a new password shorter than 12 characters at the field', async () => {
    await request(t.app).post('/api/v1/auth/password-reset').send({ email: demoAccounts.planner });
    const token = linkToken((await waitForMail(t.runtime, demoAccounts.planner)).text);
    const confirm = await request(t.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: 'short' });
    expect(confirm.status).toBe(400);
    expect(confirm.body.error.details.fields.password[0]).toMatch(/12 characters/);
  });
});

describe('the outbox', () => {
  it('shows admins the caught messages, parsed back from the .eml the SMTP fake stored', async () => {
    await invite({
      email: 'mailcheck@demo.test',
      name: 'Mail Check',
      role: 'planner',
      organisationId: 'org-home',
    });
    await waitForMail(t.runtime, 'mailcheck@demo.test');
    const list = await request(t.app).get('/api/v1/outbox/caught').set('Cookie', admin);
    const item = list.body.items.find((entry: { to: string[] }) =>
      entry.to.includes('mailcheck@demo.test'),
    );
    expect(item).toMatchObject({
      subject: 'Your Emberline invitation',
      from: 'no-reply@emberline.invalid',
    });
    const message = await request(t.app)
      .get(`/api/v1/outbox/caught/${item.id}`)
      .set('Cookie', admin);
    expect(message.body.text).toMatch(/accept-invitation#token=/);
    expect(
      (await request(t.app).get('/api/v1/outbox/caught/..%2F..%2Fetc').set('Cookie', admin)).status,
    ).toBe(404);
  });
});

describe('authorisations and qualifications', () => {
  const credentials = (id: string, body: object, cookie = admin) =>
    request(t.app).put(`/api/v1/users/${id}/credentials`).set('Cookie', cookie).send(body);
  const authorisation = { ref: 'AUTH-DEMO-7', models: ['model-vt300-v1'], expiresOn: '2027-06-30' };

  it('records an engineer’s authorisation and an inspector’s qualification, with an audit row', async () => {
    const engineer = await credentials('user-engineer', { authorisation, qualification: null });
    expect(engineer.status).toBe(200);
    expect(engineer.body.user).toMatchObject({ authorisation, qualification: null });
    const inspector = await credentials('user-inspector', {
      authorisation: null,
      qualification: { ref: 'BSI-L2-DEMO', expiresOn: '2027-03-31' },
    });
    expect(inspector.body.user.qualification).toEqual({
      ref: 'BSI-L2-DEMO',
      expiresOn: '2027-03-31',
    });
    const listed = await request(t.app).get('/api/v1/users').set('Cookie', admin);
    expect(
      listed.body.items.find((user: { id: string }) => user.id === 'user-engineer').authorisation,
    ).toEqual(authorisation);
    const audit = await request(t.app)
      .get('/api/v1/audit-log?entityType=user')
      .set('Cookie', admin);
    expect(audit.body.items[0]).toMatchObject({
      action: 'user.credentials-changed',
      entityId: 'user-inspector',
    });
  });

  it('leaves nobody to grant themselves the authority to sign', async () => {
    const own = await credentials('user-admin', { authorisation, qualification: null });
    expect(own.status).toBe(403);
    expect(own.body.error.message).toMatch(/another administrator/);
  });

  it('refuses an authorisation for a role that does not sign, and one for a model that does not exist', async () => {
    const planner = await credentials('user-planner', { authorisation, qualification: null });
    expect(planner.status).toBe(422);
    expect(planner.body.error.details.fields.authorisation[0]).toMatch(/for engineers/);
    const unknown = await credentials('user-engineer', {
      authorisation: { ...authorisation, models: ['model-nowhere'] },
      qualification: null,
    });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.message).toMatch(/no engine model "model-nowhere"/);
    const badDate = await credentials('user-engineer', {
      authorisation: { ...authorisation, expiresOn: '31/12/2027' },
      qualification: null,
    });
    expect(badDate.status).toBe(400);
  });
});
