import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { GetObjectCommand, ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import S3rver from 's3rver';

/**
 * A real S3 protocol server for the tests: s3rver, a local fake from the registry, on 127.0.0.1
 * with one bucket kept in a temporary folder. It speaks the protocol the AWS SDK speaks to any
 * S3-compatible store; it is not one.
 */
export interface S3Fake {
  /** The environment that points an installation at the fake's bucket (STORAGE=s3). */
  env: Record<string, string>;
  bucket: string;
  /** Where the fake keeps its objects on this disk. */
  directory: string;
  /**
   * The objects whose keys begin with `prefix`, by their last name, read with a plain client of
   * the SDK (not the product's storage).
   */
  objects(prefix: string): Promise<Map<string, Buffer>>;
  close(): Promise<void>;
}

export async function startS3Fake(bucket = 'emberline-test'): Promise<S3Fake> {
  const directory = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-s3-fake-'));
  const server = new S3rver({
    address: '127.0.0.1',
    port: 0,
    directory,
    silent: true,
    configureBuckets: [{ name: bucket }],
  });
  const { port } = await server.run();
  const prefix = 'installation-a/';
  const client = new S3Client({
    endpoint: `http://127.0.0.1:${port}`,
    region: 'us-east-1',
    forcePathStyle: true,
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
  });
  return {
    bucket,
    directory,
    env: {
      STORAGE: 's3',
      S3_ENDPOINT: `http://127.0.0.1:${port}`,
      S3_REGION: 'us-east-1',
      S3_BUCKET: bucket,
      S3_PREFIX: prefix,
      // s3rver's fixed credentials.
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      S3_FORCE_PATH_STYLE: 'true',
    },
    async objects(keyPrefix) {
      const found = new Map<string, Buffer>();
      let token: string | undefined;
      do {
        const page = await client.send(
          new ListObjectsV2Command({
            Bucket: bucket,
            Prefix: keyPrefix,
            ContinuationToken: token,
          }),
        );
        for (const object of page.Contents ?? []) {
          const got = await client.send(new GetObjectCommand({ Bucket: bucket, Key: object.Key }));
          found.set(
            object.Key!.split('/').at(-1)!,
            Buffer.from(await got.Body!.transformToByteArray()),
          );
        }
        token = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (token);
      return found;
    },
    async close() {
      client.destroy();
      await server.close();
      fs.rmSync(directory, { recursive: true, force: true });
    },
  };
}
