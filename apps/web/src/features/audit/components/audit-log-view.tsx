import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { useAuditLog } from '../api/audit';

function compact(value: unknown): string {
  return value === null || value === undefined ? '' : JSON.stringify(value);
}

export function AuditLogView() {
  const log = useAuditLog();
  if (log.isPending) return <LoadingLine />;
  if (log.error) return <Notice tone="error">{log.error.message}</Notice>;
  const entries = log.data.pages.flatMap((page) => page.items);
  return (
    <div className="flex flex-col gap-3">
      <div className="overflow-x-auto rounded-lg border border-soot-200 bg-white">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Audit log, newest first</caption>
          <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
            <tr>
              <th scope="col" className="px-3 py-2">
                When (UTC)
              </th>
              <th scope="col" className="px-3 py-2">
                Who
              </th>
              <th scope="col" className="px-3 py-2">
                What
              </th>
              <th scope="col" className="px-3 py-2">
                Record
              </th>
              <th scope="col" className="px-3 py-2">
                Before → after
              </th>
            </tr>
          </thead>
          <tbody className="font-mono text-xs">
            {entries.map((entry) => (
              <tr key={entry.id} className="border-b border-soot-100 align-top">
                <td className="whitespace-nowrap px-3 py-2">
                  {entry.at.replace('T', ' ').slice(0, 19)}
                </td>
                <td className="px-3 py-2">{entry.actorEmail ?? 'system'}</td>
                <td className="px-3 py-2">{entry.action}</td>
                <td className="px-3 py-2">
                  {entry.entityType}
                  {entry.entityId ? ` ${entry.entityId}` : ''}
                </td>
                <td className="max-w-md break-all px-3 py-2 text-soot-700">
                  {compact(entry.before)}
                  {entry.before && entry.after ? ' → ' : ''}
                  {compact(entry.after)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {log.hasNextPage ? (
        <Button
          variant="secondary"
          className="self-start"
          busy={log.isFetchingNextPage}
          onClick={() => void log.fetchNextPage()}
        >
          Show older entries
        </Button>
      ) : null}
    </div>
  );
}
