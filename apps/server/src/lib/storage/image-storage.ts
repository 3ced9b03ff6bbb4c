import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';

/** A stored object opened for reading. */
export interface StoredBytes {
  stream: Readable;
  size: number;
}

/**
 * Where image originals and full renditions live, by the SHA-256 of their bytes: the data
 * directory (local-storage.ts) or an S3-compatible bucket (s3-storage.ts). Uploads always arrive
 * in a temp folder on the server's disk first, where they are hashed and decoded; an original is
 * committed to its content address before the row that names it commits. Thumbnails and previews
 * are not here: they live in SQLite beside their row.
 */
export interface ImageStorage extends TempArea {
  /** Where the bytes are, in words, for logs and messages. */
  where: string;
  /** Puts a temp file at the original's address and removes the temp file. Idempotent. */
  commitOriginal(tempFile: string, sha256: string): Promise<void>;
  /** Puts a rendered temp file at the full rendition's address of an original. Idempotent. */
  commitFull(tempFile: string, sha256: string): Promise<void>;
  /** The original's bytes; null when there are none. */
  openOriginal(sha256: string): Promise<StoredBytes | null>;
  /** The full rendition's bytes; null until one has been committed. */
  openFull(sha256: string): Promise<StoredBytes | null>;
  /** Runs `use` with a file on this disk holding the original (a download for a bucket). */
  withOriginalFile<T>(sha256: string, use: (file: string) => Promise<T>): Promise<T>;
  /** The SHA-256 of the stored original's bytes; null when it is missing. */
  hashOriginal(sha256: string): Promise<string | null>;
  /** The hashes of every stored original, in no particular order. */
  originals(): AsyncIterable<string>;
  /**
   * Empties the temp folder and takes away originals and renditions whose hash `known` does not
   * name: removed from the disk, or moved to a quarantine prefix of the bucket.
   */
  sweep(known: (sha256: string) => boolean): Promise<{ removed: number; quarantined: number }>;
}

/** The server-side folder where uploads and renders are written before they are committed. */
export interface TempArea {
  tempDir: string;
  /** Streams an upload into a new temp file, hashing it on the way: one pass over the bytes. */
  receive(stream: NodeJS.ReadableStream): Promise<{ path: string; size: number; sha256: string }>;
  /** Writes bytes to a new temp file (for images made on the server, such as the demo's). */
  writeTemp(data: Buffer): Promise<string>;
  /** A new, unused temp file name (for a render to write to). */
  tempFile(suffix?: string): string;
  /** Hashes a finished temp file (SHA-256 of its bytes). */
  hash(tempFile: string): Promise<string>;
  discard(file: string): Promise<void>;
  /** Removes everything from the temp folder (at start-up, when nothing is under way). */
  clearTemp(): Promise<number>;
}

export const isSha256 = (name: string) => /^[0-9a-f]{64}$/.test(name);

/** SHA-256 of a stream's bytes. */
export async function sha256OfStream(stream: AsyncIterable<unknown>): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of stream) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export async function createTempArea(dataDir: string): Promise<TempArea> {
  const tempDir = path.join(dataDir, 'images', 'tmp');
  await fs.mkdir(tempDir, { recursive: true });
  const tempFile = (suffix = '') => path.join(tempDir, `${tempName()}${suffix}`);
  return {
    tempDir,
    tempFile,
    receive(stream) {
      const file = tempFile();
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
      const file = tempFile();
      await fs.writeFile(file, data);
      return file;
    },
    hash: (file) => sha256OfStream(createReadStream(file)),
    async discard(file) {
      await fs.rm(file, { force: true });
    },
    async clearTemp() {
      const names = await fs.readdir(tempDir);
      for (const name of names)
        await fs.rm(path.join(tempDir, name), { force: true, recursive: true });
      return names.length;
    },
  };
}

/** A server-chosen name for a temp upload; the client's file name is never a path. */
export function tempName(): string {
  return `upload-${Date.now()}-${randomBytes(8).toString('hex')}`;
}

/** The object store did not do what was asked (unreachable, refused, failed): nothing was kept. */
export class StorageUnavailable extends Error {
  override name = 'StorageUnavailable';
  readonly code = 'STORAGE_UNAVAILABLE';
}
