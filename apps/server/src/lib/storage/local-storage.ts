import { createReadStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';
import {
  createTempArea,
  isSha256,
  sha256OfStream,
  type ImageStorage,
  type StoredBytes,
} from './image-storage';

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

async function exists(file: string): Promise<boolean> {
  try {
    await fs.access(file);
    return true;
  } catch {
    return false;
  }
}

async function open(file: string): Promise<StoredBytes | null> {
  try {
    const { size } = await fs.stat(file);
    return { stream: createReadStream(file), size };
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw error;
  }
}

/** The original's file under a data directory: images/originals/ab/ab12…, as backups lay it out. */
export const originalFileUnder = (root: string, sha256: string) =>
  path.join(root, 'images', 'originals', sha256.slice(0, 2), sha256);

/** Content-addressed files under the data directory (the default storage). */
export async function createLocalStorage(dataDir: string): Promise<ImageStorage> {
  const temp = await createTempArea(dataDir);
  const root = path.join(dataDir, 'images');
  const originals = path.join(root, 'originals');
  const full = path.join(root, 'full');
  await Promise.all([originals, full].map((directory) => fs.mkdir(directory, { recursive: true })));
  const originalPath = (sha256: string) => originalFileUnder(dataDir, sha256);
  const fullPath = (sha256: string) => path.join(full, sha256.slice(0, 2), `${sha256}.jpg`);

  /** fsync, then rename, then fsync the folder: the file is whole at its name or not there. */
  async function commit(tempFile: string, target: string): Promise<void> {
    if (await exists(target)) {
      await fs.rm(tempFile, { force: true });
      return;
    }
    await fs.mkdir(path.dirname(target), { recursive: true });
    await fsyncFile(tempFile);
    await fs.rename(tempFile, target);
    await fsyncDirectory(path.dirname(target));
  }

  return {
    ...temp,
    where: `the data directory (${root})`,
    commitOriginal: (tempFile, sha256) => commit(tempFile, originalPath(sha256)),
    commitFull: (tempFile, sha256) => commit(tempFile, fullPath(sha256)),
    openOriginal: (sha256) => open(originalPath(sha256)),
    openFull: (sha256) => open(fullPath(sha256)),
    withOriginalFile: (sha256, use) => use(originalPath(sha256)),
    async hashOriginal(sha256) {
      const opened = await open(originalPath(sha256));
      return opened ? sha256OfStream(opened.stream) : null;
    },
    async *originals() {
      for (const prefix of await fs.readdir(originals))
        for (const name of await fs.readdir(path.join(originals, prefix)))
          if (isSha256(name)) yield name;
    },
    async sweep(known) {
      let removed = await temp.clearTemp();
      for (const base of [originals, full]) {
        for (const prefix of await fs.readdir(base)) {
          const directory = path.join(base, prefix);
          for (const name of await fs.readdir(directory)) {
            const sha256 = name.replace(/\..*$/, '');
            if (isSha256(sha256) && known(sha256) && !name.includes('.tmp')) continue;
            await fs.rm(path.join(directory, name), { force: true });
            removed += 1;
          }
        }
      }
      return { removed, quarantined: 0 };
    },
  };
}
