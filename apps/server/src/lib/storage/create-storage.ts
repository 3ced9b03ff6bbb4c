import type { StorageConfig } from '../../config/env';
import type { ImageStorage } from './image-storage';
import { createLocalStorage } from './local-storage';
import { createS3Storage } from './s3-storage';

/** The storage the installation's configuration names (STORAGE=local or s3). */
export function createStorage(dataDir: string, config: StorageConfig): Promise<ImageStorage> {
  return config.kind === 's3' ? createS3Storage(dataDir, config) : createLocalStorage(dataDir);
}
