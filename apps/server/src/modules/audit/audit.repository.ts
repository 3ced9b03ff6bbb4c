import {
  and,
  asc,
  desc,
  eq,
  gte,
  inArray,
  isNotNull,
  isNull,
  lt,
  or,
  sql,
  type SQL,
} from 'drizzle-orm';
import { GENESIS_SHA256 } from '@emberline/domain/signature-content';
import type { DbOrTx } from '../../db/client';
import { auditLog, users } from '../../db/schema';
import { auditRowHash } from '../../lib/records/audit-hash';

export interface AuditRecord {
  actorUserId: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  before?: unknown;
  after?: unknown;
  requestId?: string | null;
  ip?: string | null;
}

/**
 * Appends one entry to the audit chain: numbered after the last, hashed over it, sealed by SQLite's
 * `records_mac` with the records key. Callers are inside a `BEGIN IMMEDIATE` transaction, so no
 * other writer takes the same number. The table refuses updates and deletes by trigger.
 */
export function appendAudit(db: DbOrTx, at: Date, record: AuditRecord): void {
  const last = db
    .select({ seq: auditLog.seq, hash: auditLog.hash })
    .from(auditLog)
    .where(isNotNull(auditLog.seq))
    .orderBy(desc(auditLog.seq))
    .limit(1)
    .get();
  const fields = {
    seq: (last?.seq ?? 0) + 1,
    at,
    actorUserId: record.actorUserId,
    action: record.action,
    entityType: record.entityType,
    entityId: record.entityId,
    before: record.before ?? null,
    after: record.after ?? null,
    requestId: record.requestId ?? null,
    ip: record.ip ?? null,
    prevHash: last?.hash ?? GENESIS_SHA256,
  };
  const hash = auditRowHash(fields);
  db.insert(auditLog)
    .values({ ...fields, hash, mac: sql`records_mac(${hash})` })
    .run();
}

export type AuditChainRow = typeof auditLog.$inferSelect;

/** Audit rows outside the chain: written behind the product's back after it was chained. */
export function listUnchainedAudit(db: DbOrTx, limit: number): AuditChainRow[] {
  return db.select().from(auditLog).where(isNull(auditLog.seq)).limit(limit).all();
}

/** The chained rows after `seq`, in order, a page at a time; and how many rows are unchained. */
export function listAuditChainAfter(db: DbOrTx, seq: number, limit: number): AuditChainRow[] {
  return db
    .select()
    .from(auditLog)
    .where(and(isNotNull(auditLog.seq), sql`${auditLog.seq} > ${seq}`))
    .orderBy(auditLog.seq)
    .limit(limit)
    .all();
}

export function listAudit(
  db: DbOrTx,
  filter: {
    entityType?: string | undefined;
    entityId?: string | undefined;
    actorUserId?: string | undefined;
    from?: string | undefined;
    to?: string | undefined;
    before?: number | undefined;
    limit: number;
  },
) {
  const conditions: SQL[] = [];
  if (filter.entityType) conditions.push(eq(auditLog.entityType, filter.entityType));
  if (filter.entityId) conditions.push(eq(auditLog.entityId, filter.entityId));
  if (filter.actorUserId) conditions.push(eq(auditLog.actorUserId, filter.actorUserId));
  if (filter.from) conditions.push(gte(auditLog.at, new Date(`${filter.from}T00:00:00Z`)));
  if (filter.to)
    conditions.push(lt(auditLog.at, new Date(Date.parse(`${filter.to}T00:00:00Z`) + 86_400_000)));
  if (filter.before) conditions.push(lt(auditLog.id, filter.before));
  return db
    .select({
      id: auditLog.id,
      at: auditLog.at,
      actorUserId: auditLog.actorUserId,
      actorEmail: users.email,
      action: auditLog.action,
      entityType: auditLog.entityType,
      entityId: auditLog.entityId,
      before: auditLog.before,
      after: auditLog.after,
      requestId: auditLog.requestId,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorUserId))
    .where(conditions.length ? and(...conditions) : undefined)
    .orderBy(desc(auditLog.id))
    .limit(filter.limit)
    .all();
}

/** The audit entries of some records, oldest first, with the actor's name: a history. */
export function listHistory(db: DbOrTx, records: { entityType: string; ids: readonly string[] }[]) {
  const wanted = records
    .filter((record) => record.ids.length > 0)
    .map((record) =>
      and(eq(auditLog.entityType, record.entityType), inArray(auditLog.entityId, [...record.ids])),
    );
  if (wanted.length === 0) return [];
  return db
    .select({
      id: auditLog.id,
      at: auditLog.at,
      actorUserId: auditLog.actorUserId,
      actorName: users.name,
      action: auditLog.action,
      before: auditLog.before,
      after: auditLog.after,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorUserId))
    .where(or(...wanted))
    .orderBy(asc(auditLog.id))
    .all();
}
