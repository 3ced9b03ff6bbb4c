import type { Finding } from '@emberline/contracts/findings';
import { LazyTrendChart } from '../../../components/lazy-trend-chart';
import { formatDate } from '../../../lib/format';
import { useDamageSeries, useFinding } from '../api/review';
import { useJudgedAgainst } from '../../../lib/limit-set-query';

/**
 * The trend of the damage series a finding belongs to, once it has three measurements at
 * different CSN: against the limits of the rule that judged the finding.
 */
export function FindingTrend({ finding }: { finding: Finding }) {
  const series = useDamageSeries(finding.id);
  const limitSet = useJudgedAgainst(finding.limitSetId);
  const measure = finding.lengthMm === null && finding.areaMm2 !== null ? 'area' : 'length';
  const points = (series.data ?? []).flatMap((entry) => {
    const value = measure === 'area' ? entry.areaMm2 : entry.lengthMm;
    return value === null
      ? []
      : [
          {
            csn: entry.csn,
            value,
            label: `F${entry.number} of ${formatDate(entry.inspectionDate)}`,
          },
        ];
  });
  if (series.isPending || new Set(points.map((point) => point.csn)).size < 3) return null;
  const rule = limitSet.data?.rules.find((item) => item.id === finding.evaluation?.ruleId) ?? null;
  return (
    <section aria-label={`Damage trend of F${finding.number}`} className="flex flex-col gap-1">
      <h4 className="font-medium">Damage trend ({points.length} inspections)</h4>
      <LazyTrendChart
        points={points}
        measure={measure}
        limits={
          rule
            ? { unit: rule.unit, serviceableMax: rule.serviceableMax, repeatMax: rule.repeatMax }
            : null
        }
      />
    </section>
  );
}

/** The trend of the damage series of a finding known by its id (an engine's open requirement). */
export function FindingTrendOf({ findingId }: { findingId: string }) {
  const finding = useFinding(findingId);
  return finding.data ? <FindingTrend finding={finding.data} /> : null;
}
