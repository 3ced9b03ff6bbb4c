import { retryMinutes, type OutboxRecipient } from '@emberline/contracts/outbox';
import { inTransaction, type Db } from '../../db/client';
import type { Logger } from '../logger';
import type { Mailer } from './mailer';
import {
  listAttachments,
  listDueMessages,
  requeueInterrupted,
  updateOutboxMessage,
  type OutboxRow,
} from './outbox.repository';

export interface Delivery {
  /** Delivers due messages every `pollMs` until stopped. */
  start(pollMs: number): void;
  stop(): Promise<void>;
  /** Delivers every message due now, round after round, until none is left; returns how many. */
  deliverDue(): Promise<number>;
}

/** How many messages one round takes, so that a long queue does not hold one transaction. */
const ROUND_SIZE = 10;
/** Longer than the mailer's connection, greeting and socket timeouts together. */
const LEASE_MS = 5 * 60_000;

/**
 * The delivery worker of the outbox (DESIGN §5.7). Each round takes the due messages and marks them
 * `sending` under a lease in one transaction, sends each through the mailer, and records the
 * outcome per recipient: a message is `sent` when every recipient took it, `failed` with its next
 * attempt after 1, 2, 4, 8, 16 and 32 minutes, then `needs-attention`; an address the server
 * refuses is marked on its own and waits for a person, the others are not sent twice.
 */
export function createDelivery(options: {
  db: Db;
  mailer: Mailer;
  now: () => Date;
  logger: Logger;
}): Delivery {
  const { db, mailer, now, logger } = options;
  let timer: NodeJS.Timeout | null = null;
  let chain: Promise<unknown> = Promise.resolve();

  // A process that died mid-delivery left `sending` rows behind: they are due again at once.
  const interrupted = requeueInterrupted(db, now());
  if (interrupted > 0) logger.warn({ interrupted }, 'requeued messages of an interrupted delivery');

  function claim(): OutboxRow[] {
    return inTransaction(db, (tx) => {
      const at = now();
      const due = listDueMessages(tx, at, ROUND_SIZE);
      for (const message of due)
        updateOutboxMessage(tx, message.id, {
          state: 'sending',
          leaseUntil: new Date(at.getTime() + LEASE_MS),
          updatedAt: at,
        });
      return due;
    });
  }

  function failure(message: OutboxRow, error: string, recipients: OutboxRecipient[]) {
    const attempts = message.attempts + 1;
    const wait = retryMinutes[attempts - 1];
    const at = now();
    updateOutboxMessage(db, message.id, {
      recipients,
      attempts,
      lastError: error,
      leaseUntil: null,
      updatedAt: at,
      ...(wait === undefined
        ? { state: 'needs-attention', nextAttemptAt: null }
        : { state: 'failed', nextAttemptAt: new Date(at.getTime() + wait * 60_000) }),
    });
    logger.warn(
      { messageId: message.id, attempts, error },
      wait === undefined ? 'e-mail needs attention' : 'e-mail failed; will retry',
    );
  }

  async function deliver(message: OutboxRow): Promise<void> {
    const pending = message.recipients.filter((recipient) => recipient.state === 'pending');
    let result: Awaited<ReturnType<Mailer['send']>>;
    try {
      result = await mailer.send({
        to: pending.map((recipient) => recipient.address),
        subject: message.subject,
        text: message.text,
        html: message.html ?? undefined,
        attachments: listAttachments(db, message.id).map((item) => ({
          filename: item.filename,
          contentType: item.contentType,
          content: item.content,
        })),
      });
    } catch (error) {
      failure(message, error instanceof Error ? error.message : String(error), message.recipients);
      return;
    }
    const refused = new Map(result.refused.map((item) => [item.address, item.error]));
    const deferred = new Map(result.deferred.map((item) => [item.address, item.error]));
    const accepted = new Set(result.accepted);
    const recipients = message.recipients.map((recipient): OutboxRecipient => {
      if (recipient.state !== 'pending') return recipient;
      if (accepted.has(recipient.address)) return { ...recipient, state: 'sent', error: null };
      const answer = refused.get(recipient.address);
      if (answer !== undefined) return { ...recipient, state: 'refused', error: answer };
      return { ...recipient, error: deferred.get(recipient.address) ?? null };
    });
    const stillPending = recipients.filter((recipient) => recipient.state === 'pending');
    if (stillPending.length > 0) {
      // The server put these addresses off for now: try them again, the others stay sent.
      failure(
        message,
        stillPending.map((item) => `${item.address}: ${item.error ?? 'not accepted'}`).join('; '),
        recipients,
      );
      return;
    }
    const at = now();
    const refusedNow = recipients.filter((recipient) => recipient.state === 'refused');
    updateOutboxMessage(db, message.id, {
      recipients,
      attempts: message.attempts + 1,
      leaseUntil: null,
      nextAttemptAt: null,
      updatedAt: at,
      ...(refusedNow.length > 0
        ? {
            state: 'needs-attention',
            lastError: refusedNow
              .map((item) => `${item.address} refused: ${item.error}`)
              .join('; '),
          }
        : { state: 'sent', sentAt: at, lastError: null }),
    });
  }

  async function round(): Promise<number> {
    const claimed = claim();
    for (const message of claimed) await deliver(message);
    return claimed.length;
  }

  /** Rounds never overlap: the timer's and a caller's wait for each other. */
  function serial<T>(work: () => Promise<T>): Promise<T> {
    const next = chain.then(work, work);
    chain = next.catch(() => undefined);
    return next;
  }

  async function deliverAll(): Promise<number> {
    let total = 0;
    for (;;) {
      const delivered = await round();
      total += delivered;
      if (delivered < ROUND_SIZE) return total;
    }
  }

  return {
    start(pollMs) {
      if (timer) return;
      const tick = () => {
        serial(deliverAll)
          .catch((error: unknown) => logger.error({ err: error }, 'e-mail delivery round failed'))
          .finally(() => {
            if (timer) timer = setTimeout(tick, pollMs);
          });
      };
      timer = setTimeout(tick, 0);
    },
    async stop() {
      if (timer) clearTimeout(timer);
      timer = null;
      await chain;
    },
    deliverDue: () => serial(deliverAll),
  };
}
