import type { RuleChange } from '@emberline/contracts/limit-sets';
import type { LimitUnit } from '@emberline/contracts/limits';
import { ruleFieldLabels, ruleFieldWords } from '../lib/rule-form';

const kindWords = { added: 'Added', removed: 'Removed', changed: 'Changed' } as const;
/** What a draft changes against the revision it was copied from, rule by rule. */
export function DraftChanges({
  changes,
  basedOn,
  rowLabel,
  unitOf,
}: {
  changes: RuleChange[];
  basedOn: string;
  rowLabel: (key: string) => string;
  /** The unit a rule's limits are written in (the draft's, else the earlier revision's). */
  unitOf: (ruleId: string) => LimitUnit;
}) {
  // A limit is read in its own revision's unit: the earlier one for the old value if the unit changed.
  const units = (change: RuleChange) => {
    const unitChange = change.fields.find((field) => field.field === 'unit');
    const now = unitOf(change.ruleId);
    return { from: (unitChange?.from as LimitUnit | undefined) ?? now, to: now };
  };
  return (
    <section aria-label={`Changes against revision ${basedOn}`} className="text-sm">
      <h2 className="mb-2 text-lg font-semibold">What this draft changes against {basedOn}</h2>
      {changes.length === 0 ? (
        <p className="text-soot-700">Nothing yet: its rules are those of {basedOn}.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {changes.map((change) => (
            <li key={change.ruleId} data-testid="rule-change">
              <span className="font-medium">{kindWords[change.kind]}: </span>
              {change.title}{' '}
              <span className="font-mono text-xs text-soot-600" data-shows-ids>
                {change.ruleId}
              </span>
              {change.fields.length ? (
                <ul className="ml-5 list-disc">
                  {change.fields.map((field) => (
                    <li key={field.field}>
                      {ruleFieldLabels[field.field as keyof typeof ruleFieldLabels] ?? field.field}:{' '}
                      {ruleFieldWords(field.field, field.from, units(change).from, rowLabel)} →{' '}
                      {ruleFieldWords(field.field, field.to, units(change).to, rowLabel)}
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
