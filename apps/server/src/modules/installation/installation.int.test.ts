import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { demoAccounts, DEMO_PASSWORD, startTestApp, type TestApp } from '../../../test/test-app';

let t: TestApp | null = null;
afterEach(async () => {
  await t?.close();
  t = null;
});

describe('demo data only when asked', () => {
  it('starts a fresh data directory without DEMO as an empty installation: no demo account signs in', async () => {
    t = await startTestApp({ demo: false });
    for (const email of Object.values(demoAccounts)) {
      const response = await request(t.app)
        .post('/api/v1/auth/login')
        .send({ email, password: DEMO_PASSWORD });
      expect(response.status, email).toBe(401);
    }
    const installation = await request(t.app).get('/api/v1/installation');
    expect(installation.status).toBe(200);
    expect(installation.body).toEqual({ demo: false });
  });

  it('says on request, to anyone, that an installation started with DEMO=1 holds the demo data', async () => {
    t = await startTestApp();
    const installation = await request(t.app).get('/api/v1/installation');
    expect(installation.status).toBe(200);
    expect(installation.body).toEqual({ demo: true });
  });

  it('tells signed-in users, and only them, whether the records key is kept with the records', async () => {
    t = await startTestApp();
    expect((await request(t.app).get('/api/v1/installation/records-key')).status).toBe(401);
    const inspector = await t.signIn(demoAccounts.inspector);
    const inside = await request(t.app)
      .get('/api/v1/installation/records-key')
      .set('Cookie', inspector);
    expect(inside.body).toEqual({ insideDataDir: true });
    await t.close();

    const keyFile = path.join(
      fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-key-')),
      'records.key',
    );
    fs.writeFileSync(keyFile, Buffer.alloc(32, 7).toString('base64'));
    t = await startTestApp({ env: { RECORDS_KEY_FILE: keyFile } });
    const outside = await request(t.app)
      .get('/api/v1/installation/records-key')
      .set('Cookie', await t.signIn(demoAccounts.inspector));
    expect(outside.body).toEqual({ insideDataDir: false });
  });
});
