import { createReadStream, createWriteStream } from 'node:fs';
import fs from 'node:fs/promises';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import {
  CopyObjectCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  S3Client,
  type _Object,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import type { S3StorageConfig } from '../../config/env';
import {
  createTempArea,
  isSha256,
  sha256OfStream,
  StorageUnavailable,
  type ImageStorage,
  type StoredBytes,
} from './image-storage';

const notFound = (error: unknown) => {
  const e = error as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e.name === 'NoSuchKey' || e.name === 'NotFound' || e.$metadata?.httpStatusCode === 404;
};

/** An SDK call; anything but "no such key" becomes a StorageUnavailable that says what failed. */
async function call<T>(what: string, run: () => Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (error) {
    if (notFound(error)) throw error;
    throw new StorageUnavailable(`The image store failed to ${what}: ${(error as Error).message}`, {
      cause: error,
    });
  }
}

/**
 * Originals and full renditions in an S3-compatible bucket, every key under the installation's
 * prefix: `originals/ab/ab12…`, `full/ab/ab12….jpg`, and `quarantine/…` for what the sweeper took
 * away. Uploads still arrive, are hashed and decoded in the temp folder on the server's disk.
 */
export async function createS3Storage(
  dataDir: string,
  config: S3StorageConfig,
  now: () => Date = () => new Date(),
): Promise<ImageStorage & { client: S3Client }> {
  const temp = await createTempArea(dataDir);
  const client = new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    forcePathStyle: config.forcePathStyle,
    credentials: config.credentials,
  });
  const { bucket, prefix } = config;
  const originalKey = (sha256: string) => `${prefix}originals/${sha256.slice(0, 2)}/${sha256}`;
  const fullKey = (sha256: string) => `${prefix}full/${sha256.slice(0, 2)}/${sha256}.jpg`;

  async function exists(key: string): Promise<boolean> {
    try {
      await call(`look for ${key}`, () =>
        client.send(new HeadObjectCommand({ Bucket: bucket, Key: key })),
      );
      return true;
    } catch (error) {
      if (notFound(error)) return false;
      throw error;
    }
  }

  /** Uploads a temp file (in parts when large), then removes it. Content addresses never change. */
  async function commit(tempFile: string, key: string, contentType: string): Promise<void> {
    if (!(await exists(key))) {
      await call(`store ${key}`, () =>
        new Upload({
          client,
          params: {
            Bucket: bucket,
            Key: key,
            Body: createReadStream(tempFile),
            ContentType: contentType,
          },
          partSize: 8 * 1024 * 1024,
          queueSize: 4,
        }).done(),
      );
    }
    await fs.rm(tempFile, { force: true });
  }

  async function open(key: string): Promise<StoredBytes | null> {
    try {
      const response = await call(`read ${key}`, () =>
        client.send(new GetObjectCommand({ Bucket: bucket, Key: key })),
      );
      return { stream: response.Body as Readable, size: response.ContentLength ?? 0 };
    } catch (error) {
      if (notFound(error)) return null;
      throw error;
    }
  }

  async function* list(under: string): AsyncIterable<_Object> {
    let token: string | undefined;
    do {
      const page = await call(`list ${under}`, () =>
        client.send(
          new ListObjectsV2Command({ Bucket: bucket, Prefix: under, ContinuationToken: token }),
        ),
      );
      yield* page.Contents ?? [];
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
  }

  const baseName = (key: string) => key.slice(key.lastIndexOf('/') + 1);

  return {
    ...temp,
    client,
    where: `the bucket ${bucket} under ${prefix || 'its root'}${config.endpoint ? ` at ${config.endpoint}` : ''}`,
    commitOriginal: (tempFile, sha256) =>
      commit(tempFile, originalKey(sha256), 'application/octet-stream'),
    commitFull: (tempFile, sha256) => commit(tempFile, fullKey(sha256), 'image/jpeg'),
    openOriginal: (sha256) => open(originalKey(sha256)),
    openFull: (sha256) => open(fullKey(sha256)),
    async withOriginalFile(sha256, use) {
      const opened = await open(originalKey(sha256));
      if (!opened) throw new StorageUnavailable(`The image store holds no original ${sha256}`);
      const file = temp.tempFile();
      try {
        await call(`read ${originalKey(sha256)}`, () =>
          pipeline(opened.stream, createWriteStream(file)),
        );
        return await use(file);
      } finally {
        await fs.rm(file, { force: true });
      }
    },
    async hashOriginal(sha256) {
      const opened = await open(originalKey(sha256));
      return opened
        ? call(`read ${originalKey(sha256)}`, () => sha256OfStream(opened.stream))
        : null;
    },
    async *originals() {
      for await (const object of list(`${prefix}originals/`)) {
        const name = baseName(object.Key ?? '');
        if (isSha256(name)) yield name;
      }
    },
    async sweep(known) {
      const removed = await temp.clearTemp();
      let quarantined = 0;
      const before = now().getTime() - config.quarantineAfterMs;
      for (const area of ['originals/', 'full/']) {
        for await (const object of list(`${prefix}${area}`)) {
          const key = object.Key ?? '';
          const sha256 = baseName(key).replace(/\..*$/, '');
          if (isSha256(sha256) && known(sha256)) continue;
          // Young objects may belong to an upload whose row is about to commit.
          if ((object.LastModified?.getTime() ?? 0) > before) continue;
          const to = `${prefix}quarantine/${key.slice(prefix.length)}`;
          await call(`quarantine ${key}`, () =>
            client.send(
              new CopyObjectCommand({
                Bucket: bucket,
                Key: to,
                CopySource: encodeURI(`${bucket}/${key}`),
              }),
            ),
          );
          await call(`quarantine ${key}`, () =>
            client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key })),
          );
          quarantined += 1;
        }
      }
      return { removed, quarantined };
    },
  };
}
