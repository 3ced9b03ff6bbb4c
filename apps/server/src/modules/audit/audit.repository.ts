import { and, desc, eq, lt, type SQL } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { auditLog, users } from '../../db/schema';

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

/** Appends one entry. The table refuses updates and deletes by trigger. */
export function appendAudit(db: DbOrTx, at: Date, record: AuditRecord): void {
  db.insert(auditLog)
    .values({
      at,
      actorUserId: record.actorUserId,
      action: record.action,
      entityType: record.entityType,
      entityId: record.entityId,
      before: record.before ?? null,
      after: record.after ?? null,
      requestId: record.requestId ?? null,
      ip: record.ip ?? null,
    })
    .run();
}

export function listAudit(
  db: DbOrTx,
  filter: { entityType?: string; before?: number; limit: number },
) {
  const conditions: SQL[] = [];
  if (filter.entityType) conditions.push(eq(auditLog.entityType, filter.entityType));
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
