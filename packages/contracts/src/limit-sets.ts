import { z } from 'zod';
import { isoDateSchema } from './forecast';
import { ruleSchema } from './limits';

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

export const limitSetSchema = limitSetSummarySchema.extend({ rules: z.array(ruleSchema) });
export type LimitSet = z.infer<typeof limitSetSchema>;

export const limitSetListResponseSchema = z.object({ items: z.array(limitSetSummarySchema) });

const revisionText = z.string().trim().min(1, { message: 'Give the revision' }).max(40);

/** A new draft made from an existing revision: the engineer's starting point for the next one. */
export const limitSetCopyInputSchema = z.strictObject({
  revision: revisionText,
  title: z.string().trim().min(1).max(200),
  manualReference: z
    .string()
    .trim()
    .min(1, { message: 'Name the manual and its revision' })
    .max(300),
  effectiveDate: isoDateSchema.nullable().default(null),
});
export type LimitSetCopyInput = z.input<typeof limitSetCopyInputSchema>;

export const limitRulesInputSchema = z.strictObject({ rules: z.array(ruleSchema).max(5000) });
export type LimitRulesInput = z.input<typeof limitRulesInputSchema>;

/** Publishing asks for the engineer's password again. */
export const publishInputSchema = z.strictObject({
  password: z.string().min(1, { message: 'Enter your password to publish' }).max(200),
});
