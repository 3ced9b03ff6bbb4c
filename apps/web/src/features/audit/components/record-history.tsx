import { useState } from 'react';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { formatDateTime } from '../../../lib/format';
import { HISTORY_PAGE_SIZE, useRecordHistory, type HistoryKind } from '../api/audit';
import { Pager } from '../../../components/ui/pager';

/**
 * The history of one record from the audit log, in words: who, when, what changed. Folded until
 * opened, so that a long history does not push the work down the page.
 */
export function RecordHistory({ kind, id }: { kind: HistoryKind; id: string }) {
  const [page, setPage] = useState(1);
  const history = useRecordHistory(kind, id, page);
  return (
    <details className="text-sm" data-testid="record-history">
      <summary className="cursor-pointer font-medium text-ember-800">
        History{history.data ? ` (${history.data.total} entries)` : ''}
      </summary>
      {history.isPending ? <LoadingLine /> : null}
      {history.error ? <Notice tone="error">{history.error.message}</Notice> : null}
      {history.data ? (
        <ol className="mt-2 flex flex-col gap-2 border-l-2 border-soot-200 pl-3">
          {history.data.items.map((entry) => (
            <li key={entry.id}>
              <span className="text-xs text-soot-600">
                {formatDateTime(entry.at)} · {entry.actorName ?? 'the system'}
              </span>
              <p>{entry.summary}</p>
              {entry.details.length > 0 ? (
                <ul className="list-inside list-disc text-xs text-soot-700">
                  {entry.details.map((detail) => (
                    <li key={detail}>{detail}</li>
                  ))}
                </ul>
              ) : null}
            </li>
          ))}
        </ol>
      ) : null}
      {history.data && history.data.total > HISTORY_PAGE_SIZE ? (
        <Pager
          page={page}
          pageSize={HISTORY_PAGE_SIZE}
          total={history.data.total}
          noun={['entry', 'entries']}
          onPage={setPage}
        />
      ) : null}
    </details>
  );
}
