import { z } from 'zod';
import { pageOf, pageQueryFields } from './paging';
import { inspectionFlagCodes, inspectionSchema } from './inspections';
import { beyondActionSchema, categorySchema, intervalSchema } from './limits';
import { nameText, noteText } from './text';

/**
 * An engineer's decision on one finding (DESIGN §5.5): serviceable; a repeat inspection at an
 * interval (at least one of cycles, hours, days); or removal with an action (remove-within needs
 * cycles or hours).
 */
export const decisionSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('serviceable') }),
  z.strictObject({
    kind: z.literal('repeat-inspection'),
    repeatInterval: intervalSchema.refine(
      (interval) => interval.cycles !== null || interval.hours !== null || interval.days !== null,
      { message: 'Give the repeat interval in cycles, hours or days' },
    ),
  }),
  z.strictObject({
    kind: z.literal('remove'),
    action: beyondActionSchema.refine(
      (action) =>
        action.kind !== 'remove-within' || action.cycles !== null || action.hours !== null,
      { message: '"Remove within" needs a number of cycles or hours' },
    ),
  }),
]);
export type Decision = z.infer<typeof decisionSchema>;

export const decisionKindLabels: Record<Decision['kind'], string> = {
  serviceable: 'Serviceable',
  'repeat-inspection': 'Serviceable with a repeat inspection',
  remove: 'Remove from service',
};

/** The kinds of signature Emberline keeps in its append-only record (DESIGN §5.5). */
export const signatureKinds = [
  'disposition',
  'withdrawal',
  'outcome',
  'release',
  'limit-check',
  'publication',
] as const;
export type SignatureKind = (typeof signatureKinds)[number];

/** What each kind of signature attests, in the words the signer reads before signing. */
export const signatureMeanings: Record<SignatureKind, string> = {
  disposition:
    'I have compared this finding with the damage limits of the revision named and decide its disposition as stated, under my authorisation.',
  withdrawal:
    'I withdraw the current dispositions of this inspection, which returns to the inspector to be changed and submitted again.',
  outcome:
    'Every recorded finding of this inspection has a current disposition, every row its coverage and every flag my acceptance; I sign the inspection outcome stated.',
  release: 'I release this dispositioned inspection and its report to the engine’s owner.',
  'limit-check':
    'I have checked these damage limits against the approved engine manual revision they name.',
  publication: 'I publish this limit revision, which governs every inspection judged from now on.',
};

const password = z.string().min(1, { message: 'Enter your password to sign' }).max(200);
const words = (min: number, message: string) => noteText(2000, { min, message });

/** What an engineer signs about one finding (DESIGN §5.5, §6). */
export const dispositionInputSchema = z.strictObject({
  decision: decisionSchema,
  rationale: words(3, 'Say why, in a few words'),
  /** The type certificate holder's or the authority's reference; needed for a concession. */
  concessionRef: nameText('Give the reference', { min: 0, max: 200 }).nullable().default(null),
  /** The current disposition this one corrects, and why. */
  supersedesId: z.string().max(64).nullable().default(null),
  supersedeReason: noteText(2000).nullable().default(null),
  /** The answer to "possibly the same damage as an earlier finding". */
  recurrence: z
    .strictObject({
      candidateFindingId: z.string().max(64),
      answer: z.enum(['same-damage', 'new-damage']),
    })
    .nullable()
    .default(null),
  password,
});
export type DispositionInput = z.input<typeof dispositionInputSchema>;
/** The decision form: everything but the password, which the signing dialog asks for. */
export const dispositionFormSchema = dispositionInputSchema.omit({ password: true });
export type DispositionForm = z.input<typeof dispositionFormSchema>;
export type ParsedDispositionInput = z.output<typeof dispositionInputSchema>;

export const dispositionStates = ['current', 'superseded', 'withdrawn'] as const;
export const dispositionStateLabels: Record<(typeof dispositionStates)[number], string> = {
  current: 'Current',
  superseded: 'Superseded',
  withdrawn: 'Withdrawn',
};

/** A signature as people see it beside what it signs. */
export const signatureSummarySchema = z.object({
  id: z.string(),
  seq: z.number().int(),
  kind: z.enum(signatureKinds),
  signerName: z.string(),
  signerRole: z.string(),
  authorisationRef: z.string().nullable(),
  signedAt: z.string(),
  meaning: z.string(),
  sha256: z.string(),
});
export type SignatureSummary = z.infer<typeof signatureSummarySchema>;

export const dispositionSchema = z.object({
  id: z.string(),
  findingId: z.string(),
  findingNumber: z.number().int(),
  inspectionId: z.string(),
  decision: decisionSchema,
  rationale: z.string(),
  concession: z.boolean(),
  concessionRef: z.string().nullable(),
  supersedesId: z.string().nullable(),
  supersedeReason: z.string().nullable(),
  recurrence: z
    .object({ candidateFindingId: z.string(), answer: z.enum(['same-damage', 'new-damage']) })
    .nullable(),
  state: z.enum(dispositionStates),
  current: z.boolean(),
  signature: signatureSummarySchema,
});
export type Disposition = z.infer<typeof dispositionSchema>;

export const flagAcceptanceSchema = z.strictObject({
  code: z.enum(inspectionFlagCodes),
  note: words(5, 'Say why the flag does not stop the inspection, in a few words'),
});

export const outcomeInputSchema = z.strictObject({
  flagAcceptances: z.array(flagAcceptanceSchema).max(20).default([]),
  password,
});
export type OutcomeInput = z.input<typeof outcomeInputSchema>;
export type ParsedOutcomeInput = z.output<typeof outcomeInputSchema>;

export const releaseInputSchema = z.strictObject({ password });
export type ReleaseInput = z.infer<typeof releaseInputSchema>;

/** The signed outcome of an inspection: the engine-level decision. */
export const outcomeSchema = z.object({
  kind: z.enum(['serviceable', 'repeat-inspection', 'remove']),
  repeatInterval: intervalSchema.nullable(),
  removals: z.array(beyondActionSchema),
  flagAcceptances: z.array(z.object({ code: z.string(), note: z.string() })),
  current: z.boolean(),
  signature: signatureSummarySchema,
});
export type Outcome = z.infer<typeof outcomeSchema>;

/** A finding at the same place and of the same damage in the engine's previous dispositioned inspection. */
export const recurrenceCandidateSchema = z.object({
  findingId: z.string(),
  candidateFindingId: z.string(),
  candidateNumber: z.number().int(),
  candidateInspectionId: z.string(),
  candidateInspectionDate: z.string(),
});

/** The review of one inspection: every disposition (current and not), outcomes, releases, withdrawals. */
export const inspectionReviewSchema = z.object({
  items: z.array(dispositionSchema),
  outcomes: z.array(outcomeSchema),
  releases: z.array(
    z.object({
      revision: z.number().int(),
      current: z.boolean(),
      signature: signatureSummarySchema,
      /** The code printed on that revision's report, to check it at /verify/<code>. */
      verificationCode: z.string().nullable(),
    }),
  ),
  withdrawals: z.array(
    z.object({
      reason: z.string(),
      dispositionIds: z.array(z.string()),
      signature: signatureSummarySchema,
    }),
  ),
  recurrences: z.array(recurrenceCandidateSchema),
  /** What is left before the outcome can be signed. */
  left: z.object({
    findings: z.array(z.object({ findingId: z.string(), number: z.number().int() })),
    flags: z.array(z.object({ code: z.enum(inspectionFlagCodes), message: z.string() })),
    coverageGaps: z.array(z.string()),
  }),
  /** Whether the caller may sign here, and if not, why (authorisation, separation of duties). */
  signing: z.object({ allowed: z.boolean(), reason: z.string().nullable() }),
});
export type InspectionReview = z.infer<typeof inspectionReviewSchema>;

export const reviewQueueQuerySchema = z.strictObject({
  organisationId: z.string().max(64).optional(),
  modelId: z.string().max(64).optional(),
  engineId: z.string().max(64).optional(),
  verdict: categorySchema.optional(),
  ...pageQueryFields(50),
});
/** The queue's filters (its page apart). */
export type ReviewQueueQuery = Omit<z.infer<typeof reviewQueueQuerySchema>, 'page' | 'pageSize'>;

export const reviewQueueItemSchema = z.object({
  inspection: inspectionSchema,
  modelId: z.string(),
  modelName: z.string(),
  organisationName: z.string(),
  /** The worst stored verdict of its recorded findings; null without findings. */
  worstVerdict: categorySchema.nullable(),
  findingCount: z.number().int(),
  left: z.object({
    findings: z.number().int(),
    flags: z.number().int(),
    coverageGaps: z.number().int(),
    outcome: z.boolean(),
    release: z.boolean(),
  }),
});
export type ReviewQueueItem = z.infer<typeof reviewQueueItemSchema>;
export const reviewQueueResponseSchema = pageOf(reviewQueueItemSchema);
