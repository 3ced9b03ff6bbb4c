import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cautions } from '@emberline/contracts/cautions';
import type { InspectionReview } from '@emberline/contracts/review';
import { decisionWords } from '@emberline/domain/decision-words';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import { rawConnection } from '../../db/client';
import { demoAccounts, startTestApp, waitForMail, type TestApp } from '../../../test/test-app';
import { pdfText } from '../../../test/pdf-text';

let t: TestApp;
beforeAll(async () => {
  // The demo history releases VT3-D0103's first two inspections through the review service, so
  // their reports are made by the same path a release takes.
  t = await startTestApp({ env: { DEMO_IMAGES: '1' } });
});
afterAll(() => t.close());

const download = (id: string, cookie: string) =>
  request(t.app)
    .get(`/api/v1/inspections/${id}/report`)
    .set('Cookie', cookie)
    .buffer(true)
    .parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    });

describe('the signed report of a released inspection', () => {
  it('holds the engine, every verdict and decision, the cautions and its verification code, and its hash is signed', async () => {
    const customer = await t.signIn(demoAccounts.customer);
    const response = await download('inspection-d0103-h2', customer);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('application/pdf');
    const bytes = response.body as Buffer;
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');

    const sqlite = rawConnection(t.runtime.ctx.db);
    const stored = sqlite
      .prepare(
        `SELECT r.pdf_sha256 AS sha, r.verification_code AS code, s.content AS content
         FROM reports r JOIN signatures s ON s.id = r.release_signature_id
         WHERE r.inspection_id = 'inspection-d0103-h2'`,
      )
      .get() as { sha: string; code: string; content: string };
    const sha = createHash('sha256').update(bytes).digest('hex');
    expect(sha).toBe(stored.sha);
    expect(JSON.parse(stored.content).report).toEqual({ pdfSha256: sha, revision: 1 });
    expect(stored.code).toMatch(/^[A-Za-z0-9_-]{22}$/);

    const { text, pages } = await pdfText(bytes);
    expect(pages).toBeGreaterThanOrEqual(2);
    expect(text).toContain('VT3-D0103');
    expect(text).toContain(stored.code);
    expect(text).toContain(cautions.short.replace(/\s+/g, ' '));
    expect(text).toContain(`Page 1 of ${pages}`);
    const engineer = await t.signIn(demoAccounts.engineer);
    const review = (
      await request(t.app)
        .get('/api/v1/inspections/inspection-d0103-h2/dispositions')
        .set('Cookie', engineer)
    ).body as InspectionReview;
    const current = review.items.filter((item) => item.current);
    expect(current.length).toBeGreaterThan(0);
    for (const item of current) {
      expect(text).toContain(`F${item.findingNumber}`);
      expect(text).toContain(decisionWords(item.decision).slice(0, 30));
      // A hash wraps in its table cell: compared without the breaks.
      expect(text.replace(/ /g, '')).toContain(item.signature.sha256);
    }
    expect(text).toContain(verdictStyles['repeat-inspection'].label);
  });

  it('is e-mailed to the owner’s report contacts only, with the stored PDF attached', async () => {
    const caught = await waitForMail(t.runtime, 'records@corvid.demo.test');
    const store = t.runtime.ctx.caughtMail!;
    const reportMails = async () =>
      (await store.list()).filter((item) =>
        item.subject.startsWith('Inspection report: engine VT3-D0103'),
      );
    // Both releases' messages, as the delivery worker hands them over.
    for (let wait = 0; wait < 100 && (await reportMails()).length < 2; wait += 1)
      await new Promise((resolve) => setTimeout(resolve, 50));
    const reportsMail = await reportMails();
    expect(reportsMail).toHaveLength(2);
    for (const summary of reportsMail)
      expect([...summary.to].sort()).toEqual([
        'powerplant@corvid.demo.test',
        'records@corvid.demo.test',
      ]);
    expect(caught.attachmentList).toEqual([
      expect.objectContaining({ contentType: 'application/pdf' }),
    ]);
    // The attachment, read back from the message as the fake received it, is the stored report.
    const parsed = await simpleParser(
      fs.readFileSync(path.join(store.directory, `${reportsMail[0]!.id}.eml`)),
    );
    const attached = parsed.attachments[0]!.content;
    const sqlite = rawConnection(t.runtime.ctx.db);
    const hashes = (
      sqlite.prepare('SELECT pdf_sha256 AS sha FROM reports').all() as { sha: string }[]
    ).map((row) => row.sha);
    expect(hashes).toContain(createHash('sha256').update(attached).digest('hex'));
  });

  it('tells the owner only the day of an inspection still in review, nothing of its findings', async () => {
    const owner = await t.signIn(demoAccounts.customer2);
    const engine = await request(t.app).get('/api/v1/engines/engine-d0201').set('Cookie', owner);
    expect(engine.status).toBe(200);
    expect(engine.body.inspectionInReview).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(engine.body.awaitingDisposition).toBeNull();
    expect(engine.body.nextDue).toBeNull();
    const inspections = await request(t.app)
      .get('/api/v1/inspections')
      .query({ engineId: 'engine-d0201' })
      .set('Cookie', owner);
    expect(inspections.body.items).toEqual([]);
  });

  it('is refused to another customer (404), and does not exist before release (404)', async () => {
    const other = await t.signIn(demoAccounts.customer2);
    expect((await download('inspection-d0103-h2', other)).status).toBe(404);
    const engineer = await t.signIn(demoAccounts.engineer);
    const list = await request(t.app)
      .get('/api/v1/inspections')
      .query({ engineId: 'engine-d0201' })
      .set('Cookie', engineer);
    const submitted = (list.body.items as { id: string; state: string }[]).find(
      (item) => item.state === 'submitted',
    )!;
    expect((await download(submitted.id, engineer)).status).toBe(404);
  });

  it('gives the owner renditions only: the original bytes (with the probe’s metadata) are for staff', async () => {
    const customer = await t.signIn(demoAccounts.customer);
    const inspection = await request(t.app)
      .get('/api/v1/inspections/inspection-d0103-h2')
      .set('Cookie', customer);
    const imageId = (inspection.body.images as { id: string }[])[0]!.id;
    const status = async (which: string, cookie: string) =>
      (await request(t.app).get(`/api/v1/images/${imageId}/${which}`).set('Cookie', cookie)).status;
    for (const which of ['thumbnail', 'preview', 'full'])
      expect(await status(which, customer)).toBe(200);
    expect(await status('original', customer)).toBe(404);
    expect(await status('original', await t.signIn(demoAccounts.planner))).toBe(200);
  });

  it('tells anyone with its code whether it is genuine and current, with three facts only, and whether a file is it', async () => {
    const sqlite = rawConnection(t.runtime.ctx.db);
    const stored = sqlite
      .prepare(
        "SELECT verification_code AS code, pdf FROM reports WHERE inspection_id = 'inspection-d0103-h1'",
      )
      .get() as { code: string; pdf: Buffer };
    const answer = await request(t.app).get(`/api/v1/verify/${stored.code}`);
    expect(answer.status).toBe(200);
    expect(answer.body).toEqual({
      genuine: true,
      current: true,
      engineSerialNumber: 'VT3-D0103',
      inspectionDate: expect.stringMatching(/^\d{4}-\d{2}-\d{2}$/),
      revision: 1,
      message: expect.stringMatching(/^Genuine and current/),
    });
    expect((await request(t.app).get('/api/v1/verify/AAAAAAAAAAAAAAAAAAAAAA')).status).toBe(404);
    expect((await request(t.app).get('/api/v1/verify/short')).status).toBe(400);

    const file = (bytes: Buffer) =>
      request(t.app)
        .post(`/api/v1/verify/${stored.code}/file`)
        .set('Content-Type', 'application/pdf')
        .send(bytes);
    expect((await file(stored.pdf)).body).toMatchObject({ matches: true });
    const changed = Buffer.from(stored.pdf);
    changed[100] = changed[100]! ^ 1;
    expect((await file(changed)).body).toMatchObject({ matches: false });
  });

  it('refuses a change to a stored report, and the records check names one made behind its back', async () => {
    const sqlite = rawConnection(t.runtime.ctx.db);
    expect(() =>
      sqlite
        .prepare("UPDATE reports SET revision = 9 WHERE inspection_id = 'inspection-d0103-h1'")
        .run(),
    ).toThrow(/a signed report never changes/);
    const admin = await t.signIn(demoAccounts.admin);
    const before = await request(t.app).get('/api/v1/records/verification').set('Cookie', admin);
    expect(before.body).toMatchObject({ ok: true, checked: { reports: 2 } });

    // One byte changed with the trigger out of the way, as someone with the file could.
    sqlite.exec('DROP TRIGGER reports_no_update');
    const row = sqlite
      .prepare("SELECT id, pdf FROM reports WHERE inspection_id = 'inspection-d0103-h1'")
      .get() as { id: string; pdf: Buffer };
    const changed = Buffer.from(row.pdf);
    changed[changed.length - 20] = changed[changed.length - 20]! ^ 1;
    sqlite.prepare('UPDATE reports SET pdf = ? WHERE id = ?').run(changed, row.id);
    const code = (
      sqlite.prepare('SELECT verification_code AS code FROM reports WHERE id = ?').get(row.id) as {
        code: string;
      }
    ).code;
    const verified = await request(t.app).get(`/api/v1/verify/${code}`);
    expect(verified.body).toMatchObject({
      genuine: false,
      message: expect.stringMatching(/^This report does not check out/),
    });
    const after = await request(t.app).get('/api/v1/records/verification').set('Cookie', admin);
    expect(after.body.ok).toBe(false);
    expect(after.body.problems).toEqual([
      expect.objectContaining({
        id: row.id,
        message: expect.stringMatching(
          /^Report revision 1 of inspection inspection-d0103-h1: its bytes are not the ones release signature \d+ covers\.$/,
        ),
      }),
    ]);
  });

  it('stops a flood of checks from one address (429)', async () => {
    let status = 200;
    for (let attempt = 0; attempt < 40 && status !== 429; attempt += 1)
      status = (await request(t.app).get('/api/v1/verify/AAAAAAAAAAAAAAAAAAAAAA')).status;
    expect(status).toBe(429);
  });
});
