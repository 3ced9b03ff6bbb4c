import { z } from 'zod';
import { pageOf, pageQuerySchema } from './paging';
import { isoDateSchema } from './forecast';
import { outboxRecipientSchema, outboxStateSchema } from './outbox';

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

export const reportListQuerySchema = z.strictObject({
  engineId: z.string().trim().min(1).max(64).optional(),
  /** Staff only; a customer's list is their own organisation's whatever this says. */
  organisationId: z.string().trim().min(1).max(64).optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  /** At most 100 a page. */
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type ReportListQuery = z.input<typeof reportListQuerySchema>;
export type ParsedReportListQuery = z.output<typeof reportListQuerySchema>;

/** Where the e-mails of a report stand, summed up for a list. */
export const deliveryStates = ['sent', 'on-its-way', 'failed', 'needs-attention', 'none'] as const;
export const deliveryStateSchema = z.enum(deliveryStates);
export type DeliveryState = z.infer<typeof deliveryStateSchema>;
export const deliveryStateLabels: Record<DeliveryState, string> = {
  sent: 'Sent',
  'on-its-way': 'On its way',
  failed: 'Not delivered yet, will retry',
  'needs-attention': 'Not delivered: needs attention',
  none: 'Not e-mailed',
};

/** One issued report: a revision of a released inspection's report. */
export const reportListItemSchema = z.object({
  inspectionId: z.string(),
  engineId: z.string(),
  engineSerialNumber: z.string(),
  modelName: z.string(),
  organisationId: z.string(),
  organisationName: z.string(),
  inspectionDate: isoDateSchema,
  reason: z.string(),
  revision: z.number().int(),
  /** No later revision replaces it. */
  current: z.boolean(),
  releasedAt: z.string(),
  releasedByName: z.string(),
  /** The worst decision of the released outcome. */
  outcome: z.enum(['serviceable', 'repeat-inspection', 'remove']),
  verificationCode: z.string(),
  delivery: deliveryStateSchema,
});
export type ReportListItem = z.infer<typeof reportListItemSchema>;

export const reportListResponseSchema = z.object({
  items: z.array(reportListItemSchema),
  total: z.number().int(),
});
export type ReportListResponse = z.infer<typeof reportListResponseSchema>;

/** What an inspection's e-mails to its owner were: the report of each revision, urgent notices. */
export const deliveryKinds = ['report', 'urgent'] as const;
export const deliveryKindLabels: Record<(typeof deliveryKinds)[number], string> = {
  report: 'Signed report',
  urgent: 'Urgent notice',
};

export const deliverySchema = z.object({
  id: z.string(),
  kind: z.enum(deliveryKinds),
  /** The report revision a report mail carried; null for an urgent notice. */
  revision: z.number().int().nullable(),
  subject: z.string(),
  recipients: z.array(outboxRecipientSchema),
  state: outboxStateSchema,
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.string().nullable(),
  sentAt: z.string().nullable(),
  createdAt: z.string(),
});
export type Delivery = z.infer<typeof deliverySchema>;

/** A page of an inspection's delivery log, newest first. */
export const deliveryLogQuerySchema = pageQuerySchema;
export const deliveryLogSchema = pageOf(deliverySchema);
export type DeliveryLog = z.infer<typeof deliveryLogSchema>;

/** An urgent notice its owner has not received: the engineers see it at once, in the product. */
export const undeliveredUrgentNoticeSchema = deliverySchema.extend({
  inspectionId: z.string(),
  engineId: z.string(),
  engineSerialNumber: z.string(),
  organisationName: z.string(),
  inspectionDate: isoDateSchema,
});
export type UndeliveredUrgentNotice = z.infer<typeof undeliveredUrgentNoticeSchema>;
export const undeliveredUrgentNoticesQuerySchema = pageQuerySchema;
export const undeliveredUrgentNoticesSchema = pageOf(undeliveredUrgentNoticeSchema);
