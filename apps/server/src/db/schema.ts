import { sql } from 'drizzle-orm';
import {
  blob,
  index,
  integer,
  primaryKey,
  real,
  sqliteTable,
  text,
  uniqueIndex,
} from 'drizzle-orm/sqlite-core';
import type { Calibration } from '@emberline/contracts/measurement';
import type { DueMove } from '@emberline/contracts/planning';
import type { DueBasis } from '@emberline/domain/due-status';

const createdAt = () =>
  integer({ mode: 'timestamp_ms' })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`);

/** The home organisation (the one that inspects) and the customer organisations. */
export const organisations = sqliteTable('organisations', {
  id: text().primaryKey(),
  name: text().notNull().unique(),
  kind: text({ enum: ['home', 'customer'] }).notNull(),
  createdAt: createdAt(),
});

export const users = sqliteTable(
  'users',
  {
    id: text().primaryKey(),
    email: text().notNull().unique(),
    name: text().notNull(),
    role: text({ enum: ['admin', 'inspector', 'engineer', 'planner', 'customer'] }).notNull(),
    organisationId: text()
      .notNull()
      .references(() => organisations.id),
    /** Null until an invited user chooses a password. */
    passwordHash: text(),
    disabledAt: integer({ mode: 'timestamp_ms' }),
    lastSignInAt: integer({ mode: 'timestamp_ms' }),
    passwordChangedAt: integer({ mode: 'timestamp_ms' }),
    createdAt: createdAt(),
    /** An engineer's authority to sign: `{ref, models, expiresOn}`, set by another administrator. */
    authorisation: text({ mode: 'json' }).$type<{
      ref: string;
      models: string[];
      expiresOn: string;
    }>(),
    /** An inspector's qualification: `{ref, expiresOn}`. */
    qualification: text({ mode: 'json' }).$type<{ ref: string; expiresOn: string }>(),
  },
  (table) => [index('users_organisation_idx').on(table.organisationId)],
);

/** Server-side session rows: the signed cookie is only valid while its row is live. */
export const sessions = sqliteTable(
  'sessions',
  {
    id: text().primaryKey(),
    userId: text()
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    lastSeenAt: integer({ mode: 'timestamp_ms' }).notNull(),
    expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
    revokedAt: integer({ mode: 'timestamp_ms' }),
    revokedReason: text(),
    ip: text(),
    userAgent: text(),
  },
  (table) => [index('sessions_user_idx').on(table.userId, table.revokedAt)],
);

/** Failed sign-ins, kept in SQLite so the rate limit survives a restart. */
export const loginFailures = sqliteTable(
  'login_failures',
  {
    id: integer().primaryKey({ autoIncrement: true }),
    key: text().notNull(),
    at: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [index('login_failures_key_at_idx').on(table.key, table.at)],
);

/** Single-use links sent by e-mail: invitations and password resets. Only the hash is stored. */
export const userTokens = sqliteTable(
  'user_tokens',
  {
    id: text().primaryKey(),
    userId: text()
      .notNull()
      .references(() => users.id),
    purpose: text({ enum: ['invitation', 'password-reset'] }).notNull(),
    tokenHash: text().notNull(),
    createdAt: createdAt(),
    expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
    usedAt: integer({ mode: 'timestamp_ms' }),
  },
  (table) => [
    uniqueIndex('user_tokens_hash_idx').on(table.tokenHash),
    index('user_tokens_user_idx').on(table.userId, table.purpose),
  ],
);

/** Append-only: SQLite triggers refuse UPDATE and DELETE (see the custom migration). */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer().primaryKey({ autoIncrement: true }),
    at: integer({ mode: 'timestamp_ms' }).notNull(),
    actorUserId: text().references(() => users.id),
    action: text().notNull(),
    entityType: text().notNull(),
    entityId: text(),
    before: text({ mode: 'json' }),
    after: text({ mode: 'json' }),
    requestId: text(),
    ip: text(),
    /** The audit chain (DESIGN §5.5): 1, 2, 3, … without gaps, each row hashed over the last. */
    seq: integer(),
    prevHash: text(),
    hash: text(),
    /** HMAC-SHA256 of `hash` under the records key, made by SQLite's `records_mac` (db/client.ts). */
    mac: text(),
  },
  (table) => [
    index('audit_log_entity_idx').on(table.entityType, table.entityId),
    index('audit_log_at_idx').on(table.at),
    uniqueIndex('audit_log_seq_idx').on(table.seq),
  ],
);

/** Report contacts of an organisation: the only addresses reports are ever sent to. */
export const reportContacts = sqliteTable(
  'report_contacts',
  {
    id: text().primaryKey(),
    organisationId: text()
      .notNull()
      .references(() => organisations.id),
    name: text().notNull(),
    email: text().notNull(),
    role: text().notNull(),
    /** Gets each released inspection's signed report. */
    receivesReports: integer({ mode: 'boolean' }).notNull().default(true),
    /** Gets the urgent notices (an outcome ordering removal before the next flight). */
    receivesUrgent: integer({ mode: 'boolean' }).notNull().default(true),
    createdAt: createdAt(),
  },
  (table) => [uniqueIndex('report_contacts_org_email_idx').on(table.organisationId, table.email)],
);

interface RowNumbering {
  positionOne: string;
  direction: 'clockwise' | 'counter-clockwise';
  viewpoint: 'aft-looking-forward' | 'forward-looking-aft';
}

/** An engine model version. A row in use is never re-mapped: a new version is made instead. */
export const engineModels = sqliteTable(
  'engine_models',
  {
    id: text().primaryKey(),
    name: text().notNull(),
    version: integer().notNull(),
    notes: text().notNull().default(''),
    /** The routine hot-section inspection interval `{cycles, hours, days}` (DESIGN §5.6). */
    standardInterval: text({ mode: 'json' }).$type<{
      cycles: number | null;
      hours: number | null;
      days: number | null;
    }>(),
    createdAt: createdAt(),
  },
  (table) => [uniqueIndex('engine_models_name_version_idx').on(table.name, table.version)],
);

/** The hot-section rows of a model, in gas-path order. */
export const engineModelRows = sqliteTable(
  'engine_model_rows',
  {
    modelId: text()
      .notNull()
      .references(() => engineModels.id),
    key: text().notNull(),
    sequence: integer().notNull(),
    label: text().notNull(),
    kind: text({ enum: ['combustor-liner', 'fuel-nozzle', 'vane', 'blade'] }).notNull(),
    count: integer().notNull(),
    numbering: text({ mode: 'json' }).notNull().$type<RowNumbering>(),
    zones: text({ mode: 'json' }).notNull().$type<string[]>(),
    ports: text({ mode: 'json' }).notNull().$type<string[]>(),
  },
  (table) => [primaryKey({ columns: [table.modelId, table.key] })],
);

export const engines = sqliteTable(
  'engines',
  {
    id: text().primaryKey(),
    serialNumber: text().notNull(),
    modelId: text()
      .notNull()
      .references(() => engineModels.id),
    organisationId: text()
      .notNull()
      .references(() => organisations.id),
    installedPosition: text(),
    registration: text(),
    /** Hours and cycles since new as of `tsnCsnAsOf`; increments recorded after that date add to them. */
    tsn: real().notNull(),
    csn: integer().notNull(),
    tsnCsnAsOf: text().notNull(),
    status: text({ enum: ['installed', 'removed', 'in-shop'] }).notNull(),
    /** The last hot-section inspection before the engine joined the fleet, if known. */
    preFleetInspection: text({ mode: 'json' }).$type<{ date: string; csn: number; tsn: number }>(),
    /** The shop's release when it last came back to service: the new baseline (DESIGN §5.6). */
    shopRelease: text({ mode: 'json' }).$type<{ date: string; csn: number; tsn: number }>(),
    createdAt: createdAt(),
  },
  (table) => [
    uniqueIndex('engines_model_serial_idx').on(table.modelId, table.serialNumber),
    index('engines_organisation_idx').on(table.organisationId, table.serialNumber),
    index('engines_status_idx').on(table.status, table.serialNumber),
    index('engines_serial_idx').on(table.serialNumber),
  ],
);

/** Utilization increments: the cycles and hours flown in a dated period. */
export const utilizationRecords = sqliteTable(
  'utilization_records',
  {
    id: text().primaryKey(),
    engineId: text()
      .notNull()
      .references(() => engines.id),
    periodStart: text().notNull(),
    periodEnd: text().notNull(),
    cycles: integer().notNull(),
    hours: real().notNull(),
    source: text({ enum: ['form', 'csv', 'demo'] }).notNull(),
    createdBy: text().references(() => users.id),
    createdAt: createdAt(),
  },
  (table) => [index('utilization_engine_period_idx').on(table.engineId, table.periodEnd)],
);

interface StoredFlag {
  code: 'probe-calibration-expired' | 'qualification-expired' | 'csn-doubt' | 'tsn-doubt';
  message: string;
  acknowledgedAt: string | null;
  acknowledgedBy: string | null;
  note: string | null;
}

export const inspections = sqliteTable(
  'inspections',
  {
    id: text().primaryKey(),
    engineId: text()
      .notNull()
      .references(() => engines.id),
    date: text().notNull(),
    reason: text({
      enum: [
        'scheduled',
        'repeat-inspection',
        'over-temperature',
        'hot-start',
        'foreign-object-ingestion',
        'egt-trend',
        'other',
      ],
    }).notNull(),
    reasonDetail: text().notNull().default(''),
    csn: integer().notNull(),
    tsn: real().notNull(),
    inspectorName: text().notNull(),
    qualificationRef: text().notNull(),
    qualificationExpiresOn: text().notNull(),
    probe: text().notNull(),
    probeCalibrationDueOn: text().notNull(),
    rows: text({ mode: 'json' }).notNull().$type<string[]>(),
    state: text({ enum: ['draft', 'submitted', 'dispositioned', 'released', 'void'] }).notNull(),
    flags: text({ mode: 'json' }).notNull().$type<StoredFlag[]>(),
    /** Why an engineer last sent it back to draft, who and when; kept until it is submitted again. */
    returnedReason: text(),
    returnedBy: text().references(() => users.id),
    returnedAt: integer({ mode: 'timestamp_ms' }),
    /** When it was last submitted, and the limit revision it keeps from then on (DESIGN §5.5). */
    submittedAt: integer({ mode: 'timestamp_ms' }),
    limitSetId: text().references(() => limitSets.id),
    /** The signature of the current outcome, and of the current release with its revision. */
    outcomeSignatureId: text(),
    releaseSignatureId: text(),
    releaseRevision: integer().notNull().default(0),
    /** Why a draft started by mistake was voided, by whom and when (state `void`). */
    voidReason: text(),
    voidedBy: text().references(() => users.id),
    voidedAt: integer({ mode: 'timestamp_ms' }),
    createdBy: text()
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (table) => [
    index('inspections_engine_date_idx').on(table.engineId, table.date),
    // The fleet asks of every engine whether a submitted inspection waits for disposition.
    index('inspections_submitted_idx')
      .on(table.engineId, table.date)
      .where(sql`${table.state} = 'submitted'`),
  ],
);

/** An image of an inspection: the original on disk by SHA-256, renditions in the row. */
export const images = sqliteTable(
  'images',
  {
    id: text().primaryKey(),
    inspectionId: text()
      .notNull()
      .references(() => inspections.id),
    sha256: text().notNull(),
    format: text({ enum: ['jpeg', 'png', 'tiff', 'webp'] }).notNull(),
    bytes: integer().notNull(),
    width: integer().notNull(),
    height: integer().notNull(),
    originalName: text().notNull(),
    capturedAt: text(),
    source: text({ enum: ['upload', 'video-frame'] }).notNull(),
    videoFileName: text(),
    videoTimeSeconds: real(),
    rowKey: text(),
    position: integer(),
    /** The access port the still was taken through, as the inspector names it. */
    port: text(),
    /** The scale picked on this still, or reused from `calibrationImageId` (same size and port). */
    calibration: text({ mode: 'json' }).$type<Calibration>(),
    calibrationImageId: text(),
    thumbnail: blob({ mode: 'buffer' }).notNull(),
    thumbnailType: text().notNull(),
    preview: blob({ mode: 'buffer' }).notNull(),
    previewType: text().notNull(),
    createdBy: text()
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (table) => [
    uniqueIndex('images_inspection_sha_idx').on(table.inspectionId, table.sha256),
    index('images_sha_idx').on(table.sha256),
  ],
);

/**
 * A revision of an engine model's damage limits. Published and superseded revisions are frozen by
 * SQLite triggers (db/triggers.ts): only the step published → superseded is allowed.
 */
export const limitSets = sqliteTable(
  'limit_sets',
  {
    id: text().primaryKey(),
    modelId: text()
      .notNull()
      .references(() => engineModels.id),
    revision: text().notNull(),
    title: text().notNull(),
    status: text({ enum: ['draft', 'published', 'superseded'] }).notNull(),
    manualReference: text().notNull(),
    effectiveDate: text(),
    invented: integer({ mode: 'boolean' }).notNull().default(false),
    basedOnId: text(),
    publishedAt: integer({ mode: 'timestamp_ms' }),
    publishedBy: text().references(() => users.id),
    contentSha256: text(),
    createdBy: text().references(() => users.id),
    createdAt: createdAt(),
  },
  (table) => [
    uniqueIndex('limit_sets_model_revision_idx').on(table.modelId, table.revision),
    // One revision in force per model.
    uniqueIndex('limit_sets_model_published_idx')
      .on(table.modelId)
      .where(sql`status = 'published'`),
  ],
);

/** The rules of a revision, in the §5.2 shape, each with the manual section it came from. */
export const limitRules = sqliteTable(
  'limit_rules',
  {
    limitSetId: text()
      .notNull()
      .references(() => limitSets.id),
    ruleId: text().notNull(),
    /** A short title people read; empty on rules written before titles were kept. */
    title: text().notNull().default(''),
    sequence: integer().notNull(),
    rowKey: text().notNull(),
    zones: text({ mode: 'json' }).notNull().$type<string[]>(),
    damage: text().notNull(),
    measure: text({ enum: ['length', 'width', 'depth', 'area', 'count'] }).notNull(),
    unit: text({ enum: ['mm', 'in', 'mm2', 'in2', 'count'] }).notNull(),
    serviceableMax: real(),
    repeatMax: real(),
    repeatInterval: text({ mode: 'json' }).$type<{
      cycles: number | null;
      hours: number | null;
      days: number | null;
    }>(),
    beyondAction: text({ mode: 'json' }).$type<{
      kind: 'remove-before-next-flight' | 'remove-within' | 'remove-at-next-shop-visit';
      cycles: number | null;
      hours: number | null;
    }>(),
    notPermitted: integer({ mode: 'boolean' }).notNull(),
    maxPerAirfoil: integer(),
    maxTotalPerAirfoil: real(),
    maxAirfoilsPerRow: integer(),
    maxAdjacentAirfoils: integer(),
    reference: text().notNull(),
  },
  (table) => [primaryKey({ columns: [table.limitSetId, table.ruleId] })],
);

/** A finding: damage located on a row, position and zone of an image, measured and judged. Never deleted. */
export const findings = sqliteTable(
  'findings',
  {
    id: text().primaryKey(),
    inspectionId: text()
      .notNull()
      .references(() => inspections.id),
    number: integer().notNull(),
    imageId: text()
      .notNull()
      .references(() => images.id),
    shape: text({ mode: 'json' }).notNull().$type<{
      kind: 'polyline' | 'polygon' | 'point';
      points: [number, number][];
    }>(),
    calibration: text({ mode: 'json' }).$type<Record<string, unknown>>(),
    pickUncertaintyPx: real().notNull(),
    rowKey: text().notNull(),
    position: integer().notNull(),
    zone: text().notNull(),
    damage: text().notNull(),
    method: text({ enum: ['image', 'probe'] }).notNull(),
    mmPerPx: real(),
    lengthMm: real(),
    areaMm2: real(),
    perimeterMm: real(),
    maxExtentMm: real(),
    uncertaintyMm: real(),
    uncertaintyMm2: real(),
    widthMm: real(),
    depthMm: real(),
    count: integer(),
    notes: text().notNull().default(''),
    previousFindingId: text(),
    seriesId: text().notNull(),
    status: text({ enum: ['recorded', 'void'] }).notNull(),
    voidReason: text(),
    voidedAt: integer({ mode: 'timestamp_ms' }),
    voidedBy: text().references(() => users.id),
    /** The stored verdict (FindingEvaluation JSON) and its category, for lists and filters. */
    evaluation: text({ mode: 'json' }).$type<Record<string, unknown>>(),
    category: text({ enum: ['serviceable', 'repeat-inspection', 'review', 'beyond-limits'] }),
    /** The stored verdict's repeat interval, beside its JSON, so the impact preview reads an index. */
    repeatCycles: real(),
    repeatHours: real(),
    repeatDays: real(),
    limitSetId: text().references(() => limitSets.id),
    evaluatedAt: integer({ mode: 'timestamp_ms' }),
    createdBy: text()
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    updatedAt: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [
    uniqueIndex('findings_inspection_number_idx').on(table.inspectionId, table.number),
    index('findings_inspection_row_idx').on(table.inspectionId, table.rowKey, table.position),
    index('findings_series_idx').on(table.seriesId),
    index('findings_previous_idx').on(table.previousFindingId),
    index('findings_category_idx').on(table.category),
    index('findings_row_idx').on(table.rowKey),
    // Covers the impact preview's read of every current finding: no table lookups for 200,000 rows.
    index('findings_impact_idx').on(
      table.inspectionId,
      table.status,
      table.number,
      table.rowKey,
      table.position,
      table.zone,
      table.damage,
      table.lengthMm,
      table.widthMm,
      table.depthMm,
      table.areaMm2,
      table.count,
      table.uncertaintyMm,
      table.uncertaintyMm2,
      table.category,
      table.repeatCycles,
      table.repeatHours,
      table.repeatDays,
      table.limitSetId,
    ),
  ],
);

/** Coverage of a listed row: fully, partly (which positions) or not viewed, and "no damage found". */
export const rowCoverage = sqliteTable(
  'row_coverage',
  {
    inspectionId: text()
      .notNull()
      .references(() => inspections.id),
    rowKey: text().notNull(),
    status: text({ enum: ['full', 'partial', 'none'] }).notNull(),
    viewedPositions: text({ mode: 'json' }).notNull().$type<number[]>(),
    noDamageFound: integer({ mode: 'boolean' }).notNull(),
    reason: text().notNull(),
    updatedBy: text()
      .notNull()
      .references(() => users.id),
    updatedAt: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [primaryKey({ columns: [table.inspectionId, table.rowKey] })],
);

/**
 * The durable outbox (DESIGN §5.7): one row a message, written in the transaction of the change
 * that causes it and delivered by the worker in lib/email. Attachments are BLOBs beside it
 * (docs/decisions/007-durable-outbox.md).
 */
export const outboxMessages = sqliteTable(
  'outbox_messages',
  {
    id: text().primaryKey(),
    /** What the message is: invitation, password-reset, and what later modules send. */
    kind: text().notNull(),
    recipients: text({ mode: 'json' })
      .$type<{ address: string; state: 'pending' | 'sent' | 'refused'; error: string | null }[]>()
      .notNull(),
    subject: text().notNull(),
    text: text().notNull(),
    html: text(),
    recordType: text(),
    recordId: text(),
    recordLabel: text(),
    state: text({ enum: ['queued', 'sending', 'sent', 'failed', 'needs-attention'] }).notNull(),
    attempts: integer().notNull().default(0),
    lastError: text(),
    /** When the worker may take it next; null once sent or waiting for a person. */
    nextAttemptAt: integer({ mode: 'timestamp_ms' }),
    /** While `sending`: no other round takes it before this time. */
    leaseUntil: integer({ mode: 'timestamp_ms' }),
    sentAt: integer({ mode: 'timestamp_ms' }),
    createdAt: integer({ mode: 'timestamp_ms' }).notNull(),
    updatedAt: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [
    index('outbox_messages_due_idx').on(table.state, table.nextAttemptAt),
    index('outbox_messages_record_idx').on(table.recordType, table.recordId),
    index('outbox_messages_created_idx').on(table.createdAt),
  ],
);

export const outboxAttachments = sqliteTable(
  'outbox_attachments',
  {
    id: integer().primaryKey({ autoIncrement: true }),
    messageId: text()
      .notNull()
      .references(() => outboxMessages.id),
    filename: text().notNull(),
    contentType: text().notNull(),
    size: integer().notNull(),
    content: blob({ mode: 'buffer' }).notNull(),
  },
  (table) => [index('outbox_attachments_message_idx').on(table.messageId)],
);

/**
 * The append-only record of signatures (DESIGN §5.5): each row chained to the one before by
 * `prevSha256`, its own `sha256` over its header, and a `mac` under the records key. SQLite
 * refuses UPDATE and DELETE (db/triggers.ts).
 */
export const signatures = sqliteTable(
  'signatures',
  {
    /** 1, 2, 3, … without gaps: a missing number is a removed record. */
    seq: integer().primaryKey(),
    id: text().notNull().unique(),
    kind: text({
      enum: ['disposition', 'withdrawal', 'outcome', 'release', 'limit-check', 'publication'],
    }).notNull(),
    subjectId: text().notNull(),
    signer: text({ mode: 'json' })
      .$type<{ id: string; name: string; role: string; authorisationRef: string | null }>()
      .notNull(),
    signedAt: text().notNull(),
    meaning: text().notNull(),
    content: text({ mode: 'json' }).notNull(),
    contentSha256: text().notNull(),
    prevSha256: text().notNull(),
    sha256: text().notNull().unique(),
    mac: text().notNull(),
  },
  (table) => [index('signatures_subject_idx').on(table.kind, table.subjectId)],
);

/**
 * An engineer's signed decision on one recorded finding (DESIGN §5.5). Rows are only added; the
 * one column that changes is `state`, once, from `current` to `superseded` or `withdrawn`
 * (db/triggers.ts). The signature row holds what was signed.
 */
export const dispositions = sqliteTable(
  'dispositions',
  {
    id: text().primaryKey(),
    findingId: text()
      .notNull()
      .references(() => findings.id),
    inspectionId: text()
      .notNull()
      .references(() => inspections.id),
    decision: text({ mode: 'json' }).notNull().$type<Record<string, unknown>>(),
    kind: text({ enum: ['serviceable', 'repeat-inspection', 'remove'] }).notNull(),
    rationale: text().notNull(),
    concession: integer({ mode: 'boolean' }).notNull(),
    concessionRef: text(),
    supersedesId: text(),
    supersedeReason: text(),
    /** The earlier finding the engineer confirmed as the same damage, or null. */
    recurrence: text({ mode: 'json' }).$type<{
      candidateFindingId: string;
      answer: 'same-damage' | 'new-damage';
    }>(),
    state: text({ enum: ['current', 'superseded', 'withdrawn'] }).notNull(),
    signatureId: text().notNull(),
    signedBy: text()
      .notNull()
      .references(() => users.id),
    signedAt: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [
    index('dispositions_finding_idx').on(table.findingId),
    index('dispositions_inspection_idx').on(table.inspectionId, table.state),
  ],
);

/** A planner's booking of an engine's next inspection: one per engine, replaced when rebooked. */
export const bookings = sqliteTable('bookings', {
  engineId: text()
    .primaryKey()
    .references(() => engines.id),
  plannedDate: text().notNull(),
  note: text().notNull().default(''),
  /** The due date when it was booked, to tell later that the due date moved. */
  dueDateAtBooking: text(),
  bookedBy: text()
    .notNull()
    .references(() => users.id),
  bookedAt: integer({ mode: 'timestamp_ms' }).notNull(),
});

/**
 * What each engine's due status rests on (DESIGN §5.6): the open requirements, candidates and
 * removals, which change only with a signature, a utilization record, the engine or its model.
 * Rewritten in the transaction of each such change (and checked whole by the daily sweep), so that
 * the planning board reads a fleet without replaying every inspection; the state is still read
 * from it on the day. The last move of the next inspection due is kept with its reason.
 */
export const engineDue = sqliteTable('engine_due', {
  engineId: text()
    .primaryKey()
    .references(() => engines.id, { onDelete: 'cascade' }),
  basis: text({ mode: 'json' }).$type<DueBasis>().notNull(),
  lastMove: text({ mode: 'json' }).$type<DueMove>(),
  computedAt: integer({ mode: 'timestamp_ms' }).notNull(),
});

/** When each scheduled job last ran, by the day it ran for: a restart neither repeats nor skips it. */
export const jobRuns = sqliteTable('job_runs', {
  job: text().primaryKey(),
  /** The last day (installation time zone, `YYYY-MM-DD`) the job ran for. */
  lastDay: text().notNull(),
  ranAt: integer({ mode: 'timestamp_ms' }).notNull(),
});

/**
 * The signed reports of released inspections: the PDF's bytes as they were mailed and signed
 * (never regenerated), their hash (the release signature covers it), the revision and the
 * verification code anyone may check at /verify/<code>. SQLite refuses changes to a row.
 */
export const reports = sqliteTable(
  'reports',
  {
    id: text().primaryKey(),
    inspectionId: text()
      .notNull()
      .references(() => inspections.id),
    revision: integer().notNull(),
    pdf: blob({ mode: 'buffer' }).notNull(),
    pdfSha256: text().notNull(),
    /** At least 128 random bits, base64url: what a reader types or follows to check the report. */
    verificationCode: text().notNull(),
    releaseSignatureId: text()
      .notNull()
      .references(() => signatures.id),
    createdAt: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [
    uniqueIndex('reports_inspection_revision_idx').on(table.inspectionId, table.revision),
    uniqueIndex('reports_code_idx').on(table.verificationCode),
  ],
);

/**
 * The fleet findings search's projection (decision 012): one row per recorded finding of an
 * inspection that holds records (submitted or later, not void), with every column the search
 * filters or sorts by. Kept by SQLite triggers in the transaction of the rows it mirrors
 * (db/finding-search.ts) and rebuilt whole after a migration; nothing else writes it. It is read,
 * never signed: the records are the source rows.
 */
export const findingSearch = sqliteTable(
  'finding_search',
  {
    findingId: text().primaryKey(),
    inspectionId: text().notNull(),
    inspectionDate: text().notNull(),
    /** 1 once the inspection was released (an owner sees it), else 0. */
    released: integer().notNull(),
    engineId: text().notNull(),
    engineSerial: text().notNull(),
    organisationId: text().notNull(),
    modelId: text().notNull(),
    number: integer().notNull(),
    rowKey: text().notNull(),
    position: integer().notNull(),
    zone: text().notNull(),
    damage: text().notNull(),
    lengthMm: real(),
    areaMm2: real(),
    depthMm: real(),
    /** The stored verdict as a rank: serviceable 0, repeat inspection 1, review 2, beyond limits 3. */
    severity: integer(),
    /** The kind of the current disposition (staff see it), or null. */
    decision: text(),
    /** The kind of the disposition the latest release names (an owner sees it), or null. */
    releasedDecision: text(),
  },
  (table) => {
    // Each index ends in the search's tie order (newest inspection, engine serial, finding
    // number), so that a page is a range of the index, not a sort of every match.
    const newest = [sql`inspection_date DESC`, table.engineSerial, table.number] as const;
    return [
      // The triggers forget an inspection's rows by it.
      index('finding_search_inspection_idx').on(table.inspectionId),
      index('finding_search_date_idx').on(...newest),
      index('finding_search_engine_idx').on(table.engineId, ...newest),
      index('finding_search_owner_idx').on(table.organisationId, table.released, ...newest),
      index('finding_search_model_idx').on(table.modelId, ...newest),
      index('finding_search_severity_idx').on(table.severity, ...newest),
      index('finding_search_decision_idx').on(table.decision, ...newest),
      index('finding_search_damage_idx').on(table.rowKey, table.damage, table.lengthMm),
      index('finding_search_serial_idx').on(
        table.engineSerial,
        sql`inspection_date DESC`,
        table.number,
      ),
      index('finding_search_length_idx').on(table.lengthMm),
      index('finding_search_area_idx').on(table.areaMm2),
      index('finding_search_depth_idx').on(table.depthMm),
    ];
  },
);

/**
 * How many rows of the projection share each combination of the search's equality filters (owner,
 * model, row, zone, damage, verdict, decisions) and which sizes they have: a search on those alone
 * is counted by adding a few of these instead of counting every match. Kept by triggers on
 * `finding_search` (db/finding-search.ts); a combination no row has any more is removed.
 */
export const findingSearchCounts = sqliteTable(
  'finding_search_counts',
  {
    released: integer().notNull(),
    organisationId: text().notNull(),
    modelId: text().notNull(),
    rowKey: text().notNull(),
    zone: text().notNull(),
    damage: text().notNull(),
    severity: integer(),
    decision: text(),
    releasedDecision: text(),
    hasLength: integer().notNull(),
    hasArea: integer().notNull(),
    hasDepth: integer().notNull(),
    n: integer().notNull(),
  },
  (table) => [
    index('finding_search_counts_key_idx').on(
      table.organisationId,
      table.modelId,
      table.rowKey,
      table.damage,
      table.zone,
      table.severity,
      table.decision,
      table.releasedDecision,
      table.released,
      table.hasLength,
      table.hasArea,
      table.hasDepth,
    ),
  ],
);
