import { unitSymbols } from '@emberline/domain/units';
import { ruleName } from '@emberline/domain/verdict-words';
import { formatKey } from '../../../lib/format';
import type { Rule } from '@emberline/contracts/limits';
import { formatBeyondAction, formatInterval, formatLimit } from '../lib/rule-form';

function countLimits(rule: Rule): string {
  return (
    [
      rule.maxPerAirfoil !== null ? `≤ ${rule.maxPerAirfoil} per airfoil` : null,
      rule.maxTotalPerAirfoil !== null
        ? `total ≤ ${formatLimit(rule.maxTotalPerAirfoil, rule.unit)} per airfoil`
        : null,
      rule.maxAirfoilsPerRow !== null ? `≤ ${rule.maxAirfoilsPerRow} airfoils in the row` : null,
      rule.maxAdjacentAirfoils !== null ? `≤ ${rule.maxAdjacentAirfoils} adjacent` : null,
    ]
      .filter(Boolean)
      .join('; ') || '—'
  );
}

/** A revision's rules, one a line, as the engineer checks them against the manual. */
export function RulesTable({
  rules,
  rowLabels,
  onEdit,
  onRemove,
}: {
  rules: Rule[];
  rowLabels: Map<string, string>;
  onEdit?: (rule: Rule) => void;
  onRemove?: (rule: Rule) => void;
}) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[1000px] text-left text-sm" data-testid="rules-table">
        <caption className="sr-only">Rules of the revision</caption>
        <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
          <tr>
            {[
              'Rule',
              'Row and zones',
              'Damage',
              'Serviceable up to',
              'Repeat up to',
              'Repeat within',
              'Beyond',
              'Counts',
              'Manual reference',
            ].map((heading) => (
              <th key={heading} scope="col" className="py-2 pr-3">
                {heading}
              </th>
            ))}
            {onEdit ? (
              <th scope="col" className="py-2">
                <span className="sr-only">Change</span>
              </th>
            ) : null}
          </tr>
        </thead>
        <tbody>
          {rules.map((rule) => (
            <tr
              key={rule.id}
              className="border-b border-soot-100 align-top"
              data-testid={`rule-${rule.id}`}
            >
              <td className="py-2 pr-3">
                {ruleName(rule)}
                <div className="font-mono text-xs text-soot-600" data-shows-ids>
                  {rule.id}
                </div>
              </td>
              <td className="py-2 pr-3">
                {rowLabels.get(rule.row) ?? rule.row}
                <div className="text-xs text-soot-600">
                  {rule.zones.includes('*') ? 'every zone' : rule.zones.map(formatKey).join(', ')}
                </div>
              </td>
              <td className="py-2 pr-3">
                {formatKey(rule.damage)}
                <div className="text-xs text-soot-600">
                  by {rule.measure}
                  {rule.unit === 'count' ? '' : `, ${unitSymbols[rule.unit]}`}
                </div>
              </td>
              <td className="py-2 pr-3 font-mono">
                {rule.notPermitted ? 'not permitted' : formatLimit(rule.serviceableMax, rule.unit)}
              </td>
              <td className="py-2 pr-3 font-mono">{formatLimit(rule.repeatMax, rule.unit)}</td>
              <td className="py-2 pr-3">{formatInterval(rule.repeatInterval)}</td>
              <td className="py-2 pr-3">{formatBeyondAction(rule.beyondAction)}</td>
              <td className="py-2 pr-3 text-xs">{countLimits(rule)}</td>
              <td className="py-2 pr-3 text-xs">{rule.reference}</td>
              {onEdit ? (
                <td className="py-2 whitespace-nowrap">
                  <button
                    type="button"
                    className="text-ember-800 hover:underline"
                    onClick={() => onEdit(rule)}
                    aria-label={`Change rule ${ruleName(rule)} (${rule.id})`}
                  >
                    Change
                  </button>
                  {onRemove ? (
                    <button
                      type="button"
                      className="ml-3 text-red-800 hover:underline"
                      onClick={() => onRemove(rule)}
                      aria-label={`Remove rule ${ruleName(rule)} (${rule.id})`}
                    >
                      Remove
                    </button>
                  ) : null}
                </td>
              ) : null}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
