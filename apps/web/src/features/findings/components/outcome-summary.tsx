import { cautions } from '@emberline/contracts/cautions';
import type { InspectionOutcome } from '@emberline/contracts/findings';
import { categories } from '@emberline/contracts/limits';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import { Notice } from '../../../components/ui/notice';
import { VerdictBadge } from '../../../components/ui/verdict-badge';

function describeInterval(interval: InspectionOutcome['repeatInterval']): string {
  if (!interval) return '';
  return [
    interval.cycles !== null ? `${interval.cycles} cycles` : null,
    interval.hours !== null ? `${interval.hours} hours` : null,
    interval.days !== null ? `${interval.days} days` : null,
  ]
    .filter(Boolean)
    .join(' or ');
}

const actionWords = {
  'remove-before-next-flight': 'remove before the next flight',
  'remove-within': 'remove within',
  'remove-at-next-shop-visit': 'remove at the next shop visit',
} as const;

/** The inspection outcome as it stands: verdict, counts, interval, removals and gaps. */
export function OutcomeSummary({
  outcome,
  rowLabel,
}: {
  outcome: InspectionOutcome;
  rowLabel: (key: string) => string;
}) {
  return (
    <div className="flex flex-col gap-2 text-sm" data-testid="inspection-outcome">
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-medium">Outcome so far:</span>
        <VerdictBadge category={outcome.category} />
        <span className="text-soot-700">
          {categories
            .filter((category) => outcome.counts[category])
            .map(
              (category) =>
                `${outcome.counts[category]} ${verdictStyles[category].label.toLowerCase()}`,
            )
            .join(' · ') || 'no findings'}
        </span>
      </div>
      {outcome.repeatInterval ? (
        <p>
          Repeat inspection within {describeInterval(outcome.repeatInterval)} (the earliest limit
          governs).
        </p>
      ) : null}
      {outcome.beyondActions.map((action) => (
        <p
          key={`${action.kind}-${action.cycles}-${action.hours}`}
          className="font-medium text-red-900"
        >
          Beyond limits: {actionWords[action.kind]}
          {action.kind === 'remove-within'
            ? ` ${describeInterval({ cycles: action.cycles, hours: action.hours, days: null })}`
            : ''}
        </p>
      ))}
      {outcome.coverageGaps.length > 0 ? (
        <Notice tone="caution">
          Not fully viewed, with no reason given: {outcome.coverageGaps.map(rowLabel).join(', ')}.{' '}
          {outcome.category === 'beyond-limits'
            ? 'Each of them is still to be viewed or explained.'
            : 'The outcome stays at review until each of them is viewed or explained.'}
        </Notice>
      ) : null}
      <p className="text-xs text-soot-600">
        {outcome.limitSet
          ? `Limits: ${outcome.limitSet.title}, revision ${outcome.limitSet.revision}${outcome.limitSet.invented ? ' — invented for the demo' : ''}. `
          : 'No limit-set revision in force. '}
        {cautions.limits}
      </p>
    </div>
  );
}
