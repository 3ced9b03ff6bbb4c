import { useEffect, useMemo, useState } from 'react';
import { type Engine, type EngineListQuery, type EngineSortKey } from '@emberline/contracts/fleet';
import type { EngineModelSummary } from '@emberline/contracts/fleet';
import type { Organisation } from '@emberline/contracts/organisations';
import {
  columnVisibilityFeature,
  FlexRender,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type ColumnDef,
  type ColumnVisibilityState,
  type SortingState,
} from '@tanstack/react-table';
import { ArrowDown, ArrowUp, ArrowUpDown } from 'lucide-react';
import { AwaitingDisposition } from '../../../components/ui/awaiting-disposition';
import { DueStateBadge } from '../../../components/ui/due-state-badge';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Input, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { formatCount, formatDate, formatHours } from '../../../lib/format';
import { useEngines } from '../api/engines';
import { EngineStatusOptions, StatusBadge } from './status-badge';
import { dueStateLabels, dueStates } from '@emberline/contracts/planning';

const features = tableFeatures({ rowSortingFeature, columnVisibilityFeature });

export type FleetView = EngineListQuery & { hidden: string[] };

const columns: ColumnDef<typeof features, Engine>[] = [
  {
    id: 'serialNumber',
    accessorKey: 'serialNumber',
    header: 'Serial',
    enableHiding: false,
    cell: ({ row }) => (
      <span className="flex flex-col gap-1">
        <Link
          to={`/fleet/${row.original.id}`}
          className="font-mono font-medium text-ember-800 underline-offset-2 hover:underline"
        >
          {row.original.serialNumber}
        </Link>
        {row.original.awaitingDisposition ? (
          <AwaitingDisposition awaiting={row.original.awaitingDisposition} />
        ) : null}
      </span>
    ),
  },
  { id: 'modelName', accessorKey: 'modelName', header: 'Model' },
  { id: 'organisationName', accessorKey: 'organisationName', header: 'Owner' },
  {
    id: 'registration',
    accessorKey: 'registration',
    header: 'Aircraft',
    cell: ({ row }) => row.original.registration ?? '—',
  },
  {
    id: 'installedPosition',
    accessorKey: 'installedPosition',
    header: 'Position',
    enableSorting: false,
    cell: ({ row }) => row.original.installedPosition ?? '—',
  },
  {
    id: 'status',
    accessorKey: 'status',
    header: 'Status',
    cell: ({ row }) => <StatusBadge status={row.original.status} />,
  },
  {
    id: 'tsn',
    accessorKey: 'tsn',
    header: 'TSN (h)',
    cell: ({ row }) => <span className="font-mono">{formatHours(row.original.tsn)}</span>,
  },
  {
    id: 'csn',
    accessorKey: 'csn',
    header: 'CSN',
    cell: ({ row }) => <span className="font-mono">{formatCount(row.original.csn)}</span>,
  },
  {
    id: 'tsnCsnAsOf',
    accessorKey: 'tsnCsnAsOf',
    header: 'As of',
    enableSorting: false,
    cell: ({ row }) => formatDate(row.original.tsnCsnAsOf),
  },
  {
    id: 'nextDue',
    // Sorted by the server: due state first (overdue at the top), then the day it falls due.
    accessorFn: (engine) => engine.nextDue?.dueDate ?? '',
    header: 'Next due',
    cell: ({ row }) => {
      const due = row.original.nextDue;
      if (!due) return '—';
      return (
        <span className="flex flex-col gap-1">
          <DueStateBadge state={due.state} />
          {due.dueDate ? (
            <span className="text-xs">
              {formatDate(due.dueDate)}
              {due.dueCsn !== null ? ` · CSN ${formatCount(due.dueCsn)}` : ''}
              {due.governing ? ` · by ${due.governing}` : ''}
            </span>
          ) : null}
        </span>
      );
    },
  },
];

const columnLabels = Object.fromEntries(
  columns.map((column) => [column.id, String(column.header)]),
);

interface FleetTableProps {
  view: FleetView;
  onChange: (changes: Partial<FleetView>) => void;
  models: EngineModelSummary[];
  /** Owners to filter by; null for a customer, who only sees their own. */
  owners: Organisation[] | null;
}

export function FleetTable({ view, onChange, models, owners }: FleetTableProps) {
  const { hidden: hiddenInAddress, ...query } = view;
  // Shown at once, while the address follows (router navigations are transitions, and a
  // controlled checkbox would snap back until one lands).
  const [hidden, setHidden] = useState(hiddenInAddress);
  const [shownHidden, setShownHidden] = useState(hiddenInAddress);
  if (hiddenInAddress !== shownHidden) {
    setShownHidden(hiddenInAddress);
    setHidden(hiddenInAddress);
  }
  const engines = useEngines(query);
  const [search, setSearch] = useState(view.q ?? '');
  // When the address changes the search (back button, a shared link), the box follows it.
  const [shownQ, setShownQ] = useState(view.q);
  if (view.q !== shownQ) {
    setShownQ(view.q);
    setSearch(view.q ?? '');
  }
  useEffect(() => {
    const timer = setTimeout(() => {
      if ((view.q ?? '') !== search) onChange({ q: search || undefined, page: 1 });
    }, 300);
    return () => clearTimeout(timer);
  }, [search, view.q, onChange]);

  const sorting: SortingState = [{ id: view.sort, desc: view.order === 'desc' }];
  const columnVisibility: ColumnVisibilityState = useMemo(
    () =>
      Object.fromEntries(
        [...hidden, ...(owners ? [] : ['organisationName'])].map((id) => [id, false]),
      ),
    [hidden, owners],
  );

  const table = useTable({
    features,
    columns,
    data: engines.data?.items ?? [],
    manualSorting: true,
    state: { sorting, columnVisibility },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const first = next[0];
      onChange(
        first
          ? { sort: first.id as EngineSortKey, order: first.desc ? 'desc' : 'asc', page: 1 }
          : { sort: 'serialNumber', order: 'asc' },
      );
    },
  });

  const total = engines.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / view.pageSize));

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end gap-3" role="search">
        <label className="flex min-w-64 flex-1 flex-col gap-1 text-sm font-medium">
          Search serial or aircraft
          <Input
            type="search"
            value={search}
            onChange={(event) => setSearch(event.target.value)}
            placeholder="VT3-D01, ZZ-CRA…"
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium">
          Serial starts with
          <Input
            value={view.serial ?? ''}
            onChange={(event) => onChange({ serial: event.target.value || undefined, page: 1 })}
            className="w-40 font-mono"
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium">
          Model
          <Select
            value={view.modelId ?? ''}
            onChange={(event) => onChange({ modelId: event.target.value || undefined, page: 1 })}
          >
            <option value="">All models</option>
            {models.map((model) => (
              <option key={model.id} value={model.id}>
                {model.name} v{model.version}
              </option>
            ))}
          </Select>
        </label>
        {owners ? (
          <label className="flex flex-col gap-1 text-sm font-medium">
            Owner
            <Select
              value={view.organisationId ?? ''}
              onChange={(event) =>
                onChange({ organisationId: event.target.value || undefined, page: 1 })
              }
            >
              <option value="">All owners</option>
              {owners
                .filter((owner) => owner.kind === 'customer')
                .map((owner) => (
                  <option key={owner.id} value={owner.id}>
                    {owner.name}
                  </option>
                ))}
            </Select>
          </label>
        ) : null}
        <label className="flex flex-col gap-1 text-sm font-medium">
          Status
          <Select
            value={view.status ?? ''}
            onChange={(event) =>
              onChange({
                status: (event.target.value || undefined) as FleetView['status'],
                page: 1,
              })
            }
          >
            <option value="">Any status</option>
            <EngineStatusOptions />
          </Select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium">
          Due state
          <Select
            value={view.dueState ?? ''}
            onChange={(event) =>
              onChange({
                dueState: (event.target.value || undefined) as FleetView['dueState'],
                page: 1,
              })
            }
          >
            <option value="">Any due state</option>
            {dueStates.map((state) => (
              <option key={state} value={state}>
                {dueStateLabels[state]}
              </option>
            ))}
          </Select>
        </label>
        <details className="relative">
          <summary className="cursor-pointer rounded-md border border-soot-300 bg-white px-3 py-2 text-sm">
            Columns
          </summary>
          <fieldset className="absolute left-0 z-10 mt-1 flex w-48 flex-col gap-1 rounded-md border border-soot-200 bg-white p-3 shadow-lg">
            <legend className="sr-only">Columns shown</legend>
            {table
              .getAllLeafColumns()
              .filter(
                (column) => column.getCanHide() && (owners || column.id !== 'organisationName'),
              )
              .map((column) => (
                <label key={column.id} className="flex items-center gap-2 text-sm">
                  <input
                    type="checkbox"
                    checked={column.getIsVisible()}
                    onChange={(event) => {
                      const next = event.target.checked
                        ? hidden.filter((id) => id !== column.id)
                        : [...hidden, column.id];
                      setHidden(next);
                      onChange({ hidden: next });
                    }}
                  />
                  {columnLabels[column.id]}
                </label>
              ))}
          </fieldset>
        </details>
      </div>

      {engines.error ? <Notice tone="error">{engines.error.message}</Notice> : null}

      <div className="overflow-x-auto rounded-lg border border-soot-200 bg-white">
        <table className="w-full text-left text-sm" aria-busy={engines.isFetching || undefined}>
          <caption className="sr-only">Engines, sorted by {columnLabels[view.sort]}</caption>
          <thead className="border-b border-soot-200 bg-soot-50 text-xs uppercase tracking-wide text-soot-600">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className="px-3 py-2"
                      aria-sort={
                        sorted === 'asc'
                          ? 'ascending'
                          : sorted === 'desc'
                            ? 'descending'
                            : undefined
                      }
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 uppercase hover:text-soot-900"
                        >
                          <FlexRender header={header} />
                          {sorted === 'asc' ? (
                            <ArrowUp className="size-3" aria-hidden />
                          ) : sorted === 'desc' ? (
                            <ArrowDown className="size-3" aria-hidden />
                          ) : (
                            <ArrowUpDown className="size-3 opacity-40" aria-hidden />
                          )}
                        </button>
                      ) : (
                        <FlexRender header={header} />
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                className="border-b border-soot-100 hover:bg-ember-50/40"
                data-testid="engine-row"
              >
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2 align-middle">
                    <FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {engines.isPending ? <p className="p-4 text-sm text-soot-600">Loading engines…</p> : null}
        {engines.data && engines.data.items.length === 0 ? (
          <p className="p-4 text-sm text-soot-600">No engine matches these filters.</p>
        ) : null}
      </div>

      <nav aria-label="Pages" className="flex flex-wrap items-center justify-between gap-3 text-sm">
        <p role="status">
          {total === 0
            ? 'No engines'
            : `Engines ${(view.page - 1) * view.pageSize + 1}–${Math.min(view.page * view.pageSize, total)} of ${total}`}
        </p>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-2">
            Per page
            <Select
              value={String(view.pageSize)}
              onChange={(event) => onChange({ pageSize: Number(event.target.value), page: 1 })}
              className="w-20"
            >
              {[10, 25, 50, 100].map((size) => (
                <option key={size}>{size}</option>
              ))}
            </Select>
          </label>
          <Button
            variant="secondary"
            disabled={view.page <= 1}
            onClick={() => onChange({ page: view.page - 1 })}
          >
            Previous
          </Button>
          <span>
            Page {view.page} of {pages}
          </span>
          <Button
            variant="secondary"
            disabled={view.page >= pages}
            onClick={() => onChange({ page: view.page + 1 })}
          >
            Next
          </Button>
        </div>
      </nav>
    </div>
  );
}
