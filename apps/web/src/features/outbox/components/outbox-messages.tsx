import { useState } from 'react';
import { outboxStateLabels, outboxStates, type OutboxState } from '@emberline/contracts/outbox';
import { useSearchParams } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Pager } from '../../../components/ui/pager';
import { Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { formatDateTime } from '../../../lib/format';
import { useOutboxMessage, useOutboxMessages, useResendMessage } from '../api/outbox';
import { OutboxStateBadge } from './outbox-state';

const PAGE_SIZE = 25;

const recipientWords = { pending: 'not yet sent', sent: 'sent', refused: 'refused' } as const;

function MessageDetail({ id }: { id: string }) {
  const message = useOutboxMessage(id);
  const resend = useResendMessage();
  if (message.isPending) return <LoadingLine />;
  if (message.error) return <Notice tone="error">{message.error.message}</Notice>;
  const data = message.data;
  return (
    <article aria-label={`Message: ${data.subject}`} className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="text-lg font-semibold">{data.subject}</h3>
        <OutboxStateBadge state={data.state} />
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm text-soot-700">
        <dt>About</dt>
        <dd>{data.record?.label ?? '—'}</dd>
        <dt>Queued</dt>
        <dd>{formatDateTime(data.createdAt)}</dd>
        <dt>Attempts</dt>
        <dd>{data.attempts}</dd>
        {data.sentAt ? (
          <>
            <dt>Sent</dt>
            <dd>{formatDateTime(data.sentAt)}</dd>
          </>
        ) : null}
        {data.nextAttemptAt && data.state === 'failed' ? (
          <>
            <dt>Next attempt</dt>
            <dd>{formatDateTime(data.nextAttemptAt)}</dd>
          </>
        ) : null}
        {data.lastError ? (
          <>
            <dt>Last error</dt>
            <dd className="break-words text-red-900">{data.lastError}</dd>
          </>
        ) : null}
      </dl>
      <div>
        <h4 className="text-sm font-semibold">Recipients</h4>
        <ul className="text-sm">
          {data.recipients.map((recipient) => (
            <li key={recipient.address}>
              {recipient.address}: {recipientWords[recipient.state]}
              {recipient.error ? ` (${recipient.error})` : ''}
            </li>
          ))}
        </ul>
      </div>
      {data.state === 'needs-attention' || data.state === 'failed' ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button busy={resend.isPending} onClick={() => resend.mutate(data.id)}>
            {data.state === 'failed' ? 'Send now' : 'Send again'}
          </Button>
          <span className="text-sm text-soot-600">
            {data.state === 'failed'
              ? 'When the mail server is back, there is no need to wait for the next attempt.'
              : 'Tries the addresses that have not taken it yet, from a fresh back-off.'}
          </span>
        </div>
      ) : null}
      {resend.error ? <Notice tone="error">{resend.error.message}</Notice> : null}
      {data.attachments.length > 0 ? (
        <ul className="text-sm">
          {data.attachments.map((attachment) => (
            <li key={attachment.filename}>
              Attachment: {attachment.filename} ({Math.max(1, Math.round(attachment.size / 1024))}{' '}
              KB)
            </li>
          ))}
        </ul>
      ) : null}
      <pre className="whitespace-pre-wrap break-words rounded-md bg-soot-50 p-4 font-mono text-sm text-soot-900">
        {data.text}
      </pre>
    </article>
  );
}

/**
 * Every e-mail Emberline queued, newest first: its state, attempts, last error and next attempt,
 * filtered by state and by the record it is about; a message that needs attention is sent again
 * from here.
 */
export function OutboxMessages() {
  const [params, setParams] = useSearchParams();
  const state = (outboxStates as readonly string[]).includes(params.get('state') ?? '')
    ? (params.get('state') as OutboxState)
    : undefined;
  const recordType = params.get('recordType') ?? undefined;
  const recordId = params.get('recordId') ?? undefined;
  const page = Math.max(1, Number(params.get('page')) || 1);
  const messages = useOutboxMessages({ state, recordType, recordId, page, pageSize: PAGE_SIZE });
  const [selected, setSelected] = useState<string | null>(null);

  const update = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params);
    for (const [key, value] of Object.entries(changes))
      if (value) next.set(key, value);
      else next.delete(key);
    if (!('page' in changes)) next.delete('page');
    setParams(next, { replace: true });
  };

  const recordLabel = messages.data?.items.find((item) => item.record?.id === recordId)?.record
    ?.label;

  return (
    <section aria-labelledby="outbox-messages" className="flex flex-col gap-4">
      <h2 id="outbox-messages" className="text-lg font-semibold">
        Messages
      </h2>
      <div className="flex flex-wrap items-end gap-4">
        <label className="flex flex-col gap-1 text-sm">
          State
          <Select
            value={state ?? ''}
            onChange={(event) => update({ state: event.target.value || undefined })}
          >
            <option value="">Every state</option>
            {outboxStates.map((item) => (
              <option key={item} value={item}>
                {outboxStateLabels[item]}
              </option>
            ))}
          </Select>
        </label>
        {recordId ? (
          <p className="flex items-center gap-2 text-sm">
            About: <span className="font-medium">{recordLabel ?? recordId}</span>
            <button
              type="button"
              className="text-ember-800 hover:underline"
              onClick={() => update({ recordType: undefined, recordId: undefined })}
            >
              Every record
            </button>
          </p>
        ) : null}
      </div>
      {messages.isPending ? (
        <LoadingLine />
      ) : messages.error ? (
        <Notice tone="error">{messages.error.message}</Notice>
      ) : messages.data.items.length === 0 ? (
        <Notice>No message matches.</Notice>
      ) : (
        <div className="grid gap-6 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
          <div className="overflow-x-auto rounded-lg border border-soot-200 bg-white">
            <table className="w-full text-left text-sm">
              <thead className="border-b border-soot-200 bg-soot-50 text-xs uppercase text-soot-600">
                <tr>
                  <th className="px-3 py-2">Message</th>
                  <th className="px-3 py-2">About</th>
                  <th className="px-3 py-2">State</th>
                  <th className="px-3 py-2">Attempts</th>
                  <th className="px-3 py-2">Next attempt</th>
                </tr>
              </thead>
              <tbody>
                {messages.data.items.map((item) => (
                  <tr
                    key={item.id}
                    className={`border-b border-soot-100 align-top ${selected === item.id ? 'bg-ember-50' : ''}`}
                    data-testid="outbox-row"
                  >
                    <td className="px-3 py-2">
                      <button
                        type="button"
                        className="text-left font-medium text-ember-800 hover:underline"
                        onClick={() => setSelected(item.id)}
                        aria-current={selected === item.id || undefined}
                      >
                        {item.subject}
                      </button>
                      <span className="block text-xs text-soot-600">
                        To {item.recipients.map((recipient) => recipient.address).join(', ')} ·{' '}
                        {formatDateTime(item.createdAt)}
                      </span>
                      {item.lastError && item.state !== 'sent' ? (
                        <span className="block break-words text-xs text-red-900">
                          {item.lastError}
                        </span>
                      ) : null}
                    </td>
                    <td className="px-3 py-2">
                      {item.record ? (
                        <button
                          type="button"
                          className="text-left hover:underline"
                          title="Show only the messages about this record"
                          onClick={() =>
                            update({ recordType: item.record!.type, recordId: item.record!.id })
                          }
                        >
                          {item.record.label}
                        </button>
                      ) : (
                        '—'
                      )}
                    </td>
                    <td className="px-3 py-2">
                      <OutboxStateBadge state={item.state} />
                    </td>
                    <td className="px-3 py-2">{item.attempts}</td>
                    <td className="px-3 py-2">
                      {item.state === 'failed' ? formatDateTime(item.nextAttemptAt) : '—'}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            <Pager
              page={page}
              pageSize={PAGE_SIZE}
              total={messages.data.total}
              noun={['message', 'messages']}
              onPage={(next) => update({ page: String(next) })}
            />
          </div>
          <div className="rounded-lg border border-soot-200 bg-white p-5">
            {selected ? (
              <MessageDetail id={selected} />
            ) : (
              <p className="text-sm text-soot-600">
                Choose a message to see its recipients and text.
              </p>
            )}
          </div>
        </div>
      )}
    </section>
  );
}
