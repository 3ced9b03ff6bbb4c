import { z } from 'zod';
import { pageOf, pageQuerySchema } from './paging';

/**
 * The durable outbox (DESIGN §5.7): every e-mail is a row written with the business change that
 * causes it, then delivered by the server's worker. `sending` is held under a lease while one
 * delivery is in flight; `failed` waits for its next attempt; `needs-attention` waits for a person.
 */
export const outboxStates = ['queued', 'sending', 'sent', 'failed', 'needs-attention'] as const;
export const outboxStateSchema = z.enum(outboxStates);
export type OutboxState = z.infer<typeof outboxStateSchema>;

export const outboxStateLabels: Record<OutboxState, string> = {
  queued: 'Queued',
  sending: 'Sending',
  sent: 'Sent',
  failed: 'Failed, will retry',
  'needs-attention': 'Needs attention',
};

/** Minutes to wait after the 1st, 2nd, … failed attempt; after the last, a person must look. */
export const retryMinutes = [1, 2, 4, 8, 16, 32] as const;

export const recipientStates = ['pending', 'sent', 'refused'] as const;
export const outboxRecipientSchema = z.object({
  address: z.string(),
  state: z.enum(recipientStates),
  /** What the SMTP server answered when it refused this address. */
  error: z.string().nullable(),
});
export type OutboxRecipient = z.infer<typeof outboxRecipientSchema>;

/** What a message was sent about: the record, and its name as people read it. */
export const outboxRecordSchema = z.object({
  type: z.string(),
  id: z.string(),
  label: z.string(),
});
export type OutboxRecord = z.infer<typeof outboxRecordSchema>;

export const outboxMessageSchema = z.object({
  id: z.string(),
  kind: z.string(),
  subject: z.string(),
  recipients: z.array(outboxRecipientSchema),
  record: outboxRecordSchema.nullable(),
  state: outboxStateSchema,
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.string().nullable(),
  sentAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  attachments: z.array(
    z.object({ filename: z.string(), contentType: z.string(), size: z.number().int() }),
  ),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

export const outboxMessageDetailSchema = outboxMessageSchema.extend({ text: z.string() });
export type OutboxMessageDetail = z.infer<typeof outboxMessageDetailSchema>;

export const outboxListQuerySchema = z.strictObject({
  state: outboxStateSchema.optional(),
  recordType: z.string().trim().min(1).max(40).optional(),
  recordId: z.string().trim().min(1).max(64).optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  /** At most 100 a page. */
  pageSize: z.coerce.number().int().min(1).max(100).default(50),
});
export type OutboxListQuery = z.input<typeof outboxListQuerySchema>;
export type ParsedOutboxListQuery = z.output<typeof outboxListQuerySchema>;

export const outboxCountsSchema = z.record(outboxStateSchema, z.number().int());

export const outboxListResponseSchema = z.object({
  items: z.array(outboxMessageSchema),
  total: z.number().int(),
});
export type OutboxListResponse = z.infer<typeof outboxListResponseSchema>;

/** For the admins' banner: how many messages wait for a person. */
export const outboxSummarySchema = z.object({ counts: outboxCountsSchema });
export type OutboxSummary = z.infer<typeof outboxSummarySchema>;

/** A message as the local SMTP fake caught it (parsed back from its `.eml`). */
export const mailSummarySchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  attachments: z.number().int(),
});
export type MailSummary = z.infer<typeof mailSummarySchema>;

/** The caught messages, newest first; `catching` is false when a real relay is configured. */
export const mailListQuerySchema = pageQuerySchema;
export const mailListResponseSchema = pageOf(mailSummarySchema).extend({ catching: z.boolean() });
export type MailListResponse = z.infer<typeof mailListResponseSchema>;

export const mailMessageSchema = mailSummarySchema.extend({
  text: z.string(),
  attachmentList: z.array(
    z.object({ filename: z.string(), contentType: z.string(), size: z.number().int() }),
  ),
});
export type MailMessage = z.infer<typeof mailMessageSchema>;
