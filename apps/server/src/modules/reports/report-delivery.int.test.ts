import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import type {
  DeliveryLog,
  ReportListResponse,
  UndeliveredUrgentNotice,
} from '@emberline/contracts/reports';
import type { Finding } from '@emberline/contracts/findings';
import { freePort } from '../../../../../scripts/lib/server-process';
import {
  demoAccounts,
  DEMO_PASSWORD,
  makeDataDir,
  startTestApp,
  TestClock,
  type TestApp,
} from '../../../test/test-app';
import {
  coverAllRows,
  getBytes,
  openInspection,
  still,
  submitForReview,
  tenMillimetreReference,
  uploadImages,
} from '../../../test/inspection-fixtures';
import { rawConnection } from '../../db/client';
import { pdfText } from '../../../test/pdf-text';
import { caughtMailStore } from '../../lib/email/caught-mail';
import { startSmtpFake, type SmtpFake } from '../../lib/email/smtp-fake';

let apps: TestApp[] = [];
let smtp: SmtpFake | null = null;
afterEach(async () => {
  for (const app of apps) await app.close();
  apps = [];
  await smtp?.close();
  smtp = null;
});

const minutes = (n: number) => n * 60_000;
const removeBeforeNextFlight = {
  kind: 'remove',
  action: { kind: 'remove-before-next-flight', cycles: null, hours: null },
};

/**
 * VT3-D0101 with one 10 mm NGV leading-edge crack (beyond the invented limits), submitted and
 * dispositioned "remove before the next flight" by the engineer: the outcome is not signed yet.
 */
async function dispositionedCrack(t: TestApp) {
  const inspector = await t.signIn(demoAccounts.inspector);
  const engineer = await t.signIn(demoAccounts.engineer);
  const id = await openInspection(t.app, inspector, {
    engineId: 'engine-d0101',
    date: '2026-05-20',
    csn: 14_125,
  });
  const [image] = await uploadImages(t.app, inspector, id, [await still(1600, 1200)]);
  const recorded = await request(t.app)
    .post(`/api/v1/inspections/${id}/findings`)
    .set('Cookie', inspector)
    .send({
      imageId: image,
      shape: {
        kind: 'polyline',
        points: [
          [200, 600],
          [600, 600],
        ],
      },
      calibration: tenMillimetreReference,
      row: 'hpt1-ngv',
      position: 7,
      zone: 'leading-edge',
      damage: 'crack',
      method: 'image',
    })
    .expect(201);
  const finding = recorded.body as Finding;
  expect(finding.evaluation?.category).toBe('beyond-limits');
  await coverAllRows(t.app, inspector, id);
  await submitForReview(t.app, inspector, id);
  const disposition = await request(t.app)
    .post(`/api/v1/findings/${finding.id}/dispositions`)
    .set('Cookie', engineer)
    .send({
      decision: removeBeforeNextFlight,
      rationale: 'Crack through the leading edge (invented limits)',
      password: DEMO_PASSWORD,
    })
    .expect(201);
  return { id, findingId: finding.id, dispositionId: disposition.body.id as string, engineer };
}

async function signOutcome(t: TestApp, id: string, engineer: string) {
  const left = await request(t.app)
    .get(`/api/v1/inspections/${id}/dispositions`)
    .set('Cookie', engineer);
  await request(t.app)
    .post(`/api/v1/inspections/${id}/outcome`)
    .set('Cookie', engineer)
    .send({
      password: DEMO_PASSWORD,
      flagAcceptances: (left.body.left.flags as { code: string }[]).map((flag) => ({
        code: flag.code,
        note: 'Checked against the log book',
      })),
    })
    .expect(201);
}

const release = (t: TestApp, id: string, engineer: string) =>
  request(t.app)
    .post(`/api/v1/inspections/${id}/release`)
    .set('Cookie', engineer)
    .send({ password: DEMO_PASSWORD })
    .expect(201);

const get = async <T>(t: TestApp, url: string, cookie: string, status = 200): Promise<T> => {
  const response = await request(t.app).get(`/api/v1${url}`).set('Cookie', cookie);
  expect(response.status).toBe(status);
  return response.body as T;
};

describe('delivery of reports and urgent notices (DESIGN §5.7)', () => {
  it('keeps the report and the urgent notice through an SMTP outage and a restart, shows the engineers the notice that did not arrive, and logs each delivery', async () => {
    // SMTP down: a relay at a port where nothing listens until the test starts one there.
    const port = await freePort();
    const dataDir = makeDataDir();
    const clock = new TestClock();
    const start = () =>
      startTestApp({
        dataDir,
        clock,
        delivery: 'manual',
        env: { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(port) },
      }).then((app) => {
        apps.push(app);
        return app;
      });
    const first = await start();
    const { id, engineer } = await dispositionedCrack(first);
    await signOutcome(first, id, engineer);
    expect(await first.deliver()).toBeGreaterThanOrEqual(1);

    // The urgent notice failed: every engineer sees it at once; customers may not ask.
    const undelivered = await get<{ items: UndeliveredUrgentNotice[] }>(
      first,
      '/urgent-notices/undelivered',
      engineer,
    );
    expect(undelivered.items).toHaveLength(1);
    expect(undelivered.items[0]).toMatchObject({
      inspectionId: id,
      engineSerialNumber: 'VT3-D0101',
      organisationName: 'Corvid Regional Airways (demo)',
      state: 'failed',
      attempts: 1,
    });
    expect(undelivered.items[0]!.lastError).toMatch(/ECONNREFUSED/);
    const customer = await first.signIn(demoAccounts.customer);
    await get(first, '/urgent-notices/undelivered', customer, 403);

    clock.advance(10_000);
    await release(first, id, engineer);
    await first.deliver();
    const log = await get<DeliveryLog>(first, `/inspections/${id}/deliveries`, customer);
    expect(log.items.map((item) => [item.kind, item.revision, item.state])).toEqual([
      ['urgent', null, 'failed'],
      ['report', 1, 'failed'],
    ]);
    expect(log.items[1]!.recipients.map((item) => item.address).sort()).toEqual([
      'powerplant@corvid.demo.test',
      'records@corvid.demo.test',
    ]);
    const listed = await get<ReportListResponse>(first, '/reports', customer);
    expect(listed.items.find((item) => item.inspectionId === id)).toMatchObject({
      revision: 1,
      current: true,
      outcome: 'remove',
      delivery: 'failed',
    });
    const customer2 = await first.signIn(demoAccounts.customer2);
    await get(first, `/inspections/${id}/deliveries`, customer2, 404);

    // The server restarts while SMTP comes back: both go out once their minute is up.
    await first.close();
    apps = [];
    const mailDir = path.join(makeDataDir(), 'mail');
    smtp = await startSmtpFake(mailDir, port);
    const second = await start();
    clock.advance(minutes(2));
    expect(await second.deliver()).toBeGreaterThanOrEqual(2);
    const engineer2 = await second.signIn(demoAccounts.engineer);
    const after = await get<DeliveryLog>(second, `/inspections/${id}/deliveries`, engineer2);
    expect(after.items.map((item) => [item.kind, item.state, item.attempts])).toEqual([
      ['urgent', 'sent', 2],
      ['report', 'sent', 2],
    ]);
    expect(
      (await get<{ items: unknown[] }>(second, '/urgent-notices/undelivered', engineer2)).items,
    ).toEqual([]);

    // The report that arrived is the stored one, byte for byte, and went to those contacts only.
    const store = caughtMailStore(mailDir);
    const caught = await store.list();
    const reportMail = caught.find((item) => item.subject.startsWith('Inspection report'))!;
    expect([...reportMail.to].sort()).toEqual([
      'powerplant@corvid.demo.test',
      'records@corvid.demo.test',
    ]);
    const parsed = await simpleParser(fs.readFileSync(path.join(mailDir, `${reportMail.id}.eml`)));
    const stored = rawConnection(second.runtime.ctx.db)
      .prepare('SELECT pdf_sha256 AS sha FROM reports WHERE inspection_id = ?')
      .get(id) as { sha: string };
    expect(createHash('sha256').update(parsed.attachments[0]!.content).digest('hex')).toBe(
      stored.sha,
    );
    expect(caught.filter((item) => item.subject.startsWith('Urgent'))).toHaveLength(1);
  });

  it('issues revision 2 after a correction, mailed as replacing revision 1; both stay downloadable and the first checks as replaced', async () => {
    const t = await startTestApp({ delivery: 'manual' });
    apps.push(t);
    const { id, findingId, dispositionId, engineer } = await dispositionedCrack(t);
    await signOutcome(t, id, engineer);
    await release(t, id, engineer);
    t.clock.advance(60_000);

    // A correction after release: the outcome and the release are signed again.
    await request(t.app)
      .post(`/api/v1/findings/${findingId}/dispositions`)
      .set('Cookie', engineer)
      .send({
        decision: removeBeforeNextFlight,
        rationale: 'Crack through the leading edge and into the platform (invented limits)',
        supersedesId: dispositionId,
        supersedeReason: 'The rationale left out the platform',
        password: DEMO_PASSWORD,
      })
      .expect(201);
    await signOutcome(t, id, engineer);
    await release(t, id, engineer);
    await t.deliver();

    const customer = await t.signIn(demoAccounts.customer);
    const log = await get<DeliveryLog>(t, `/inspections/${id}/deliveries`, customer);
    const reportsMailed = log.items.filter((item) => item.kind === 'report');
    expect(reportsMailed.map((item) => [item.revision, item.state])).toEqual([
      [1, 'sent'],
      [2, 'sent'],
    ]);
    expect(reportsMailed[1]!.subject).toBe(
      'Inspection report: engine VT3-D0101, 20 May 2026 (revision 2, replaces revision 1)',
    );
    const store = t.runtime.ctx.caughtMail!;
    const second = (await store.list()).find((item) => item.subject === reportsMailed[1]!.subject)!;
    expect((await store.read(second.id))!.text).toContain(
      'It replaces revision 1, which stays on record.',
    );

    const download = (revision: number) =>
      getBytes(t.app, `/inspections/${id}/report?revision=${revision}`, customer);
    const [one, two] = [await download(1), await download(2)];
    expect([one.status, two.status]).toEqual([200, 200]);
    expect(one.headers['content-disposition']).toContain('rev1.pdf');
    expect(two.headers['content-disposition']).toContain('rev2.pdf');
    expect(Buffer.compare(one.body as Buffer, two.body as Buffer)).not.toBe(0);

    const listed = (await get<ReportListResponse>(t, '/reports', customer)).items.filter(
      (item) => item.inspectionId === id,
    );
    expect(listed.map((item) => [item.revision, item.current])).toEqual([
      [2, true],
      [1, false],
    ]);
    const check = (code: string) =>
      request(t.app).get(`/api/v1/verify/${code}`).expect(200) as Promise<{
        body: { genuine: boolean; current: boolean; revision: number };
      }>;
    expect((await check(listed[1]!.verificationCode)).body).toMatchObject({
      genuine: true,
      current: false,
      revision: 1,
    });
    expect((await check(listed[0]!.verificationCode)).body).toMatchObject({
      genuine: true,
      current: true,
      revision: 2,
    });
  });

  it('draws the damage trend of a series measured three times into the report', async () => {
    const t = await startTestApp({ delivery: 'manual', env: { DEMO_IMAGES: '1' } });
    apps.push(t);
    const inspector = await t.signIn(demoAccounts.inspector);
    const engineer = await t.signIn(demoAccounts.engineer);
    // VT3-D0103's blade 12 crack was measured at its two released inspections: a third follows.
    const earlier = await get<{ items: Finding[] }>(
      t,
      '/inspections/inspection-d0103-h2/findings',
      engineer,
    );
    const crack = earlier.items.find((item) => item.row === 'hpt1-blade')!;
    const h2 = await get<{ csn: number; date: string }>(
      t,
      '/inspections/inspection-d0103-h2',
      engineer,
    );
    const id = await openInspection(t.app, inspector, {
      engineId: 'engine-d0103',
      date: t.clock.now().toISOString().slice(0, 10),
      csn: h2.csn + 120,
    });
    const [image] = await uploadImages(t.app, inspector, id, [await still(1600, 1200)]);
    const recorded = await request(t.app)
      .post(`/api/v1/inspections/${id}/findings`)
      .set('Cookie', inspector)
      .send({
        imageId: image,
        shape: {
          kind: 'polyline',
          points: [
            [200, 600],
            [256, 600],
          ],
        },
        calibration: tenMillimetreReference,
        row: 'hpt1-blade',
        position: crack.position,
        zone: crack.zone,
        damage: 'crack',
        method: 'image',
        previousFindingId: crack.id,
      })
      .expect(201);
    const finding = recorded.body as Finding;
    await coverAllRows(t.app, inspector, id);
    await submitForReview(t.app, inspector, id);
    const evaluation = finding.evaluation!;
    await request(t.app)
      .post(`/api/v1/findings/${finding.id}/dispositions`)
      .set('Cookie', engineer)
      .send({
        decision:
          evaluation.category === 'serviceable'
            ? { kind: 'serviceable' }
            : evaluation.category === 'repeat-inspection'
              ? { kind: 'repeat-inspection', repeatInterval: evaluation.repeatInterval }
              : removeBeforeNextFlight,
        rationale: 'Grows as the series foretold (invented limits)',
        password: DEMO_PASSWORD,
      })
      .expect(201);
    await signOutcome(t, id, engineer);
    await release(t, id, engineer);

    const response = await getBytes(t.app, `/inspections/${id}/report`, engineer);
    expect(response.status).toBe(200);
    const { text } = await pdfText(response.body as Buffer);
    expect(text).toContain('Damage trends');
    expect(text).toContain(`F${finding.number}, HPT stage 1 blades ${crack.position}`);
    expect(text).toContain('3 measurements');
    expect(text).toContain(`CSN ${(h2.csn + 120).toLocaleString('en-GB')}`);
    expect(text).toMatch(/Straight line: [+-]\d\.\d{3} mm per 1,000 cycles \(r² \d\.\d{2}\)/);

    // The two reports before it held no trend: their series had fewer than three measurements.
    const first = await getBytes(t.app, '/inspections/inspection-d0103-h2/report', engineer);
    expect((await pdfText(first.body as Buffer)).text).not.toContain('Damage trends');
  });

  it('lists to each customer their own reports only, whatever the query asks; staff see every one', async () => {
    const t = await startTestApp({ delivery: 'manual', env: { DEMO_IMAGES: '1' } });
    apps.push(t);
    const customer = await t.signIn(demoAccounts.customer);
    const own = await get<ReportListResponse>(t, '/reports?organisationId=org-pellucid', customer);
    expect(own.total).toBe(2);
    expect(own.items.map((item) => item.engineSerialNumber)).toEqual(['VT3-D0103', 'VT3-D0103']);
    expect(own.items.every((item) => item.delivery === 'on-its-way')).toBe(true);
    const customer2 = await t.signIn(demoAccounts.customer2);
    expect((await get<ReportListResponse>(t, '/reports', customer2)).total).toBe(0);
    const planner = await t.signIn(demoAccounts.planner);
    const all = await get<ReportListResponse>(t, '/reports?pageSize=1', planner);
    expect(all.total).toBe(2);
    expect(all.items).toHaveLength(1);
    expect(all.items[0]).toMatchObject({ inspectionDate: expect.any(String), current: true });
    await get(t, '/reports?pageSize=101', planner, 400);
  });
});
