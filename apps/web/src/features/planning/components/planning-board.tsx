import {
  dueStates,
  dueStateLabels,
  type PlanningItem,
  type PlanningQuery,
} from '@emberline/contracts/planning';
import { removalKindWords } from '@emberline/domain/decision-words';
import { FlexRender, tableFeatures, useTable, type ColumnDef } from '@tanstack/react-table';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { DueStateBadge } from '../../../components/ui/due-state-badge';
import { Button } from '../../../components/ui/button';
import { Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { formatCount, formatDate, formatHours } from '../../../lib/format';
import { planningCsvUrl, usePlanning } from '../api/planning';
import { BookingForm } from './booking-form';
import { DueMoveNote } from './due-move-note';

const features = tableFeatures({});
const dimensionWords = { cycles: 'cycles', hours: 'hours', days: 'days' } as const;

const columns: ColumnDef<typeof features, PlanningItem>[] = [
  {
    id: 'engine',
    header: 'Engine',
    cell: ({ row }) => (
      <span className="flex flex-col">
        <Link
          to={`/fleet/${row.original.engineId}`}
          className="font-mono font-medium text-ember-800 underline"
        >
          {row.original.serialNumber}
        </Link>
        <span className="text-xs text-soot-600">{row.original.modelName}</span>
      </span>
    ),
  },
  { id: 'customer', header: 'Customer', cell: ({ row }) => row.original.organisationName },
  {
    id: 'state',
    header: 'State',
    cell: ({ row }) => <DueStateBadge state={row.original.state} />,
  },
  {
    id: 'due',
    header: 'Next due',
    cell: ({ row }) => {
      const next = row.original.nextInspection;
      const move = row.original.lastMove;
      if (!next) return <span className="text-soot-600">—</span>;
      return (
        <span className="flex max-w-xs flex-col gap-0.5">
          <span className="font-medium" data-due-date={next.dueDate ?? ''}>
            {formatDate(next.dueDate)}
          </span>
          <span className="font-mono text-xs">
            CSN {next.dueCsn !== null ? formatCount(next.dueCsn) : '—'} · TSN{' '}
            {next.dueTsn !== null ? formatHours(next.dueTsn) : '—'}
          </span>
          {move ? <DueMoveNote move={move} compact /> : null}
        </span>
      );
    },
  },
  {
    id: 'governing',
    header: 'Governed by',
    cell: ({ row }) => {
      const item = row.original;
      if (!item.governedBy || !item.nextInspection?.governing) return '—';
      return `${item.governedBy.kind === 'repeat' ? 'Repeat inspection' : 'Standard interval'}, ${dimensionWords[item.nextInspection.governing]}`;
    },
  },
  {
    id: 'removal',
    header: 'Removal',
    cell: ({ row }) => {
      const removal = row.original.removal;
      if (!removal) return '—';
      return (
        <span className="font-medium text-red-900">
          {removalKindWords[removal.kind]}
          {removal.dueDate ? `, ${formatDate(removal.dueDate)}` : ''}
        </span>
      );
    },
  },
  {
    id: 'booking',
    header: 'Booking',
    cell: ({ row }) => {
      const booking = row.original.booking;
      return (
        <details className="text-sm">
          <summary className="cursor-pointer font-medium text-ember-800">
            {booking
              ? `Booked for ${formatDate(booking.plannedDate)}${booking.afterDueDate ? ' — after the due date' : ''}`
              : 'Book…'}
          </summary>
          <div className="mt-2">
            <BookingForm
              engineId={row.original.engineId}
              serialNumber={row.original.serialNumber}
              due={row.original}
            />
          </div>
        </details>
      );
    },
  },
];

export type BoardFilters = Pick<
  Partial<PlanningQuery>,
  'organisationId' | 'modelId' | 'state' | 'page'
>;

/**
 * The planning board's list: every engine with its due status, overdue first and then by the
 * day it falls due, filtered by customer, model and state (kept in the address by the caller),
 * each bookable in place.
 */
export function PlanningBoard({
  filters,
  onFilters,
  customers,
  models,
  canBook,
  calendar,
}: {
  /** Shown in place of the list (with the same filters) when the board is seen as a calendar. */
  calendar?: ReactNode;
  filters: BoardFilters;
  onFilters: (filters: BoardFilters) => void;
  customers: { id: string; label: string }[];
  models: { id: string; label: string }[];
  canBook: boolean;
}) {
  const pageSize = 50;
  const board = usePlanning({ ...filters, pageSize }, !calendar);
  const table = useTable({
    features,
    columns,
    data: board.data?.items ?? [],
    state: { columnVisibility: {} },
  });
  const visible = canBook
    ? table.getAllLeafColumns()
    : table.getAllLeafColumns().filter((column) => column.id !== 'booking');
  const page = filters.page ?? 1;
  const total = board.data?.total ?? 0;
  const select = (
    key: keyof BoardFilters,
    label: string,
    options: { id: string; label: string }[],
  ) => (
    <label className="flex flex-col gap-1 text-sm font-medium">
      {label}
      <Select
        value={String(filters[key] ?? '')}
        onChange={(event) =>
          onFilters({ ...filters, [key]: event.target.value || undefined, page: 1 })
        }
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
      <div className="grid gap-3 sm:grid-cols-3" role="search" aria-label="Filter the board">
        {select('organisationId', 'Customer', customers)}
        {select('modelId', 'Engine model', models)}
        {select(
          'state',
          'State',
          dueStates.map((state) => ({ id: state, label: dueStateLabels[state] })),
        )}
      </div>
      <a
        href={planningCsvUrl(filters)}
        download
        className="self-start text-sm font-medium text-ember-800 underline"
      >
        Download the list as CSV
      </a>
      {calendar ? calendar : null}
      {calendar ? null : board.error ? <Notice tone="error">{board.error.message}</Notice> : null}
      <div
        hidden={Boolean(calendar)}
        className="overflow-x-auto rounded-lg border border-soot-200 bg-white"
      >
        <table className="w-full text-left text-sm" aria-busy={board.isFetching || undefined}>
          <caption className="sr-only">Engines by when they fall due, overdue first</caption>
          <thead className="border-b border-soot-200 bg-soot-50 text-xs uppercase tracking-wide text-soot-600">
            <tr>
              {visible.map((column) => (
                <th key={column.id} scope="col" className="px-3 py-2">
                  {String(column.columnDef.header)}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                className="border-b border-soot-100 align-top"
                data-testid="planning-row"
              >
                {row
                  .getAllCells()
                  .filter((cell) => canBook || cell.column.id !== 'booking')
                  .map((cell) => (
                    <td key={cell.id} className="px-3 py-2">
                      <FlexRender cell={cell} />
                    </td>
                  ))}
              </tr>
            ))}
          </tbody>
        </table>
        {board.isPending ? <p className="p-4 text-sm text-soot-600">Loading the board…</p> : null}
        {board.data && board.data.items.length === 0 ? (
          <p className="p-4 text-sm text-soot-600">No engine matches these filters.</p>
        ) : null}
      </div>
      <nav
        aria-label="Pages"
        hidden={Boolean(calendar)}
        className="flex items-center justify-between text-sm"
      >
        <p role="status">
          {total === 0
            ? 'No engines'
            : `Engines ${(page - 1) * pageSize + 1}–${Math.min(page * pageSize, total)} of ${total}`}
        </p>
        <div className="flex gap-2">
          <Button
            variant="secondary"
            disabled={page <= 1}
            onClick={() => onFilters({ ...filters, page: page - 1 })}
          >
            Previous
          </Button>
          <Button
            variant="secondary"
            disabled={page * pageSize >= total}
            onClick={() => onFilters({ ...filters, page: page + 1 })}
          >
            Next
          </Button>
        </div>
      </nav>
    </div>
  );
}
