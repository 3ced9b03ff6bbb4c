// Copies an installation's original images from its data directory into the bucket that
// STORAGE=s3 and the S3_ variables name, and reads every one back to check its SHA-256:
// STORAGE=s3 S3_BUCKET=… pnpm migrate-storage. Safe to run again: what is there already is
// checked, not copied. The files on disk are left for the administrator to remove once the
// installation runs on the bucket. Exits 1 on any problem.
import path from 'node:path';
import { ConfigError, loadConfig } from '../config/env';
import { openDatabase } from '../db/client';
import { runMigrations } from '../db/migrate';
import { createLogger } from '../lib/logger';
import { loadRecordsKey } from '../lib/records/records-key';
import { createLocalStorage } from '../lib/storage/local-storage';
import { createS3Storage } from '../lib/storage/s3-storage';
import { knownImageHashes } from '../modules/images/images.repository';

try {
  const config = loadConfig();
  if (config.storage.kind !== 's3')
    throw new ConfigError(
      'Name the bucket to copy into: STORAGE=s3 with S3_BUCKET (and S3_ENDPOINT, S3_REGION, S3_PREFIX and the keys as the installation will use them).',
    );
  const recordsKey = loadRecordsKey(config, createLogger('error', false));
  const handle = openDatabase(path.join(config.dataDir, 'emberline.sqlite'), recordsKey.key);
  runMigrations(handle.db);
  const named = knownImageHashes(handle.db);
  handle.close();

  const disk = await createLocalStorage(config.dataDir);
  const bucket = await createS3Storage(config.dataDir, config.storage);
  const problems: string[] = [];
  const verified = new Set<string>();
  let copied = 0;
  for await (const sha256 of disk.originals()) {
    if ((await bucket.hashOriginal(sha256)) === sha256) {
      verified.add(sha256);
      continue;
    }
    // Hashed on the way into a temp file: bytes that changed on disk are not carried over.
    const received = await bucket.receive((await disk.openOriginal(sha256))!.stream);
    if (received.sha256 !== sha256) {
      await bucket.discard(received.path);
      problems.push(
        `The file of the original ${sha256} on disk hashes to ${received.sha256}: its bytes changed, and it was not copied. Run pnpm verify-records.`,
      );
      continue;
    }
    await bucket.commitOriginal(received.path, sha256);
    const back = await bucket.hashOriginal(sha256);
    if (back !== sha256)
      problems.push(
        `The original ${sha256} reads back from the bucket ${back === null ? 'as missing' : `hashing to ${back}`}.`,
      );
    else {
      verified.add(sha256);
      copied += 1;
    }
  }
  // Every original a row names must now be in the bucket, whether it was copied now or before.
  let missing = 0;
  for (const sha256 of named)
    if (!verified.has(sha256) && (await bucket.hashOriginal(sha256)) !== sha256) {
      missing += 1;
      if (missing <= 20)
        problems.push(`The original ${sha256}, which an image names, is not in the bucket.`);
    }
  if (missing > 20) problems.push(`… and ${missing - 20} more originals are not in the bucket.`);

  console.log(
    `Copied ${copied} original images from ${disk.where} to ${bucket.where}; ${verified.size - copied} were there already. Each was read back with its SHA-256; all ${named.size} originals the database names are checked.`,
  );
  for (const problem of problems) console.log(`PROBLEM ${problem}`);
  if (problems.length > 0) {
    console.log(
      `${problems.length} problems: keep the installation on STORAGE=local until they are solved.`,
    );
    process.exit(1);
  }
  console.log(
    'Start the installation with the same STORAGE=s3 settings. Full renditions are made again from the bucket on first view; the files under images/ on disk can be removed once it runs.',
  );
} catch (error) {
  console.error(error instanceof ConfigError || error instanceof Error ? error.message : error);
  process.exit(1);
}
