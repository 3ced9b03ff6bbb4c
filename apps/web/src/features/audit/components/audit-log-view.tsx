import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { DateInput, Input, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { formatDateTime } from '../../../lib/format';
import { useAuditLog, type AuditFilters } from '../api/audit';

const recordKinds = [
  ['inspection', 'Inspection'],
  ['finding', 'Finding'],
  ['image', 'Image'],
  ['limit-set', 'Limit revision'],
  ['engine', 'Engine'],
  ['user', 'User'],
  ['organisation', 'Organisation'],
  ['session', 'Session'],
] as const;

/** Filters of the audit log: one record, one person, a span of days. */
function AuditFiltersForm({
  filters,
  onFilters,
  people,
}: {
  filters: AuditFilters;
  onFilters: (filters: AuditFilters) => void;
  people: { id: string; name: string }[];
}) {
  const set = (key: keyof AuditFilters, value: string) =>
    onFilters({ ...filters, [key]: value || undefined });
  const field = 'flex flex-col gap-1 text-sm font-medium';
  return (
    <div className="grid gap-3 sm:grid-cols-5" role="search" aria-label="Filter the audit log">
      <label className={field}>
        Record kind
        <Select
          value={filters.entityType ?? ''}
          onChange={(event) => set('entityType', event.target.value)}
        >
          <option value="">All</option>
          {recordKinds.map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </Select>
      </label>
      <label className={field}>
        Record id
        <Input
          value={filters.entityId ?? ''}
          onChange={(event) => set('entityId', event.target.value.trim())}
          placeholder="Any"
        />
      </label>
      <label className={field}>
        Person
        <Select
          value={filters.actorUserId ?? ''}
          onChange={(event) => set('actorUserId', event.target.value)}
        >
          <option value="">Anyone</option>
          {people.map((person) => (
            <option key={person.id} value={person.id}>
              {person.name}
            </option>
          ))}
        </Select>
      </label>
      <label className={field}>
        From
        <DateInput
          value={filters.from ?? ''}
          onChange={(event) => set('from', event.target.value)}
        />
      </label>
      <label className={field}>
        To
        <DateInput value={filters.to ?? ''} onChange={(event) => set('to', event.target.value)} />
      </label>
    </div>
  );
}

function compact(value: unknown): string {
  return value === null || value === undefined ? '' : JSON.stringify(value);
}

export function AuditLogView({ people }: { people: { id: string; name: string }[] }) {
  const [filters, setFilters] = useState<AuditFilters>({});
  const log = useAuditLog(filters);
  const entries = log.data?.pages.flatMap((page) => page.items) ?? [];
  return (
    <div className="flex flex-col gap-3">
      <AuditFiltersForm filters={filters} onFilters={setFilters} people={people} />
      {log.isPending ? <LoadingLine /> : null}
      {log.error ? <Notice tone="error">{log.error.message}</Notice> : null}
      {log.data && entries.length === 0 ? <Notice>No entry matches these filters.</Notice> : null}
      <p className="text-xs text-soot-600">
        The log shows each change as the records keep it: ids, keys and values as stored, for
        tracing a record; the record’s own page says it in words.
      </p>
      <div className="overflow-x-auto rounded-lg border border-soot-200 bg-white" data-shows-ids>
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Audit log, newest first</caption>
          <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
            <tr>
              <th scope="col" className="px-3 py-2">
                When
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
                <td className="whitespace-nowrap px-3 py-2">{formatDateTime(entry.at)}</td>
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
