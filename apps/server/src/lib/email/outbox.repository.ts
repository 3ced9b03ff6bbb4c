import { and, asc, count, desc, eq, inArray, lte, or, type SQL } from 'drizzle-orm';
import type { OutboxState } from '@emberline/contracts/outbox';
import type { DbOrTx } from '../../db/client';
import { outboxAttachments, outboxMessages } from '../../db/schema';

export type OutboxRow = typeof outboxMessages.$inferSelect;
export type NewOutboxRow = typeof outboxMessages.$inferInsert;
export type OutboxAttachmentRow = typeof outboxAttachments.$inferSelect;
export type AttachmentMeta = Pick<
  OutboxAttachmentRow,
  'messageId' | 'filename' | 'contentType' | 'size'
>;

export function insertOutboxMessage(
  db: DbOrTx,
  row: NewOutboxRow,
  attachments: Omit<OutboxAttachmentRow, 'id' | 'messageId'>[],
): void {
  db.insert(outboxMessages).values(row).run();
  for (const attachment of attachments)
    db.insert(outboxAttachments)
      .values({ ...attachment, messageId: row.id })
      .run();
}

/**
 * Messages the worker may take now: queued or failed ones whose attempt is due, and `sending` ones
 * whose lease ran out (a delivery that never reported back).
 */
export function listDueMessages(db: DbOrTx, now: Date, limit: number): OutboxRow[] {
  return db
    .select()
    .from(outboxMessages)
    .where(
      or(
        and(
          inArray(outboxMessages.state, ['queued', 'failed']),
          lte(outboxMessages.nextAttemptAt, now),
        ),
        and(eq(outboxMessages.state, 'sending'), lte(outboxMessages.leaseUntil, now)),
      ),
    )
    .orderBy(asc(outboxMessages.nextAttemptAt), asc(outboxMessages.createdAt))
    .limit(limit)
    .all();
}

export function updateOutboxMessage(db: DbOrTx, id: string, changes: Partial<NewOutboxRow>): void {
  db.update(outboxMessages).set(changes).where(eq(outboxMessages.id, id)).run();
}

/**
 * At start-up every `sending` row belongs to a process that died mid-delivery: it is due again at
 * once (its message may go out a second time; see docs/decisions/007-durable-outbox.md).
 */
export function requeueInterrupted(db: DbOrTx, now: Date): number {
  return db
    .update(outboxMessages)
    .set({ state: 'queued', nextAttemptAt: now, leaseUntil: null, updatedAt: now })
    .where(eq(outboxMessages.state, 'sending'))
    .run().changes;
}

export function findOutboxMessage(db: DbOrTx, id: string): OutboxRow | undefined {
  return db.select().from(outboxMessages).where(eq(outboxMessages.id, id)).get();
}

export function listAttachments(db: DbOrTx, messageId: string): OutboxAttachmentRow[] {
  return db
    .select()
    .from(outboxAttachments)
    .where(eq(outboxAttachments.messageId, messageId))
    .orderBy(asc(outboxAttachments.id))
    .all();
}

/** The name, type and size of the attachments of these messages, without their bytes. */
export function listAttachmentMeta(db: DbOrTx, messageIds: string[]): AttachmentMeta[] {
  if (messageIds.length === 0) return [];
  return db
    .select({
      messageId: outboxAttachments.messageId,
      filename: outboxAttachments.filename,
      contentType: outboxAttachments.contentType,
      size: outboxAttachments.size,
    })
    .from(outboxAttachments)
    .where(inArray(outboxAttachments.messageId, messageIds))
    .orderBy(asc(outboxAttachments.id))
    .all();
}

export interface OutboxFilter {
  state?: OutboxState;
  recordType?: string;
  recordId?: string;
}

function conditions(filter: OutboxFilter): SQL | undefined {
  const parts: SQL[] = [];
  if (filter.state) parts.push(eq(outboxMessages.state, filter.state));
  if (filter.recordType) parts.push(eq(outboxMessages.recordType, filter.recordType));
  if (filter.recordId) parts.push(eq(outboxMessages.recordId, filter.recordId));
  return parts.length ? and(...parts) : undefined;
}

/** A page of messages, newest first, and how many match. */
export function listOutboxMessages(
  db: DbOrTx,
  filter: OutboxFilter,
  page: { offset: number; limit: number },
): { rows: OutboxRow[]; total: number } {
  const where = conditions(filter);
  const rows = db
    .select()
    .from(outboxMessages)
    .where(where)
    .orderBy(desc(outboxMessages.createdAt), desc(outboxMessages.id))
    .limit(page.limit)
    .offset(page.offset)
    .all();
  const total = db.select({ n: count() }).from(outboxMessages).where(where).get()?.n ?? 0;
  return { rows, total };
}

export function countOutboxByState(db: DbOrTx): { state: OutboxState; n: number }[] {
  return db
    .select({ state: outboxMessages.state, n: count() })
    .from(outboxMessages)
    .groupBy(outboxMessages.state)
    .all();
}

/** The messages about some records (a record's delivery log), oldest first. */
export function listMessagesAbout(
  db: DbOrTx,
  about: readonly { type: string; ids: readonly string[]; kinds?: readonly string[] }[],
): OutboxRow[] {
  const matches = about
    .filter((item) => item.ids.length > 0)
    .map((item) =>
      and(
        eq(outboxMessages.recordType, item.type),
        inArray(outboxMessages.recordId, [...item.ids]),
        item.kinds ? inArray(outboxMessages.kind, [...item.kinds]) : undefined,
      ),
    );
  if (matches.length === 0) return [];
  return db
    .select()
    .from(outboxMessages)
    .where(or(...matches))
    .orderBy(asc(outboxMessages.createdAt), asc(outboxMessages.id))
    .all();
}

/** Messages of one kind that have not reached everyone yet: failed, or waiting for a person. */
export function listUndelivered(db: DbOrTx, kind: string): OutboxRow[] {
  return db
    .select()
    .from(outboxMessages)
    .where(
      and(
        eq(outboxMessages.kind, kind),
        inArray(outboxMessages.state, ['failed', 'needs-attention']),
      ),
    )
    .orderBy(asc(outboxMessages.createdAt))
    .all();
}
