import { Button } from './button';

/**
 * The foot of a paged list: where the reader is, how many there are in all, and the way to the
 * page before and after. Every list of the API is paged (at most 200 a page).
 */
export function Pager({
  page,
  pageSize,
  total,
  noun,
  onPage,
}: {
  page: number;
  pageSize: number;
  total: number;
  /** Singular and plural: ['user', 'users']. */
  noun: readonly [string, string];
  onPage: (page: number) => void;
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  return (
    <div className="flex items-center justify-between px-3 py-2 text-sm">
      <span>
        Page {page} of {pages} · {total} {total === 1 ? noun[0] : noun[1]}
      </span>
      {pages > 1 ? (
        <span className="flex gap-2">
          <Button variant="secondary" disabled={page <= 1} onClick={() => onPage(page - 1)}>
            Previous
          </Button>
          <Button variant="secondary" disabled={page >= pages} onClick={() => onPage(page + 1)}>
            Next
          </Button>
        </span>
      ) : null}
    </div>
  );
}
