import type Database from 'better-sqlite3';

/*
 * The fleet findings search's projection, `finding_search` (db/schema.ts, decision 012): one row
 * per recorded finding of an inspection that holds records. One SELECT below says what a row is;
 * the triggers run it for the rows a change touches, in the change's own transaction, and a
 * rebuild runs it for every row. The triggers write only the projection, never a record.
 */

const columns = [
  'finding_id',
  'inspection_id',
  'inspection_date',
  'released',
  'engine_id',
  'engine_serial',
  'organisation_id',
  'model_id',
  'number',
  'row_key',
  'position',
  'zone',
  'damage',
  'length_mm',
  'area_mm2',
  'depth_mm',
  'severity',
  'decision',
  'released_decision',
].join(', ');

/**
 * The projection's rows for the findings `where` names (over `f` findings, `i` inspections and
 * `e` engines). The decision an owner sees is the one the inspection's latest release names
 * through its outcome signature, so that a decision signed again after a release stays with the
 * staff until the next one.
 */
const sourceRows = (where: string) => `
  SELECT f.id, f.inspection_id, i.date, i.release_revision > 0, e.id, e.serial_number,
    e.organisation_id, e.model_id, f.number, f.row_key, f.position, f.zone, f.damage,
    f.length_mm, f.area_mm2, f.depth_mm,
    CASE f.category WHEN 'serviceable' THEN 0 WHEN 'repeat-inspection' THEN 1
      WHEN 'review' THEN 2 WHEN 'beyond-limits' THEN 3 END,
    (SELECT d.kind FROM dispositions d WHERE d.finding_id = f.id AND d.state = 'current' LIMIT 1),
    CASE WHEN i.release_revision > 0 THEN (SELECT d.kind FROM dispositions d
      WHERE d.finding_id = f.id AND d.id IN (
        SELECT json_extract(item.value, '$.dispositionId')
        FROM signatures outcome, json_each(outcome.content, '$.dispositions') item
        WHERE outcome.kind = 'outcome' AND outcome.sha256 = (
          SELECT json_extract(released.content, '$.outcomeSignatureSha256')
          FROM signatures released
          WHERE released.kind = 'release' AND released.subject_id = f.inspection_id
          ORDER BY released.seq DESC LIMIT 1))
      LIMIT 1) END
  FROM findings f
  JOIN inspections i ON i.id = f.inspection_id
  JOIN engines e ON e.id = i.engine_id
  WHERE f.status = 'recorded' AND i.state NOT IN ('draft', 'void') AND ${where}`;

/** Forgets the rows `stale` names and writes again those `where` names. */
const refresh = (stale: string, where: string) =>
  `DELETE FROM finding_search WHERE ${stale};
   INSERT INTO finding_search (${columns}) ${sourceRows(where)};`;

/** What `finding_search_counts` groups the projection's rows by. */
const countKey = [
  ['released', 'released'],
  ['organisation_id', 'organisation_id'],
  ['model_id', 'model_id'],
  ['row_key', 'row_key'],
  ['zone', 'zone'],
  ['damage', 'damage'],
  ['severity', 'severity'],
  ['decision', 'decision'],
  ['released_decision', 'released_decision'],
  ['has_length', 'length_mm IS NOT NULL'],
  ['has_area', 'area_mm2 IS NOT NULL'],
  ['has_depth', 'depth_mm IS NOT NULL'],
] as const;
const countColumns = countKey.map(([column]) => column).join(', ');
/** The projection row's values of the key, read from `row` (NEW, OLD, or nothing for a query). */
const keyOf = (row: string) =>
  countKey.map(([, value]) => value.replace(/^(\w+)/, row ? `${row}.$1` : '$1')).join(', ');
/** The count row of `row`'s combination (IS: a verdict or a decision may be null). */
const countOf = (row: string) =>
  countKey
    .map(([column, value]) => `${column} IS (${value.replace(/^(\w+)/, `${row}.$1`)})`)
    .join(' AND ');
const counted = (row: string) => `
  INSERT INTO finding_search_counts (${countColumns}, n) SELECT ${keyOf(row)}, 0
    WHERE NOT EXISTS (SELECT 1 FROM finding_search_counts WHERE ${countOf(row)});
  UPDATE finding_search_counts SET n = n + 1 WHERE ${countOf(row)};`;
const uncounted = (row: string) => `
  UPDATE finding_search_counts SET n = n - 1 WHERE ${countOf(row)};
  DELETE FROM finding_search_counts WHERE n = 0 AND ${countOf(row)};`;

/** The triggers that keep the projection, installed with the rest by db/triggers.ts. */
export const findingSearchTriggers: Record<string, string> = {
  finding_search_finding_insert: `AFTER INSERT ON findings BEGIN
    ${refresh('finding_id = NEW.id', 'f.id = NEW.id')} END`,
  finding_search_finding_update: `AFTER UPDATE ON findings BEGIN
    ${refresh('finding_id = OLD.id', 'f.id = NEW.id')} END`,
  finding_search_finding_delete: `AFTER DELETE ON findings BEGIN
    DELETE FROM finding_search WHERE finding_id = OLD.id; END`,
  finding_search_inspection_update: `AFTER UPDATE ON inspections BEGIN
    ${refresh('inspection_id = OLD.id', 'f.inspection_id = NEW.id')} END`,
  finding_search_inspection_delete: `AFTER DELETE ON inspections BEGIN
    DELETE FROM finding_search WHERE inspection_id = OLD.id; END`,
  finding_search_engine_update: `AFTER UPDATE ON engines WHEN
      NEW.id IS NOT OLD.id OR NEW.serial_number IS NOT OLD.serial_number OR
      NEW.organisation_id IS NOT OLD.organisation_id OR NEW.model_id IS NOT OLD.model_id
    BEGIN ${refresh('engine_id = OLD.id', 'e.id = NEW.id')} END`,
  finding_search_disposition_insert: `AFTER INSERT ON dispositions BEGIN
    ${refresh('finding_id = NEW.finding_id', 'f.id = NEW.finding_id')} END`,
  finding_search_disposition_update: `AFTER UPDATE ON dispositions BEGIN
    ${refresh('finding_id = OLD.finding_id', 'f.id = NEW.finding_id')} END`,
  finding_search_disposition_delete: `AFTER DELETE ON dispositions BEGIN
    ${refresh('finding_id = OLD.finding_id', 'f.id = OLD.finding_id')} END`,
  finding_search_release: `AFTER INSERT ON signatures WHEN NEW.kind = 'release' BEGIN
    ${refresh('inspection_id = NEW.subject_id', 'f.inspection_id = NEW.subject_id')} END`,
  finding_search_counts_insert: `AFTER INSERT ON finding_search BEGIN ${counted('NEW')} END`,
  finding_search_counts_delete: `AFTER DELETE ON finding_search BEGIN ${uncounted('OLD')} END`,
  finding_search_counts_update: `AFTER UPDATE ON finding_search BEGIN
    ${uncounted('OLD')} ${counted('NEW')} END`,
};

/** The counts as the projection gives them, one row per combination. */
const countsOfProjection = `SELECT ${keyOf('')}, count(*) FROM finding_search GROUP BY ${keyOf('')}`;

/** Writes the whole projection again from the records (after a migration, which runs without triggers). */
export function rebuildFindingSearch(sqlite: Database.Database): void {
  sqlite.transaction(() =>
    sqlite.exec(`${refresh('1', '1')}
      DELETE FROM finding_search_counts;
      INSERT INTO finding_search_counts (${countColumns}, n) ${countsOfProjection};`),
  )();
}

/**
 * How many rows the projection has that the records do not give, how many the records give that
 * it lacks or holds otherwise, and how many of its counts differ from its rows: all 0 when it
 * agrees with the records.
 */
export function findingSearchDrift(sqlite: Database.Database): {
  extra: number;
  missing: number;
  miscounted: number;
} {
  return sqlite.transaction(() => {
    sqlite.exec(`DROP TABLE IF EXISTS temp.finding_search_expected;
      CREATE TEMP TABLE finding_search_expected AS ${sourceRows('1')};`);
    const differ = (from: string, minus: string) =>
      (
        sqlite
          .prepare(
            `SELECT count(*) AS n FROM (SELECT * FROM ${from} EXCEPT SELECT * FROM ${minus})`,
          )
          .get() as { n: number }
      ).n;
    const stored = `(SELECT ${columns} FROM main.finding_search)`;
    const counts = `(SELECT ${countColumns}, n FROM finding_search_counts)`;
    const drift = {
      extra: differ(stored, 'temp.finding_search_expected'),
      missing: differ('temp.finding_search_expected', stored),
      miscounted:
        differ(counts, `(${countsOfProjection})`) + differ(`(${countsOfProjection})`, counts),
    };
    sqlite.exec('DROP TABLE temp.finding_search_expected');
    return drift;
  })();
}
