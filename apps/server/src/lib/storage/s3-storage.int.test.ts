import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeDataDir, startTestApp, demoAccounts } from '../../../test/test-app';
import { openInspection, still } from '../../../test/inspection-fixtures';
import { startS3Fake, type S3Fake } from '../../../test/s3-fake';
import { takeServerErrors } from '../../../test/server-log';
import { loadConfig, type S3StorageConfig } from '../../config/env';
import { sha256OfStream } from './image-storage';
import { createS3Storage } from './s3-storage';

let s3: S3Fake;
beforeAll(async () => {
  s3 = await startS3Fake();
});
afterAll(() => s3.close());

const configOf = (prefix: string): S3StorageConfig => {
  const config = loadConfig({ DATA_DIR: makeDataDir(), ...s3.env, S3_PREFIX: prefix }).storage;
  if (config.kind !== 's3') throw new Error('STORAGE=s3 did not make an S3 configuration');
  return config;
};

describe('image storage on an S3 protocol server', () => {
  it('stores a 20 MB original in parts under its hash, reads it back whole, and leaves no temp file', async () => {
    const storage = await createS3Storage(makeDataDir(), configOf('parts/'));
    const bytes = randomBytes(20 * 1024 * 1024);
    const temp = await storage.writeTemp(bytes);
    const sha256 = await storage.hash(temp);
    await storage.commitOriginal(temp, sha256);
    expect(fs.existsSync(temp)).toBe(false);
    expect(await storage.hashOriginal(sha256)).toBe(sha256);
    const opened = await storage.openOriginal(sha256);
    expect(opened?.size).toBe(bytes.length);
    opened?.stream.destroy();
    // sharp and the records check read a file on this disk: a download, removed afterwards.
    let downloaded = '';
    const hashed = await storage.withOriginalFile(sha256, async (file) => {
      downloaded = file;
      return sha256OfStream(fs.createReadStream(file));
    });
    expect(hashed).toBe(sha256);
    expect(fs.existsSync(downloaded)).toBe(false);
    expect(await storage.openOriginal('0'.repeat(64))).toBeNull();
    expect(await storage.hashOriginal('0'.repeat(64))).toBeNull();
    const listed: string[] = [];
    for await (const hash of storage.originals()) listed.push(hash);
    expect(listed).toEqual([sha256]);
  });

  it('moves to quarantine only old objects of its own prefix that no row or signature names', async () => {
    let now = new Date();
    const config = { ...configOf('sweep/'), quarantineAfterMs: 3_600_000 };
    const storage = await createS3Storage(makeDataDir(), config, () => now);
    const neighbour = await createS3Storage(makeDataDir(), configOf('neighbour/'));
    const put = async (target: typeof storage, label: string) => {
      const temp = await target.writeTemp(Buffer.from(label));
      const sha256 = await target.hash(temp);
      await target.commitOriginal(temp, sha256);
      return sha256;
    };
    const named = await put(storage, 'a row names me');
    const signed = await put(storage, 'a signature names me');
    const orphan = await put(storage, 'nobody names me');
    const theirs = await put(neighbour, 'another installation');
    const known = (sha256: string) => sha256 === named || sha256 === signed;

    // An hour's grace: what an upload under way put there a moment ago stays.
    expect(await storage.sweep(known)).toEqual({ removed: 0, quarantined: 0 });
    now = new Date(now.getTime() + 2 * 3_600_000);
    expect(await storage.sweep(known)).toEqual({ removed: 0, quarantined: 1 });

    expect(await storage.hashOriginal(named)).toBe(named);
    expect(await storage.hashOriginal(signed)).toBe(signed);
    expect(await storage.openOriginal(orphan)).toBeNull();
    expect(await neighbour.hashOriginal(theirs)).toBe(theirs);
    const quarantine = await storage.client.send(
      new ListObjectsV2Command({ Bucket: s3.bucket, Prefix: 'sweep/quarantine/' }),
    );
    expect(quarantine.Contents?.map((object) => object.Key)).toEqual([
      `sweep/quarantine/originals/${orphan.slice(0, 2)}/${orphan}`,
    ]);
  });

  it('answers an upload 503 while the store cannot be reached, and keeps nothing of it', async () => {
    const own = await startS3Fake('emberline-outage');
    const t = await startTestApp({ env: own.env });
    try {
      const inspector = await t.signIn(demoAccounts.inspector);
      const inspectionId = await openInspection(t.app, inspector, {
        engineId: 'engine-d0101',
        date: '2026-05-20',
        csn: 14_125,
        rows: ['hpt1-blade'],
      });
      await own.close();
      const image = await still(320, 240);
      const response = await request(t.app)
        .post(`/api/v1/inspections/${inspectionId}/images`)
        .set('Cookie', inspector)
        .attach('files', image, { filename: 'outage.jpg', contentType: 'image/jpeg' });
      expect(response.status).toBe(503);
      expect(response.body.error.code).toBe('storage_unavailable');
      expect(response.body.error.message).toMatch(/image store cannot be reached/);
      expect(fs.readdirSync(t.runtime.ctx.storage.tempDir)).toEqual([]);
      const detail = await request(t.app)
        .get(`/api/v1/inspections/${inspectionId}`)
        .set('Cookie', inspector);
      expect(detail.body.images).toEqual([]);
      // The operator's log says what failed, with the store's own words.
      expect(
        takeServerErrors().map(
          (line) => (line.err as { message?: string } | undefined)?.message ?? '',
        ),
      ).toContainEqual(expect.stringMatching(/The image store failed to .*ECONNREFUSED/));
    } finally {
      await t.close();
    }
  });

  it('refuses STORAGE=s3 without a bucket, in words', () => {
    expect(() => loadConfig({ DATA_DIR: makeDataDir(), STORAGE: 's3' })).toThrow(
      /S3_BUCKET is needed when STORAGE=s3/,
    );
    expect(path.isAbsolute(makeDataDir())).toBe(true);
  });
});
