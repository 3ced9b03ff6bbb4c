import { z } from 'zod';
import type { OutboxRecord } from '@emberline/contracts/outbox';
import type { AppContext } from '../../context';
import type { DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import { newId } from '../ids';
import { insertOutboxMessage } from './outbox.repository';

/** What a message says and to whom, as a module's e-mail template writes it. */
export type MailContent = Pick<QueuedMail, 'to' | 'subject' | 'text' | 'html' | 'attachments'>;

/** A message as a module hands it to the outbox. */
export interface QueuedMail {
  /** What the message is: invitation, password-reset, report, reminder, alert. */
  kind: string;
  to: string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; contentType: string; content: Buffer }[];
  /** The business record the message belongs to, with its name as people read it. */
  record?: OutboxRecord;
}

const address = z.email();

function refuse(message: string): AppError {
  return AppError.unprocessable(message, { fields: { to: [message] }, form: [] });
}

/**
 * The one way to send an e-mail: writes it to the outbox inside the caller's transaction, so that
 * the message exists exactly when the change that causes it does. The delivery worker sends it;
 * nothing waits for SMTP. A message without a valid recipient, or with attachments over the
 * configured size, is refused here (422) and the transaction with it.
 */
export function queueMail(
  ctx: Pick<AppContext, 'config' | 'now'>,
  tx: DbOrTx,
  mail: QueuedMail,
): string {
  if (mail.to.length === 0) throw refuse('The message has no recipient: add an e-mail address.');
  for (const to of mail.to)
    if (!address.safeParse(to).success)
      throw refuse(`"${to}" is not an e-mail address a message can be sent to.`);
  const attachments = mail.attachments ?? [];
  const limit = ctx.config.mailMaxAttachmentBytes;
  const total = attachments.reduce((sum, item) => sum + item.content.byteLength, 0);
  if (total > limit) {
    const megabytes = (bytes: number) => (bytes / 1024 / 1024).toFixed(1);
    const largest = attachments.reduce((a, b) =>
      b.content.byteLength > a.content.byteLength ? b : a,
    );
    throw AppError.unprocessable(
      `The attachments come to ${megabytes(total)} MB (${largest.filename} alone ${megabytes(largest.content.byteLength)} MB); a message carries at most ${megabytes(limit)} MB.`,
    );
  }
  const id = newId();
  const now = ctx.now();
  insertOutboxMessage(
    tx,
    {
      id,
      kind: mail.kind,
      recipients: [...new Set(mail.to)].map((to) => ({
        address: to,
        state: 'pending',
        error: null,
      })),
      subject: mail.subject,
      text: mail.text,
      html: mail.html ?? null,
      recordType: mail.record?.type ?? null,
      recordId: mail.record?.id ?? null,
      recordLabel: mail.record?.label ?? null,
      state: 'queued',
      attempts: 0,
      nextAttemptAt: now,
      createdAt: now,
      updatedAt: now,
    },
    attachments.map((item) => ({
      filename: item.filename,
      contentType: item.contentType,
      size: item.content.byteLength,
      content: item.content,
    })),
  );
  return id;
}
