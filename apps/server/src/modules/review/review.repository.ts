import { and, asc, desc, eq, inArray, like, lt, ne, or, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import {
  auditLog,
  dispositions,
  engineModels,
  engines,
  findings,
  inspections,
  organisations,
  signatures,
} from '../../db/schema';

export type DispositionRecord = typeof dispositions.$inferSelect;

export function insertDisposition(db: DbOrTx, row: typeof dispositions.$inferInsert): void {
  db.insert(dispositions).values(row).run();
}

/** Ends current dispositions: superseded by a correction, or withdrawn with the inspection's return. */
export function endDispositions(
  db: DbOrTx,
  ids: readonly string[],
  state: 'superseded' | 'withdrawn',
): void {
  if (ids.length === 0) return;
  db.update(dispositions)
    .set({ state })
    .where(and(inArray(dispositions.id, [...ids]), eq(dispositions.state, 'current')))
    .run();
}

/** Every disposition of an inspection in the order signed, with its finding's number. */
export function listDispositions(db: DbOrTx, inspectionId: string) {
  return db
    .select({ disposition: dispositions, findingNumber: findings.number })
    .from(dispositions)
    .innerJoin(findings, eq(findings.id, dispositions.findingId))
    .innerJoin(signatures, eq(signatures.id, dispositions.signatureId))
    .where(eq(dispositions.inspectionId, inspectionId))
    .orderBy(asc(signatures.seq))
    .all()
    .map((row) => ({ ...row.disposition, findingNumber: row.findingNumber }));
}

export function findDisposition(db: DbOrTx, id: string): DispositionRecord | undefined {
  return db.select().from(dispositions).where(eq(dispositions.id, id)).get();
}

export function currentDisposition(db: DbOrTx, findingId: string): DispositionRecord | undefined {
  return db
    .select()
    .from(dispositions)
    .where(and(eq(dispositions.findingId, findingId), eq(dispositions.state, 'current')))
    .get();
}

/** Every disposition signed so far that is still current, across all inspections: the verifier's list. */
export function listCurrentDispositions(db: DbOrTx): DispositionRecord[] {
  return db.select().from(dispositions).where(eq(dispositions.state, 'current')).all();
}

/**
 * Whether a person recorded, changed or voided a finding: the actor of any of its `finding.*`
 * audit entries (a disposition's own entries are `disposition.*`).
 */
export function changedFinding(db: DbOrTx, findingId: string, userId: string): boolean {
  return (
    db
      .select({ id: auditLog.id })
      .from(auditLog)
      .where(
        and(
          eq(auditLog.entityType, 'finding'),
          eq(auditLog.entityId, findingId),
          eq(auditLog.actorUserId, userId),
          like(auditLog.action, 'finding.%'),
        ),
      )
      .limit(1)
      .get() !== undefined
  );
}

/** The flag codes a person acknowledged on an inspection (from the audit log). */
export function flagsAcknowledgedBy(db: DbOrTx, inspectionId: string, userId: string): string[] {
  return db
    .select({ after: auditLog.after })
    .from(auditLog)
    .where(
      and(
        eq(auditLog.entityType, 'inspection'),
        eq(auditLog.entityId, inspectionId),
        eq(auditLog.action, 'inspection.flag-acknowledged'),
        eq(auditLog.actorUserId, userId),
      ),
    )
    .all()
    .map((row) => String((row.after as { code?: unknown } | null)?.code ?? ''));
}

/** The inspections waiting for an engineer: submitted or dispositioned, with what the queue shows. */
export function listReviewInspections(
  db: DbOrTx,
  filter: { organisationId?: string; modelId?: string; engineId?: string },
) {
  const conditions = [inArray(inspections.state, ['submitted', 'dispositioned'])];
  if (filter.organisationId) conditions.push(eq(engines.organisationId, filter.organisationId));
  if (filter.modelId) conditions.push(eq(engines.modelId, filter.modelId));
  if (filter.engineId) conditions.push(eq(inspections.engineId, filter.engineId));
  return db
    .select({
      id: inspections.id,
      modelId: engines.modelId,
      modelName: engineModels.name,
      organisationName: organisations.name,
    })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .innerJoin(engineModels, eq(engineModels.id, engines.modelId))
    .innerJoin(organisations, eq(organisations.id, engines.organisationId))
    .where(and(...conditions))
    .all();
}

/**
 * The engine's inspection dispositioned last before this one (by date, then creation): where a
 * finding at the same place and of the same damage may be the same damage again.
 */
export function previousDispositionedInspection(
  db: DbOrTx,
  engineId: string,
  before: { id: string; date: string; createdAt: Date },
) {
  return db
    .select({ id: inspections.id, date: inspections.date })
    .from(inspections)
    .where(
      and(
        eq(inspections.engineId, engineId),
        ne(inspections.id, before.id),
        inArray(inspections.state, ['dispositioned', 'released']),
        or(
          lt(inspections.date, before.date),
          and(eq(inspections.date, before.date), lt(inspections.createdAt, before.createdAt)),
        ),
      ),
    )
    .orderBy(desc(inspections.date), desc(inspections.createdAt))
    .limit(1)
    .get();
}

/** Recorded findings of an inspection still in a series of their own: no later finding continues them. */
export function recordedFindingsOf(db: DbOrTx, inspectionId: string) {
  return db
    .select()
    .from(findings)
    .where(and(eq(findings.inspectionId, inspectionId), eq(findings.status, 'recorded')))
    .orderBy(asc(findings.number))
    .all();
}

/** Whether any finding continues `findingId` (a later finding names it as previous). */
export function isContinued(db: DbOrTx, findingId: string): boolean {
  return (
    db
      .select({ n: sql<number>`1` })
      .from(findings)
      .where(eq(findings.previousFindingId, findingId))
      .limit(1)
      .get() !== undefined
  );
}
