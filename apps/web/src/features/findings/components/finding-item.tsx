import { useState, type ReactNode } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { findingQueryOptions } from '../../../lib/finding-query';
import type { Finding } from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { Button } from '../../../components/ui/button';
import { Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useVoidFinding } from '../api/findings';
import { formatKey } from '../../../lib/format';
import { VerdictBadge } from '../../../components/ui/verdict-badge';
import { VerdictBasis } from '../../../components/verdict-basis';
import { useJudgedAgainst } from '../../../lib/limit-set-query';
import { FindingEditForm } from './finding-edit-form';

/** One finding in the list: its verdict and reasons, and correct or void while a draft. */
export function FindingItem({
  finding,
  rows,
  editable,
  inspectionId,
  onOpen,
  trend,
  rulesReadable,
}: {
  finding: Finding;
  rows: EngineModelRow[];
  editable: boolean;
  inspectionId: string;
  onOpen: (finding: Finding) => void;
  /** The damage trend of a finding that continues earlier ones, drawn by the caller. */
  trend?: ((finding: Finding) => ReactNode) | undefined;
  /** Whether the rules may be read, to state what the verdict was compared with. */
  rulesReadable: boolean;
}) {
  const voiding = useVoidFinding(inspectionId);
  const [reason, setReason] = useState('');
  const [asking, setAsking] = useState(false);
  const [correcting, setCorrecting] = useState(false);
  const evaluation = finding.evaluation;
  const judgedAgainst = useJudgedAgainst(evaluation && rulesReadable ? finding.limitSetId : null);
  return (
    <li
      className={`flex flex-col gap-1 rounded border border-soot-200 p-2 text-sm ${finding.status === 'void' ? 'opacity-60' : ''}`}
      data-testid="finding-item"
    >
      <div className="flex flex-wrap items-center gap-2">
        <button
          type="button"
          className="font-semibold text-ember-800 hover:underline"
          onClick={() => onOpen(finding)}
        >
          F{finding.number}
        </button>
        <span>
          position {finding.position}, {formatKey(finding.zone)}, {formatKey(finding.damage)}
        </span>
        {finding.status === 'void' ? (
          <span className="font-medium">Void: {finding.voidReason}</span>
        ) : evaluation ? (
          <VerdictBadge category={evaluation.category} />
        ) : null}
      </div>
      <p className="font-mono text-xs" data-testid="finding-figures">
        {finding.lengthMm !== null
          ? `${finding.lengthMm.toFixed(3)} mm ± ${finding.uncertaintyMm?.toFixed(3)}`
          : ''}
        {finding.areaMm2 !== null
          ? `${finding.areaMm2.toFixed(2)} mm² ± ${finding.uncertaintyMm2?.toFixed(2)}`
          : ''}
        {finding.depthMm !== null ? ` depth ${finding.depthMm} mm` : ''}
        {finding.count !== null ? ` count ${finding.count}` : ''}
        {finding.method === 'probe' ? ' (probe)' : ''}
      </p>
      {evaluation && finding.status === 'recorded' ? (
        <p className="text-xs text-soot-700">
          <VerdictBasis evaluation={evaluation} limitSet={judgedAgainst.data} />
          {evaluation.indeterminate
            ? ' · indeterminate: a re-measurement or a better view could settle it'
            : ''}
        </p>
      ) : null}
      {finding.previousFindingId ? <EarlierFinding findingId={finding.previousFindingId} /> : null}
      {finding.previousFindingId && finding.status === 'recorded' && trend ? (
        <details className="text-xs">
          <summary className="cursor-pointer text-ember-800">Show the damage trend</summary>
          {trend(finding)}
        </details>
      ) : null}
      {editable && finding.status === 'recorded' && correcting ? (
        <FindingEditForm finding={finding} rows={rows} onDone={() => setCorrecting(false)} />
      ) : null}
      {editable && finding.status === 'recorded' && !correcting ? (
        asking ? (
          <form
            className="flex flex-wrap items-end gap-2"
            onSubmit={(event) => {
              event.preventDefault();
              voiding.mutate({ id: finding.id, reason });
            }}
          >
            <label className="flex flex-col gap-1 text-xs">
              Why is F{finding.number} void?
              <Input value={reason} onChange={(event) => setReason(event.target.value)} />
            </label>
            <Button type="submit" variant="danger" busy={voiding.isPending}>
              Void F{finding.number}
            </Button>
            {voiding.error ? <Notice tone="error">{voiding.error.message}</Notice> : null}
          </form>
        ) : (
          <div className="flex gap-4 text-xs">
            <button
              type="button"
              className="text-ember-800 hover:underline"
              onClick={() => setCorrecting(true)}
            >
              Correct F{finding.number}…
            </button>
            <button
              type="button"
              className="text-red-800 hover:underline"
              onClick={() => setAsking(true)}
            >
              Void (recorded by mistake)…
            </button>
          </div>
        )
      ) : null}
    </li>
  );
}

/** Per row: the stage ring (click a position to filter), the findings, and the row's coverage. */

/** "Continues an earlier finding", as a link to it (its inspection, on its number). */
function EarlierFinding({ findingId }: { findingId: string }) {
  const earlier = useQuery(findingQueryOptions(findingId));
  return (
    <p className="text-xs text-soot-700">
      Continues{' '}
      {earlier.data ? (
        <Link
          to={`/inspections/${earlier.data.inspectionId}?finding=${earlier.data.id}`}
          className="text-ember-800 underline"
        >
          an earlier finding (F{earlier.data.number})
        </Link>
      ) : (
        'an earlier finding'
      )}
      .
    </p>
  );
}
