import { execFileSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, describe, expect, it } from 'vitest';
import {
  freePort,
  openInspectionOverHttp,
  signInCookie,
  startServerProcess,
} from '../../scripts/lib/server-process';

// QUALITY §3: a full disk for real, on a small tmpfs holding the whole data directory. Mounting
// needs root and a kernel that allows it; where the machine refuses, this variant says so and is
// skipped. The same fault injected at the storage interface always runs (server tests:
// modules/images/storage-full.int.test.ts).
const mountPoint = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-tmpfs-'));
let refusal: string | null = null;
try {
  execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=40m', 'tmpfs', mountPoint], { stdio: 'pipe' });
} catch (error) {
  refusal = String((error as { stderr?: Buffer }).stderr ?? error).trim() || 'mount failed';
  console.warn(
    `The full-disk test on a tmpfs is skipped: this machine refused to mount one (${refusal}).`,
  );
}

let server: ChildProcess | null = null;
afterAll(async () => {
  if (server && server.exitCode === null)
    await new Promise<void>((resolve) => {
      server!.once('exit', () => resolve());
      server!.kill('SIGKILL');
    });
  if (!refusal) execFileSync('umount', [mountPoint]);
});

const noisy = (shade: number) =>
  sharp({
    create: {
      width: 1600,
      height: 1200,
      channels: 3,
      background: '#000',
      noise: { type: 'gaussian', mean: shade, sigma: 40 },
    },
  })
    .jpeg({ quality: 95 })
    .toBuffer();

describe('a full disk under the data directory', () => {
  it.skipIf(refusal !== null)(
    'answers an upload 507, leaves nothing of it, keeps serving, and takes uploads again once there is room',
    async () => {
      const dataDir = path.join(mountPoint, 'data');
      fs.mkdirSync(dataDir);
      const port = await freePort();
      const base = `http://127.0.0.1:${port}/api/v1`;
      server = await startServerProcess(dataDir, port, { FROM_SOURCES: '1' });
      const cookie = await signInCookie(base, 'inspector@demo.test');
      const inspectionId = await openInspectionOverHttp(base, cookie, {
        inspectorName: 'Disk Test',
      });
      const upload = async (data: Buffer, name: string) => {
        const form = new FormData();
        form.append('files', new Blob([new Uint8Array(data)], { type: 'image/jpeg' }), name);
        return fetch(`${base}/inspections/${inspectionId}/images`, {
          method: 'POST',
          headers: { cookie },
          body: form,
        });
      };
      const first = await upload(await noisy(90), 'before.jpg');
      expect(first.status).toBe(201);
      const stored = ((await first.json()) as { images: { id: string }[] }).images[0]!.id;

      // Fill the disk but for 256 KB: less than the next still (about 1.5 MB).
      const filler = path.join(mountPoint, 'filler');
      const free = () => {
        const stats = fs.statfsSync(mountPoint);
        return stats.bavail * stats.bsize;
      };
      fs.writeFileSync(filler, Buffer.alloc(Math.max(0, free() - 256 * 1024)));
      const refused = await upload(await noisy(150), 'while-full.jpg');
      expect(refused.status).toBe(507);
      const body = (await refused.json()) as { error: { code: string; message: string } };
      expect(body.error.code).toBe('storage_full');
      expect(body.error.message).toMatch(/^The server's storage is full/);
      expect(fs.readdirSync(path.join(dataDir, 'images', 'tmp'))).toEqual([]);

      // Still up and serving what it has.
      expect((await fetch(`${base}/health`)).status).toBe(200);
      const thumbnail = await fetch(`${base}/images/${stored}/thumbnail`, { headers: { cookie } });
      expect(thumbnail.status).toBe(200);
      const detail = await fetch(`${base}/inspections/${inspectionId}`, { headers: { cookie } });
      expect(((await detail.json()) as { images: unknown[] }).images).toHaveLength(1);

      fs.rmSync(filler);
      expect((await upload(await noisy(150), 'with-room.jpg')).status).toBe(201);
    },
    120_000,
  );
});
