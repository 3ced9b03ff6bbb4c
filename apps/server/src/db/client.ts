import { createHmac } from 'node:crypto';
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import * as schema from './schema';
import { countCommit } from './request-writes';

export type Db = BetterSQLite3Database<typeof schema>;
/** A database handle or an open transaction: repositories accept either. */
export type DbOrTx = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

export interface DatabaseHandle {
  db: Db;
  sqlite: Database.Database;
  close(): void;
}

/**
 * Opens the one writer connection with the pragmas Emberline relies on: WAL for concurrent readers,
 * synchronous=FULL so an acknowledged upload or signature survives a power cut, foreign keys on,
 * and a busy timeout instead of immediate SQLITE_BUSY errors. `records_mac(hash)` seals audit rows
 * with the records key.
 */
export function openDatabase(file: string, recordsKey: Buffer): DatabaseHandle {
  const sqlite = new Database(file);
  // The seal of the audit chain is made inside the insert, so that no audit row exists unsealed.
  sqlite.function('records_mac', { deterministic: true }, (hash: unknown) =>
    createHmac('sha256', recordsKey).update(String(hash), 'utf8').digest('hex'),
  );
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('synchronous = FULL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  const db = drizzle({ client: sqlite, schema, casing: 'snake_case' });
  return { db, sqlite, close: () => sqlite.close() };
}

/**
 * Runs `work` in one `BEGIN IMMEDIATE` transaction: one business action, one transaction. A
 * commit is counted for the request it serves, so that an error after it is not answered with
 * "nothing was changed" (request-writes.ts).
 */
export function inTransaction<T>(db: Db, work: (tx: DbOrTx) => T): T {
  return countCommit(() => db.transaction((tx) => work(tx), { behavior: 'immediate' }));
}

/** The better-sqlite3 connection behind a Drizzle handle, for tests and benchmarks that need raw SQL. */
export function rawConnection(db: Db): Database.Database {
  return (db as unknown as { $client: Database.Database }).$client;
}
