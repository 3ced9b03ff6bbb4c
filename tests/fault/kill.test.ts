import type { ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startS3Fake, type S3Fake } from '../../apps/server/test/s3-fake';
import {
  freePort,
  openInspectionOverHttp,
  signInCookie,
  startServerProcess,
} from '../../scripts/lib/server-process';

// QUALITY §3 kill test: concurrent uploads, the server killed (SIGKILL) at a random moment and
// restarted, 20 rounds; every acknowledged upload must survive, and nothing may be left orphaned.
// The same for e-mail (DESIGN §5.7): queued messages survive kills during delivery rounds; and
// for signatures (DESIGN §5.5): a kill during signing leaves the whole signature or none.

const ROUNDS = 20;
const UPLOADS_PER_ROUND = 4;
const MAIL_ROUNDS = 8;
const MAIL_PER_ROUND = 6;
const SIGNING_ROUNDS = 20;

function kill(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null) return resolve();
    child.once('exit', () => resolve());
    child.kill('SIGKILL');
  });
}

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

/** The originals in a data directory, by file name. */
function diskOriginals(dataDir: string): Map<string, Buffer> {
  const root = path.join(dataDir, 'images', 'originals');
  return new Map(
    fs
      .readdirSync(root, { recursive: true, withFileTypes: true })
      .filter((entry) => entry.isFile())
      .map((entry) => [entry.name, fs.readFileSync(path.join(entry.parentPath, entry.name))]),
  );
}

// On the data directory, and on an S3 protocol fake's bucket that outlives the server (with no
// grace, the start-up sweep moves every object no row names to quarantine at once).
describe.each(['local', 's3'] as const)('uploads survive a killed server on %s storage', (kind) => {
  let s3: S3Fake | null = null;
  beforeAll(async () => {
    s3 = kind === 's3' ? await startS3Fake('emberline-kill') : null;
  });
  afterAll(() => s3?.close());

  it(`keeps every acknowledged image through ${ROUNDS} rounds of SIGKILL during concurrent uploads`, async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-kill-'));
    const port = await freePort();
    const base = `http://127.0.0.1:${port}/api/v1`;
    const env = { FROM_SOURCES: '1', ...(s3 ? { ...s3.env, S3_QUARANTINE_AFTER_HOURS: '0' } : {}) };
    let server = await startServerProcess(dataDir, port, env);
    const cookie = await signInCookie(base, 'inspector@demo.test');
    const inspectionId = await openInspectionOverHttp(base, cookie, { inspectorName: 'Kill Test' });

    const acknowledged = new Map<string, string>();
    let cut = 0;
    for (let round = 0; round < ROUNDS; round += 1) {
      const uploads = await Promise.all(
        Array.from({ length: UPLOADS_PER_ROUND }, async (_, index) => {
          const data = await sharp({
            create: {
              width: 1600,
              height: 1200,
              channels: 3,
              background: '#000',
              noise: { type: 'gaussian', mean: 100 + round, sigma: 30 + index },
            },
          })
            .jpeg()
            .toBuffer();
          return data;
        }),
      );
      let firstAcknowledged: () => void = () => {};
      const acknowledgedOnce = new Promise<void>((resolve) => (firstAcknowledged = resolve));
      const inFlight = uploads.map(async (data, index) => {
        const form = new FormData();
        form.append(
          'files',
          new Blob([new Uint8Array(data)], { type: 'image/jpeg' }),
          `round-${round}-${index}.jpg`,
        );
        let response: Response;
        let body: unknown;
        try {
          response = await fetch(`${base}/inspections/${inspectionId}/images`, {
            method: 'POST',
            headers: { cookie },
            body: form,
          });
          body = await response.json();
        } catch (error) {
          // The kill cut the connection before an answer: this upload was never acknowledged.
          expect(error, `upload ${round}-${index}`).toBeInstanceOf(TypeError);
          cut += 1;
          return;
        }
        // A server that answered took the file: anything but 201 is a failure, not a cut.
        expect(response.status, `upload ${round}-${index}: ${JSON.stringify(body)}`).toBe(201);
        const { images } = body as { images: { id: string; sha256: string }[] };
        expect(images).toHaveLength(1);
        expect(images[0]!.sha256).toBe(sha256(data));
        acknowledged.set(images[0]!.id, images[0]!.sha256);
        firstAcknowledged();
      });
      // The kill falls at a random moment once the round is under way: after its first
      // acknowledgement (or 3 s on a machine too busy to give one), so that some uploads are
      // done and others are cut however loaded the machine is.
      await Promise.race([acknowledgedOnce, new Promise((resolve) => setTimeout(resolve, 3000))]);
      await new Promise((resolve) => setTimeout(resolve, Math.random() * 250));
      await kill(server);
      await Promise.all(inFlight);
      server = await startServerProcess(dataDir, port, env);

      for (const [id, hash] of acknowledged) {
        const thumbnail = await fetch(`${base}/images/${id}/thumbnail`, { headers: { cookie } });
        expect(thumbnail.status, `image ${id} after round ${round}`).toBe(200);
        expect((await thumbnail.arrayBuffer()).byteLength).toBeGreaterThan(0);
        const original = Buffer.from(
          await (
            await fetch(`${base}/images/${id}/original`, { headers: { cookie } })
          ).arrayBuffer(),
        );
        expect(sha256(original)).toBe(hash);
      }
    }
    await kill(server);
    // The restart after the last kill swept; a last start and stop checks nothing is left over.
    server = await startServerProcess(dataDir, port, env);
    await kill(server);

    const db = new Database(path.join(dataDir, 'emberline.sqlite'));
    expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    expect(db.pragma('foreign_key_check')).toEqual([]);
    const rows = db.prepare('select id, sha256 from images').all() as {
      id: string;
      sha256: string;
    }[];
    db.close();
    for (const [id, hash] of acknowledged)
      expect(rows.find((row) => row.id === id)?.sha256).toBe(hash);
    // Exactly the originals the rows name are stored, each under the hash of its bytes.
    const stored = s3 ? await s3.objects(`${s3.env.S3_PREFIX}originals/`) : diskOriginals(dataDir);
    expect(new Set(stored.keys())).toEqual(new Set(rows.map((row) => row.sha256)));
    for (const [name, bytes] of stored) expect(sha256(bytes)).toBe(name);
    expect(fs.readdirSync(path.join(dataDir, 'images', 'tmp'))).toEqual([]);
    if (s3) expect(fs.existsSync(path.join(dataDir, 'images', 'originals'))).toBe(false);
    console.log(
      `kill test on ${kind} storage: ${ROUNDS} rounds, ${acknowledged.size} acknowledged images kept, ${rows.length} stored, ${cut} uploads cut by a kill`,
    );
    // Every upload was either acknowledged or cut, and the kills did land in the middle of some.
    expect(acknowledged.size + cut).toBe(ROUNDS * UPLOADS_PER_ROUND);
    expect(acknowledged.size).toBeGreaterThan(0);
    expect(cut, 'uploads cut by a kill').toBeGreaterThan(0);
  }, 420_000);
});

describe('e-mail survives a killed server', () => {
  it(`delivers every queued message through ${MAIL_ROUNDS} kills during delivery rounds, repeating at most one a kill`, async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-kill-mail-'));
    const port = await freePort();
    const base = `http://127.0.0.1:${port}/api/v1`;
    let server = await startServerProcess(dataDir, port, { FROM_SOURCES: '1' });
    const cookie = await signInCookie(base, 'admin@demo.test');
    const invited: string[] = [];
    let cutWithMailWaiting = 0;

    for (let round = 0; round < MAIL_ROUNDS; round += 1) {
      // Each invitation is acknowledged (201) with its message queued in the same transaction;
      // the worker delivers within a second, and the kill falls somewhere in that second.
      for (let index = 0; index < MAIL_PER_ROUND; index += 1) {
        const email = `kill-${round}-${index}@demo.test`;
        const response = await fetch(`${base}/users`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', cookie },
          body: JSON.stringify({
            email,
            name: `Kill Test ${round}-${index}`,
            role: 'planner',
            organisationId: 'org-home',
          }),
        });
        expect(response.status, email).toBe(201);
        invited.push(email);
      }
      await new Promise((resolve) => setTimeout(resolve, Math.random() * 1500));
      const before = await fetch(`${base}/outbox/summary`, { headers: { cookie } });
      const waiting = ((await before.json()) as { counts: Record<string, number> }).counts;
      if ((waiting.queued ?? 0) + (waiting.sending ?? 0) > 0) cutWithMailWaiting += 1;
      await kill(server);
      server = await startServerProcess(dataDir, port, { FROM_SOURCES: '1' });
    }

    // After the last restart the queue drains: nothing queued, sending or failed is left.
    let counts: Record<string, number> = {};
    for (let wait = 0; wait < 200; wait += 1) {
      const summary = await fetch(`${base}/outbox/summary`, { headers: { cookie } });
      counts = ((await summary.json()) as { counts: Record<string, number> }).counts;
      if (counts.queued === 0 && counts.sending === 0 && counts.failed === 0) break;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    await kill(server);
    expect(counts).toMatchObject({ queued: 0, sending: 0, failed: 0, 'needs-attention': 0 });
    // Besides the invitations, each start's first scheduler tick may queue the planners' daily
    // reminders (once a day, whatever the restarts): every message was sent, the invitations once.
    const db = new Database(path.join(dataDir, 'emberline.sqlite'));
    const kinds = Object.fromEntries(
      (
        db.prepare('SELECT kind, count(*) AS n FROM outbox_messages GROUP BY kind').all() as {
          kind: string;
          n: number;
        }[]
      ).map((row) => [row.kind, row.n]),
    );
    expect(kinds.invitation).toBe(invited.length);
    expect(counts.sent).toBe(Object.values(kinds).reduce((sum, n) => sum + n, 0));
    expect(
      kinds.reminder ?? 0,
      'reminders: one digest, at most one e-mail an engine',
    ).toBeLessThanOrEqual(11);

    const caught = fs
      .readdirSync(path.join(dataDir, 'mail'))
      .filter((name) => name.endsWith('.json'))
      .map(
        (name) =>
          JSON.parse(fs.readFileSync(path.join(dataDir, 'mail', name), 'utf8')) as { to: string[] },
      );
    const received = (email: string) => caught.filter((item) => item.to.includes(email)).length;
    for (const email of invited) expect(received(email), email).toBeGreaterThanOrEqual(1);
    const repeated = invited.reduce((sum, email) => sum + received(email) - 1, 0);
    console.log(
      `kill test (mail): ${MAIL_ROUNDS} kills (${cutWithMailWaiting} with messages still waiting), ${invited.length} messages queued, all sent, ${repeated} delivered twice`,
    );
    expect(cutWithMailWaiting, 'kills that fell while messages waited').toBeGreaterThan(0);
    expect(repeated, 'messages delivered twice').toBeLessThanOrEqual(MAIL_ROUNDS);

    expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    db.close();
  });
});

describe('signatures survive a killed server', () => {
  it(`keeps the chain whole through ${SIGNING_ROUNDS} kills during signing: each signature all there or not at all`, async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-kill-sign-'));
    const port = await freePort();
    const base = `http://127.0.0.1:${port}/api/v1`;
    let server = await startServerProcess(dataDir, port, { FROM_SOURCES: '1' });
    const inspector = await signInCookie(base, 'inspector@demo.test');
    const post = (url: string, cookie: string, body: unknown) =>
      fetch(`${base}${url}`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', cookie },
        body: JSON.stringify(body),
      });

    // A submitted inspection with one finding, recorded by the inspector.
    const opened = await post('/inspections', inspector, {
      engineId: 'engine-d0101',
      date: '2026-05-20',
      reason: 'scheduled',
      csn: 14_125,
      tsn: 22_600,
      inspectorName: 'Tobias Rennick',
      qualificationRef: 'BSI-L2-0457',
      qualificationExpiresOn: '2030-03-31',
      probe: 'Demo probe VX-6 s/n 118',
      probeCalibrationDueOn: '2030-09-30',
      rows: ['hpt1-ngv'],
    });
    const inspectionId = ((await opened.json()) as { id: string }).id;
    const form = new FormData();
    const jpeg = await sharp({
      create: { width: 800, height: 600, channels: 3, background: { r: 90, g: 60, b: 30 } },
    })
      .jpeg()
      .toBuffer();
    form.append('files', new Blob([jpeg], { type: 'image/jpeg' }), 'still.jpg');
    const uploaded = await fetch(`${base}/inspections/${inspectionId}/images`, {
      method: 'POST',
      headers: { cookie: inspector },
      body: form,
    });
    const imageId = ((await uploaded.json()) as { images: { id: string }[] }).images[0]!.id;
    const recorded = await post(`/inspections/${inspectionId}/findings`, inspector, {
      imageId,
      shape: {
        kind: 'polyline',
        points: [
          [100, 300],
          [140, 300],
        ],
      },
      calibration: { kind: 'reference', p1: [100, 100], p2: [500, 100], lengthMm: 10 },
      row: 'hpt1-ngv',
      position: 4,
      zone: 'leading-edge',
      damage: 'crack',
      method: 'image',
    });
    const findingId = ((await recorded.json()) as { id: string }).id;
    await fetch(`${base}/inspections/${inspectionId}/coverage/hpt1-ngv`, {
      method: 'PUT',
      headers: { 'Content-Type': 'application/json', cookie: inspector },
      body: JSON.stringify({
        status: 'full',
        viewedPositions: [],
        noDamageFound: false,
        reason: '',
      }),
    });
    const detail = await fetch(`${base}/inspections/${inspectionId}`, {
      headers: { cookie: inspector },
    });
    for (const flag of ((await detail.json()) as { flags: { code: string }[] }).flags)
      await post(`/inspections/${inspectionId}/flags/${flag.code}/acknowledgement`, inspector, {
        note: 'Checked against the engine log book',
      });
    const submitted = await post(`/inspections/${inspectionId}/submission`, inspector, {});
    if (submitted.status !== 200) await kill(server);
    expect(submitted.status).toBe(200);

    let engineer = await signInCookie(base, 'engineer@demo.test');
    const review = async () =>
      (await (
        await fetch(`${base}/inspections/${inspectionId}/dispositions`, {
          headers: { cookie: engineer },
        })
      ).json()) as { items: { id: string; current: boolean }[] };
    let acknowledged = 0;
    let cut = 0;
    for (let round = 0; round < SIGNING_ROUNDS; round += 1) {
      const current = (await review()).items.find((item) => item.current) ?? null;
      // A first disposition, then corrections of the current one: each a signature, each
      // answered only once its disposition, its signature and its audit row are committed.
      const signing = post(`/findings/${findingId}/dispositions`, engineer, {
        decision: { kind: 'serviceable' },
        rationale: `Round ${round}`,
        supersedesId: current?.id ?? null,
        supersedeReason: current ? `Corrected in round ${round}` : null,
        password: 'emberline-demo',
      }).then(
        (response) => (response.status === 201 ? 'signed' : `answered ${response.status}`),
        () => 'cut',
      );
      // The password check alone takes tens of milliseconds: kills fall before, during and after.
      await new Promise((resolve) => setTimeout(resolve, Math.random() * (round % 2 ? 500 : 80)));
      await kill(server);
      const outcome = await signing;
      if (outcome === 'signed') acknowledged += 1;
      else if (outcome === 'cut') cut += 1;
      else throw new Error(`round ${round}: the signature ${outcome}`);
      server = await startServerProcess(dataDir, port, { FROM_SOURCES: '1' });
      engineer = await signInCookie(base, 'engineer@demo.test');
    }

    // Every acknowledged signature is there; the chain is whole; exactly one disposition is current.
    const admin = await signInCookie(base, 'admin@demo.test');
    const verification = (await (
      await fetch(`${base}/records/verification`, { headers: { cookie: admin } })
    ).json()) as { ok: boolean; checked: { signatures: number }; problems: unknown[] };
    const items = (await review()).items;
    await kill(server);
    console.log(
      `kill test (signing): ${SIGNING_ROUNDS} kills, ${acknowledged} signatures answered, ${cut} cut, ${items.length} kept, chain ${verification.ok ? 'whole' : 'BROKEN'}`,
    );
    expect(verification.problems).toEqual([]);
    expect(verification.ok).toBe(true);
    expect(items.length).toBeGreaterThanOrEqual(acknowledged);
    expect(items.length).toBeLessThanOrEqual(SIGNING_ROUNDS);
    expect(verification.checked.signatures).toBe(items.length);
    expect(items.filter((item) => item.current)).toHaveLength(1);
    expect(cut, 'kills that fell during a signature').toBeGreaterThan(0);

    const db = new Database(path.join(dataDir, 'emberline.sqlite'));
    expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    db.close();
  });
});
