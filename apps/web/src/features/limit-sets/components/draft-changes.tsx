import type { RuleChange } from '@emberline/contracts/limit-sets';

const kindWords = { added: 'Added', removed: 'Removed', changed: 'Changed' } as const;
const value = (item: unknown) =>
  item === null || item === undefined
    ? 'none'
    : Array.isArray(item)
      ? item.join(', ') || 'none'
      : typeof item === 'object'
        ? JSON.stringify(item)
        : String(item);

/** What a draft changes against the revision it was copied from, rule by rule. */
export function DraftChanges({
  changes,
  basedOn,
  ruleTitle,
}: {
  changes: RuleChange[];
  basedOn: string;
  ruleTitle: (ruleId: string) => string;
}) {
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
              {ruleTitle(change.ruleId)}{' '}
              <span className="font-mono text-xs text-soot-600">{change.ruleId}</span>
              {change.fields.length ? (
                <ul className="ml-5 list-disc">
                  {change.fields.map((field) => (
                    <li key={field.field}>
                      {field.field}: {value(field.from)} → {value(field.to)}
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
