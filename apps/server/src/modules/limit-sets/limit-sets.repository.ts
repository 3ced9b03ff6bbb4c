import { and, asc, count, desc, eq } from 'drizzle-orm';
import type { Rule } from '@emberline/contracts/limits';
import type { DbOrTx } from '../../db/client';
import { limitRules, limitSets, users } from '../../db/schema';

export type LimitSetRecord = typeof limitSets.$inferSelect;
export type LimitSetRow = LimitSetRecord & { ruleCount: number; publishedByName: string | null };

const ruleCounts = (db: DbOrTx) =>
  db
    .select({ limitSetId: limitRules.limitSetId, rules: count().as('rules') })
    .from(limitRules)
    .groupBy(limitRules.limitSetId)
    .as('rule_counts');

function selectLimitSets(db: DbOrTx) {
  const counts = ruleCounts(db);
  return db
    .select({ set: limitSets, ruleCount: counts.rules, publishedByName: users.name })
    .from(limitSets)
    .leftJoin(counts, eq(counts.limitSetId, limitSets.id))
    .leftJoin(users, eq(users.id, limitSets.publishedBy));
}

const toRow = (row: {
  set: LimitSetRecord;
  ruleCount: number | null;
  publishedByName: string | null;
}): LimitSetRow => ({
  ...row.set,
  ruleCount: row.ruleCount ?? 0,
  publishedByName: row.publishedByName,
});

/** A model's revisions, newest first. */
export function listLimitSets(db: DbOrTx, modelId: string): LimitSetRow[] {
  return selectLimitSets(db)
    .where(eq(limitSets.modelId, modelId))
    .orderBy(desc(limitSets.createdAt), desc(limitSets.revision))
    .all()
    .map(toRow);
}

export function findLimitSet(db: DbOrTx, id: string): LimitSetRow | undefined {
  const row = selectLimitSets(db).where(eq(limitSets.id, id)).get();
  return row ? toRow(row) : undefined;
}

/** The revision in force for a model: the one published revision, if there is one. */
export function publishedLimitSet(db: DbOrTx, modelId: string): LimitSetRecord | undefined {
  return db
    .select()
    .from(limitSets)
    .where(and(eq(limitSets.modelId, modelId), eq(limitSets.status, 'published')))
    .get();
}

export function listRules(db: DbOrTx, limitSetId: string): Rule[] {
  return db
    .select()
    .from(limitRules)
    .where(eq(limitRules.limitSetId, limitSetId))
    .orderBy(asc(limitRules.sequence))
    .all()
    .map((row) => ({
      id: row.ruleId,
      title: row.title,
      row: row.rowKey,
      zones: row.zones,
      damage: row.damage as Rule['damage'],
      measure: row.measure,
      unit: row.unit,
      serviceableMax: row.serviceableMax,
      repeatMax: row.repeatMax,
      repeatInterval: row.repeatInterval,
      beyondAction: row.beyondAction,
      notPermitted: row.notPermitted,
      maxPerAirfoil: row.maxPerAirfoil,
      maxTotalPerAirfoil: row.maxTotalPerAirfoil,
      maxAirfoilsPerRow: row.maxAirfoilsPerRow,
      maxAdjacentAirfoils: row.maxAdjacentAirfoils,
      reference: row.reference,
    }));
}

export function insertLimitSet(db: DbOrTx, row: typeof limitSets.$inferInsert): void {
  db.insert(limitSets).values(row).run();
}

export function updateLimitSet(
  db: DbOrTx,
  id: string,
  changes: Pick<
    typeof limitSets.$inferInsert,
    'revision' | 'title' | 'manualReference' | 'effectiveDate'
  >,
): void {
  db.update(limitSets).set(changes).where(eq(limitSets.id, id)).run();
}

/** Adds rules to a draft revision, in the given order (SQLite refuses it for any other). */
export function insertRules(db: DbOrTx, limitSetId: string, rules: readonly Rule[]): void {
  if (rules.length === 0) return;
  db.insert(limitRules)
    .values(
      rules.map((rule, sequence) => ({
        limitSetId,
        ruleId: rule.id,
        title: rule.title,
        sequence,
        rowKey: rule.row,
        zones: rule.zones,
        damage: rule.damage,
        measure: rule.measure,
        unit: rule.unit,
        serviceableMax: rule.serviceableMax,
        repeatMax: rule.repeatMax,
        repeatInterval: rule.repeatInterval,
        beyondAction: rule.beyondAction,
        notPermitted: rule.notPermitted,
        maxPerAirfoil: rule.maxPerAirfoil,
        maxTotalPerAirfoil: rule.maxTotalPerAirfoil,
        maxAirfoilsPerRow: rule.maxAirfoilsPerRow,
        maxAdjacentAirfoils: rule.maxAdjacentAirfoils,
        reference: rule.reference,
      })),
    )
    .run();
}

/** Publishes a draft (the revision in force, if any, becomes superseded first). */
export function publishLimitSet(
  db: DbOrTx,
  id: string,
  modelId: string,
  published: { at: Date; by: string; contentSha256: string },
): void {
  db.update(limitSets)
    .set({ status: 'superseded' })
    .where(and(eq(limitSets.modelId, modelId), eq(limitSets.status, 'published')))
    .run();
  db.update(limitSets)
    .set({
      status: 'published',
      publishedAt: published.at,
      publishedBy: published.by,
      contentSha256: published.contentSha256,
    })
    .where(eq(limitSets.id, id))
    .run();
}

/** Replaces the rules of a draft (SQLite refuses it for a published or superseded revision). */
export function replaceRules(db: DbOrTx, limitSetId: string, rules: readonly Rule[]): void {
  db.delete(limitRules).where(eq(limitRules.limitSetId, limitSetId)).run();
  insertRules(db, limitSetId, rules);
}
