import type { Finding } from '@emberline/contracts/findings';
import type { Rule } from '@emberline/contracts/limits';
import type { Disposition } from '@emberline/contracts/review';
import { decisionWords } from '@emberline/domain/decision-words';
import { comparisonWords, ruleName } from '@emberline/domain/verdict-words';
import { unitSymbols } from '@emberline/domain/units';
import { Link } from 'react-router-dom';
import { VerdictBadge } from '../../../components/ui/verdict-badge';
import {
  formatArea,
  formatDate,
  formatDateTime,
  formatKey,
  formatLength,
} from '../../../lib/format';
import { reasonLabels } from '../../../lib/reason-labels';
import { useDamageSeries } from '../api/review';
import { useJudgedAgainst } from '../../../lib/limit-set-query';
import { FindingTrend } from './finding-trend';

/** The figures of a finding as measured, in mm and in. */
function measurementLines(finding: Finding): string[] {
  const lines: string[] = [];
  if (finding.lengthMm !== null)
    lines.push(`Length ${formatLength(finding.lengthMm, finding.uncertaintyMm)}`);
  if (finding.areaMm2 !== null)
    lines.push(`Area ${formatArea(finding.areaMm2, finding.uncertaintyMm2)}`);
  if (finding.widthMm !== null) lines.push(`Width ${formatLength(finding.widthMm, null)}`);
  if (finding.depthMm !== null) lines.push(`Depth ${formatLength(finding.depthMm, null)}`);
  if (finding.count !== null) lines.push(`Count ${finding.count}`);
  if (lines.length === 0) lines.push('Nothing measured');
  return lines;
}

function ruleLimits(rule: Rule): string {
  if (rule.notPermitted) return 'not permitted: any such damage is beyond limits';
  const unit = unitSymbols[rule.unit];
  const value = (limit: number | null) => (limit === null ? 'none' : `${limit} ${unit}`.trim());
  return `serviceable to ${value(rule.serviceableMax)}, repeat inspection to ${value(rule.repeatMax)}`;
}

/**
 * What the engineer judges a finding by: its place and figures (mm and in), the verdict with the
 * rule, the limit values compared and the reasons, the earlier findings of its damage series, and
 * its dispositions so far.
 */
export function FindingReview({
  finding,
  rowLabel,
  dispositions,
}: {
  finding: Finding;
  rowLabel: string;
  dispositions: Disposition[];
}) {
  const evaluation = finding.evaluation;
  const limitSet = useJudgedAgainst(finding.limitSetId);
  const series = useDamageSeries(finding.id);
  const rule = limitSet.data?.rules.find((item) => item.id === evaluation?.ruleId) ?? null;
  const judgement = evaluation?.judgements.find((item) => item.ruleId === evaluation.ruleId);
  const earlier = (series.data ?? []).filter((entry) => entry.findingId !== finding.id);

  return (
    <div className="flex flex-col gap-3 text-sm" data-testid="finding-review">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="text-base font-semibold">
          F{finding.number} · {rowLabel} {finding.position}, {formatKey(finding.zone)},{' '}
          {formatKey(finding.damage)}
        </h3>
        {evaluation ? <VerdictBadge category={evaluation.category} /> : null}
      </div>
      <ul className="font-mono text-xs" aria-label="Measurement">
        {measurementLines(finding).map((line) => (
          <li key={line}>{line}</li>
        ))}
        <li className="font-sans text-soot-600">
          {finding.method === 'probe' ? 'Measured with the probe' : 'Measured on the image'} by{' '}
          {finding.createdByName}
          {finding.notes ? ` · “${finding.notes}”` : ''}
        </li>
      </ul>
      {evaluation ? (
        <div className="rounded border border-soot-200 bg-soot-50 p-3" data-testid="verdict-basis">
          <p>
            {rule ? (
              <>
                {ruleName(rule)}{' '}
                <span className="font-mono text-xs text-soot-600" data-shows-ids>
                  {rule.id}
                </span>
                {rule.reference ? ` (${rule.reference})` : ''}: {ruleLimits(rule)}.
              </>
            ) : evaluation.ruleId ? (
              'The rule it was judged by is loading.'
            ) : (
              'No rule of the limit revision covers it.'
            )}
          </p>
          {rule && judgement && judgement.value !== null && limitSet.data ? (
            <p>Compared: {comparisonWords(judgement, rule, limitSet.data.revision)}.</p>
          ) : null}
          <p>Reasons: {evaluation.reasons.map((reason) => reasonLabels[reason]).join('; ')}.</p>
          {evaluation.indeterminate ? (
            <p>
              Indeterminate: the uncertainty spans a limit, so the worse category is taken; a
              re-measurement or a better view could settle it.
            </p>
          ) : null}
          <p className="text-xs text-soot-600">
            Judged against{' '}
            {limitSet.data
              ? `${limitSet.data.title}, revision ${limitSet.data.revision}${limitSet.data.invented ? ' (invented for the demo)' : ''}`
              : finding.limitSetRevision
                ? `revision ${finding.limitSetRevision}`
                : 'no limit revision'}
            .
          </p>
        </div>
      ) : null}
      <div>
        <h4 className="font-medium">Earlier findings of this damage</h4>
        {earlier.length === 0 ? (
          <p className="text-soot-600">
            {series.isPending ? 'Loading…' : 'None: this is the first finding of its series.'}
          </p>
        ) : (
          <ul className="list-inside list-disc" data-testid="damage-series">
            {earlier.map((entry) => (
              <li key={entry.findingId}>
                <Link
                  to={`/inspections/${entry.inspectionId}`}
                  className="text-ember-800 hover:underline"
                >
                  F{entry.number} of {formatDate(entry.inspectionDate)}
                </Link>{' '}
                at CSN {entry.csn.toLocaleString('en-GB')}:{' '}
                {entry.lengthMm !== null ? formatLength(entry.lengthMm, entry.uncertaintyMm) : ''}
                {entry.areaMm2 !== null ? formatArea(entry.areaMm2, entry.uncertaintyMm2) : ''}
              </li>
            ))}
          </ul>
        )}
      </div>
      <FindingTrend finding={finding} />
      {dispositions.length > 0 ? (
        <div>
          <h4 className="font-medium">Dispositions</h4>
          <ol className="flex flex-col gap-1" data-testid="finding-dispositions">
            {dispositions.map((item) => (
              <li
                key={item.id}
                className={item.current ? '' : 'text-soot-600 line-through decoration-soot-400'}
              >
                <span className="no-underline">
                  {item.current
                    ? 'Current'
                    : item.state === 'withdrawn'
                      ? 'Withdrawn'
                      : 'Superseded'}
                  : {decisionWords(item.decision)}
                  {item.concession ? ` — concession ${item.concessionRef}` : ''}. “{item.rationale}”
                  {item.supersedeReason ? ` Corrected because: ${item.supersedeReason}.` : ''}{' '}
                  Signed by {item.signature.signerName} ({item.signature.authorisationRef}),{' '}
                  {formatDateTime(item.signature.signedAt)}.
                </span>
              </li>
            ))}
          </ol>
        </div>
      ) : null}
    </div>
  );
}
