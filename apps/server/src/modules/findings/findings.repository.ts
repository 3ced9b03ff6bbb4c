import { and, asc, desc, eq, max, ne, or, lt, sql, type SQL } from 'drizzle-orm';
import type { EvaluationFinding, FindingEvaluation } from '@emberline/contracts/limits';
import { SQLiteSyncDialect } from 'drizzle-orm/sqlite-core';
import { rawConnection, type DbOrTx } from '../../db/client';
import { findings, inspections, limitSets, users } from '../../db/schema';

const sqliteDialect = new SQLiteSyncDialect();

export type FindingRecord = typeof findings.$inferSelect;
export type FindingRow = FindingRecord & {
  createdByName: string;
  limitSetRevision: string | null;
};

function selectFindings(db: DbOrTx, where: SQL) {
  return db
    .select({ finding: findings, createdByName: users.name, limitSetRevision: limitSets.revision })
    .from(findings)
    .innerJoin(users, eq(users.id, findings.createdBy))
    .leftJoin(limitSets, eq(limitSets.id, findings.limitSetId))
    .where(where)
    .orderBy(asc(findings.number))
    .all()
    .map((row): FindingRow => ({
      ...row.finding,
      createdByName: row.createdByName,
      limitSetRevision: row.limitSetRevision,
    }));
}

/** Every finding of an inspection, void ones included, in the order recorded. */
export function listFindings(db: DbOrTx, inspectionId: string): FindingRow[] {
  return selectFindings(db, eq(findings.inspectionId, inspectionId));
}

export function findFinding(db: DbOrTx, id: string): FindingRow | undefined {
  return selectFindings(db, eq(findings.id, id))[0];
}

export function nextFindingNumber(db: DbOrTx, inspectionId: string): number {
  const row = db
    .select({ n: max(findings.number) })
    .from(findings)
    .where(eq(findings.inspectionId, inspectionId))
    .get();
  return (row?.n ?? 0) + 1;
}

export function insertFinding(db: DbOrTx, row: typeof findings.$inferInsert): void {
  db.insert(findings).values(row).run();
}

export function updateFinding(
  db: DbOrTx,
  id: string,
  changes: Partial<typeof findings.$inferInsert>,
): void {
  db.update(findings).set(changes).where(eq(findings.id, id)).run();
}

export function storeEvaluation(
  db: DbOrTx,
  id: string,
  stored: Pick<FindingRecord, 'category' | 'limitSetId' | 'evaluatedAt'> & {
    evaluation: FindingEvaluation;
  },
): void {
  const interval = stored.evaluation.repeatInterval;
  db.update(findings)
    .set({
      ...stored,
      evaluation: stored.evaluation as unknown as Record<string, unknown>,
      repeatCycles: interval?.cycles ?? null,
      repeatHours: interval?.hours ?? null,
      repeatDays: interval?.days ?? null,
    })
    .where(eq(findings.id, id))
    .run();
}

/** Recorded findings of earlier inspections of an engine, newest inspection first. */
export function earlierFindings(
  db: DbOrTx,
  engineId: string,
  before: { inspectionId: string; date: string; createdAt: Date },
  match: { row: string; position: number; damage: string; zone?: string },
) {
  const conditions = [
    eq(inspections.engineId, engineId),
    ne(inspections.id, before.inspectionId),
    or(
      lt(inspections.date, before.date),
      and(eq(inspections.date, before.date), lt(inspections.createdAt, before.createdAt)),
    )!,
    eq(findings.status, 'recorded'),
    eq(findings.rowKey, match.row),
    eq(findings.position, match.position),
    eq(findings.damage, match.damage),
  ];
  if (match.zone) conditions.push(eq(findings.zone, match.zone));
  return db
    .select({ finding: findings, inspection: inspections })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .where(and(...conditions))
    .orderBy(desc(inspections.date), desc(inspections.createdAt), asc(findings.number))
    .all();
}

/** The findings of one damage series, oldest inspection first. */
export function seriesFindings(db: DbOrTx, seriesId: string) {
  return db
    .select({ finding: findings, inspection: inspections })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .where(and(eq(findings.seriesId, seriesId), eq(findings.status, 'recorded')))
    .orderBy(asc(inspections.date), asc(inspections.createdAt))
    .all();
}

/** Findings that continue this one (in later inspections). */
export function listSuccessors(db: DbOrTx, findingId: string): FindingRecord[] {
  return db.select().from(findings).where(eq(findings.previousFindingId, findingId)).all();
}

/** An inspection whose findings are current: not yet released, or its engine's latest released. */
export interface CurrentInspection {
  id: string;
  date: string;
  released: boolean;
  engineId: string;
  engineSerial: string;
}

/** The inspections whose findings are current, of one model's engines (`e` engines, `i` inspections). */
const currentInspectionsOf = (modelId: string) => sql`
  FROM engines e JOIN inspections i ON i.engine_id = e.id
  WHERE e.model_id = ${modelId} AND (i.state NOT IN ('released', 'void') OR i.id = (
    SELECT r.id FROM inspections r WHERE r.engine_id = e.id AND r.state = 'released'
    ORDER BY r.date DESC, r.created_at DESC LIMIT 1))`;

/**
 * A recorded finding as the impact preview reads it: what the evaluation reads (its id, the
 * finding's number within its inspection), where it is and the stored verdict.
 */
export interface CurrentFinding extends EvaluationFinding {
  number: number;
  category: FindingRecord['category'];
  repeatInterval: { cycles: number | null; hours: number | null; days: number | null } | null;
  limitSetId: string | null;
}

/** One finding as `currentFindingsQuery` gives it: the columns of `CurrentFinding`, in order. */
type CurrentRow = [
  number,
  string,
  number,
  string,
  string,
  number | null,
  number | null,
  number | null,
  number | null,
  number | null,
  number | null,
  number | null,
  FindingRecord['category'],
  number | null,
  number | null,
  number | null,
  string | null,
];

/**
 * The SQL of `currentFindings`, also for the benchmark's bare scan of the same rows: one row per
 * current inspection, its recorded findings as one JSON array of arrays. better-sqlite3 spends
 * about 4 µs turning each row of 18 columns into JavaScript (0.8 s for 200,000 findings), and
 * JSON.parse about a tenth of that on the same values. SQLite writes every real in the fewest
 * digits that read back as the same double (checked in findings.repository.int.test.ts).
 */
export function currentFindingsQuery(modelId: string): { sql: string; params: unknown[] } {
  return sqliteDialect.sqlToQuery(sql`
    WITH current AS MATERIALIZED (SELECT i.id, i.date, i.state = 'released' AS released,
      e.id AS engine_id, e.serial_number ${currentInspectionsOf(modelId)})
    SELECT c.id, c.date, c.released, c.engine_id, c.serial_number, (
      SELECT json_group_array(json_array(f.number, f.row_key, f.position, f.zone, f.damage,
          f.length_mm, f.width_mm, f.depth_mm, f.area_mm2, f.count, f.uncertainty_mm,
          f.uncertainty_mm2, f.category, f.repeat_cycles, f.repeat_hours, f.repeat_days,
          f.limit_set_id))
        FROM findings f INDEXED BY findings_impact_idx
        WHERE f.inspection_id = c.id AND f.status = 'recorded'
    )
    FROM current c`);
}

/**
 * The current findings of a model's engines, an inspection at a time: every recorded finding of
 * the inspections not yet released and of each engine's latest released inspection. Read from
 * the covering index `findings_impact_idx` and streamed (never all in memory at once), so that
 * 200,000 findings are read in about half a second.
 */
export function* currentFindings(
  db: DbOrTx,
  modelId: string,
): Generator<{ inspection: CurrentInspection; findings: CurrentFinding[] }> {
  const { sql: text, params } = currentFindingsQuery(modelId);
  const statement = rawConnection(db).prepare(text).raw(true);
  type Row = [string, string, number, string, string, string];
  for (const [id, date, released, engineId, engineSerial, json] of statement.iterate(
    ...params,
  ) as IterableIterator<Row>) {
    const rows = JSON.parse(json) as CurrentRow[];
    if (rows.length === 0) continue;
    const inspection = { id, date, released: released === 1, engineId, engineSerial };
    const findings = rows.map((row): CurrentFinding => {
      const interval =
        row[13] === null && row[14] === null && row[15] === null
          ? null
          : { cycles: row[13], hours: row[14], days: row[15] };
      return {
        id: String(row[0]),
        number: row[0],
        row: row[1],
        position: row[2],
        zone: row[3],
        damage: row[4] as EvaluationFinding['damage'],
        lengthMm: row[5],
        widthMm: row[6],
        depthMm: row[7],
        areaMm2: row[8],
        count: row[9],
        uncertaintyMm: row[10],
        uncertaintyMm2: row[11],
        category: row[12],
        repeatInterval: row[12] === 'repeat-inspection' ? interval : null,
        limitSetId: row[16],
      };
    });
    yield { inspection, findings };
  }
}

/** What a listed change shows beyond the index: the finding's id and its stored rule. */
export function findingRefs(
  db: DbOrTx,
  keys: readonly { inspectionId: string; number: number }[],
): Map<string, { id: string; ruleId: string | null }> {
  const refs = new Map<string, { id: string; ruleId: string | null }>();
  for (let start = 0; start < keys.length; start += 400) {
    const slice = keys.slice(start, start + 400);
    const pairs = sql.join(
      slice.map((key) => sql`(${key.inspectionId}, ${key.number})`),
      sql`, `,
    );
    const rows = db.all<{
      inspectionId: string;
      number: number;
      id: string;
      ruleId: string | null;
    }>(
      sql`SELECT inspection_id AS inspectionId, number, id,
            json_extract(evaluation, '$.ruleId') AS ruleId
          FROM findings WHERE (inspection_id, number) IN (VALUES ${pairs})`,
    );
    for (const row of rows) refs.set(`${row.inspectionId}#${row.number}`, row);
  }
  return refs;
}
