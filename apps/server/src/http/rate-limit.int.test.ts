import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { demoAccounts, startTestApp, type TestApp } from '../../test/test-app';
import { requestLimits } from './rate-limit';

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

const measurement = {
  calibration: { kind: 'reference', p1: [0, 0], p2: [100, 0], lengthMm: 10 },
  shape: {
    kind: 'polyline',
    points: [
      [0, 0],
      [30, 40],
    ],
  },
};

/** Sends `count` requests, `batch` at a time; the statuses in order. */
async function flood(count: number, send: () => request.Test, batch = 50): Promise<number[]> {
  const statuses: number[] = [];
  for (let sent = 0; sent < count; sent += batch) {
    const answers = await Promise.all(
      Array.from({ length: Math.min(batch, count - sent) }, () => send()),
    );
    statuses.push(...answers.map((answer) => answer.status));
  }
  return statuses;
}

describe('rate limits', () => {
  it('limits calculations per person across the four endpoints, then lets them in again', async () => {
    const t = await start();
    const engineer = await t.signIn(demoAccounts.engineer);
    const planner = await t.signIn(demoAccounts.planner);
    const { perUser } = requestLimits.calculation;
    const statuses = await flood(perUser, () =>
      request(t.app).post('/api/v1/measurements').set('Cookie', engineer).send(measurement),
    );
    expect(statuses.every((status) => status === 200)).toBe(true);
    const past = await request(t.app)
      .post('/api/v1/trends')
      .set('Cookie', engineer)
      .send({ points: [] });
    expect(past.status).toBe(429);
    expect(past.body.error.message).toMatch(
      /^Too many calculations from your account: wait \d+ seconds? and try again\.$/,
    );
    expect(Number(past.headers['retry-after'])).toBeGreaterThan(0);
    // Another person at the same address is not held by the engineer's count.
    expect(
      (await request(t.app).post('/api/v1/measurements').set('Cookie', planner).send(measurement))
        .status,
    ).toBe(200);
    t.clock.advance(requestLimits.calculation.windowMs + 1000);
    expect(
      (await request(t.app).post('/api/v1/measurements').set('Cookie', engineer).send(measurement))
        .status,
    ).toBe(200);
  });

  it('limits report checks per address, and per person whatever their address', async () => {
    const t = await start({ env: { TRUST_PROXY: 'true' } });
    const code = 'AAAAAAAAAAAAAAAAAAAAAA';
    const { perAddress, perUser } = requestLimits.verification;
    const fromOne = await flood(perAddress + 1, () =>
      request(t.app).get(`/api/v1/verify/${code}`).set('X-Forwarded-For', '203.0.113.5'),
    );
    expect(fromOne.slice(0, perAddress).every((status) => status === 404)).toBe(true);
    expect(fromOne[perAddress]).toBe(429);
    // A person signed in is counted wherever they are.
    const customer = await t.signIn(demoAccounts.customer);
    let address = 0;
    const spread = await flood(perUser + 1, () =>
      request(t.app)
        .get(`/api/v1/verify/${code}`)
        .set('Cookie', customer)
        .set('X-Forwarded-For', `198.51.100.${(address += 1)}`),
    );
    expect(spread.slice(0, perUser).every((status) => status === 404)).toBe(true);
    expect(spread[perUser]).toBe(429);
  });

  it('limits uploads per person before a byte of the upload is read', async () => {
    const t = await start();
    const inspector = await t.signIn(demoAccounts.inspector);
    const { perUser } = requestLimits.upload;
    // Requests to an inspection that does not exist: each one counted, none stored.
    const statuses = await flood(perUser, () =>
      request(t.app)
        .post('/api/v1/inspections/no-such-inspection/images')
        .set('Cookie', inspector)
        .attach('files', Buffer.from('not an image'), 'x.jpg'),
    );
    expect(statuses.every((status) => status === 404)).toBe(true);
    const past = await request(t.app)
      .post('/api/v1/inspections/no-such-inspection/images')
      .set('Cookie', inspector)
      .attach('files', Buffer.from('not an image'), 'x.jpg');
    expect(past.status).toBe(429);
    expect(past.body.error.message).toMatch(/^Too many uploads from your account/);
  });
});
