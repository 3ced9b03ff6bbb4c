import type { ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startS3Fake, type S3Fake } from '../../apps/server/test/s3-fake';
import {
  freePort,
  runCommand,
  signInCookie,
  startServerProcess,
} from '../../scripts/lib/server-process';

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

async function stop(server: ChildProcess): Promise<void> {
  await new Promise<void>((resolve) => {
    server.once('exit', () => resolve());
    server.kill('SIGKILL');
  });
}

/** Every image of the inspections an engineer sees, with the hash of its original. */
async function imagesOf(base: string, cookie: string) {
  const list = (await (await fetch(`${base}/inspections`, { headers: { cookie } })).json()) as {
    items: { id: string }[];
  };
  const found: { id: string; sha256: string }[] = [];
  for (const { id } of list.items) {
    const detail = (await (
      await fetch(`${base}/inspections/${id}`, { headers: { cookie } })
    ).json()) as { images: { id: string; sha256: string }[] };
    found.push(...detail.images.map((image) => ({ id: image.id, sha256: image.sha256 })));
  }
  return found;
}

describe('pnpm migrate-storage', () => {
  let s3: S3Fake;
  beforeAll(async () => {
    s3 = await startS3Fake('emberline-migrate');
  });
  afterAll(() => s3.close());

  it("moves the demo's originals to a bucket, checked by hash, and the product serves them from there", async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-migrate-'));
    const port = await freePort();
    const base = `http://127.0.0.1:${port}/api/v1`;
    // The demo with its invented stills, on the data directory.
    let server = await startServerProcess(dataDir, port, { FROM_SOURCES: '1', DEMO_IMAGES: '1' });
    const images = await imagesOf(base, await signInCookie(base, 'engineer@demo.test'));
    await stop(server);
    expect(images.length).toBeGreaterThan(0);
    const onDisk = new Set(images.map((image) => image.sha256));

    const refused = await runCommand('apps/server/src/cli/migrate-storage.ts', [], dataDir);
    expect(refused.code).toBe(1);
    expect(refused.output).toMatch(/Name the bucket to copy into: STORAGE=s3/);

    const moved = await runCommand('apps/server/src/cli/migrate-storage.ts', [], dataDir, s3.env);
    expect(moved.code, moved.output).toBe(0);
    expect(moved.output).toContain(`Copied ${onDisk.size} original images`);
    const inBucket = await s3.objects(`${s3.env.S3_PREFIX}originals/`);
    expect(new Set(inBucket.keys())).toEqual(onDisk);
    for (const [name, bytes] of inBucket) expect(sha256(bytes)).toBe(name);

    // Again: nothing copied twice, everything checked.
    const again = await runCommand('apps/server/src/cli/migrate-storage.ts', [], dataDir, s3.env);
    expect(again.code, again.output).toBe(0);
    expect(again.output).toContain(
      `Copied 0 original images from the data directory (${path.join(dataDir, 'images')}) to the bucket ${s3.bucket} under ${s3.env.S3_PREFIX} at ${s3.env.S3_ENDPOINT}; ${onDisk.size} were there already.`,
    );

    // With the files gone from disk, the product serves every image from the bucket, and the
    // signed originals still verify.
    fs.rmSync(path.join(dataDir, 'images'), { recursive: true });
    server = await startServerProcess(dataDir, port, {
      FROM_SOURCES: '1',
      DEMO_IMAGES: '1',
      ...s3.env,
    });
    try {
      const cookie = await signInCookie(base, 'engineer@demo.test');
      for (const image of images) {
        const original = await fetch(`${base}/images/${image.id}/original`, {
          headers: { cookie },
        });
        expect(original.status).toBe(200);
        expect(sha256(Buffer.from(await original.arrayBuffer()))).toBe(image.sha256);
      }
      const full = await fetch(`${base}/images/${images[0]!.id}/full`, { headers: { cookie } });
      expect(full.status).toBe(200);
      expect(full.headers.get('content-type')).toBe('image/jpeg');
      expect(Buffer.from(await full.arrayBuffer()).subarray(0, 2)).toEqual(
        Buffer.from([0xff, 0xd8]),
      );
      const admin = await signInCookie(base, 'admin@demo.test');
      const verification = (await (
        await fetch(`${base}/records/verification`, { headers: { cookie: admin } })
      ).json()) as { ok: boolean; checked: { originals: number } };
      expect(verification.ok).toBe(true);
      expect(verification.checked.originals).toBeGreaterThan(0);
      expect(fs.existsSync(path.join(dataDir, 'images', 'originals'))).toBe(false);
    } finally {
      await stop(server);
    }
  }, 180_000);
});
