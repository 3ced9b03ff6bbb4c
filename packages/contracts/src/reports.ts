import { z } from 'zod';
import { isoDateSchema } from './forecast';

/** A verification code as printed on a report: 128 random bits, base64url. */
export const verificationCodeParamsSchema = z.strictObject({
  code: z
    .string()
    .trim()
    .regex(/^[A-Za-z0-9_-]{22}$/, { message: 'A verification code is 22 letters, digits, - or _' }),
});

/**
 * What anyone holding a report may learn from its code, without signing in: whether it is genuine
 * and current, and only the three facts that let them tell it is the report they hold.
 */
export const reportVerificationSchema = z.object({
  /** The stored bytes hash to what the release signature covers, and that signature's seal holds. */
  genuine: z.boolean(),
  /** No later revision replaces it. */
  current: z.boolean(),
  engineSerialNumber: z.string(),
  inspectionDate: isoDateSchema,
  revision: z.number().int(),
  /** What the reader should make of it, in words. */
  message: z.string(),
});
export type ReportVerification = z.infer<typeof reportVerificationSchema>;

/** Whether an uploaded file is, byte for byte, the report of the code. */
export const reportFileCheckSchema = z.object({
  matches: z.boolean(),
  message: z.string(),
});
export type ReportFileCheck = z.infer<typeof reportFileCheckSchema>;
