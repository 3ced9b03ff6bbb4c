import type { Request } from 'express';
import type { StorageEngine } from 'multer';
import type { ImageStorage } from '../../lib/storage/image-storage';

/** A received upload: multer's file fields plus the SHA-256 computed while it was written. */
export interface ReceivedFile extends Express.Multer.File {
  sha256: string;
}

/**
 * A multer storage engine that writes each part to a server-named temp file and hashes it in the
 * same pass, so that the bytes are read once. Multer removes the files itself when a limit is hit.
 */
export function hashingStorage(storage: ImageStorage): StorageEngine {
  return {
    _handleFile(_req: Request, file, done) {
      storage
        .receive(file.stream)
        .then(({ path, size, sha256 }) =>
          done(null, { path, size, sha256 } as Partial<ReceivedFile>),
        )
        .catch((error: Error) => done(error));
    },
    _removeFile(_req: Request, file, done) {
      storage
        .discard(file.path)
        .then(() => done(null))
        .catch((error: Error) => done(error));
    },
  };
}
