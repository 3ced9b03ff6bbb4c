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
  runCommand,
  signInCookie,
  startServerProcess,
} from '../../scripts/lib/server-process';

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

function tableCounts(file: string): Record<string, number> {
  const database = new Database(file, { readonly: true });
  try {
    const tables = database
      .prepare(
        "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE '__drizzle%'",
      )
      .all() as { name: string }[];
    return Object.fromEntries(
      tables.map(({ name }) => [
        name,
        (database.prepare(`SELECT count(*) AS n FROM "${name}"`).get() as { n: number }).n,
      ]),
    );
  } finally {
    database.close();
  }
}

// On the data directory, and on an S3 protocol fake's bucket: the backup reads the bucket, and the
// restore puts the images into the bucket under a prefix of its own.
describe.each(['local', 's3'] as const)('pnpm backup and pnpm restore on %s storage', (kind) => {
  let s3: S3Fake | null = null;
  beforeAll(async () => {
    s3 = kind === 's3' ? await startS3Fake('emberline-backup') : null;
  });
  afterAll(() => s3?.close());

  it('back up while uploads run, and restore a whole, verified copy', async () => {
    const sourceEnv = s3?.env ?? {};
    const restoredEnv: Record<string, string> = s3 ? { ...s3.env, S3_PREFIX: 'restored/' } : {};
    const command = (script: string, args: string[], dataDir: string, env = sourceEnv) =>
      runCommand(script, args, dataDir, env);
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-backup-source-'));
    const port = await freePort();
    const base = `http://127.0.0.1:${port}/api/v1`;
    const server = await startServerProcess(dataDir, port, { FROM_SOURCES: '1', ...sourceEnv });
    const backupDir = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-backups-')), 'b1');
    const restoredDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-restored-'));
    let inspectionId = '';
    try {
      const cookie = await signInCookie(base, 'inspector@demo.test');
      inspectionId = await openInspectionOverHttp(base, cookie, {
        inspectorName: 'Backup Test',
      });
      const acknowledged: string[] = [];
      let uploading = true;
      const uploader = async (lane: number) => {
        for (let round = 0; uploading; round += 1) {
          const data = await sharp({
            create: {
              width: 1200,
              height: 900,
              channels: 3,
              background: '#000',
              noise: { type: 'gaussian', mean: 60 + lane * 50 + (round % 40), sigma: 25 + round },
            },
          })
            .jpeg()
            .toBuffer();
          const form = new FormData();
          form.append(
            'files',
            new Blob([new Uint8Array(data)], { type: 'image/jpeg' }),
            `l${lane}-${round}.jpg`,
          );
          const answer = await fetch(`${base}/inspections/${inspectionId}/images`, {
            method: 'POST',
            headers: { cookie },
            body: form,
          });
          if (answer.status === 201) acknowledged.push(sha256(data));
        }
      };
      const uploads = Promise.all([uploader(0), uploader(1)]);
      while (acknowledged.length < 4) await new Promise((resolve) => setTimeout(resolve, 50));
      const before = acknowledged.length;
      const backedUp = await command('apps/server/src/cli/backup.ts', [backupDir], dataDir);
      const after = acknowledged.length;
      uploading = false;
      await uploads;
      expect(backedUp.code, backedUp.output).toBe(0);
      expect(backedUp.output).toMatch(/^Backed up .* original images/m);

      const manifest = JSON.parse(
        fs.readFileSync(path.join(backupDir, 'manifest.json'), 'utf8'),
      ) as {
        rowCounts: Record<string, number>;
        images: { sha256: string }[];
      };
      // Every upload acknowledged before the backup began is in it; none after it ended.
      const inBackup = new Set(manifest.images.map((image) => image.sha256));
      for (const hash of acknowledged.slice(0, before)) expect(inBackup.has(hash)).toBe(true);
      expect(manifest.images.length).toBeLessThanOrEqual(after);

      // A changed byte in the backup is found before anything is restored.
      const tampered = path.join(path.dirname(backupDir), 'tampered');
      fs.cpSync(backupDir, tampered, { recursive: true });
      const image = path.join(
        tampered,
        'images',
        'originals',
        manifest.images[0]!.sha256.slice(0, 2),
        manifest.images[0]!.sha256,
      );
      const bytes = fs.readFileSync(image);
      bytes.writeUInt8(bytes.readUInt8(bytes.length - 10) ^ 0xff, bytes.length - 10);
      fs.writeFileSync(image, bytes);
      const refusedDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-refused-'));
      const refused = await command(
        'apps/server/src/cli/restore.ts',
        [tampered],
        refusedDir,
        restoredEnv,
      );
      expect(refused.code).toBe(1);
      expect(refused.output).toMatch(/is not the one its manifest names/);
      expect(fs.existsSync(path.join(refusedDir, 'emberline.sqlite'))).toBe(false);

      if (s3) {
        // The backup took the bucket's originals into its own folder.
        const inBucket = await s3.objects(`${s3.env.S3_PREFIX}originals/`);
        for (const { sha256: hash } of manifest.images) expect(inBucket.has(hash)).toBe(true);
      }
      const restored = await command(
        'apps/server/src/cli/restore.ts',
        [backupDir],
        restoredDir,
        restoredEnv,
      );
      expect(restored.code, restored.output).toBe(0);
      expect(restored.output).toMatch(/Both chains check out/);
      expect(tableCounts(path.join(restoredDir, 'emberline.sqlite'))).toEqual(manifest.rowCounts);
      const restoredOriginals = s3
        ? await s3.objects('restored/originals/')
        : new Map(
            manifest.images.map(({ sha256: hash }) => [
              hash,
              fs.readFileSync(
                path.join(restoredDir, 'images', 'originals', hash.slice(0, 2), hash),
              ),
            ]),
          );
      expect(restoredOriginals.size).toBe(manifest.images.length);
      for (const { sha256: hash } of manifest.images)
        expect(sha256(restoredOriginals.get(hash)!)).toBe(hash);
      // A second restore into the same place is refused: nothing is overwritten.
      const again = await command(
        'apps/server/src/cli/restore.ts',
        [backupDir],
        restoredDir,
        restoredEnv,
      );
      expect(again.code).toBe(1);
      expect(again.output).toMatch(/already holds a database/);
    } finally {
      await new Promise<void>((resolve) => {
        server.once('exit', () => resolve());
        server.kill('SIGKILL');
      });
    }

    // The restored installation starts and serves its images.
    const restoredPort = await freePort();
    const restoredServer = await startServerProcess(restoredDir, restoredPort, {
      FROM_SOURCES: '1',
      ...restoredEnv,
    });
    try {
      const restoredBase = `http://127.0.0.1:${restoredPort}/api/v1`;
      const cookie = await signInCookie(restoredBase, 'inspector@demo.test');
      const list = await fetch(`${restoredBase}/inspections`, { headers: { cookie } });
      expect(list.status).toBe(200);
      const detail = (await (
        await fetch(`${restoredBase}/inspections/${inspectionId}`, { headers: { cookie } })
      ).json()) as { images: { id: string; sha256: string }[] };
      const image = detail.images[0]!;
      const original = await fetch(`${restoredBase}/images/${image.id}/original`, {
        headers: { cookie },
      });
      expect(original.status).toBe(200);
      expect(sha256(Buffer.from(await original.arrayBuffer()))).toBe(image.sha256);
    } finally {
      await new Promise<void>((resolve) => {
        restoredServer.once('exit', () => resolve());
        restoredServer.kill('SIGKILL');
      });
    }
  }, 180_000);
});
