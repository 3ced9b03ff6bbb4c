import type { FindingEvaluation } from '@emberline/contracts/limits';
import type { LimitSet } from '@emberline/contracts/limit-sets';
import { comparisonWords, ruleName } from '@emberline/domain/verdict-words';
import { reasonLabels } from '../lib/reason-labels';

/**
 * What a verdict was compared with, in words: the value and its uncertainty, the limit, the
 * revision and the rule's title (its id small beside it), then the reasons.
 */
export function VerdictBasis({
  evaluation,
  limitSet,
}: {
  evaluation: FindingEvaluation;
  limitSet: Pick<LimitSet, 'revision' | 'rules'> | null | undefined;
}) {
  const rule = limitSet?.rules.find((item) => item.id === evaluation.ruleId);
  const judgement = evaluation.judgements.find((item) => item.ruleId === evaluation.ruleId);
  const reasons = evaluation.reasons.map((reason) => reasonLabels[reason]).join('; ');
  return (
    <span data-testid="verdict-basis-line">
      {!evaluation.ruleId ? (
        'No rule of the limit revision covers it'
      ) : rule && judgement && limitSet ? (
        <>
          {comparisonWords(judgement, rule, limitSet.revision)}{' '}
          <span className="font-mono text-[0.7rem] text-soot-600" data-shows-ids>
            {rule.id}
          </span>
        </>
      ) : rule ? (
        ruleName(rule)
      ) : (
        'the rule it was judged by'
      )}
      {reasons ? ` · ${reasons}` : ''}
    </span>
  );
}
