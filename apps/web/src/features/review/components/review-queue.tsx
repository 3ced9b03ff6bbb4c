import { useState } from 'react';
import { categories, type Category } from '@emberline/contracts/limits';
import type { ReviewQueueQuery } from '@emberline/contracts/review';
import { Link } from 'react-router-dom';
import { Select } from '../../../components/ui/field';
import { LoadingLine } from '../../../components/ui/page';
import { Notice } from '../../../components/ui/notice';
import { VerdictBadge } from '../../../components/ui/verdict-badge';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import { formatDate, formatDateTime } from '../../../lib/format';
import { REVIEW_QUEUE_PAGE_SIZE, useReviewQueue } from '../api/review';
import { Pager } from '../../../components/ui/pager';

interface Option {
  id: string;
  label: string;
}

/** What is left on one queued inspection, in words. */
function leftWords(left: {
  findings: number;
  flags: number;
  coverageGaps: number;
  outcome: boolean;
}): string {
  const parts = [
    left.findings ? `${left.findings} finding${left.findings === 1 ? '' : 's'} to decide` : null,
    left.flags ? `${left.flags} flag${left.flags === 1 ? '' : 's'} to accept` : null,
    left.coverageGaps
      ? `${left.coverageGaps} coverage gap${left.coverageGaps === 1 ? '' : 's'}`
      : null,
  ].filter(Boolean);
  if (parts.length) return parts.join(', ');
  return left.outcome ? 'the outcome to sign' : 'the release to sign';
}

/**
 * Submitted and dispositioned inspections, worst verdict first, then the longest waiting, with
 * filters by customer, model, engine and verdict.
 */
export function ReviewQueue({
  query,
  onQuery,
  customers,
  models,
}: {
  query: ReviewQueueQuery;
  onQuery: (query: ReviewQueueQuery) => void;
  customers: Option[];
  models: Option[];
}) {
  const [page, setPage] = useState(1);
  const queue = useReviewQueue(query, page);
  const items = queue.data?.items;
  const engines = new Map(
    (items ?? []).map((item) => [item.inspection.engineId, item.inspection.engineSerialNumber]),
  );
  const filter = (key: keyof ReviewQueueQuery, label: string, options: Option[]) => (
    <label className="flex flex-col gap-1 text-sm font-medium">
      {label}
      <Select
        value={query[key] ?? ''}
        onChange={(event) => {
          setPage(1);
          onQuery({ ...query, [key]: event.target.value || undefined });
        }}
      >
        <option value="">All</option>
        {options.map((option) => (
          <option key={option.id} value={option.id}>
            {option.label}
          </option>
        ))}
      </Select>
    </label>
  );

  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-3 sm:grid-cols-4" role="search" aria-label="Filter the queue">
        {filter('organisationId', 'Customer', customers)}
        {filter('modelId', 'Engine model', models)}
        {filter(
          'engineId',
          'Engine',
          [...engines].map(([id, label]) => ({ id, label })),
        )}
        {filter(
          'verdict',
          'Worst verdict',
          categories.map((category: Category) => ({
            id: category,
            label: verdictStyles[category].label,
          })),
        )}
      </div>
      {queue.isPending ? <LoadingLine /> : null}
      {queue.error ? <Notice tone="error">{queue.error.message}</Notice> : null}
      {items && items.length === 0 ? (
        <Notice>
          Nothing waits for review{Object.values(query).some(Boolean) ? ' with these filters' : ''}.
        </Notice>
      ) : null}
      {queue.data && items && items.length > 0 ? (
        <div>
          <div className="overflow-x-auto rounded-lg border border-soot-200 bg-white">
            <table className="w-full text-left text-sm">
              <caption className="sr-only">Inspections waiting for review</caption>
              <thead className="bg-soot-50 text-xs uppercase tracking-wide text-soot-600">
                <tr>
                  <th scope="col" className="px-3 py-2">
                    Engine
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Customer
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Inspected
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Submitted
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Worst verdict
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Left to do
                  </th>
                </tr>
              </thead>
              <tbody>
                {items.map((item) => (
                  <tr
                    key={item.inspection.id}
                    className="border-t border-soot-200"
                    data-testid="queue-row"
                  >
                    <td className="px-3 py-2">
                      <Link
                        to={`/review/${item.inspection.id}`}
                        className="font-semibold text-ember-800 hover:underline"
                      >
                        {item.inspection.engineSerialNumber}
                      </Link>
                      <span className="block text-xs text-soot-600">{item.modelName}</span>
                    </td>
                    <td className="px-3 py-2">{item.organisationName}</td>
                    <td className="px-3 py-2">{formatDate(item.inspection.date)}</td>
                    <td className="px-3 py-2">{formatDateTime(item.inspection.submittedAt)}</td>
                    <td className="px-3 py-2">
                      {item.worstVerdict ? (
                        <VerdictBadge category={item.worstVerdict} />
                      ) : (
                        'No findings'
                      )}
                      {item.inspection.newerRevisionInForce ? (
                        <span className="block text-xs text-soot-700">
                          A newer limit revision is in force
                        </span>
                      ) : null}
                    </td>
                    <td className="px-3 py-2">{leftWords(item.left)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager
            page={page}
            pageSize={REVIEW_QUEUE_PAGE_SIZE}
            total={queue.data.total}
            noun={['inspection', 'inspections']}
            onPage={setPage}
          />
        </div>
      ) : null}
    </div>
  );
}
