import { SignJWT, base64url } from 'jose';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import {
  demoAccounts,
  DEMO_PASSWORD,
  makeDataDir,
  sessionCookieOf,
  startTestApp,
  type TestApp,
} from '../../../test/test-app';

let running: TestApp[] = [];
async function start(...args: Parameters<typeof startTestApp>) {
  const app = await startTestApp(...args);
  running.push(app);
  return app;
}
afterEach(async () => {
  await Promise.all(running.map((app) => app.close()));
  running = [];
});

const me = (t: TestApp, cookie?: string) => {
  const call = request(t.app).get('/api/v1/auth/me');
  return cookie ? call.set('Cookie', cookie) : call;
};

describe('sign-in', () => {
  it('signs in a demo user and returns who they are, never a password hash', async () => {
    const t = await start();
    const login = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: 'Engineer@Demo.test ', password: DEMO_PASSWORD });
    expect(login.status).toBe(200);
    expect(login.body.user).toMatchObject({ email: 'engineer@demo.test', role: 'engineer' });
    const cookie = sessionCookieOf(login.headers['set-cookie']);
    const response = await me(t, cookie);
    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      user: {
        id: 'user-engineer',
        email: 'engineer@demo.test',
        name: expect.any(String),
        role: 'engineer',
        organisationId: 'org-home',
        organisationName: expect.any(String),
      },
    });
    expect(JSON.stringify(response.body)).not.toMatch(/\$2[aby]\$|passwordHash/);
  });

  it('refuses a wrong password and an unknown account with the same 401', async () => {
    const t = await start();
    const wrong = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.admin, password: 'not-the-password' });
    const unknown = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: 'nobody@demo.test', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
    expect(wrong.headers['set-cookie']).toBeUndefined();
  });

  it('sets the session cookie HttpOnly, SameSite=Lax, Path=/ and Secure only over HTTPS', async () => {
    const t = await start({ env: { TRUST_PROXY: '1' } });
    const plain = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.admin, password: DEMO_PASSWORD });
    const cookie = String(plain.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    expect(cookie).toMatch(/Path=\//);
    expect(cookie).not.toMatch(/Secure/);
    const secure = await request(t.app)
      .post('/api/v1/auth/login')
      .set('X-Forwarded-Proto', 'https')
      .send({ email: demoAccounts.admin, password: DEMO_PASSWORD });
    expect(String(secure.headers['set-cookie'])).toMatch(/; Secure/);
  });

  it('answers 429 on the 11th bad attempt, even after a restart and with a changed X-Forwarded-For', async () => {
    const dataDir = makeDataDir();
    const first = await start({ dataDir });
    for (let attempt = 1; attempt <= 10; attempt += 1) {
      const response = await request(first.app)
        .post('/api/v1/auth/login')
        .set('X-Forwarded-For', `10.0.0.${attempt}`)
        .send({ email: demoAccounts.planner, password: `wrong-${attempt}` });
      expect(response.status, `attempt ${attempt}`).toBe(401);
    }
    await first.close();
    running = running.filter((app) => app !== first);

    const restarted = await start({ dataDir });
    const eleventh = await request(restarted.app)
      .post('/api/v1/auth/login')
      .set('X-Forwarded-For', '203.0.113.77')
      .send({ email: demoAccounts.planner, password: 'wrong-11' });
    expect(eleventh.status).toBe(429);
    expect(eleventh.body.error.code).toBe('too_many_attempts');
    expect(eleventh.headers['retry-after']).toBeDefined();
    // Even the right password waits until the window has passed.
    const right = await request(restarted.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.planner, password: DEMO_PASSWORD });
    expect(right.status).toBe(429);
    restarted.clock.advance(15 * 60_000 + 1000);
    const later = await request(restarted.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.planner, password: DEMO_PASSWORD });
    expect(later.status).toBe(200);
  });

  it('limits failures per IP across accounts', async () => {
    const t = await start({ env: { LOGIN_MAX_FAILURES_PER_IP: '5' } });
    const accounts = Object.values(demoAccounts);
    for (let attempt = 0; attempt < 5; attempt += 1) {
      const response = await request(t.app)
        .post('/api/v1/auth/login')
        .send({ email: accounts[attempt], password: 'wrong-password' });
      expect(response.status).toBe(401);
    }
    const blocked = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.customer2, password: DEMO_PASSWORD });
    expect(blocked.status).toBe(429);
  });

  it('holds the limit under thirty parallel guesses: at most ten passwords are checked', async () => {
    const t = await start();
    const answers = await Promise.all(
      Array.from({ length: 30 }, (_, index) =>
        request(t.app)
          .post('/api/v1/auth/login')
          .send({ email: demoAccounts.planner, password: `parallel-guess-${index}` }),
      ),
    );
    const statuses = answers.map((answer) => answer.status);
    // A 401 is a password that bcrypt compared; a 429 was refused before bcrypt.
    expect(statuses.filter((status) => status === 401).length).toBeLessThanOrEqual(10);
    expect(statuses.filter((status) => status === 429).length).toBeGreaterThanOrEqual(20);
    expect(statuses.every((status) => status === 401 || status === 429)).toBe(true);
    const right = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.planner, password: DEMO_PASSWORD });
    expect(right.status).toBe(429);
  });

  it('says to wait until the oldest counted failure leaves the window, not the whole window', async () => {
    const t = await start();
    const wrong = (attempt: number) =>
      request(t.app)
        .post('/api/v1/auth/login')
        .send({ email: demoAccounts.admin, password: `wrong-${attempt}` });
    expect((await wrong(1)).status).toBe(401);
    // Ten minutes later nine more: the first of the ten ages out five minutes from now.
    t.clock.advance(10 * 60_000);
    for (let attempt = 2; attempt <= 10; attempt += 1)
      expect((await wrong(attempt)).status, `attempt ${attempt}`).toBe(401);
    const held = await wrong(11);
    expect(held.status).toBe(429);
    expect(held.headers['retry-after']).toBe(String(5 * 60));
    expect(held.body.error.message).toMatch(/Wait 5 minutes/);
    t.clock.advance(5 * 60_000 + 1000);
    expect((await wrong(12)).status).toBe(401);
  });

  it('counts wrong current passwords of a password change with the sign-ins', async () => {
    const t = await start();
    const cookie = await t.signIn(demoAccounts.inspector);
    for (let attempt = 0; attempt < 10; attempt += 1) {
      const wrong = await request(t.app)
        .post('/api/v1/auth/password')
        .set('Cookie', cookie)
        .send({ currentPassword: `wrong-${attempt}`, newPassword: 'a-new-password-2026' });
      expect(wrong.status, `attempt ${attempt + 1}`).toBe(422);
    }
    const eleventh = await request(t.app)
      .post('/api/v1/auth/password')
      .set('Cookie', cookie)
      .send({ currentPassword: DEMO_PASSWORD, newPassword: 'a-new-password-2026' });
    expect(eleventh.status).toBe(429);
    const signIn = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.inspector, password: DEMO_PASSWORD });
    expect(signIn.status).toBe(429);
  });

  it('slows guesses at one account from many addresses, while the owner gets in from their usual address', async () => {
    // Behind a proxy that names the client (TRUST_PROXY): each guess from an address of its own.
    const t = await start({ env: { TRUST_PROXY: 'true' } });
    const login = (ip: string, password: string) =>
      request(t.app)
        .post('/api/v1/auth/login')
        .set('X-Forwarded-For', ip)
        .send({ email: demoAccounts.engineer, password });
    const home = '198.51.100.7';
    expect((await login(home, DEMO_PASSWORD)).status).toBe(200);
    t.clock.advance(3_600_000);

    // Twenty guesses from twenty addresses: each pair and each address is far below its limit.
    for (let guess = 1; guess <= 20; guess += 1)
      expect((await login(`203.0.113.${guess}`, `guess-${guess}`)).status, `guess ${guess}`).toBe(
        401,
      );
    // Past the account's free count, each further try waits twice as long as the one before.
    const held = await login('203.0.113.21', 'guess-21');
    expect(held.status).toBe(429);
    expect(held.headers['retry-after']).toBe('1');
    expect(held.body.error.message).toMatch(/sign in from where you usually do/);
    t.clock.advance(1_100);
    expect((await login('203.0.113.22', 'guess-22')).status).toBe(401);
    const longer = await login('203.0.113.23', 'guess-23');
    expect(longer.status).toBe(429);
    expect(longer.headers['retry-after']).toBe('2');
    // The right password from a new address waits too; from the owner's usual address it is in.
    expect((await login('192.0.2.99', DEMO_PASSWORD)).status).toBe(429);
    expect((await login(home, DEMO_PASSWORD)).status).toBe(200);
    // The delays grow to the window and no further: at most four tries an hour keep coming in.
    for (let round = 0; round < 12; round += 1) {
      t.clock.advance(15 * 60_000);
      await login(`203.0.113.${100 + round}`, `late-guess-${round}`);
    }
    const capped = await login('203.0.113.200', 'another');
    expect(capped.status).toBe(429);
    expect(Number(capped.headers['retry-after'])).toBeLessThanOrEqual(15 * 60);
    expect((await login(home, DEMO_PASSWORD)).status).toBe(200);
  });

  it('refuses a password over 72 bytes with a clear message', async () => {
    const t = await start();
    const response = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.admin, password: 'é'.repeat(37) });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/72 bytes/);
  });

  it('refuses unknown keys with 400, naming them', async () => {
    const t = await start();
    const response = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.admin, password: DEMO_PASSWORD, role: 'admin' });
    expect(response.status).toBe(400);
    expect(response.body.error.details.fields.role).toBeDefined();
    const polluted = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Content-Type', 'application/json')
      .send('{"email":"admin@demo.test","password":"x","__proto__":{"admin":true}}');
    expect(polluted.status).toBe(400);
    expect(({} as Record<string, unknown>).admin).toBeUndefined();
  });
});

describe('session tokens', () => {
  async function forge(
    t: TestApp,
    header: Record<string, unknown>,
    claims: Record<string, unknown>,
    key?: Uint8Array,
  ) {
    const valid = await t.signIn(demoAccounts.admin);
    const [, payload] = valid.split('=')[1]!.split('.');
    const decoded = JSON.parse(new TextDecoder().decode(base64url.decode(payload!))) as Record<
      string,
      unknown
    >;
    const body = { ...decoded, ...claims };
    for (const [name, value] of Object.entries(claims)) if (value === undefined) delete body[name];
    if (key) {
      const signer = new SignJWT(body).setProtectedHeader(header as { alg: string });
      return `emberline_session=${await signer.sign(key)}`;
    }
    const encode = (value: unknown) => base64url.encode(JSON.stringify(value));
    return `emberline_session=${encode(header)}.${encode(body)}.`;
  }

  it('refuses alg none, another algorithm, a bad signature, an expired token and one without exp', async () => {
    const t = await start();
    const key = t.runtime.ctx.sessionKey;
    const now = Math.floor(t.clock.now().getTime() / 1000);
    const cases = {
      'alg none': await forge(t, { alg: 'none' }, {}),
      'HS512 with the right key': await forge(t, { alg: 'HS512' }, {}, key),
      'bad signature': await forge(
        t,
        { alg: 'HS256' },
        {},
        new TextEncoder().encode('x'.repeat(64)),
      ),
      expired: await forge(t, { alg: 'HS256' }, { exp: now - 10 }, key),
      'no exp': await forge(t, { alg: 'HS256' }, { exp: undefined }, key),
      'wrong audience': await forge(t, { alg: 'HS256' }, { aud: 'someone-else' }, key),
    };
    for (const [name, cookie] of Object.entries(cases)) {
      const response = await me(t, cookie);
      expect(response.status, name).toBe(401);
    }
    // The same construction with nothing changed is accepted: the cases above fail for their reason.
    expect((await me(t, await forge(t, { alg: 'HS256' }, {}, key))).status).toBe(200);
  });

  it('revokes the session on logout: the replayed cookie answers 401', async () => {
    const t = await start();
    const cookie = await t.signIn(demoAccounts.inspector);
    expect((await me(t, cookie)).status).toBe(200);
    const logout = await request(t.app).post('/api/v1/auth/logout').set('Cookie', cookie);
    expect(logout.status).toBe(204);
    expect(String(logout.headers['set-cookie'])).toMatch(/emberline_session=;/);
    expect((await me(t, cookie)).status).toBe(401);
  });

  it('revokes every session on a password change, and gives the caller a new one', async () => {
    const t = await start();
    const other = await t.signIn(demoAccounts.engineer);
    const cookie = await t.signIn(demoAccounts.engineer);
    const change = await request(t.app)
      .post('/api/v1/auth/password')
      .set('Cookie', cookie)
      .send({ currentPassword: DEMO_PASSWORD, newPassword: 'a much longer passphrase' });
    expect(change.status).toBe(200);
    expect((await me(t, cookie)).status).toBe(401);
    expect((await me(t, other)).status).toBe(401);
    expect((await me(t, sessionCookieOf(change.headers['set-cookie']))).status).toBe(200);
    const old = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.engineer, password: DEMO_PASSWORD });
    expect(old.status).toBe(401);
  });

  it('refuses a password change with the wrong current password at the field', async () => {
    const t = await start();
    const cookie = await t.signIn(demoAccounts.engineer);
    const change = await request(t.app)
      .post('/api/v1/auth/password')
      .set('Cookie', cookie)
      .send({ currentPassword: 'not-it', newPassword: 'a much longer passphrase' });
    expect(change.status).toBe(422);
    expect(change.body.error.details.fields.currentPassword).toBeDefined();
  });

  it('revokes the sessions of a disabled account', async () => {
    const t = await start();
    const admin = await t.signIn(demoAccounts.admin);
    const cookie = await t.signIn(demoAccounts.planner);
    const disable = await request(t.app)
      .patch('/api/v1/users/user-planner')
      .set('Cookie', admin)
      .send({ disabled: true });
    expect(disable.status).toBe(200);
    expect(disable.body.user.status).toBe('disabled');
    expect((await me(t, cookie)).status).toBe(401);
    const again = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.planner, password: DEMO_PASSWORD });
    expect(again.status).toBe(401);
  });

  it('ends a session after the idle lifetime and after the absolute lifetime', async () => {
    const t = await start({ env: { SESSION_IDLE_MINUTES: '30', SESSION_ABSOLUTE_HOURS: '2' } });
    const idle = await t.signIn(demoAccounts.planner);
    t.clock.advance(29 * 60_000);
    expect((await me(t, idle)).status).toBe(200);
    t.clock.advance(29 * 60_000);
    expect((await me(t, idle)).status, 'activity keeps the session alive').toBe(200);
    t.clock.advance(31 * 60_000);
    expect((await me(t, idle)).status, 'idle past 30 minutes').toBe(401);

    const busy = await t.signIn(demoAccounts.planner);
    for (let step = 0; step < 4; step += 1) {
      t.clock.advance(25 * 60_000);
      expect((await me(t, busy)).status).toBe(200);
    }
    t.clock.advance(25 * 60_000);
    expect((await me(t, busy)).status, 'past the 2-hour absolute lifetime').toBe(401);
  });
});

describe('request safety', () => {
  it('refuses a cross-site POST and accepts a same-origin one at localhost or 127.0.0.1', async () => {
    const t = await start();
    const body = { email: demoAccounts.admin, password: DEMO_PASSWORD };
    const crossOrigin = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Origin', 'https://evil.example')
      .send(body);
    expect(crossOrigin.status).toBe(403);
    const crossSite = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Sec-Fetch-Site', 'cross-site')
      .send(body);
    expect(crossSite.status).toBe(403);
    const nullOrigin = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Origin', 'null')
      .send(body);
    expect(nullOrigin.status).toBe(403);
    for (const host of ['localhost:8080', '127.0.0.1:8080']) {
      const same = await request(t.app)
        .post('/api/v1/auth/login')
        .set('Host', host)
        .set('Origin', `http://${host}`)
        .set('Sec-Fetch-Site', 'same-origin')
        .send(body);
      expect(same.status, host).toBe(200);
    }
  });

  it('holds a request without an Origin to its Referer', async () => {
    const t = await start();
    const body = { email: demoAccounts.admin, password: DEMO_PASSWORD };
    const elsewhere = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Host', 'localhost:8080')
      .set('Referer', 'https://evil.example/page')
      .send(body);
    expect(elsewhere.status).toBe(403);
    const ours = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Host', 'localhost:8080')
      .set('Referer', 'http://localhost:8080/sign-in')
      .send(body);
    expect(ours.status).toBe(200);
  });

  it('accepts a configured public origin behind a proxy', async () => {
    const t = await start({ env: { PUBLIC_ORIGIN: 'https://emberline.example.org' } });
    const response = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Host', 'internal:8080')
      .set('Origin', 'https://emberline.example.org')
      .send({ email: demoAccounts.admin, password: DEMO_PASSWORD });
    expect(response.status).toBe(200);
  });

  it('answers an oversized JSON body with 413 and malformed JSON with 400, in the error shape', async () => {
    const t = await start({ env: { JSON_LIMIT: '1kb' } });
    const big = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.admin, password: 'x'.repeat(2000) });
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
    const broken = await request(t.app)
      .post('/api/v1/auth/login')
      .set('Content-Type', 'application/json')
      .send('{"email":');
    expect(broken.status).toBe(400);
    expect(broken.body.error).toMatchObject({
      code: 'invalid_json',
      requestId: expect.any(String),
    });
    expect(JSON.stringify(broken.body)).not.toMatch(/at .*\.(ts|js)|node_modules|SyntaxError/);
  });

  it('answers an unknown API path with 404 in the error shape', async () => {
    const t = await start();
    const response = await request(t.app).get('/api/v1/no-such-thing');
    expect(response.status).toBe(404);
    expect(response.body.error).toMatchObject({ code: 'not_found', requestId: expect.any(String) });
  });

  it('sends the security headers: CSP, nosniff, no X-Powered-By', async () => {
    const t = await start();
    const response = await request(t.app).get('/api/v1/health');
    expect(response.body).toEqual({ status: 'ok' });
    const csp = String(response.headers['content-security-policy']);
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).not.toContain('upgrade-insecure-requests');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-powered-by']).toBeUndefined();
    expect(response.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });
});
