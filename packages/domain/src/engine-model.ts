import type { EngineModelRow } from '@emberline/contracts/fleet';

/**
 * What a change to a model's rows would break: a row that findings refer to keeps its position
 * count, numbering and zones, and stays in the model, so that no recorded finding is re-mapped.
 * Returns one message per problem, empty when the change is allowed.
 */
export function rowChangeProblems(
  before: readonly EngineModelRow[],
  after: readonly EngineModelRow[],
  inUse: ReadonlySet<string>,
): string[] {
  const problems: string[] = [];
  const next = new Map(after.map((row) => [row.key, row]));
  for (const row of before) {
    if (!inUse.has(row.key)) continue;
    const changed = next.get(row.key);
    if (!changed) {
      problems.push(
        `${row.key} has recorded findings and cannot be removed: make a new version of the model instead`,
      );
      continue;
    }
    if (changed.count !== row.count)
      problems.push(
        `${row.key} has recorded findings: its ${row.count} positions cannot change to ${changed.count}`,
      );
    if (JSON.stringify(changed.numbering) !== JSON.stringify(row.numbering))
      problems.push(`${row.key} has recorded findings: its numbering cannot change`);
    if (JSON.stringify(changed.zones) !== JSON.stringify(row.zones))
      problems.push(`${row.key} has recorded findings: its zones cannot change`);
  }
  return problems;
}
