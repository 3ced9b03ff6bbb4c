import { formatDate, formatKey } from '../../../lib/format';
import { Link } from 'react-router-dom';
import type { LimitSetImpact } from '@emberline/contracts/limit-sets';
import { categories, type Interval } from '@emberline/contracts/limits';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import { Notice } from '../../../components/ui/notice';
import { VerdictBadge } from '../../../components/ui/verdict-badge';
import { formatInterval } from '../lib/rule-form';

function Verdict({
  category,
  interval,
}: {
  category: LimitSetImpact['changes'][number]['after']['category'];
  interval: Interval | null;
}) {
  if (!category) return <span className="text-soot-600">not judged</span>;
  return (
    <span className="flex flex-col gap-0.5">
      <VerdictBadge category={category} />
      {category === 'repeat-inspection' ? (
        <span className="text-xs">{formatInterval(interval)}</span>
      ) : null}
    </span>
  );
}

/**
 * What publishing the draft would change: verdict counts before and after over the current
 * findings, each finding whose verdict or interval changes (the relaxed ones first: those are
 * where a transcription error would make damage look acceptable), and the engines affected.
 */
export function ImpactPanel({
  impact,
  rowLabel,
  ruleTitle,
}: {
  impact: LimitSetImpact;
  rowLabel: (key: string) => string;
  ruleTitle: (id: string) => string;
}) {
  const ruleWords = (id: string | null) => (id ? ruleTitle(id) : 'no rule');
  const relaxed = impact.changes.filter((change) => change.relaxed).length;
  return (
    <div className="flex flex-col gap-4 text-sm" data-testid="impact-preview">
      <p>
        {impact.findings.toLocaleString('en-GB')} current findings on{' '}
        {impact.inspections.toLocaleString('en-GB')} inspections (those not yet released, and each
        engine’s latest released one) judged against this draft:{' '}
        <strong>
          {impact.changedCount} change{impact.changedCount === 1 ? '' : 's'}
        </strong>
        {impact.engines.length > 0
          ? ` on ${impact.engines.length} engine${impact.engines.length === 1 ? '' : 's'}`
          : ''}
        .
      </p>
      <table className="w-fit text-left text-sm">
        <caption className="sr-only">Verdicts before and after</caption>
        <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
          <tr>
            <th scope="col" className="py-1 pr-6">
              Verdict
            </th>
            <th scope="col" className="py-1 pr-6">
              Now
            </th>
            <th scope="col" className="py-1">
              With this draft
            </th>
          </tr>
        </thead>
        <tbody>
          {categories.map((category) => (
            <tr key={category} className="border-b border-soot-100">
              <td className="py-1 pr-6">{verdictStyles[category].label}</td>
              <td className="py-1 pr-6 font-mono">{impact.before[category] ?? 0}</td>
              <td className="py-1 font-mono" data-testid={`impact-after-${category}`}>
                {impact.after[category] ?? 0}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {relaxed > 0 ? (
        <Notice
          tone="caution"
          title={`${relaxed} finding${relaxed === 1 ? '' : 's'} judged less severely`}
        >
          Check these against the manual before publishing: a transcription error here would make
          damaged engines look serviceable.
        </Notice>
      ) : null}
      {impact.changes.length > 0 ? (
        <div className="overflow-x-auto">
          <table className="w-full min-w-[800px] text-left text-sm" data-testid="impact-changes">
            <caption className="sr-only">Findings whose verdict changes</caption>
            <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
              <tr>
                {['Engine', 'Inspection', 'Finding', 'Now', 'With this draft', 'Rule'].map(
                  (heading) => (
                    <th key={heading} scope="col" className="py-2 pr-3">
                      {heading}
                    </th>
                  ),
                )}
              </tr>
            </thead>
            <tbody>
              {impact.changes.map((change) => (
                <tr
                  key={`${change.inspectionId}-${change.number}`}
                  className={`border-b border-soot-100 align-top ${change.relaxed ? 'bg-amber-50' : ''}`}
                >
                  <td className="py-2 pr-3 font-medium">{change.engineSerial}</td>
                  <td className="py-2 pr-3">
                    <Link
                      to={`/inspections/${change.inspectionId}`}
                      className="text-ember-800 hover:underline"
                    >
                      {formatDate(change.inspectionDate)}
                    </Link>
                    <div className="text-xs text-soot-600">
                      {change.released ? 'released' : 'open'}
                    </div>
                  </td>
                  <td className="py-2 pr-3">
                    F{change.number} · {rowLabel(change.row)} position {change.position}
                    <div className="text-xs text-soot-600">
                      {formatKey(change.zone)}, {formatKey(change.damage)}
                    </div>
                  </td>
                  <td className="py-2 pr-3">
                    <Verdict
                      category={change.before.category}
                      interval={change.before.repeatInterval}
                    />
                    {change.before.revision ? (
                      <span className="text-xs text-soot-600">rev. {change.before.revision}</span>
                    ) : null}
                  </td>
                  <td className="py-2 pr-3">
                    <Verdict
                      category={change.after.category}
                      interval={change.after.repeatInterval}
                    />
                    {change.relaxed ? (
                      <span className="text-xs font-medium text-amber-900">less severe</span>
                    ) : null}
                  </td>
                  <td className="py-2 pr-3 text-xs">
                    {change.before.ruleId === change.after.ruleId
                      ? ruleWords(change.after.ruleId)
                      : `${ruleWords(change.before.ruleId)} → ${ruleWords(change.after.ruleId)}`}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          {impact.changedCount > impact.changes.length ? (
            <p className="mt-2 text-xs text-soot-600">
              The first {impact.changes.length} of {impact.changedCount} changes are listed.
            </p>
          ) : null}
        </div>
      ) : (
        <p>No finding would change verdict or interval.</p>
      )}
      {impact.engines.length > 0 ? (
        <div>
          <h4 className="mb-1 font-medium">Engines affected</h4>
          <ul className="flex flex-col gap-1" data-testid="impact-engines">
            {impact.engines.map((engine) => (
              <li key={engine.engineId} className="flex flex-wrap items-center gap-2">
                <Link to={`/fleet/${engine.engineId}`} className="text-ember-800 hover:underline">
                  {engine.engineSerial}
                </Link>
                <span className="text-soot-600">
                  {engine.changedFindings} finding{engine.changedFindings === 1 ? '' : 's'}:
                </span>
                {engine.before ? <VerdictBadge category={engine.before} /> : null} →{' '}
                {engine.after ? <VerdictBadge category={engine.after} /> : null}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
