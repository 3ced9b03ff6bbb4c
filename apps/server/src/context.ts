import type { Config } from './config/env';
import type { Db } from './db/client';
import type { CaughtMailStore } from './lib/email/caught-mail';
import type { RecordsKey } from './lib/records/records-key';
import type { Logger } from './lib/logger';
import type { ImageStorage } from './lib/storage/image-storage';

/** What every module is given: configuration, the database, side-effect services and the clock. */
export interface AppContext {
  config: Config;
  db: Db;
  logger: Logger;
  /** The outbox of the local SMTP fake; null when a real relay is configured. */
  caughtMail: CaughtMailStore | null;
  sessionKey: Uint8Array;
  /** Seals the signature chain (DESIGN §5.5). */
  recordsKey: RecordsKey;
  storage: ImageStorage;
  now: () => Date;
}

/** Facts about the request that the audit log and the security log keep. */
export interface RequestMeta {
  requestId: string;
  ip: string;
  userAgent: string | null;
}
