import { z } from 'zod';
import { pageOf, pageQuerySchema } from './paging';
import { isoDateSchema } from './forecast';
import { categorySchema, intervalSchema, ruleSchema } from './limits';
import { nameText } from './text';

export const limitSetStatuses = ['draft', 'published', 'superseded'] as const;
export const limitSetStatusSchema = z.enum(limitSetStatuses);
export type LimitSetStatus = z.infer<typeof limitSetStatusSchema>;
export const limitSetStatusLabels: Record<LimitSetStatus, string> = {
  draft: 'Draft',
  published: 'In force',
  superseded: 'Superseded',
};

/** A revision of an engine model's damage limits, without its rules. */
export const limitSetSummarySchema = z.object({
  id: z.string(),
  modelId: z.string(),
  revision: z.string(),
  title: z.string(),
  status: limitSetStatusSchema,
  /** The engine manual (document and revision) the rules were transcribed from. */
  manualReference: z.string(),
  effectiveDate: isoDateSchema.nullable(),
  /** Demo limits made up for the scenario: never from a real manual. */
  invented: z.boolean(),
  ruleCount: z.number().int(),
  basedOnId: z.string().nullable(),
  publishedAt: z.string().nullable(),
  publishedByName: z.string().nullable(),
  /** SHA-256 of the canonical JSON of the revision as published. */
  contentSha256: z.string().nullable(),
  createdAt: z.string(),
});
export type LimitSetSummary = z.infer<typeof limitSetSummarySchema>;

/** What differs in a draft from the revision it was copied from, rule by rule. */
export const ruleChangeSchema = z.object({
  ruleId: z.string(),
  /** The rule's title (its id where it has none): in the draft, or in the earlier revision if removed. */
  title: z.string(),
  kind: z.enum(['added', 'removed', 'changed']),
  /** For a changed rule: each field that differs, with its old and new value. */
  fields: z.array(z.object({ field: z.string(), from: z.unknown(), to: z.unknown() })),
});
export type RuleChange = z.infer<typeof ruleChangeSchema>;

/** The independent check of a draft (DESIGN §5.5): signed by an engineer who changed nothing in it. */
export const limitCheckSchema = z.object({
  signerName: z.string(),
  signedAt: z.string(),
});
export type LimitCheck = z.infer<typeof limitCheckSchema>;

export const limitSetSchema = limitSetSummarySchema.extend({
  rules: z.array(ruleSchema),
  /** The check that stands for the draft as it is now; null when none (or an edit came after). */
  check: limitCheckSchema.nullable(),
  /** Who changed the draft (they may not check it). */
  editorIds: z.array(z.string()),
  /** Against the revision it was copied from; empty for a revision copied from none. */
  changes: z.array(ruleChangeSchema),
  basedOnRevision: z.string().nullable(),
});
export type LimitSet = z.infer<typeof limitSetSchema>;

export const limitSetListQuerySchema = pageQuerySchema;
export const limitSetListResponseSchema = pageOf(limitSetSummarySchema);

const revisionText = nameText('Give the revision', { max: 40 });

/** A new draft made from an existing revision: the engineer's starting point for the next one. */
export const limitSetCopyInputSchema = z.strictObject({
  revision: revisionText,
  title: nameText('Give the title', { max: 200 }),
  manualReference: nameText('Name the manual and its revision', { max: 300 }),
  effectiveDate: isoDateSchema.nullable().default(null),
});
export type LimitSetCopyInput = z.input<typeof limitSetCopyInputSchema>;
export type ParsedLimitSetCopyInput = z.output<typeof limitSetCopyInputSchema>;

/** A draft's particulars, changed: the same fields as a copy's. */
export const limitSetParticularsSchema = limitSetCopyInputSchema;

export const limitRulesInputSchema = z.strictObject({ rules: z.array(ruleSchema).max(5000) });
export type LimitRulesInput = z.input<typeof limitRulesInputSchema>;

/** The independent check asks for the checker's password again. */
export const limitCheckInputSchema = z.strictObject({
  password: z.string().min(1, { message: 'Enter your password to sign the check' }).max(200),
});

/** Publishing asks for the engineer's password again. */
export const publishInputSchema = z.strictObject({
  password: z.string().min(1, { message: 'Enter your password to publish' }).max(200),
});

const verdictAt = z.object({
  category: categorySchema.nullable(),
  ruleId: z.string().nullable(),
  repeatInterval: intervalSchema.nullable(),
});

/** A finding whose verdict or repeat interval would change if the draft were put in force. */
export const impactChangeSchema = z.object({
  findingId: z.string(),
  number: z.number().int(),
  inspectionId: z.string(),
  inspectionDate: z.string(),
  released: z.boolean(),
  engineId: z.string(),
  engineSerial: z.string(),
  row: z.string(),
  position: z.number().int(),
  zone: z.string(),
  damage: z.string(),
  /** As stored now (judged against `revision`); null category: never judged. */
  before: verdictAt.extend({ revision: z.string().nullable() }),
  after: verdictAt,
  /** The draft judges it less severely, or with a longer interval: the change to look at first. */
  relaxed: z.boolean(),
});
export type ImpactChange = z.infer<typeof impactChangeSchema>;

export const impactEngineSchema = z.object({
  engineId: z.string(),
  engineSerial: z.string(),
  changedFindings: z.number().int(),
  before: categorySchema.nullable(),
  after: categorySchema.nullable(),
});

/**
 * What a draft would change: the current findings of the model's engines (every finding of
 * inspections not yet released, and of each engine's latest released inspection) judged against
 * the draft, beside their stored verdicts.
 */
export const limitSetImpactSchema = z.object({
  limitSetId: z.string(),
  inspections: z.number().int(),
  findings: z.number().int(),
  before: z.record(categorySchema, z.number().int()),
  after: z.record(categorySchema, z.number().int()),
  changedCount: z.number().int(),
  /** The changed findings, relaxed first; at most `impactListLimit` of them. */
  changes: z.array(impactChangeSchema),
  engines: z.array(impactEngineSchema),
});
export type LimitSetImpact = z.infer<typeof limitSetImpactSchema>;
export const impactListLimit = 500;

export const limitFileFormats = ['csv', 'json'] as const;
export const limitFileFormatSchema = z.enum(limitFileFormats);
export type LimitFileFormat = z.infer<typeof limitFileFormatSchema>;
export const limitFileQuerySchema = z.strictObject({ format: limitFileFormatSchema });

/**
 * What an import would take and refuse, before anything is saved. `line` is the file line for
 * CSV and the rule's place in the list (from 1) for JSON. A file with a refused line is not
 * imported at all.
 */
export const limitImportPreviewSchema = z.object({
  format: limitFileFormatSchema,
  accepted: z.array(z.object({ line: z.number().int(), rule: ruleSchema })),
  refused: z.array(z.object({ line: z.number().int(), text: z.string(), reason: z.string() })),
  /** The rules the draft has now, which an import replaces. */
  currentRuleCount: z.number().int(),
});
export type LimitImportPreview = z.infer<typeof limitImportPreviewSchema>;
