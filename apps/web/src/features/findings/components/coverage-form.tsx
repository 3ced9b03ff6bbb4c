import { useState } from 'react';
import {
  coverageStatusLabels,
  type CoverageStatus,
  type RowCoverage,
} from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { Button } from '../../../components/ui/button';
import { Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useRecordCoverage } from '../api/findings';
import { formatPositions, parsePositions } from '../lib/live';

/** How much of a row was viewed, and "no damage found" where that is the result. */
export function CoverageForm({
  inspectionId,
  row,
  coverage,
}: {
  inspectionId: string;
  row: EngineModelRow;
  coverage: RowCoverage;
}) {
  const save = useRecordCoverage(inspectionId);
  // Nothing is chosen until the inspector chooses: a choice shown is one made.
  const [status, setStatus] = useState<CoverageStatus | null>(
    coverage.recorded ? coverage.status : null,
  );
  const [positions, setPositions] = useState(formatPositions(coverage.viewedPositions));
  const [noDamage, setNoDamage] = useState(coverage.noDamageFound);
  const [reason, setReason] = useState(coverage.reason);
  const parsed = status === 'partial' ? parsePositions(positions, row.count) : null;
  const unsaved = coverage.recorded
    ? status !== coverage.status ||
      positions !== formatPositions(coverage.viewedPositions) ||
      noDamage !== coverage.noDamageFound ||
      reason !== coverage.reason
    : status !== null;
  return (
    <form
      className="flex flex-col gap-2 text-sm"
      aria-label={`Coverage of ${row.label}`}
      onSubmit={(event) => {
        event.preventDefault();
        if (parsed?.error || status === null) return;
        save.mutate({
          row: row.key,
          input: { status, viewedPositions: parsed?.value ?? [], noDamageFound: noDamage, reason },
        });
      }}
    >
      <fieldset className="flex flex-wrap gap-3">
        <legend className="mb-1 font-medium">Viewed</legend>
        {(['full', 'partial', 'none'] as const).map((option) => (
          <label key={option} className="flex items-center gap-1">
            <input
              type="radio"
              name={`coverage-${row.key}`}
              checked={status === option}
              onChange={() => setStatus(option)}
            />
            {coverageStatusLabels[option]}
          </label>
        ))}
      </fieldset>
      {status === 'partial' ? (
        <label className="flex flex-col gap-1">
          Positions viewed (such as 1-20, 25)
          <Input
            value={positions}
            onChange={(event) => setPositions(event.target.value)}
            aria-invalid={Boolean(parsed?.error)}
          />
          {parsed?.error ? <span className="text-red-700">{parsed.error}</span> : null}
        </label>
      ) : null}
      {status !== 'full' && status !== null ? (
        <label className="flex flex-col gap-1">
          Why it was not fully viewed
          <Input
            value={reason}
            onChange={(event) => setReason(event.target.value)}
            placeholder="Port blocked, rotor could not be turned, …"
          />
        </label>
      ) : null}
      {status !== 'none' && status !== null ? (
        <label className="flex items-center gap-2">
          <input
            type="checkbox"
            checked={noDamage}
            onChange={(event) => setNoDamage(event.target.checked)}
          />
          No damage found on this row
        </label>
      ) : null}
      {save.error ? <Notice tone="error">{save.error.message}</Notice> : null}
      <div className="flex flex-wrap items-center gap-3">
        <Button
          type="submit"
          variant="secondary"
          busy={save.isPending}
          disabled={status === null}
          className="w-fit"
        >
          Save coverage of {row.label}
        </Button>
        {unsaved && !save.isPending ? (
          <span className="font-medium text-amber-900" data-testid={`coverage-unsaved-${row.key}`}>
            Not saved: the coverage of this row is recorded when you save it.
          </span>
        ) : null}
      </div>
    </form>
  );
}

/** Corrects what was entered about a recorded finding; its drawing and scale stay as recorded. */
