import { spawnSync } from 'node:child_process';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { canonicalSha256 } from '../../lib/canonical';
import { rawConnection, inTransaction } from '../../db/client';
import { signatureHeader } from '@emberline/domain/signature-content';
import { demoAccounts, DEMO_PASSWORD, startTestApp, type TestApp } from '../../../test/test-app';
import { checkLimitDraft } from '../../../test/limit-fixtures';
import { DEMO_DRAFT_LIMIT_SET_ID } from '../../demo/demo-limits';
import { appendSignature } from './signature-writer';
import { macOf } from './signature-chain';
import { runMigrations } from '../../db/migrate';
import { appendAudit } from '../audit/audit.repository';
import { auditRowHash } from '../../lib/records/audit-hash';

let t: TestApp;
beforeEach(async () => {
  t = await startTestApp({ delivery: 'manual' });
});
afterEach(() => t.close());

const signer = {
  id: 'user-engineer',
  name: 'Invented Signer',
  role: 'engineer',
  authorisationRef: null,
};

/** Three signatures of invented content, appended as the services append them. */
function signThree() {
  const { ctx } = t.runtime;
  return [1, 2, 3].map((n) =>
    inTransaction(ctx.db, (tx) =>
      appendSignature(ctx, tx, {
        kind: 'limit-check',
        subjectId: `subject-${n}`,
        signer,
        content: { checked: n, note: `invented content ${n}` },
      }),
    ),
  );
}

async function verification() {
  const engineer = await t.signIn(demoAccounts.engineer);
  const response = await request(t.app).get('/api/v1/records/verification').set('Cookie', engineer);
  expect(response.status).toBe(200);
  return response.body as {
    ok: boolean;
    checked: { signatures: number; auditRows: number };
    head: { seq: number; sha256: string } | null;
    problems: { kind: string; id: string; message: string }[];
  };
}

/** Tampering as someone with the database file would: triggers dropped first. */
function tamper(sql: string, ...params: unknown[]) {
  const sqlite = rawConnection(t.runtime.ctx.db);
  sqlite.exec(
    'DROP TRIGGER IF EXISTS signatures_no_update; DROP TRIGGER IF EXISTS signatures_no_delete;',
  );
  sqlite.prepare(sql).run(...params);
}

describe('the signature chain', () => {
  it('signs a publication into the chain, and the records check finds it whole', async () => {
    await checkLimitDraft(t.app, (email) => t.signIn(email), DEMO_DRAFT_LIMIT_SET_ID);
    const engineer = await t.signIn(demoAccounts.engineer);
    const published = await request(t.app)
      .post(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/publication`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD });
    expect(published.status).toBe(200);
    const row = rawConnection(t.runtime.ctx.db)
      .prepare("select * from signatures where kind = 'publication'")
      .get() as { seq: number; subject_id: string; content: string; prev_sha256: string };
    // The independent check is the first record; the publication follows it in the chain.
    expect(row).toMatchObject({ seq: 2, subject_id: DEMO_DRAFT_LIMIT_SET_ID });
    expect(row.prev_sha256).not.toBe('0'.repeat(64));
    expect(JSON.parse(row.content)).toMatchObject({
      revision: 'D-2',
      limitSetId: DEMO_DRAFT_LIMIT_SET_ID,
    });
    signThree();
    const result = await verification();
    expect(result).toMatchObject({ ok: true, checked: { signatures: 5 }, problems: [] });
    expect(result.head?.seq).toBe(5);
  });

  it('has SQLite refuse to change or remove a signature', () => {
    signThree();
    const sqlite = rawConnection(t.runtime.ctx.db);
    expect(() => sqlite.prepare("update signatures set meaning = 'x' where seq = 2").run()).toThrow(
      /append-only/,
    );
    expect(() => sqlite.prepare('delete from signatures where seq = 3').run()).toThrow(
      /append-only/,
    );
  });

  it('names a byte changed in what a signature covers, after the trigger was dropped', async () => {
    const [, second] = signThree();
    tamper(
      "update signatures set content = replace(content, 'invented', 'Invented') where seq = 2",
    );
    const result = await verification();
    expect(result.ok).toBe(false);
    expect(result.problems).toEqual([
      {
        kind: 'signature',
        id: second!.id,
        message: expect.stringMatching(/^Signature 2 \(limit-check\): what it covers was changed/),
      },
    ]);
  });

  it('names a record removed from the middle as a gap', async () => {
    signThree();
    tamper('delete from signatures where seq = 2');
    const result = await verification();
    expect(result.problems.map((problem) => problem.message)).toEqual([
      expect.stringMatching(/^Signature 3 .*records 2 to 2 are missing/),
      expect.stringMatching(/^Signature 3 .*does not follow the record before it/),
    ]);
  });

  it('shows a cut-off tail through the chain head printed before', async () => {
    signThree();
    const before = (await verification()).head;
    tamper('delete from signatures where seq = 3');
    const after = await verification();
    // The rest still checks out: only the head printed elsewhere (on a report) tells.
    expect(after.ok).toBe(true);
    expect(after.head).not.toEqual(before);
    expect(after.head?.seq).toBe(2);
  });

  it('names a record recomputed without the records key as forged', async () => {
    const [, second] = signThree();
    // Whoever rewrites a record can recompute every hash, but not the seal without the key.
    const sqlite = rawConnection(t.runtime.ctx.db);
    const row = sqlite.prepare('select * from signatures where seq = 2').get() as Record<
      string,
      string
    >;
    const content = { checked: 2, note: 'rewritten' };
    const header = signatureHeader({
      seq: 2,
      kind: 'limit-check',
      subjectId: row.subject_id!,
      signer,
      signedAt: row.signed_at!,
      meaning: row.meaning!,
      contentSha256: canonicalSha256(content),
      prevSha256: row.prev_sha256!,
    });
    const sha256 = canonicalSha256(header);
    tamper(
      'update signatures set content = ?, content_sha256 = ?, sha256 = ?, mac = ? where seq = 2',
      JSON.stringify(content),
      header.contentSha256,
      sha256,
      macOf(Buffer.from('a key that is not the records key'), sha256),
    );
    const result = await verification();
    expect(result.problems.map((problem) => [problem.id, problem.message])).toEqual([
      [second!.id, expect.stringMatching(/seal was not made with the records key/)],
      [
        expect.any(String),
        expect.stringMatching(/^Signature 3 .*does not follow the record before it/),
      ],
    ]);
  });

  it('has `pnpm verify-records` exit 0 on a whole chain and 1 naming a broken record', () => {
    signThree();
    const run = () =>
      spawnSync(process.execPath, ['--import', 'tsx', 'apps/server/src/cli/verify-records.ts'], {
        env: { ...process.env, DATA_DIR: t.dataDir },
        encoding: 'utf8',
      });
    const whole = run();
    expect(whole.stdout).toContain('Checked 3 signatures');
    expect(whole.status).toBe(0);
    tamper("update signatures set meaning = 'I agree to nothing.' where seq = 1");
    const broken = run();
    expect(broken.stdout).toMatch(/PROBLEM Signature 1 \(limit-check\): its signer, time, meaning/);
    expect(broken.status).toBe(1);
  }, 30_000);

  it('is for engineers and admins: a planner is refused', async () => {
    const planner = await t.signIn(demoAccounts.planner);
    expect(
      (await request(t.app).get('/api/v1/records/verification').set('Cookie', planner)).status,
    ).toBe(403);
  });
});

describe('the audit chain', () => {
  const sqlite = () => rawConnection(t.runtime.ctx.db);
  const auditCount = () =>
    (sqlite().prepare('select count(*) as n from audit_log').get() as { n: number }).n;
  const untriggered = (sql: string, ...params: unknown[]) => {
    sqlite().exec(
      'DROP TRIGGER IF EXISTS audit_log_no_update; DROP TRIGGER IF EXISTS audit_log_no_delete;',
    );
    sqlite()
      .prepare(sql)
      .run(...params);
  };

  it('chains every audit row as it is written, and the records check walks them all', async () => {
    const result = await verification();
    expect(result.ok).toBe(true);
    expect(result.checked.auditRows).toBe(auditCount());
    expect(result.checked.auditRows).toBeGreaterThan(0);
    expect(() => sqlite().prepare('update audit_log set action = action').run()).toThrow(
      /append-only/,
    );
    expect(() => sqlite().prepare('delete from audit_log where seq = 1').run()).toThrow(
      /append-only/,
    );
  });

  it('chains the rows written before the chain existed, in id order, when it migrates', async () => {
    untriggered('update audit_log set seq = null, prev_hash = null, hash = null, mac = null');
    runMigrations(t.runtime.ctx.db);
    const rows = sqlite().prepare('select id, seq from audit_log order by id').all() as {
      id: number;
      seq: number;
    }[];
    expect(rows.map((row) => row.seq)).toEqual(rows.map((_, index) => index + 1));
    expect(await verification()).toMatchObject({ ok: true, problems: [] });
  });

  it('names a changed row, a removed row, a forged row and a row outside the chain', async () => {
    const { ctx } = t.runtime;
    for (let n = 0; n < 5; n += 1)
      inTransaction(ctx.db, (tx) =>
        appendAudit(tx, ctx.now(), {
          actorUserId: null,
          action: 'test.invented-change',
          entityType: 'test',
          entityId: `entry-${n}`,
          after: { n },
        }),
      );
    expect(auditCount()).toBeGreaterThanOrEqual(6);
    untriggered("update audit_log set action = 'user.nothing-happened' where seq = 2");
    untriggered('delete from audit_log where seq = 4');
    const last = sqlite()
      .prepare('select seq, hash from audit_log order by seq desc limit 1')
      .get() as { seq: number; hash: string };
    // A forger who knows the scheme but not the records key.
    const forged = {
      seq: last.seq + 1,
      at: new Date('2026-06-01T09:00:00Z'),
      actorUserId: null,
      action: 'user.role-changed',
      entityType: 'user',
      entityId: 'user-planner',
      before: null,
      after: { role: 'admin' },
      requestId: null,
      ip: null,
      prevHash: last.hash,
    };
    const hash = auditRowHash(forged);
    sqlite()
      .prepare(
        `insert into audit_log (at, action, entity_type, entity_id, after, seq, prev_hash, hash, mac)
         values (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(
        forged.at.getTime(),
        forged.action,
        forged.entityType,
        forged.entityId,
        JSON.stringify(forged.after),
        forged.seq,
        forged.prevHash,
        hash,
        macOf(Buffer.from('not the records key'), hash),
      );
    sqlite()
      .prepare(
        "insert into audit_log (at, action, entity_type) values (1, 'user.slipped-in', 'user')",
      )
      .run();
    const messages = (await verification()).problems
      .filter((problem) => problem.kind === 'audit')
      .map((problem) => problem.message);
    expect(messages).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/outside the audit chain/),
        expect.stringMatching(/it was changed after it was written/),
        expect.stringMatching(/rows 4 to 4 of the chain are missing/),
        expect.stringMatching(/seal was not made with the records key/),
      ]),
    );
  });
});

describe('the records check in the background', () => {
  async function waitForCheck(cookie: string) {
    for (let attempt = 0; attempt < 200; attempt += 1) {
      const latest = await request(t.app)
        .get('/api/v1/records/verifications/latest')
        .set('Cookie', cookie);
      expect(latest.status).toBe(200);
      if (latest.body.job.state !== 'running') return latest.body.job;
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    throw new Error('the records check did not finish');
  }

  it('runs the whole check with its progress, one at a time, and gives the same result as the check in the request', async () => {
    const engineer = await t.signIn(demoAccounts.engineer);
    const none = await request(t.app)
      .get('/api/v1/records/verifications/latest')
      .set('Cookie', engineer);
    expect(none.status).toBe(200);
    expect(none.body).toEqual({ job: null });

    signThree();
    const started = await request(t.app)
      .post('/api/v1/records/verifications')
      .set('Cookie', engineer);
    expect(started.status).toBe(202);
    expect(started.body).toMatchObject({ state: 'running', startedBy: 'Priya Castellane' });
    const done = await waitForCheck(engineer);
    expect(done).toMatchObject({ id: started.body.id, state: 'done', error: null });
    expect(done.progress.phase).toBe('done');
    expect(done.finishedAt).not.toBeNull();
    // The same as the check in a request, but for the sign-in that request is audited with.
    const direct = await verification();
    expect(done.result).toEqual({
      ...direct,
      checked: { ...direct.checked, auditRows: direct.checked.auditRows - 1 },
    });
    expect(done.result.checked.signatures).toBe(3);

    // A record changed behind the product's back is found by the next check.
    tamper("update signatures set meaning = 'changed' where seq = 2");
    const again = await request(t.app)
      .post('/api/v1/records/verifications')
      .set('Cookie', engineer);
    expect(again.body.id).not.toBe(started.body.id);
    const found = await waitForCheck(engineer);
    expect(found.result.ok).toBe(false);
    expect(found.result.problems.length).toBeGreaterThan(0);
  });

  it('gives the running check to a second request instead of starting another', async () => {
    const engineer = await t.signIn(demoAccounts.engineer);
    const [first, second] = await Promise.all([
      request(t.app).post('/api/v1/records/verifications').set('Cookie', engineer),
      request(t.app).post('/api/v1/records/verifications').set('Cookie', engineer),
    ]);
    expect([first.status, second.status]).toEqual([202, 202]);
    const running = [first.body, second.body].filter((job) => job.state === 'running');
    // Both asked while it ran: the same check.
    if (running.length === 2) expect(second.body.id).toBe(first.body.id);
    await waitForCheck(engineer);
    const planner = await t.signIn(demoAccounts.planner);
    expect(
      (await request(t.app).post('/api/v1/records/verifications').set('Cookie', planner)).status,
    ).toBe(403);
  });
});
