import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';

/**
 * Where image originals and cached full renditions live: content-addressed files under the data
 * directory. It is the one module that writes them, behind an interface an object store could take.
 */
export interface ImageStorage {
  tempDir: string;
  /** Streams an upload into a new temp file, hashing it on the way: one pass over the bytes. */
  receive(stream: NodeJS.ReadableStream): Promise<{ path: string; size: number; sha256: string }>;
  /** Writes bytes to a new temp file (for images made on the server, such as the demo's). */
  writeTemp(data: Buffer): Promise<string>;
  /** Hashes a finished temp file (SHA-256 of its bytes). */
  hash(tempFile: string): Promise<string>;
  /** Moves a temp file to its content address: fsync, then rename. Idempotent for the same hash. */
  commitOriginal(tempFile: string, sha256: string): Promise<void>;
  originalPath(sha256: string): string;
  fullPath(sha256: string): string;
  /** Whether a file of the storage is there (a full rendition is made on first request). */
  exists(file: string): Promise<boolean>;
  discard(file: string): Promise<void>;
  /** Removes temp files, and originals and full renditions whose hash no record names. */
  sweep(known: (sha256: string) => boolean): Promise<{ removed: number }>;
}

async function fsyncFile(file: string): Promise<void> {
  const handle = await fs.open(file, 'r+');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

async function fsyncDirectory(directory: string): Promise<void> {
  const handle = await fs.open(directory, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

export async function createLocalStorage(dataDir: string): Promise<ImageStorage> {
  const root = path.join(dataDir, 'images');
  const tempDir = path.join(root, 'tmp');
  const originals = path.join(root, 'originals');
  const full = path.join(root, 'full');
  await Promise.all(
    [tempDir, originals, full].map((directory) => fs.mkdir(directory, { recursive: true })),
  );
  const shard = (base: string, sha256: string, suffix = '') =>
    path.join(base, sha256.slice(0, 2), `${sha256}${suffix}`);

  return {
    tempDir,
    receive(stream) {
      const file = path.join(tempDir, tempName());
      const hash = createHash('sha256');
      let size = 0;
      return new Promise((resolve, reject) => {
        const out = createWriteStream(file);
        // A cut connection or a failed write leaves nothing of the file behind.
        const fail = (error: Error) => {
          out.destroy();
          fs.rm(file, { force: true }).then(
            () => reject(error),
            () => reject(error),
          );
        };
        stream.on('data', (chunk: Buffer) => {
          hash.update(chunk);
          size += chunk.length;
        });
        stream.on('error', fail);
        out.on('error', fail);
        out.on('finish', () => resolve({ path: file, size, sha256: hash.digest('hex') }));
        stream.pipe(out);
      });
    },
    async writeTemp(data) {
      const file = path.join(tempDir, tempName());
      await fs.writeFile(file, data);
      return file;
    },
    hash(tempFile) {
      return new Promise((resolve, reject) => {
        const hash = createHash('sha256');
        createReadStream(tempFile)
          .on('data', (chunk) => hash.update(chunk))
          .on('error', reject)
          .on('end', () => resolve(hash.digest('hex')));
      });
    },
    async commitOriginal(tempFile, sha256) {
      const target = shard(originals, sha256);
      try {
        await fs.access(target);
        await fs.rm(tempFile, { force: true });
        return;
      } catch {
        // not stored yet
      }
      await fs.mkdir(path.dirname(target), { recursive: true });
      await fsyncFile(tempFile);
      await fs.rename(tempFile, target);
      await fsyncDirectory(path.dirname(target));
    },
    originalPath: (sha256) => shard(originals, sha256),
    fullPath: (sha256) => shard(full, sha256, '.jpg'),
    async exists(file) {
      try {
        await fs.access(file);
        return true;
      } catch {
        return false;
      }
    },
    async discard(file) {
      await fs.rm(file, { force: true });
    },
    async sweep(known) {
      let removed = 0;
      for (const name of await fs.readdir(tempDir)) {
        await fs.rm(path.join(tempDir, name), { force: true, recursive: true });
        removed += 1;
      }
      for (const base of [originals, full]) {
        for (const prefix of await fs.readdir(base)) {
          const directory = path.join(base, prefix);
          for (const name of await fs.readdir(directory)) {
            const sha256 = name.replace(/\..*$/, '');
            if (/^[0-9a-f]{64}$/.test(sha256) && known(sha256) && !name.includes('.tmp')) continue;
            await fs.rm(path.join(directory, name), { force: true });
            removed += 1;
          }
        }
      }
      return { removed };
    },
  };
}

/** A server-chosen name for a temp upload; the client's file name is never a path. */
export function tempName(): string {
  return `upload-${Date.now()}-${randomBytes(8).toString('hex')}`;
}
