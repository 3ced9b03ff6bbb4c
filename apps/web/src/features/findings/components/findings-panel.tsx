import { useState, type ReactNode } from 'react';
import {
  coverageStatusLabels,
  type Finding,
  type RowCoverage,
} from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { categories, type Category } from '@emberline/contracts/limits';
import { clockOfPositionOne, stageRing } from '@emberline/drawings/stage-ring';
import { Input } from '../../../components/ui/field';
import { SvgDrawing } from '../../../components/ui/svg-drawing';
import { formatKey } from '../../../lib/format';
import { formatPositions } from '../lib/live';
import { CoverageForm } from './coverage-form';
import { FindingItem } from './finding-item';

const rank = (category: Category) => categories.indexOf(category);

export function FindingsPanel({
  inspectionId,
  rows,
  findings,
  coverage,
  editable,
  onOpen,
  trend,
  rulesReadable,
}: {
  inspectionId: string;
  rows: EngineModelRow[];
  findings: Finding[];
  coverage: RowCoverage[];
  editable: boolean;
  onOpen: (finding: Finding) => void;
  trend?: (finding: Finding) => ReactNode;
  /** Whether the signed-in person may read the limit library (customers may not). */
  rulesReadable: boolean;
}) {
  const [filter, setFilter] = useState<Record<string, number | null>>({});
  return (
    <div className="flex flex-col gap-6">
      {rows.map((row) => {
        const onRow = findings.filter((finding) => finding.row === row.key);
        const verdicts = new Map<number, Category>();
        for (const finding of onRow) {
          const category = finding.status === 'recorded' ? finding.evaluation?.category : undefined;
          if (!category) continue;
          const current = verdicts.get(finding.position);
          if (!current || rank(category) > rank(current)) verdicts.set(finding.position, category);
        }
        const rowCoverage = coverage.find((item) => item.row === row.key);
        const viewed = new Set(rowCoverage?.viewedPositions ?? []);
        const unviewed = new Set(
          rowCoverage?.status === 'full'
            ? []
            : Array.from({ length: row.count }, (_, index) => index + 1).filter(
                (position) => !viewed.has(position),
              ),
        );
        const selected = filter[row.key] ?? null;
        const shown = onRow
          .filter((finding) => selected === null || finding.position === selected)
          .sort((a, b) => a.position - b.position || a.number - b.number);
        return (
          <section
            key={row.key}
            aria-labelledby={`row-${row.key}`}
            className="grid gap-4 border-t border-soot-200 pt-4 lg:grid-cols-[360px_1fr]"
            data-testid={`row-${row.key}`}
          >
            <div>
              <SvgDrawing
                drawing={stageRing({
                  count: row.count,
                  positionOneClock: clockOfPositionOne(row.numbering.positionOne),
                  direction: row.numbering.direction,
                  viewpoint: formatKey(row.numbering.viewpoint),
                  title: row.label,
                  verdicts,
                  unviewed: rowCoverage?.recorded || rowCoverage ? unviewed : new Set(),
                  selected,
                })}
                svgProps={{
                  className: 'h-auto w-full max-w-[360px] cursor-pointer',
                  onClick: (event) => {
                    const target = (event.target as Element).closest('[data-position]');
                    const position = target ? Number(target.getAttribute('data-position')) : null;
                    setFilter({ ...filter, [row.key]: position === selected ? null : position });
                  },
                }}
              />
              <label className="mt-2 flex items-center gap-2 text-sm">
                Show position
                <Input
                  type="number"
                  min={1}
                  max={row.count}
                  value={selected ?? ''}
                  onChange={(event) =>
                    setFilter({
                      ...filter,
                      [row.key]: event.target.value ? Number(event.target.value) : null,
                    })
                  }
                  className="w-24"
                  aria-label={`Show the findings of one position of ${row.label}`}
                />
                {selected !== null ? (
                  <button
                    type="button"
                    className="text-ember-800 hover:underline"
                    onClick={() => setFilter({ ...filter, [row.key]: null })}
                  >
                    All positions
                  </button>
                ) : null}
              </label>
            </div>
            <div className="flex flex-col gap-3">
              <h3 id={`row-${row.key}`} className="font-semibold">
                {row.label}{' '}
                <span className="text-sm font-normal text-soot-600">
                  {rowCoverage
                    ? `· ${rowCoverage.recorded ? coverageStatusLabels[rowCoverage.status] : 'Coverage not recorded'}`
                    : ''}
                  {rowCoverage?.status === 'partial'
                    ? ` (${formatPositions(rowCoverage.viewedPositions)})`
                    : ''}
                  {rowCoverage?.noDamageFound ? ' · no damage found' : ''}
                  {rowCoverage?.reason ? ` · ${rowCoverage.reason}` : ''}
                </span>
              </h3>
              {shown.length > 0 ? (
                <ul className="flex flex-col gap-2">
                  {shown.map((finding) => (
                    <FindingItem
                      key={finding.id}
                      finding={finding}
                      rows={rows}
                      editable={editable}
                      inspectionId={inspectionId}
                      onOpen={onOpen}
                      trend={trend}
                      rulesReadable={rulesReadable}
                    />
                  ))}
                </ul>
              ) : (
                <p className="text-sm text-soot-600">
                  {selected !== null
                    ? `No findings at position ${selected}.`
                    : 'No findings on this row.'}
                </p>
              )}
              {editable && rowCoverage ? (
                <CoverageForm
                  key={rowCoverage.updatedAt ?? 'new'}
                  inspectionId={inspectionId}
                  row={row}
                  coverage={rowCoverage}
                />
              ) : null}
            </div>
          </section>
        );
      })}
    </div>
  );
}
