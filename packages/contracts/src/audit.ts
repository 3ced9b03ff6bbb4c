import { z } from 'zod';
import { pageOf, pageQuerySchema } from './paging';

export const auditEntrySchema = z.object({
  id: z.number().int(),
  at: z.string(),
  actorUserId: z.string().nullable(),
  actorEmail: z.string().nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  before: z.unknown().nullable(),
  after: z.unknown().nullable(),
  requestId: z.string().nullable(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, { message: 'a date as YYYY-MM-DD' });

export const auditListQuerySchema = z.strictObject({
  entityType: z.string().max(64).optional(),
  /** One record: its type and id. */
  entityId: z.string().max(64).optional(),
  /** One person: the user who acted. */
  actorUserId: z.string().max(64).optional(),
  /** From and to this day (UTC), both included. */
  from: day.optional(),
  to: day.optional(),
  before: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});
export type AuditListQuery = z.infer<typeof auditListQuerySchema>;

export const auditListResponseSchema = z.object({
  items: z.array(auditEntrySchema),
  nextBefore: z.number().int().nullable(),
});
export type AuditListResponse = z.infer<typeof auditListResponseSchema>;

/** One line of a record's history: who, when, what changed, in words. */
export const historyEntrySchema = z.object({
  id: z.number().int(),
  at: z.string(),
  actorName: z.string().nullable(),
  summary: z.string(),
  details: z.array(z.string()),
});
export type HistoryEntry = z.infer<typeof historyEntrySchema>;
/** A page of a record's history, oldest first. */
export const historyQuerySchema = pageQuerySchema;
export const historyResponseSchema = pageOf(historyEntrySchema);
