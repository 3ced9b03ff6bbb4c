import { z } from 'zod';

/**
 * The records check (DESIGN §5.5): both chains (signatures and the audit log) walked, every
 * number present, every hash and seal recomputed.
 */
export const recordsVerificationSchema = z.object({
  ok: z.boolean(),
  checked: z.object({
    signatures: z.number().int(),
    auditRows: z.number().int(),
    /** Current dispositions compared with the live rows they cover. */
    dispositions: z.number().int(),
    /** Originals of signed findings hashed again. */
    originals: z.number().int(),
    /** Stored report PDFs hashed again and compared with their release signatures. */
    reports: z.number().int(),
  }),
  /** The last record of the chain, as reports print it, so that a cut-off tail shows. */
  head: z.object({ seq: z.number().int(), sha256: z.string() }).nullable(),
  /** The records key was made inside the data directory: tampering there cannot be detected. */
  keyInsideDataDir: z.boolean(),
  problems: z.array(
    z.object({ kind: z.enum(['signature', 'audit']), id: z.string(), message: z.string() }),
  ),
});
export type RecordsVerification = z.infer<typeof recordsVerificationSchema>;

/** The steps of a records check, in order, as the screen names them while it runs. */
export const verificationPhases = [
  'signatures',
  'audit',
  'dispositions',
  'reports',
  'originals',
  'done',
] as const;
export const verificationPhaseLabels: Record<(typeof verificationPhases)[number], string> = {
  signatures: 'Walking the signature chain',
  audit: 'Walking the audit chain',
  dispositions: 'Comparing signed dispositions with their findings',
  reports: 'Hashing the issued reports again',
  originals: 'Hashing the signed original images again',
  done: 'Done',
};

/**
 * A records check run in the background (at volume it reads every record and re-hashes every
 * signed original, for minutes): where it is, and its result once done.
 */
export const verificationJobSchema = z.object({
  id: z.string(),
  state: z.enum(['running', 'done', 'failed']),
  startedAt: z.string(),
  finishedAt: z.string().nullable(),
  startedBy: z.string(),
  progress: z.object({
    phase: z.enum(verificationPhases),
    /** Records of the phase checked so far, of `total` (null where not counted ahead). */
    done: z.number().int(),
    total: z.number().int().nullable(),
  }),
  result: recordsVerificationSchema.nullable(),
  /** Why a failed check stopped, in words. */
  error: z.string().nullable(),
});
export type VerificationJob = z.infer<typeof verificationJobSchema>;
/** The latest check since the server started; null before the first. */
export const latestVerificationSchema = z.object({ job: verificationJobSchema.nullable() });
export type VerificationProgress = VerificationJob['progress'];
