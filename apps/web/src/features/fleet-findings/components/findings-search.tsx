import { cautions } from '@emberline/contracts/cautions';
import type { EngineModelRow, EngineModelSummary } from '@emberline/contracts/fleet';
import {
  searchDecisions,
  type FindingSearchItem,
  type FindingSearchQuery,
  type FindingSearchSortKey,
  type ParsedFindingSearchQuery,
  type SearchDecision,
} from '@emberline/contracts/fleet-findings';
import { categories, damageTypes, type Category } from '@emberline/contracts/limits';
import type { Organisation } from '@emberline/contracts/organisations';
import { decisionKindLabels } from '@emberline/contracts/review';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import { ArrowDown, ArrowUp } from 'lucide-react';
import { useId } from 'react';
import { Link } from 'react-router-dom';
import { Pager } from '../../../components/ui/pager';
import { ExportLinks } from '../../../components/ui/export-links';
import { DateInput, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { VerdictBadge } from '../../../components/ui/verdict-badge';
import { formatArea, formatDate, formatKey, formatLength } from '../../../lib/format';
import { useFindingSearch } from '../api/fleet-findings';

const decisionLabels: Record<SearchDecision, string> = {
  ...decisionKindLabels,
  none: 'No decision yet',
};

/** A filter as a labelled choice of its values; the empty choice lifts it. */
function Choice<T extends string>({
  label,
  value,
  every,
  options,
  onChange,
  disabled,
}: {
  label: string;
  value: T | undefined;
  every: string;
  options: readonly { value: T; label: string }[];
  onChange: (value: T | undefined) => void;
  disabled?: boolean;
}) {
  const id = useId();
  return (
    <div className="flex w-52 flex-col gap-1 text-sm font-medium">
      <label htmlFor={id}>{label}</label>
      <Select
        id={id}
        value={value ?? ''}
        disabled={disabled}
        onChange={(event) => onChange((event.target.value || undefined) as T | undefined)}
      >
        <option value="">{every}</option>
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </Select>
    </div>
  );
}

/** A column heading that sorts the search by its column, the second click the other way. */
function SortHeading({
  label,
  sortKey,
  query,
  onChange,
}: {
  label: string;
  sortKey: FindingSearchSortKey;
  query: ParsedFindingSearchQuery;
  onChange: (changes: Partial<FindingSearchQuery>) => void;
}) {
  const active = query.sort === sortKey;
  const Arrow = query.order === 'asc' ? ArrowUp : ArrowDown;
  return (
    <th
      className="px-3 py-2"
      aria-sort={active ? (query.order === 'asc' ? 'ascending' : 'descending') : 'none'}
    >
      <button
        type="button"
        className="inline-flex items-center gap-1 uppercase hover:text-ember-800"
        onClick={() =>
          onChange({
            sort: sortKey,
            order: active && query.order === 'desc' ? 'asc' : 'desc',
            page: 1,
          })
        }
      >
        {label}
        {active ? <Arrow className="size-3" aria-hidden /> : null}
      </button>
    </th>
  );
}

/** A measurement in mm (or mm²) over the same in inches, smaller: "1.30 mm ± 0.09" / "0.0512 in …". */
function Measure({ words }: { words: string | null }) {
  if (words === null) return <>—</>;
  const [metric, imperial] = words.split(' (');
  return (
    <>
      <span className="whitespace-nowrap">{metric}</span>
      <span className="block whitespace-nowrap text-xs text-soot-600">
        {imperial?.replace(/\)$/, '')}
      </span>
    </>
  );
}

const lengthOf = (item: FindingSearchItem) =>
  item.lengthMm === null ? null : formatLength(item.lengthMm, item.uncertaintyMm);

/**
 * Every recorded finding of the fleet the caller may see, filtered by model, row, zone, damage,
 * verdict, decision, days and owner, sorted and paged on the server; each row opens its still.
 */
export function FindingsSearch({
  query,
  onChange,
  models,
  rows,
  owners,
}: {
  query: ParsedFindingSearchQuery;
  onChange: (changes: Partial<FindingSearchQuery>) => void;
  models: readonly EngineModelSummary[];
  /** The rows of the model searched (or of the one model there is); empty until known. */
  rows: readonly EngineModelRow[];
  /** Owners to filter by; null for a customer, who only sees their own. */
  owners: readonly Organisation[] | null;
}) {
  const search = useFindingSearch(query);
  const row = rows.find((candidate) => candidate.key === query.row);
  const { page: _page, pageSize: _pageSize, ...selection } = query;
  return (
    <section className="flex flex-col gap-4" aria-label="Findings">
      <div className="flex flex-wrap items-start gap-3" role="group" aria-label="Filters">
        {models.length > 1 ? (
          <Choice
            label="Engine model"
            value={query.modelId}
            every="Every model"
            options={models.map((model) => ({
              value: model.id,
              label: `${model.name} v${model.version}`,
            }))}
            onChange={(modelId) => onChange({ modelId, row: undefined, zone: undefined, page: 1 })}
          />
        ) : null}
        <Choice
          label="Row"
          value={query.row}
          every={rows.length > 0 ? 'Every row' : 'Every row (choose a model first)'}
          options={rows.map((candidate) => ({ value: candidate.key, label: candidate.label }))}
          onChange={(value) => onChange({ row: value, zone: undefined, page: 1 })}
          disabled={rows.length === 0}
        />
        <Choice
          label="Zone"
          value={query.zone}
          every={row ? 'Every zone' : 'Every zone (choose a row first)'}
          options={(row?.zones ?? []).map((zone) => ({ value: zone, label: formatKey(zone) }))}
          onChange={(zone) => onChange({ zone, page: 1 })}
          disabled={!row}
        />
        <Choice
          label="Damage"
          value={query.damage}
          every="Every kind of damage"
          options={damageTypes.map((damage) => ({ value: damage, label: formatKey(damage) }))}
          onChange={(damage) => onChange({ damage, page: 1 })}
        />
        <Choice
          label="Verdict"
          value={query.category}
          every="Every verdict"
          options={categories.map((category: Category) => ({
            value: category,
            label: verdictStyles[category].label,
          }))}
          onChange={(category) => onChange({ category, page: 1 })}
        />
        <Choice
          label="Decision"
          value={query.decision}
          every="Any decision or none"
          options={searchDecisions.map((decision) => ({
            value: decision,
            label: decisionLabels[decision],
          }))}
          onChange={(decision) => onChange({ decision, page: 1 })}
        />
        {owners ? (
          <Choice
            label="Owner"
            value={query.organisationId}
            every="Every owner"
            options={owners
              .filter((owner) => owner.kind === 'customer')
              .map((owner) => ({ value: owner.id, label: owner.name }))}
            onChange={(organisationId) => onChange({ organisationId, page: 1 })}
          />
        ) : null}
        <label className="flex w-44 flex-col gap-1 text-sm font-medium">
          Inspected from
          <DateInput
            value={query.from ?? ''}
            onChange={(event) => onChange({ from: event.target.value || undefined, page: 1 })}
          />
        </label>
        <label className="flex w-44 flex-col gap-1 text-sm font-medium">
          Inspected until
          <DateInput
            value={query.to ?? ''}
            onChange={(event) => onChange({ to: event.target.value || undefined, page: 1 })}
          />
        </label>
      </div>
      {search.isPending ? (
        <LoadingLine />
      ) : search.error ? (
        <Notice tone="error">{search.error.message}</Notice>
      ) : search.data.items.length === 0 ? (
        <Notice>
          No recorded finding matches these filters. Findings are listed once their inspection is
          submitted for review.
        </Notice>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-soot-200 bg-white">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-soot-200 bg-soot-50 text-xs uppercase text-soot-600">
              <tr>
                <SortHeading
                  label="Engine"
                  sortKey="engineSerial"
                  query={query}
                  onChange={onChange}
                />
                <SortHeading
                  label="Inspected"
                  sortKey="inspectionDate"
                  query={query}
                  onChange={onChange}
                />
                <SortHeading label="Where" sortKey="position" query={query} onChange={onChange} />
                <th className="px-3 py-2">Damage</th>
                <SortHeading label="Length" sortKey="lengthMm" query={query} onChange={onChange} />
                <SortHeading label="Area" sortKey="areaMm2" query={query} onChange={onChange} />
                <SortHeading label="Depth" sortKey="depthMm" query={query} onChange={onChange} />
                <SortHeading label="Verdict" sortKey="category" query={query} onChange={onChange} />
                <th className="px-3 py-2">Decision</th>
                <th className="px-3 py-2">
                  <span className="sr-only">Open</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {search.data.items.map((item) => (
                <tr
                  key={item.id}
                  className="border-b border-soot-100 align-top"
                  data-testid="finding-row"
                >
                  <td className="px-3 py-2 whitespace-nowrap">
                    <Link
                      to={`/fleet/${item.engineId}`}
                      className="font-mono font-medium text-ember-800 hover:underline"
                    >
                      {item.engineSerialNumber}
                    </Link>
                    {owners ? (
                      <span className="block text-xs text-soot-600">{item.organisationName}</span>
                    ) : null}
                  </td>
                  <td className="px-3 py-2 whitespace-nowrap">{formatDate(item.inspectionDate)}</td>
                  <td className="min-w-44 px-3 py-2">
                    {item.rowLabel}, position {item.position}
                    <span className="block text-xs text-soot-600">{formatKey(item.zone)}</span>
                  </td>
                  <td className="px-3 py-2">{formatKey(item.damage)}</td>
                  <td className="px-3 py-2">
                    <Measure words={lengthOf(item)} />
                  </td>
                  <td className="px-3 py-2">
                    <Measure
                      words={
                        item.areaMm2 === null ? null : formatArea(item.areaMm2, item.uncertaintyMm2)
                      }
                    />
                  </td>
                  <td className="px-3 py-2">
                    <Measure
                      words={item.depthMm === null ? null : formatLength(item.depthMm, null)}
                    />
                  </td>
                  <td className="px-3 py-2">
                    {item.category ? <VerdictBadge category={item.category} /> : 'Not judged'}
                  </td>
                  <td className="px-3 py-2">
                    {item.decision ? decisionKindLabels[item.decision] : 'No decision yet'}
                  </td>
                  <td className="px-3 py-2 whitespace-nowrap">
                    <Link
                      to={`/inspections/${item.inspectionId}?finding=${item.id}`}
                      className="font-medium text-ember-800 hover:underline"
                    >
                      Open F{item.number}
                      <span className="sr-only">
                        {' '}
                        of {item.engineSerialNumber}, {formatDate(item.inspectionDate)}
                      </span>
                    </Link>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <Pager
            page={query.page}
            pageSize={query.pageSize}
            total={search.data.total}
            noun={['finding', 'findings']}
            onPage={(page) => onChange({ page })}
          />
        </div>
      )}
      <ExportLinks
        label="Export these findings, in this order"
        path="/findings/export"
        formats={['csv', 'xlsx']}
        query={Object.fromEntries(
          Object.entries(selection).map(([key, value]) => [key, value as string | undefined]),
        )}
      />
      <p className="text-xs text-soot-600">{cautions.dispositions}</p>
    </section>
  );
}
