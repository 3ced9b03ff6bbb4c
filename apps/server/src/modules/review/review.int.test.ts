import sharp from 'sharp';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Finding } from '@emberline/contracts/findings';
import type { Disposition, InspectionReview } from '@emberline/contracts/review';
import { rawConnection } from '../../db/client';
import {
  demoAccounts,
  DEMO_PASSWORD,
  startTestApp,
  waitForMail,
  type TestApp,
} from '../../../test/test-app';
import { checkLimitDraft } from '../../../test/limit-fixtures';
import {
  openInspection,
  still,
  tenMillimetreReference,
  submitForReview,
  uploadImages,
} from '../../../test/inspection-fixtures';
import { DEMO_DRAFT_LIMIT_SET_ID } from '../../demo/demo-limits';

let t: TestApp;
let inspector: string;
let engineer: string;
let admin: string;

beforeEach(async () => {
  t = await startTestApp({ delivery: 'manual' });
  inspector = await t.signIn(demoAccounts.inspector);
  engineer = await t.signIn(demoAccounts.engineer);
  admin = await t.signIn(demoAccounts.admin);
});
afterEach(() => t.close());

// 0.025 mm a pixel: a crack of 20 px is 0.5 mm (serviceable under the invented demo limits of
// 1.5 mm and 4 mm for NGV edge cracks), 100 px 2.5 mm (repeat inspection within 400 cycles),
// 240 px 6 mm (beyond limits: remove within 50 cycles).
const crack = (x: number, px: number) => ({
  kind: 'polyline' as const,
  points: [
    [x, 600],
    [x + px, 600],
  ] as [number, number][],
});

interface Prepared {
  inspectionId: string;
  findings: Finding[];
}

/** An inspection on VT3-D0101 with a serviceable, a repeat and a beyond-limits finding, covered. */
async function prepare(options: { submit?: boolean; recorder?: string } = {}): Promise<Prepared> {
  const recorder = options.recorder ?? inspector;
  const inspectionId = await openInspection(t.app, recorder, {
    engineId: 'engine-d0101',
    date: '2026-05-20',
    csn: 14_125,
  });
  const [image] = await uploadImages(t.app, recorder, inspectionId, [await still(1600, 1200)]);
  const findings: Finding[] = [];
  for (const [position, px] of [
    [3, 20],
    [10, 100],
    [20, 240],
  ] as const) {
    const response = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/findings`)
      .set('Cookie', recorder)
      .send({
        imageId: image,
        shape: crack(200 + position * 10, px),
        calibration: tenMillimetreReference,
        row: 'hpt1-ngv',
        position,
        zone: 'leading-edge',
        damage: 'crack',
        method: 'image',
      });
    expect(response.status).toBe(201);
    findings.push(response.body);
  }
  for (const row of ['hpt1-ngv', 'hpt1-blade'])
    await request(t.app)
      .put(`/api/v1/inspections/${inspectionId}/coverage/${row}`)
      .set('Cookie', recorder)
      .send({ status: 'full', viewedPositions: [], noDamageFound: false, reason: '' })
      .expect(200);
  if (options.submit !== false)
    await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/submission`)
      .set('Cookie', recorder)
      .expect(200);
  // Re-read: the verdicts of all three after the whole inspection was judged.
  const list = await request(t.app)
    .get(`/api/v1/inspections/${inspectionId}/findings`)
    .set('Cookie', engineer);
  return { inspectionId, findings: list.body.items };
}

const dispose = (findingId: string, body: Record<string, unknown>, cookie = engineer) =>
  request(t.app)
    .post(`/api/v1/findings/${findingId}/dispositions`)
    .set('Cookie', cookie)
    .send({ rationale: 'Checked against the invented limits', password: DEMO_PASSWORD, ...body });

const reviewOf = async (id: string, cookie = engineer): Promise<InspectionReview> => {
  const response = await request(t.app)
    .get(`/api/v1/inspections/${id}/dispositions`)
    .set('Cookie', cookie);
  expect(response.status).toBe(200);
  return response.body;
};

const decisionFor = (finding: Finding) => {
  const evaluation = finding.evaluation!;
  switch (evaluation.category) {
    case 'serviceable':
      return { kind: 'serviceable' };
    case 'repeat-inspection':
      return { kind: 'repeat-inspection', repeatInterval: evaluation.repeatInterval };
    default:
      return { kind: 'remove', action: evaluation.beyondAction };
  }
};

describe('engineering review', () => {
  it('dispositions each finding (one by concession), corrects one, signs the outcome and releases to the customer', async () => {
    const { inspectionId, findings } = await prepare();
    expect(findings.map((finding) => finding.evaluation?.category)).toEqual([
      'serviceable',
      'repeat-inspection',
      'beyond-limits',
    ]);
    const [f1, f2, f3] = findings as [Finding, Finding, Finding];

    // The queue shows it, beyond limits first, with three findings left.
    const queue = await request(t.app).get('/api/v1/review-queue').set('Cookie', engineer);
    expect(queue.status).toBe(200);
    expect(queue.body.items[0]).toMatchObject({
      inspection: { id: inspectionId, state: 'submitted' },
      worstVerdict: 'beyond-limits',
      left: { findings: 3, coverageGaps: 0 },
    });

    const first = await dispose(f1.id, { decision: decisionFor(f1) });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({
      findingNumber: 1,
      concession: false,
      current: true,
      signature: {
        kind: 'disposition',
        signerName: 'Priya Castellane',
        authorisationRef: 'DEMO-AUTH-E-0112',
      },
    });
    expect(first.body.signature.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect((await dispose(f2.id, { decision: decisionFor(f2) })).status).toBe(201);

    // Keeping a beyond-limits blade in service is a concession: refused without its reference.
    const loose = await dispose(f3.id, {
      decision: {
        kind: 'repeat-inspection',
        repeatInterval: { cycles: 50, hours: null, days: null },
      },
    });
    expect(loose.status).toBe(422);
    expect(loose.body.error.details.fields.concessionRef[0]).toMatch(
      /concession needs its reference/,
    );
    const conceded = await dispose(f3.id, {
      decision: {
        kind: 'repeat-inspection',
        repeatInterval: { cycles: 50, hours: null, days: null },
      },
      concessionRef: 'INVENTED-TCH-0042',
    });
    expect(conceded.status).toBe(201);
    expect(conceded.body).toMatchObject({ concession: true, concessionRef: 'INVENTED-TCH-0042' });

    // A correction names the one it supersedes and why; both stay visible, one is current.
    const correction = await dispose(f2.id, {
      decision: {
        kind: 'repeat-inspection',
        repeatInterval: { cycles: 200, hours: null, days: null },
      },
      supersedesId: (await reviewOf(inspectionId)).items.find((item) => item.findingId === f2.id)!
        .id,
      supersedeReason: 'Halved the interval: the crack sits near the cooling holes',
    });
    expect(correction.status).toBe(201);
    const review = await reviewOf(inspectionId);
    const ofF2 = review.items.filter((item) => item.findingId === f2.id);
    expect(ofF2.map((item) => item.state)).toEqual(['superseded', 'current']);
    expect(review.left.findings).toEqual([]);

    const outcome = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/outcome`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD });
    expect(outcome.status).toBe(201);
    expect(outcome.body.outcomes[0]).toMatchObject({
      kind: 'repeat-inspection',
      repeatInterval: { cycles: 50, hours: null, days: null },
      removals: [],
      current: true,
    });

    // The customer sees nothing until the release, then the decisions.
    const customer = await t.signIn(demoAccounts.customer);
    expect(
      (await request(t.app).get(`/api/v1/inspections/${inspectionId}`).set('Cookie', customer))
        .status,
    ).toBe(404);
    const released = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/release`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD });
    expect(released.status).toBe(201);
    expect(released.body.releases).toEqual([
      expect.objectContaining({ revision: 1, current: true }),
    ]);
    const seen = await request(t.app)
      .get(`/api/v1/inspections/${inspectionId}`)
      .set('Cookie', customer);
    expect(seen.body).toMatchObject({ state: 'released', releaseRevision: 1 });
    const decisions = await reviewOf(inspectionId, customer);
    expect(decisions.items.filter((item: Disposition) => item.current)).toHaveLength(3);

    // Every signature chained and sealed; every signed finding as it was.
    const verification = await request(t.app)
      .get('/api/v1/records/verification')
      .set('Cookie', admin);
    expect(verification.body).toMatchObject({
      ok: true,
      checked: { signatures: 6, dispositions: 3, originals: 1 },
      problems: [],
    });
  });

  it('alerts the reviewers by e-mail when an inspection beyond limits is submitted', async () => {
    const { inspectionId } = await prepare();
    const messages = await request(t.app)
      .get('/api/v1/outbox/messages')
      .query({ pageSize: 100 })
      .set('Cookie', admin);
    const alerts = (
      messages.body.items as {
        kind: string;
        subject: string;
        recipients: { address: string }[];
        record: { id: string } | null;
      }[]
    ).filter((item) => item.kind === 'alert');
    expect(alerts).toHaveLength(1);
    expect(alerts[0]!.subject).toBe('Beyond limits: engine VT3-D0101 awaits disposition');
    expect(alerts[0]!.record?.id).toBe(inspectionId);
    const addresses = alerts[0]!.recipients.map((recipient) => recipient.address).sort();
    expect(addresses).toEqual(['admin@demo.test', 'engineer2@demo.test', 'engineer@demo.test']);
    // The fleet shows the engine as awaiting disposition, beyond limits; not to its owner, who
    // sees released inspections only.
    const fleet = await request(t.app)
      .get('/api/v1/engines')
      .query({ serial: 'VT3-D0101' })
      .set('Cookie', engineer);
    expect(fleet.body.items[0].awaitingDisposition).toEqual({ inspectionId, beyondLimits: true });
    const owner = await t.signIn(demoAccounts.customer);
    const theirs = await request(t.app).get('/api/v1/engines/engine-d0101').set('Cookie', owner);
    expect(theirs.body.awaitingDisposition).toBeNull();

    await t.deliver();
    const caught = await waitForMail(t.runtime, 'engineer2@demo.test');
    expect(caught.subject).toBe('Beyond limits: engine VT3-D0101 awaits disposition');
    expect(caught.text).toMatch(
      /F3, HPT stage 1 nozzle guide vanes 20, leading edge: beyond limits, remove within 50 cycles/,
    );
  });

  it('tells the planners at once when a signed outcome calls for a removal', async () => {
    const { inspectionId, findings } = await prepare();
    for (const finding of findings)
      await dispose(finding.id, { decision: decisionFor(finding) }).expect(201);
    await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/outcome`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD })
      .expect(201);
    const messages = await request(t.app)
      .get('/api/v1/outbox/messages')
      .query({ pageSize: 100 })
      .set('Cookie', admin);
    const removal = (
      messages.body.items as { kind: string; subject: string; recipients: { address: string }[] }[]
    ).filter((item) => item.kind === 'removal');
    expect(removal).toHaveLength(1);
    expect(removal[0]!.subject).toBe('Removal ordered: engine VT3-D0101');
    expect(removal[0]!.recipients.map((recipient) => recipient.address).sort()).toEqual([
      'admin@demo.test',
      'planner@demo.test',
    ]);
    await t.deliver();
    const caught = await waitForMail(t.runtime, 'planner@demo.test');
    expect(caught.text).toMatch(/Remove within 50 cycles\./);
  });

  it('sends the owner an urgent notice at once for a removal before the next flight, and releases only to an owner with a report contact', async () => {
    const { inspectionId, findings } = await prepare();
    for (const finding of findings)
      await dispose(finding.id, {
        decision:
          finding.evaluation!.category === 'beyond-limits'
            ? {
                kind: 'remove',
                action: { kind: 'remove-before-next-flight', cycles: null, hours: null },
              }
            : decisionFor(finding),
      }).expect(201);
    await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/outcome`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD })
      .expect(201);
    const messages = await request(t.app)
      .get('/api/v1/outbox/messages')
      .query({ pageSize: 100 })
      .set('Cookie', admin);
    const urgent = (
      messages.body.items as { kind: string; subject: string; recipients: { address: string }[] }[]
    ).filter((item) => item.kind === 'urgent');
    expect(urgent.map((item) => item.subject)).toEqual([
      'Urgent: engine VT3-D0101 to be removed before its next flight',
    ]);
    expect(urgent[0]!.recipients.map((recipient) => recipient.address).sort()).toEqual([
      'powerplant@corvid.demo.test',
      'records@corvid.demo.test',
    ]);

    // With no contact for reports, the owner could not receive the report: nothing is released.
    rawConnection(t.runtime.ctx.db)
      .prepare(
        "UPDATE report_contacts SET receives_reports = 0 WHERE organisation_id = 'org-corvid'",
      )
      .run();
    const refused = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/release`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD });
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toBe(
      'Corvid Regional Airways (demo) has no contact for reports: add one under Admin → Organisations, then release. The signed report is e-mailed to them.',
    );
    const inspection = await request(t.app)
      .get(`/api/v1/inspections/${inspectionId}`)
      .set('Cookie', engineer);
    expect(inspection.body.state).toBe('dispositioned');
  });

  it('refuses the finding’s own recorder, whatever their role, and a signer without authorisation', async () => {
    // An administrator may record and review, but not disposition what they recorded.
    const own = await prepare({ recorder: admin });
    const refused = await dispose(
      own.findings[0]!.id,
      { decision: decisionFor(own.findings[0]!) },
      admin,
    );
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toBe(
      'You recorded or changed this finding: another engineer dispositions it.',
    );

    // An inspector who became an engineer (with an authorisation) still may not.
    const { inspectionId, findings } = await prepare();
    const users = await request(t.app).get('/api/v1/users').set('Cookie', admin);
    const tobias = (users.body.items as { id: string; email: string }[]).find(
      (user) => user.email === demoAccounts.inspector,
    )!;
    await request(t.app)
      .patch(`/api/v1/users/${tobias.id}`)
      .set('Cookie', admin)
      .send({ role: 'engineer' })
      .expect(200);
    const promoted = await dispose(
      findings[0]!.id,
      { decision: decisionFor(findings[0]!) },
      inspector,
    );
    expect(promoted.status).toBe(403);
    expect(promoted.body.error.message).toMatch(/You recorded or changed this finding/);

    // The administrator holds no authorisation to sign.
    const unauthorised = await dispose(
      findings[0]!.id,
      { decision: decisionFor(findings[0]!) },
      admin,
    );
    expect(unauthorised.status).toBe(403);
    expect(unauthorised.body.error.message).toMatch(/You hold no authorisation to sign/);
    expect((await reviewOf(inspectionId)).items).toEqual([]);
  });

  it('answers a wrong password on the field, counts it with the sign-ins, and stops both at the limit', async () => {
    const { findings } = await prepare();
    const limit = t.runtime.ctx.config.loginMaxFailures;
    for (let attempt = 0; attempt < limit; attempt += 1) {
      const wrong = await dispose(findings[0]!.id, {
        decision: decisionFor(findings[0]!),
        password: 'not the password',
      });
      expect(wrong.status).toBe(422);
      expect(wrong.body.error.details.fields.password).toEqual(['Not your password']);
    }
    const stopped = await dispose(findings[0]!.id, { decision: decisionFor(findings[0]!) });
    expect(stopped.status).toBe(429);
    const signIn = await request(t.app)
      .post('/api/v1/auth/login')
      .send({ email: demoAccounts.engineer, password: DEMO_PASSWORD });
    expect(signIn.status).toBe(429);
  });

  it('refuses a decision on a draft, a voided finding and a superseded disposition (409), and an outcome with work left (422)', async () => {
    const draft = await prepare({ submit: false });
    expect(
      (await dispose(draft.findings[0]!.id, { decision: { kind: 'serviceable' } })).status,
    ).toBe(409);
    await request(t.app)
      .post(`/api/v1/findings/${draft.findings[0]!.id}/void`)
      .set('Cookie', inspector)
      .send({ reason: 'Drawn on the wrong vane' })
      .expect(200);
    await request(t.app)
      .post(`/api/v1/inspections/${draft.inspectionId}/submission`)
      .set('Cookie', inspector)
      .expect(200);
    expect(
      (await dispose(draft.findings[0]!.id, { decision: { kind: 'serviceable' } })).status,
    ).toBe(409);

    const [, f2, f3] = draft.findings as [Finding, Finding, Finding];
    const signed = await dispose(f2.id, { decision: decisionFor(f2) });
    await dispose(f2.id, {
      decision: decisionFor(f2),
      supersedesId: signed.body.id,
      supersedeReason: 'Rationale worded again',
    }).expect(201);
    const stale = await dispose(f2.id, {
      decision: decisionFor(f2),
      supersedesId: signed.body.id,
      supersedeReason: 'Corrected twice',
    });
    expect(stale.status).toBe(409);

    const early = await request(t.app)
      .post(`/api/v1/inspections/${draft.inspectionId}/outcome`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD });
    expect(early.status).toBe(422);
    expect(early.body.error.details.left).toEqual(['F3 has no current disposition.']);
    expect((await dispose(f3.id, { decision: decisionFor(f3) })).status).toBe(201);
    expect(
      (
        await request(t.app)
          .post(`/api/v1/inspections/${draft.inspectionId}/outcome`)
          .set('Cookie', engineer)
          .send({ password: DEMO_PASSWORD })
      ).status,
    ).toBe(201);
  });

  it('locks a submitted inspection in the API (409) and in SQLite, and keeps dispositions to their state', async () => {
    const { inspectionId, findings } = await prepare();
    const image = findings[0]!.imageId;
    const late = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/findings`)
      .set('Cookie', inspector)
      .send({
        imageId: image,
        shape: crack(900, 20),
        calibration: tenMillimetreReference,
        row: 'hpt1-ngv',
        position: 30,
        zone: 'leading-edge',
        damage: 'crack',
        method: 'image',
      });
    expect(late.status).toBe(409);
    const sqlite = rawConnection(t.runtime.ctx.db);
    expect(() =>
      sqlite.prepare('UPDATE findings SET length_mm = 0.1 WHERE id = ?').run(findings[2]!.id),
    ).toThrow(/locked: this inspection has been submitted/);
    expect(() =>
      sqlite.prepare('UPDATE inspections SET csn = 1 WHERE id = ?').run(inspectionId),
    ).toThrow(/locked/);
    expect(() =>
      sqlite
        .prepare("UPDATE row_coverage SET status = 'none' WHERE inspection_id = ?")
        .run(inspectionId),
    ).toThrow(/locked/);
    expect(() =>
      sqlite
        .prepare(
          "INSERT INTO images (id, inspection_id, sha256, format, bytes, width, height, original_name, source, thumbnail, thumbnail_type, preview, preview_type, created_by, created_at) SELECT 'late', inspection_id, 'x', format, bytes, width, height, 'late.jpg', source, thumbnail, thumbnail_type, preview, preview_type, created_by, created_at FROM images WHERE inspection_id = ?",
        )
        .run(inspectionId),
    ).toThrow(/locked/);

    const signed = await dispose(findings[0]!.id, { decision: decisionFor(findings[0]!) });
    expect(() =>
      sqlite
        .prepare("UPDATE dispositions SET rationale = 'changed' WHERE id = ?")
        .run(signed.body.id),
    ).toThrow(/cannot change/);
    expect(() =>
      sqlite.prepare('DELETE FROM dispositions WHERE id = ?').run(signed.body.id),
    ).toThrow(/never deleted/);
  });

  it('withdraws signed dispositions with a signed withdrawal when sent back, and tells the inspector who, when and why', async () => {
    const { inspectionId, findings } = await prepare();
    await dispose(findings[0]!.id, { decision: decisionFor(findings[0]!) }).expect(201);
    const noPassword = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/return`)
      .set('Cookie', engineer)
      .send({ reason: 'Measure F3 again on a sharper still' });
    expect(noPassword.status).toBe(422);
    const returned = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/return`)
      .set('Cookie', engineer)
      .send({ reason: 'Measure F3 again on a sharper still', password: DEMO_PASSWORD });
    expect(returned.status).toBe(200);
    expect(returned.body).toMatchObject({
      state: 'draft',
      returnedReason: 'Measure F3 again on a sharper still',
      returnedByName: 'Priya Castellane',
    });
    const review = await reviewOf(inspectionId);
    expect(review.items.map((item) => item.state)).toEqual(['withdrawn']);
    expect(review.withdrawals).toEqual([
      expect.objectContaining({
        reason: 'Measure F3 again on a sharper still',
        dispositionIds: [review.items[0]!.id],
        signature: expect.objectContaining({ kind: 'withdrawal', signerName: 'Priya Castellane' }),
      }),
    ]);
  });

  it('keeps a submitted inspection on the revision it was judged against when a newer one is published', async () => {
    const submitted = await prepare();
    const draft = await prepare({ submit: false });
    const before = submitted.findings.map((finding) => finding.evaluation);
    await checkLimitDraft(t.app, (email) => t.signIn(email), DEMO_DRAFT_LIMIT_SET_ID);
    await request(t.app)
      .post(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/publication`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD })
      .expect(200);
    const after = await request(t.app)
      .get(`/api/v1/inspections/${submitted.inspectionId}/findings`)
      .set('Cookie', engineer);
    expect(after.body.items.map((finding: Finding) => finding.evaluation)).toEqual(before);
    const detail = await request(t.app)
      .get(`/api/v1/inspections/${submitted.inspectionId}`)
      .set('Cookie', engineer);
    expect(detail.body.newerRevisionInForce).toBe(true);
    const rejudged = await request(t.app)
      .get(`/api/v1/inspections/${draft.inspectionId}/findings`)
      .set('Cookie', engineer);
    expect(rejudged.body.items[0].limitSetId).toBe(DEMO_DRAFT_LIMIT_SET_ID);
  });

  it('names a finding changed after its disposition was signed', async () => {
    const { findings } = await prepare();
    await dispose(findings[1]!.id, { decision: decisionFor(findings[1]!) }).expect(201);
    const sqlite = rawConnection(t.runtime.ctx.db);
    sqlite.exec('DROP TRIGGER findings_locked_update');
    sqlite.prepare('UPDATE findings SET length_mm = 1.2 WHERE id = ?').run(findings[1]!.id);
    const verification = await request(t.app)
      .get('/api/v1/records/verification')
      .set('Cookie', admin);
    expect(verification.body.ok).toBe(false);
    expect(verification.body.problems).toEqual([
      expect.objectContaining({
        message: expect.stringMatching(
          /^The disposition of F2 of the inspection of VT3-D0101 on 20 May 2026: the finding, its verdict or its limit revision changed after signature \d+ was given\.$/,
        ),
      }),
    ]);
  });

  it('asks whether a finding at the same place as one of the previous dispositioned inspection is the same damage, and records the answer', async () => {
    const earlier = await prepare();
    for (const finding of earlier.findings)
      await dispose(finding.id, { decision: decisionFor(finding) }).expect(201);
    const outcome = await request(t.app)
      .post(`/api/v1/inspections/${earlier.inspectionId}/outcome`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD });
    expect(outcome.status).toBe(201);

    // The next inspection of the engine records the same crack again, without linking it.
    const later = await openInspection(t.app, inspector, {
      engineId: 'engine-d0101',
      date: '2026-05-28',
      csn: 14_400,
    });
    const [image] = await uploadImages(t.app, inspector, later, [await still(1600, 1200, 150)]);
    const again = await request(t.app)
      .post(`/api/v1/inspections/${later}/findings`)
      .set('Cookie', inspector)
      .send({
        imageId: image,
        shape: crack(300, 110),
        calibration: tenMillimetreReference,
        row: 'hpt1-ngv',
        position: 10,
        zone: 'leading-edge',
        damage: 'crack',
        method: 'image',
      })
      .expect(201);
    for (const row of ['hpt1-ngv', 'hpt1-blade'])
      await request(t.app)
        .put(`/api/v1/inspections/${later}/coverage/${row}`)
        .set('Cookie', inspector)
        .send({ status: 'full', viewedPositions: [], noDamageFound: false, reason: '' })
        .expect(200);
    await submitForReview(t.app, inspector, later);

    const review = await reviewOf(later);
    expect(review.recurrences).toEqual([
      {
        findingId: again.body.id,
        candidateFindingId: earlier.findings[1]!.id,
        candidateNumber: 2,
        candidateInspectionId: earlier.inspectionId,
        candidateInspectionDate: '2026-05-20',
      },
    ]);
    const signed = await dispose(again.body.id, {
      decision: decisionFor(again.body),
      recurrence: { candidateFindingId: earlier.findings[1]!.id, answer: 'same-damage' },
    });
    expect(signed.status).toBe(201);
    expect(signed.body.recurrence).toEqual({
      candidateFindingId: earlier.findings[1]!.id,
      answer: 'same-damage',
    });
    // Answered: no longer asked.
    expect((await reviewOf(later)).recurrences).toEqual([]);
  });

  it('keeps an upload in flight from adding an image to an inspection submitted meanwhile', async () => {
    const { inspectionId } = await prepare({ submit: false });
    // Large noisy stills take a while to send and process: the submission commits while they are
    // on their way. Whichever guard meets them (the draft check when the upload is taken, or the
    // SQLite trigger at the insert, tested alone above), none is added and the answer is 409.
    const files = await Promise.all(
      [1, 2, 3].map((seed) =>
        sharp({
          create: {
            width: 4000,
            height: 3000,
            channels: 3,
            background: { r: 0, g: 0, b: 0 },
            noise: { type: 'gaussian', mean: 100 + seed, sigma: 40 },
          },
        })
          .jpeg({ quality: 95 })
          .toBuffer(),
      ),
    );
    let call = request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/images`)
      .set('Cookie', inspector);
    files.forEach((data, index) => {
      call = call.attach('files', data, {
        filename: `late-${index}.jpg`,
        contentType: 'image/jpeg',
      });
    });
    const upload = call.then((response) => response);
    await new Promise((resolve) => setTimeout(resolve, 150));
    await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/submission`)
      .set('Cookie', inspector)
      .expect(200);
    const answered = await upload;
    expect(answered.status).toBe(409);
    expect(answered.body.error.message).toMatch(/submitted for review and is locked/);
    const detail = await request(t.app)
      .get(`/api/v1/inspections/${inspectionId}`)
      .set('Cookie', engineer);
    expect(detail.body.images.map((image: { originalName: string }) => image.originalName)).toEqual(
      ['still-0.jpg'],
    );
  });

  it('shows the owner what was released while a correction after release waits for the next release', async () => {
    const { inspectionId, findings } = await prepare();
    for (const finding of findings)
      await dispose(finding.id, { decision: decisionFor(finding) }).expect(201);
    const sign = (what: 'outcome' | 'release') =>
      request(t.app)
        .post(`/api/v1/inspections/${inspectionId}/${what}`)
        .set('Cookie', engineer)
        .send({ password: DEMO_PASSWORD })
        .expect(201);
    await sign('outcome');
    await sign('release');
    const customer = await t.signIn(demoAccounts.customer);
    const first = (await reviewOf(inspectionId, customer)).items.find(
      (item) => item.findingId === findings[1]!.id,
    )!;

    // A correction after release: the staff see it at once and the inspection waits for a new
    // outcome; the owner keeps seeing revision 1 as it was released.
    const correction = await dispose(findings[1]!.id, {
      decision: {
        kind: 'repeat-inspection',
        repeatInterval: { cycles: 200, hours: null, days: null },
      },
      supersedesId: first.id,
      supersedeReason: 'Halved after a second look',
    });
    expect(correction.status).toBe(201);
    const staff = await request(t.app)
      .get(`/api/v1/inspections/${inspectionId}`)
      .set('Cookie', engineer);
    expect(staff.body).toMatchObject({ state: 'submitted', releaseRevision: 1 });
    const owner = await request(t.app)
      .get(`/api/v1/inspections/${inspectionId}`)
      .set('Cookie', customer);
    expect(owner.body).toMatchObject({ state: 'released', releaseRevision: 1 });
    const ownerView = await reviewOf(inspectionId, customer);
    expect(ownerView.items.map((item) => item.id)).toContain(first.id);
    expect(ownerView.items.map((item) => item.id)).not.toContain(correction.body.id);
    expect(ownerView.withdrawals).toEqual([]);

    // The new outcome and release (revision 2) bring the correction to the owner.
    await sign('outcome');
    await sign('release');
    const second = await reviewOf(inspectionId, customer);
    expect(second.releases).toEqual([expect.objectContaining({ revision: 2 })]);
    expect(second.items.map((item) => item.id)).toContain(correction.body.id);
    expect(second.items.map((item) => item.id)).not.toContain(first.id);
  });
});
