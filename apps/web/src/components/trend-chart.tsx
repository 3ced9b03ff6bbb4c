import type { LimitUnit } from '@emberline/contracts/limits';
import { trend } from '@emberline/domain/trend';
import { MM2_PER_SQUARE_INCH, MM_PER_INCH } from '@emberline/domain/units';
import {
  CartesianGrid,
  ComposedChart,
  Line,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';

export interface TrendPoint {
  csn: number;
  /** The measured value in mm or mm². */
  value: number;
  label: string;
}

export interface TrendLimits {
  unit: LimitUnit;
  serviceableMax: number | null;
  repeatMax: number | null;
}

/** A limit written in inches, in the mm the measurements are in. */
const inMillimetres = (value: number | null, unit: LimitUnit) =>
  value === null
    ? null
    : unit === 'in'
      ? value * MM_PER_INCH
      : unit === 'in2'
        ? value * MM2_PER_SQUARE_INCH
        : value;

const fixed = (value: number, digits = 2) =>
  value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });

/**
 * The damage trend of one series (DESIGN §5.4): the measured value against CSN, the serviceable
 * and repeat limits as lines, the least-squares fit and its projection to the outer limit, with
 * the cycles remaining and r². Three points or more; a straight line, so a projection only.
 */
export default function TrendChart({
  points,
  limits,
  measure,
}: {
  points: TrendPoint[];
  limits: TrendLimits | null;
  measure: 'length' | 'area';
}) {
  const unit = measure === 'area' ? 'mm²' : 'mm';
  const serviceable = limits ? inMillimetres(limits.serviceableMax, limits.unit) : null;
  const repeat = limits ? inMillimetres(limits.repeatMax, limits.unit) : null;
  const outer = repeat ?? serviceable;
  const fit = outer !== null && points.length >= 2 ? trend({ points, limit: outer }) : null;
  const lastCsn = Math.max(...points.map((point) => point.csn));
  const firstCsn = Math.min(...points.map((point) => point.csn));
  const endCsn =
    fit?.projectedCsnAtLimit && fit.projectedCsnAtLimit > lastCsn
      ? Math.min(fit.projectedCsnAtLimit, lastCsn + (lastCsn - firstCsn) * 4 + 500)
      : lastCsn;
  const line = fit
    ? [firstCsn, endCsn].map((csn) => ({ csn, fit: fit.intercept + fit.slopePerCycle * csn }))
    : [];
  const summary = fit
    ? fit.slopePerCycle <= 0
      ? 'Not growing: the fitted line does not rise.'
      : `Projected to reach the ${repeat !== null ? 'repeat' : 'serviceable'} limit of ${fixed(outer!)} ${unit} at about CSN ${Math.round(fit.projectedCsnAtLimit!).toLocaleString('en-GB')}: ${
          fit.cyclesRemaining! > 0
            ? `${Math.round(fit.cyclesRemaining!).toLocaleString('en-GB')} cycles after the last inspection`
            : `already passed, ${Math.round(-fit.cyclesRemaining!).toLocaleString('en-GB')} cycles before the last inspection`
        }${fit.r2 !== null ? `; r² ${fixed(fit.r2)}` : ''}.`
    : 'No limit to project to.';

  return (
    <figure className="flex flex-col gap-2" data-testid="trend-chart">
      <div className="h-56 w-full" aria-hidden="true">
        <ResponsiveContainer width="100%" height="100%">
          {/* The figures below the chart say what it shows; the drawing takes no focus. */}
          <ComposedChart
            margin={{ top: 8, right: 16, bottom: 8, left: 8 }}
            accessibilityLayer={false}
          >
            <CartesianGrid stroke="#e7e5e4" />
            <XAxis
              dataKey="csn"
              type="number"
              domain={['dataMin', 'dataMax']}
              tickFormatter={(value: number) => Math.round(value).toLocaleString('en-GB')}
              name="CSN"
            />
            <YAxis
              type="number"
              domain={[0, (max: number) => Math.max(max, (outer ?? max) * 1.1)]}
              tickFormatter={(value: number) => fixed(value)}
              name={unit}
            />
            <Tooltip />
            {serviceable !== null ? (
              <ReferenceLine
                y={serviceable}
                stroke="#3f6b35"
                strokeDasharray="6 3"
                label="serviceable"
              />
            ) : null}
            {repeat !== null ? (
              <ReferenceLine y={repeat} stroke="#b45309" strokeDasharray="2 2" label="repeat" />
            ) : null}
            <Line
              data={line}
              dataKey="fit"
              stroke="#9a3412"
              dot={false}
              isAnimationActive={false}
            />
            <Scatter data={points} dataKey="value" fill="#1c1917" isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-sm">
        <span className="block">
          {points
            .map(
              (point) =>
                `${point.label}: ${fixed(point.value)} ${unit} at CSN ${point.csn.toLocaleString('en-GB')}`,
            )
            .join(' · ')}
        </span>
        <span className="block font-medium">{summary}</span>
        <span className="block text-xs text-soot-600">
          The projection is a straight line through past measurements, not a prediction; the
          approved manual and the engineer decide.
        </span>
      </figcaption>
    </figure>
  );
}
