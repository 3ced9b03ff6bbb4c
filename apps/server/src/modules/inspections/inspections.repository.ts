import { and, count, desc, eq, gt, ne, sql, type SQL } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { alias } from 'drizzle-orm/sqlite-core';
import { engines, images, inspections, users } from '../../db/schema';

const voiders = alias(users, 'voiders');

export type InspectionRecord = typeof inspections.$inferSelect;
export type InspectionRow = InspectionRecord & {
  engineSerialNumber: string;
  organisationId: string;
  modelId: string;
  imageCount: number;
  returnedByName: string | null;
  voidedByName: string | null;
  /** The revision in force for the engine's model now. */
  inForceLimitSetId: string | null;
};

function selectInspections(
  db: DbOrTx,
  where: SQL | undefined,
  page: { limit: number; offset: number } = { limit: -1, offset: 0 },
) {
  return db
    .select({
      inspection: inspections,
      engineSerialNumber: engines.serialNumber,
      organisationId: engines.organisationId,
      modelId: engines.modelId,
      // Counted per inspection through images_inspection_sha_idx: a grouped count of every image
      // joined in would read the whole table for one inspection.
      imageCount: sql<number>`(SELECT count(*) FROM ${images} WHERE ${images.inspectionId} = ${inspections.id})`,
      returnedByName: users.name,
      voidedByName: voiders.name,
      inForceLimitSetId: sql<
        string | null
      >`(SELECT ls.id FROM limit_sets ls WHERE ls.model_id = ${engines.modelId} AND ls.status = 'published')`,
    })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .leftJoin(users, eq(users.id, inspections.returnedBy))
    .leftJoin(voiders, eq(voiders.id, inspections.voidedBy))
    .where(where)
    .orderBy(desc(inspections.date), desc(inspections.createdAt), desc(inspections.id))
    .limit(page.limit)
    .offset(page.offset)
    .all()
    .map((row): InspectionRow => ({
      ...row.inspection,
      engineSerialNumber: row.engineSerialNumber,
      organisationId: row.organisationId,
      modelId: row.modelId,
      imageCount: row.imageCount,
      returnedByName: row.returnedByName,
      voidedByName: row.voidedByName,
      inForceLimitSetId: row.inForceLimitSetId,
    }));
}

type InspectionFilter = { engineId?: string; organisationId?: string; releasedOnly?: boolean };

function inspectionFilter(filter: InspectionFilter): SQL | undefined {
  const conditions: SQL[] = [];
  if (filter.engineId) conditions.push(eq(inspections.engineId, filter.engineId));
  if (filter.organisationId) conditions.push(eq(engines.organisationId, filter.organisationId));
  if (filter.releasedOnly) conditions.push(gt(inspections.releaseRevision, 0));
  return conditions.length ? and(...conditions) : undefined;
}

/** A page of inspections, newest first, and how many the filter selects in all. */
export function listInspections(
  db: DbOrTx,
  filter: InspectionFilter,
  page: { limit: number; offset: number },
): { rows: InspectionRow[]; total: number } {
  const where = inspectionFilter(filter);
  const total =
    db
      .select({ n: count() })
      .from(inspections)
      .innerJoin(engines, eq(engines.id, inspections.engineId))
      .where(where)
      .get()?.n ?? 0;
  return { rows: selectInspections(db, where, page), total };
}

export function findInspection(db: DbOrTx, id: string): InspectionRow | undefined {
  return selectInspections(db, eq(inspections.id, id))[0];
}

export function insertInspection(db: DbOrTx, row: typeof inspections.$inferInsert): void {
  db.insert(inspections).values(row).run();
}

/** A review step: the new state and the marks it sets (submission, return, outcome, release). */
export function setInspectionState(
  db: DbOrTx,
  id: string,
  state: InspectionRecord['state'],
  marks: Partial<
    Pick<
      InspectionRecord,
      | 'returnedReason'
      | 'returnedBy'
      | 'returnedAt'
      | 'submittedAt'
      | 'limitSetId'
      | 'outcomeSignatureId'
      | 'releaseSignatureId'
      | 'releaseRevision'
      | 'voidReason'
      | 'voidedBy'
      | 'voidedAt'
    >
  > = {},
): void {
  db.update(inspections)
    .set({ state, ...marks })
    .where(eq(inspections.id, id))
    .run();
}

export function updateInspectionFlags(
  db: DbOrTx,
  id: string,
  flags: InspectionRecord['flags'],
): void {
  db.update(inspections).set({ flags }).where(eq(inspections.id, id)).run();
}

/** A draft's particulars, corrected, with its flags computed again. */
export function updateInspectionParticulars(
  db: DbOrTx,
  id: string,
  particulars: Pick<
    InspectionRecord,
    | 'date'
    | 'reason'
    | 'reasonDetail'
    | 'csn'
    | 'tsn'
    | 'inspectorName'
    | 'qualificationRef'
    | 'qualificationExpiresOn'
    | 'probe'
    | 'probeCalibrationDueOn'
    | 'flags'
  >,
): void {
  db.update(inspections).set(particulars).where(eq(inspections.id, id)).run();
}

/** The latest inspection a person opened (void ones left out): where their probe is taken from. */
export function lastInspectionBy(db: DbOrTx, userId: string): InspectionRecord | undefined {
  return db
    .select()
    .from(inspections)
    .where(and(eq(inspections.createdBy, userId), ne(inspections.state, 'void')))
    .orderBy(desc(inspections.date), desc(inspections.createdAt))
    .limit(1)
    .get();
}

/**
 * The drafts of a model's engines: the inspections a newly published revision judges again. From
 * submission on an inspection keeps the revision it was judged against (DESIGN §5.5).
 */
export function draftInspectionIds(db: DbOrTx, modelId: string): string[] {
  return db
    .select({ id: inspections.id })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .where(and(eq(engines.modelId, modelId), eq(inspections.state, 'draft')))
    .all()
    .map((row) => row.id);
}
