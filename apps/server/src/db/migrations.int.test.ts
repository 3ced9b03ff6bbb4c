import fs from 'node:fs';
import path from 'node:path';
import type Database from 'better-sqlite3';
import request from 'supertest';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { describe, expect, it } from 'vitest';
import {
  openInspection,
  still,
  tenMillimetreReference,
  uploadImages,
} from '../../test/inspection-fixtures';
import { demoAccounts, makeDataDir, startTestApp } from '../../test/test-app';
import { paths } from '../config/paths';
import { DEMO_LIMIT_SET_ID } from '../demo/demo-limits';
import { openDatabase } from './client';
import { runMigrations } from './migrate';

const testKey = Buffer.from('an invented records key for this test only');
import { triggers } from './triggers';

const guarded = ['limit_sets', 'limit_rules', 'findings', 'audit_log'];

/** A database with the demo's published revision, an inspection, an image and findings. */
async function populatedDatabase(): Promise<string> {
  const dataDir = makeDataDir();
  const t = await startTestApp({ dataDir, env: { DEMO_IMAGES: '0' } });
  const inspector = await t.signIn(demoAccounts.inspector);
  const inspectionId = await openInspection(t.app, inspector, {
    engineId: 'engine-d0101',
    date: '2026-05-20',
    csn: 14_125,
    rows: ['hpt1-ngv'],
  });
  const [imageId] = await uploadImages(t.app, inspector, inspectionId, [await still(800, 600)]);
  for (const position of [1, 2, 3]) {
    const response = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/findings`)
      .set('Cookie', inspector)
      .send({
        imageId,
        shape: {
          kind: 'polyline',
          points: [
            [300, 300],
            [340, 330],
          ],
        },
        calibration: tenMillimetreReference,
        row: 'hpt1-ngv',
        position,
        zone: 'leading-edge',
        damage: 'crack',
        method: 'image',
      });
    expect(response.status).toBe(201);
  }
  await t.close();
  return path.join(dataDir, 'emberline.sqlite');
}

/**
 * The migrations folder with one more migration that rebuilds the guarded tables the way
 * drizzle-kit does to change a column: a new table with an added column, copy, drop, rename.
 */
function foldersWithRebuild(sqlite: Database.Database): string {
  const folder = fs.mkdtempSync(path.join(makeDataDir(), 'migrations-'));
  fs.cpSync(paths.migrations, folder, { recursive: true });
  const statements = ['PRAGMA defer_foreign_keys = ON;'];
  for (const table of guarded) {
    const { sql } = sqlite
      .prepare("SELECT sql FROM sqlite_master WHERE type = 'table' AND name = ?")
      .get(table) as { sql: string };
    const columns = (sqlite.prepare(`PRAGMA table_info(${table})`).all() as { name: string }[])
      .map((column) => `\`${column.name}\``)
      .join(', ');
    const rebuilt = sql.replace(
      /CREATE TABLE [`"]?\w+[`"]? \(/,
      `CREATE TABLE \`__new_${table}\` (\n\t\`rebuild_note\` text,`,
    );
    statements.push(
      rebuilt + ';',
      `INSERT INTO \`__new_${table}\`(${columns}) SELECT ${columns} FROM \`${table}\`;`,
      `DROP TABLE \`${table}\`;`,
      `ALTER TABLE \`__new_${table}\` RENAME TO \`${table}\`;`,
    );
  }
  // Indexes go with their table; put the ones the schema declares back, as drizzle-kit does.
  for (const { sql } of sqlite
    .prepare(
      `SELECT sql FROM sqlite_master WHERE type = 'index' AND sql IS NOT NULL AND tbl_name IN (${guarded.map(() => '?').join(', ')})`,
    )
    .all(...guarded) as { sql: string }[])
    statements.push(sql + ';');
  const tag = '9999_rebuild-guarded-tables';
  fs.writeFileSync(
    path.join(folder, `${tag}.sql`),
    statements.join('\n--> statement-breakpoint\n'),
  );
  const journalFile = path.join(folder, 'meta', '_journal.json');
  const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8'));
  journal.entries.push({
    idx: journal.entries.length,
    version: '6',
    when: Date.now() + 1000,
    tag,
    breakpoints: true,
  });
  fs.writeFileSync(journalFile, JSON.stringify(journal));
  return folder;
}

const counts = (sqlite: Database.Database) =>
  Object.fromEntries(
    guarded.map((table) => [
      table,
      (sqlite.prepare(`SELECT count(*) AS n FROM ${table}`).get() as { n: number }).n,
    ]),
  );

const triggerNames = (sqlite: Database.Database) =>
  (
    sqlite.prepare("SELECT name FROM sqlite_master WHERE type = 'trigger' ORDER BY name").all() as {
      name: string;
    }[]
  ).map((row) => row.name);

describe('migrating a populated database', () => {
  it('keeps its rows and its triggers when a migration rebuilds the guarded tables', async () => {
    const file = await populatedDatabase();
    const handle = openDatabase(file, testKey);
    const before = counts(handle.sqlite);
    expect(before.findings).toBe(3);
    expect(before.limit_rules).toBeGreaterThan(40);
    const folder = foldersWithRebuild(handle.sqlite);

    // The same migration without Emberline's trigger step fails: a trigger on limit_rules reads
    // limit_sets, and SQLite will not rename the rebuilt table under it.
    const copy = path.join(makeDataDir(), 'copy.sqlite');
    await handle.sqlite.backup(copy);
    const bare = openDatabase(copy, testKey);
    expect(() => migrate(bare.db, { migrationsFolder: folder })).toThrow();
    bare.close();

    runMigrations(handle.db, folder);
    const columns = (
      handle.sqlite.prepare('PRAGMA table_info(limit_rules)').all() as { name: string }[]
    ).map((c) => c.name);
    expect(columns).toContain('rebuild_note');
    expect(counts(handle.sqlite)).toEqual(before);
    expect(triggerNames(handle.sqlite)).toEqual(Object.keys(triggers).sort());

    const refuse = (sql: string) =>
      expect(() => handle.sqlite.prepare(sql).run()).toThrow(
        /cannot change|never deleted|append-only/,
      );
    refuse(
      `UPDATE limit_rules SET serviceable_max = 99 WHERE limit_set_id = '${DEMO_LIMIT_SET_ID}'`,
    );
    refuse(`DELETE FROM limit_rules WHERE limit_set_id = '${DEMO_LIMIT_SET_ID}'`);
    refuse(
      `INSERT INTO limit_rules (limit_set_id, rule_id, sequence, row_key, zones, damage, measure, unit, not_permitted, reference)
       VALUES ('${DEMO_LIMIT_SET_ID}', 'extra', 999, 'hpt1-ngv', '["*"]', 'crack', 'length', 'mm', 0, 'x')`,
    );
    refuse(`UPDATE limit_sets SET title = 'edited' WHERE id = '${DEMO_LIMIT_SET_ID}'`);
    refuse(
      `UPDATE limit_sets SET status = 'superseded', title = 'edited' WHERE id = '${DEMO_LIMIT_SET_ID}'`,
    );
    refuse(`DELETE FROM limit_sets WHERE id = '${DEMO_LIMIT_SET_ID}'`);
    refuse('DELETE FROM findings');
    refuse('UPDATE audit_log SET action = action');
    expect(counts(handle.sqlite)).toEqual(before);

    // The one change allowed: published → superseded, nothing else.
    handle.sqlite
      .prepare(`UPDATE limit_sets SET status = 'superseded' WHERE id = '${DEMO_LIMIT_SET_ID}'`)
      .run();
    refuse(`UPDATE limit_sets SET status = 'published' WHERE id = '${DEMO_LIMIT_SET_ID}'`);
    expect(handle.sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
    expect(handle.sqlite.pragma('foreign_key_check')).toEqual([]);
    handle.close();
  });
});
