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
