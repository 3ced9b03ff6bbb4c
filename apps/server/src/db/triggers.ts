import type Database from 'better-sqlite3';
import { findingSearchTriggers } from './finding-search';

/**
 * The rules SQLite itself enforces, whatever code runs. They are dropped before the migrations run
 * and created again after them: drizzle-kit rebuilds a table to change a column (new table, copy,
 * drop, rename), a dropped table takes its triggers with it, and a trigger that reads a table being
 * rebuilt stops the rename. Defining them here, not in a migration, keeps them in place.
 */
const frozen = "SELECT RAISE(ABORT, 'a published or superseded limit-set revision cannot change')";

/** Every column of limit_sets but status: none may change once a revision is published. */
const limitSetContent = [
  'id',
  'model_id',
  'revision',
  'title',
  'manual_reference',
  'effective_date',
  'invented',
  'based_on_id',
  'published_at',
  'published_by',
  'content_sha256',
  'created_by',
  'created_at',
];

/*
 * Locks of a submitted inspection (DESIGN §5.5): its particulars, images, findings and coverage
 * refuse change until an engineer sends it back to draft. A message starting `locked:` reaches the
 * user as a 409 in these words (middleware/error-handler.ts).
 */
const locked =
  "SELECT RAISE(ABORT, 'locked: this inspection has been submitted for review and is locked; an engineer can send it back to draft')";
const stateOf = (column: string) =>
  `(SELECT state FROM inspections WHERE id = ${column}) <> 'draft'`;

/** The particulars of an inspection: every column but its review state and the review's marks. */
const inspectionParticulars = [
  'id',
  'engine_id',
  'date',
  'reason',
  'reason_detail',
  'csn',
  'tsn',
  'inspector_name',
  'qualification_ref',
  'qualification_expires_on',
  'probe',
  'probe_calibration_due_on',
  'rows',
  'flags',
  'created_by',
  'created_at',
];

/** Every column of a disposition but its state, which changes once, from current. */
const dispositionContent = [
  'id',
  'finding_id',
  'inspection_id',
  'decision',
  'kind',
  'rationale',
  'concession',
  'concession_ref',
  'supersedes_id',
  'supersede_reason',
  'recurrence',
  'signature_id',
  'signed_by',
  'signed_at',
];

export const triggers: Record<string, string> = {
  audit_log_no_update: `BEFORE UPDATE ON audit_log BEGIN SELECT RAISE(ABORT, 'audit_log is append-only'); END`,
  audit_log_no_delete: `BEFORE DELETE ON audit_log BEGIN SELECT RAISE(ABORT, 'audit_log is append-only'); END`,
  limit_sets_frozen_update: `BEFORE UPDATE ON limit_sets
    WHEN OLD.status <> 'draft' AND NOT (
      OLD.status = 'published' AND NEW.status = 'superseded' AND
      ${limitSetContent.map((column) => `NEW.${column} IS OLD.${column}`).join(' AND ')}
    )
    BEGIN ${frozen}; END`,
  limit_sets_status_step: `BEFORE UPDATE OF status ON limit_sets
    WHEN OLD.status = 'draft' AND NEW.status NOT IN ('draft', 'published')
    BEGIN SELECT RAISE(ABORT, 'a draft limit-set revision can only be published'); END`,
  limit_sets_frozen_delete: `BEFORE DELETE ON limit_sets WHEN OLD.status <> 'draft' BEGIN ${frozen}; END`,
  limit_rules_frozen_insert: `BEFORE INSERT ON limit_rules
    WHEN (SELECT status FROM limit_sets WHERE id = NEW.limit_set_id) <> 'draft'
    BEGIN ${frozen}; END`,
  limit_rules_frozen_update: `BEFORE UPDATE ON limit_rules
    WHEN (SELECT status FROM limit_sets WHERE id = OLD.limit_set_id) <> 'draft'
      OR (SELECT status FROM limit_sets WHERE id = NEW.limit_set_id) <> 'draft'
    BEGIN ${frozen}; END`,
  limit_rules_frozen_delete: `BEFORE DELETE ON limit_rules
    WHEN (SELECT status FROM limit_sets WHERE id = OLD.limit_set_id) <> 'draft'
    BEGIN ${frozen}; END`,
  signatures_no_update: `BEFORE UPDATE ON signatures BEGIN SELECT RAISE(ABORT, 'signatures are append-only'); END`,
  signatures_no_delete: `BEFORE DELETE ON signatures BEGIN SELECT RAISE(ABORT, 'signatures are append-only'); END`,
  findings_no_delete: `BEFORE DELETE ON findings
    BEGIN SELECT RAISE(ABORT, 'findings are voided with a reason, never deleted'); END`,
  inspections_locked: `BEFORE UPDATE ON inspections WHEN OLD.state <> 'draft' AND NOT (
      ${inspectionParticulars.map((column) => `NEW.${column} IS OLD.${column}`).join(' AND ')}
    ) BEGIN ${locked}; END`,
  images_locked_insert: `BEFORE INSERT ON images WHEN ${stateOf('NEW.inspection_id')} BEGIN ${locked}; END`,
  images_locked_update: `BEFORE UPDATE ON images WHEN ${stateOf('OLD.inspection_id')} BEGIN ${locked}; END`,
  images_locked_delete: `BEFORE DELETE ON images WHEN ${stateOf('OLD.inspection_id')} BEGIN ${locked}; END`,
  findings_locked_insert: `BEFORE INSERT ON findings WHEN ${stateOf('NEW.inspection_id')} BEGIN ${locked}; END`,
  findings_locked_update: `BEFORE UPDATE ON findings WHEN ${stateOf('OLD.inspection_id')} BEGIN ${locked}; END`,
  row_coverage_locked_insert: `BEFORE INSERT ON row_coverage WHEN ${stateOf('NEW.inspection_id')} BEGIN ${locked}; END`,
  row_coverage_locked_update: `BEFORE UPDATE ON row_coverage WHEN ${stateOf('OLD.inspection_id')} BEGIN ${locked}; END`,
  row_coverage_locked_delete: `BEFORE DELETE ON row_coverage WHEN ${stateOf('OLD.inspection_id')} BEGIN ${locked}; END`,
  reports_no_update: `BEFORE UPDATE ON reports BEGIN SELECT RAISE(ABORT, 'a signed report never changes; a correction issues a new revision'); END`,
  reports_no_delete: `BEFORE DELETE ON reports BEGIN SELECT RAISE(ABORT, 'a signed report never changes; a correction issues a new revision'); END`,
  dispositions_no_delete: `BEFORE DELETE ON dispositions
    BEGIN SELECT RAISE(ABORT, 'dispositions are superseded or withdrawn, never deleted'); END`,
  dispositions_state_only: `BEFORE UPDATE ON dispositions WHEN NOT (
      OLD.state = 'current' AND NEW.state IN ('superseded', 'withdrawn') AND
      ${dispositionContent.map((column) => `NEW.${column} IS OLD.${column}`).join(' AND ')}
    ) BEGIN SELECT RAISE(ABORT, 'a signed disposition cannot change; supersede it with a new one'); END`,
  ...findingSearchTriggers,
};

/**
 * Drops every trigger above. Migrations run without them: a trigger on one table that reads
 * another makes SQLite refuse to rename a rebuilt table ("error in trigger … no such table").
 */
export function dropTriggers(sqlite: Database.Database): void {
  sqlite.transaction(() => {
    for (const name of Object.keys(triggers)) sqlite.exec(`DROP TRIGGER IF EXISTS ${name}`);
  })();
}

/** Drops and creates every trigger above, in one transaction, so that they match this code. */
export function ensureTriggers(sqlite: Database.Database): void {
  sqlite.transaction(() => {
    for (const [name, body] of Object.entries(triggers)) {
      sqlite.exec(`DROP TRIGGER IF EXISTS ${name}`);
      sqlite.exec(`CREATE TRIGGER ${name} ${body}`);
    }
  })();
}
