import type { EngineDetail } from '@emberline/contracts/fleet';
import { formatCount, formatDate, formatHours, formatRate } from '../../../lib/format';
import { StatusBadge } from './status-badge';

export function EngineParticulars({ engine }: { engine: EngineDetail }) {
  const items: [string, React.ReactNode][] = [
    ['Model', engine.modelName],
    ['Owner', engine.organisationName],
    ['Status', <StatusBadge key="status" status={engine.status} />],
    ['Aircraft', engine.registration ?? 'Not installed'],
    ['Position', engine.installedPosition ?? '—'],
    ['TSN', `${formatHours(engine.tsn)} h`],
    ['CSN', formatCount(engine.csn)],
    ['TSN and CSN as of', formatDate(engine.tsnCsnAsOf)],
    ['Cycles per day', formatRate(engine.utilization.cyclesPerDay, 'cycles/day')],
    ['Hours per day', formatRate(engine.utilization.hoursPerDay, 'h/day')],
  ];
  // What the standard interval runs from when no inspection has viewed a row fully.
  const baselines: [string, { date: string; csn: number; tsn: number } | null][] = [
    ['Last shop release', engine.shopRelease],
    ['Last inspection before the fleet', engine.preFleetInspection],
  ];
  for (const [label, baseline] of baselines)
    if (baseline)
      items.push([
        label,
        `${formatDate(baseline.date)} · CSN ${formatCount(baseline.csn)} · TSN ${formatHours(baseline.tsn)} h`,
      ]);
  return (
    <>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-3 text-sm sm:grid-cols-3 lg:grid-cols-5">
        {items.map(([label, value]) => (
          <div key={label}>
            <dt className="text-xs uppercase tracking-wide text-soot-600">{label}</dt>
            <dd className="mt-0.5 font-medium text-soot-900">{value}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-3 text-xs text-soot-600">
        Daily utilization averages the records{' '}
        {engine.utilization.windowStart
          ? `from ${formatDate(engine.utilization.windowStart)} to ${formatDate(engine.utilization.windowEnd)}`
          : 'of the last 90 days'}{' '}
        ({engine.utilization.coveredDays} days covered).
      </p>
    </>
  );
}
