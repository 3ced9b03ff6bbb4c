import {
  outboxStates,
  type OutboxListResponse,
  type OutboxMessage,
  type OutboxMessageDetail,
  type OutboxState,
  type OutboxSummary,
  type ParsedOutboxListQuery,
} from '@emberline/contracts/outbox';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import {
  countOutboxByState,
  findOutboxMessage,
  listAttachmentMeta,
  listOutboxMessages,
  updateOutboxMessage,
  type AttachmentMeta,
  type OutboxRow,
} from '../../lib/email/outbox.repository';
import { appendAudit } from '../audit/audit.repository';

function toMessage(row: OutboxRow, attachments: AttachmentMeta[]): OutboxMessage {
  return {
    id: row.id,
    kind: row.kind,
    subject: row.subject,
    recipients: row.recipients,
    record:
      row.recordType && row.recordId
        ? { type: row.recordType, id: row.recordId, label: row.recordLabel ?? row.recordId }
        : null,
    state: row.state,
    attempts: row.attempts,
    lastError: row.lastError,
    nextAttemptAt: row.nextAttemptAt?.toISOString() ?? null,
    sentAt: row.sentAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    attachments: attachments
      .filter((item) => item.messageId === row.id)
      .map(({ filename, contentType, size }) => ({ filename, contentType, size })),
  };
}

/**
 * The single-use links of invitations and resets are the recipient's secret: an admin who could
 * read them could take over the account, and with it the account's signature.
 */
const withheldLinks = (text: string) =>
  text.replace(/#token=[A-Za-z0-9_-]+/g, '#token=(withheld: only the recipient sees the link)');

/** The admins' view of the outbox: what was sent, what waits, and what needs a person. */
export function createOutboxService(ctx: AppContext) {
  const { db } = ctx;

  function detail(id: string): OutboxMessageDetail {
    const row = findOutboxMessage(db, id);
    if (!row) throw AppError.notFound('There is no such message in the outbox');
    return { ...toMessage(row, listAttachmentMeta(db, [id])), text: withheldLinks(row.text) };
  }

  return {
    list(query: ParsedOutboxListQuery): OutboxListResponse {
      const { page, pageSize, ...filter } = query;
      const { rows, total } = listOutboxMessages(db, filter, {
        offset: (page - 1) * pageSize,
        limit: pageSize,
      });
      const attachments = listAttachmentMeta(
        db,
        rows.map((row) => row.id),
      );
      return { items: rows.map((row) => toMessage(row, attachments)), total };
    },

    detail,

    summary(): OutboxSummary {
      const counts = Object.fromEntries(outboxStates.map((state) => [state, 0])) as Record<
        OutboxState,
        number
      >;
      for (const { state, n } of countOutboxByState(db)) counts[state] = n;
      return { counts };
    },

    /**
     * Sends a message now: one that failed is tried at once (when the mail server is known to be
     * back, nobody should wait out the back-off); one that needs attention starts a fresh
     * back-off with its refused addresses tried again. Those that took it are not sent it twice.
     */
    resend(principal: Principal, id: string, meta: RequestMeta): OutboxMessageDetail {
      const now = ctx.now();
      inTransaction(db, (tx) => {
        const row = findOutboxMessage(tx, id);
        if (!row) throw AppError.notFound('There is no such message in the outbox');
        if (row.state !== 'needs-attention' && row.state !== 'failed')
          throw AppError.conflict(
            'Only a message that failed or needs attention is sent by hand; this one is on its way or sent.',
          );
        updateOutboxMessage(tx, id, {
          state: 'queued',
          nextAttemptAt: now,
          updatedAt: now,
          ...(row.state === 'needs-attention'
            ? {
                attempts: 0,
                recipients: row.recipients.map((recipient) =>
                  recipient.state === 'refused' ? { ...recipient, state: 'pending' } : recipient,
                ),
              }
            : {}),
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'outbox.resent',
          entityType: 'outbox-message',
          entityId: id,
          before: { state: row.state, attempts: row.attempts, lastError: row.lastError },
          after: { state: 'queued' },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return detail(id);
    },
  };
}
