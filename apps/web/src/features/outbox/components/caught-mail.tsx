import { useState } from 'react';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { formatDateTime } from '../../../lib/format';
import { Pager } from '../../../components/ui/pager';
import { CAUGHT_PAGE_SIZE, useCaughtMail, useCaughtMessage } from '../api/outbox';

/** What the local SMTP fake caught: the messages as they arrived, read back from their `.eml`. */
export function CaughtMail() {
  const [page, setPage] = useState(1);
  const outbox = useCaughtMail(page);
  const [selected, setSelected] = useState<string | null>(null);
  const mail = useCaughtMessage(selected);

  if (outbox.isPending) return <LoadingLine />;
  if (outbox.error) return <Notice tone="error">{outbox.error.message}</Notice>;
  // With a real relay configured nothing is caught: the messages above are the whole story.
  if (!outbox.data.catching) return null;

  return (
    <section aria-labelledby="caught-mail" className="flex flex-col gap-4">
      <h2 id="caught-mail" className="text-lg font-semibold">
        Caught by the local mail server
      </h2>
      <p className="text-sm text-soot-600">
        No SMTP relay is configured, so nothing leaves this machine: the messages arrive here
        instead, links included.
      </p>
      {outbox.data.items.length === 0 ? (
        <Notice>No e-mail has arrived yet.</Notice>
      ) : (
        <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
          <div>
            <ul
              className="divide-y divide-soot-100 rounded-lg border border-soot-200 bg-white"
              aria-label="Caught messages"
            >
              {outbox.data.items.map((item) => (
                <li key={item.id}>
                  <button
                    type="button"
                    onClick={() => setSelected(item.id)}
                    aria-current={selected === item.id || undefined}
                    className={`block w-full px-4 py-3 text-left text-sm hover:bg-soot-50 ${selected === item.id ? 'bg-ember-50' : ''}`}
                  >
                    <span className="block font-medium text-soot-900">
                      {item.subject || '(no subject)'}
                    </span>
                    <span className="block text-soot-600">To {item.to.join(', ')}</span>
                    <span className="block text-xs text-soot-500">
                      {formatDateTime(item.receivedAt)}
                    </span>
                  </button>
                </li>
              ))}
            </ul>
            <Pager
              page={page}
              pageSize={CAUGHT_PAGE_SIZE}
              total={outbox.data.total}
              noun={['message', 'messages']}
              onPage={setPage}
            />
          </div>
          <div className="rounded-lg border border-soot-200 bg-white p-5">
            {!selected ? (
              <p className="text-sm text-soot-600">Choose a message to read it.</p>
            ) : mail.isPending ? (
              <LoadingLine />
            ) : mail.error ? (
              <Notice tone="error">{mail.error.message}</Notice>
            ) : (
              <article>
                <h2 className="text-lg font-semibold">{mail.data.subject}</h2>
                <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 text-sm text-soot-700">
                  <dt>From</dt>
                  <dd>{mail.data.from}</dd>
                  <dt>To</dt>
                  <dd>{mail.data.to.join(', ')}</dd>
                  <dt>Received</dt>
                  <dd>{formatDateTime(mail.data.receivedAt)}</dd>
                </dl>
                <pre
                  className="mt-4 whitespace-pre-wrap break-words rounded-md bg-soot-50 p-4 font-mono text-sm text-soot-900"
                  data-testid="mail-text"
                >
                  {mail.data.text}
                </pre>
                {mail.data.attachmentList.length > 0 ? (
                  <ul className="mt-3 text-sm">
                    {mail.data.attachmentList.map((attachment) => (
                      <li key={attachment.filename}>
                        Attachment: {attachment.filename} ({attachment.contentType},{' '}
                        {Math.round(attachment.size / 1024)} KB)
                      </li>
                    ))}
                  </ul>
                ) : null}
              </article>
            )}
          </div>
        </div>
      )}
    </section>
  );
}
