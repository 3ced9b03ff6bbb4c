import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Config } from './config/env';
import type { AppContext } from './context';
import { openDatabase } from './db/client';
import { runMigrations } from './db/migrate';
import { loadDemoHistory } from './demo/demo-history';
import { loadDemoScenario } from './demo/demo-scenario';
import { caughtMailStore } from './lib/email/caught-mail';
import { createDelivery, type Delivery } from './lib/email/delivery';
import { createMailer } from './lib/email/mailer';
import { startSmtpFake, type SmtpFake } from './lib/email/smtp-fake';
import type { Logger } from './lib/logger';
import { loadRecordsKey } from './lib/records/records-key';
import { createStorage } from './lib/storage/create-storage';
import { knownImageHashes } from './modules/images/images.repository';
import { imageHashesNamedInSignatures } from './modules/records/records.repository';
import { createReminders } from './modules/reminders/reminders.service';
import { createScheduler, type Scheduler } from './modules/reminders/scheduler';
import { countUsers } from './modules/users/users.repository';

export interface Runtime {
  ctx: AppContext;
  /** The outbox's delivery worker; `server.ts` starts it, tests drive it. */
  delivery: Delivery;
  /** The reminders' scheduler; `server.ts` starts it, tests call `reminders.tick()` with their clock. */
  scheduler: Scheduler;
  reminders: ReturnType<typeof createReminders>;
  /** The in-process SMTP fake; null when a real relay is configured. */
  smtpFake: SmtpFake | null;
  close(): Promise<void>;
}

/** The session signing key: SESSION_SECRET, or a secret generated once into the data directory. */
function sessionKey(config: Config, logger: Logger): Uint8Array {
  if (config.sessionSecret) return new TextEncoder().encode(config.sessionSecret);
  const file = path.join(config.dataDir, 'session-secret');
  if (!fs.existsSync(file)) {
    try {
      fs.writeFileSync(file, randomBytes(48).toString('base64url'), { mode: 0o600, flag: 'wx' });
      logger.info({ file }, 'generated a session secret');
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
    }
  }
  return new TextEncoder().encode(fs.readFileSync(file, 'utf8').trim());
}

function assertWritable(directory: string): void {
  try {
    fs.mkdirSync(directory, { recursive: true });
    fs.accessSync(directory, fs.constants.W_OK);
  } catch {
    throw new Error(
      `Emberline cannot start: the data directory ${directory} cannot be written. Set DATA_DIR to a folder this user may write.`,
    );
  }
}

/**
 * Prepares everything the app needs: data directory, migrated database, demo data on first start,
 * and e-mail (the local SMTP fake unless a relay is configured).
 */
export async function prepareRuntime(
  config: Config,
  logger: Logger,
  now: () => Date = () => new Date(),
): Promise<Runtime> {
  assertWritable(config.dataDir);
  const recordsKey = loadRecordsKey(config, logger);
  const handle = openDatabase(path.join(config.dataDir, 'emberline.sqlite'), recordsKey.key);
  runMigrations(handle.db);

  let demoLoaded = false;
  if (countUsers(handle.db) === 0) {
    if (config.demo) {
      await loadDemoScenario(handle.db, { bcryptCost: config.bcryptCost, now: now() });
      demoLoaded = true;
      logger.info('loaded the demo scenario (invented organisations, users and fleet)');
    } else {
      logger.warn(
        'there are no users yet: create the first administrator with `pnpm create-admin`',
      );
    }
  }

  const storage = await createStorage(config.dataDir, config.storage);
  // Files that a crash left without a record (or half-written) go; every record keeps its file,
  // because a record is only written after its file is in place, and what a signature names
  // stays whatever the rows say.
  const known = knownImageHashes(handle.db);
  const signed = imageHashesNamedInSignatures(handle.db);
  const swept = await storage.sweep((sha256) => known.has(sha256) || signed.has(sha256));
  if (swept.removed > 0 || swept.quarantined > 0)
    logger.info(swept, `took away image files without records from ${storage.where}`);

  const smtpFake = config.smtp ? null : await startSmtpFake(path.join(config.dataDir, 'mail'));
  const mailer = createMailer(
    config.smtp ?? { host: '127.0.0.1', port: smtpFake?.port ?? 0, secure: false },
    config.mailFrom,
  );

  const ctx: AppContext = {
    config,
    db: handle.db,
    logger,
    caughtMail: smtpFake ? caughtMailStore(path.join(config.dataDir, 'mail')) : null,
    sessionKey: sessionKey(config, logger),
    recordsKey,
    storage,
    now,
  };
  if (demoLoaded && config.demoImages) await loadDemoHistory(ctx);
  const delivery = createDelivery({ db: handle.db, mailer, now, logger });
  const reminders = createReminders(ctx);
  const scheduler = createScheduler(() => reminders.tick(), logger);

  return {
    ctx,
    delivery,
    scheduler,
    reminders,
    smtpFake,
    async close() {
      scheduler.stop();
      await delivery.stop();
      mailer.close();
      await smtpFake?.close();
      handle.close();
    },
  };
}
