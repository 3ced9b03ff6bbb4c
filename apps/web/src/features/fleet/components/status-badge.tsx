import { engineStatuses, engineStatusLabels, type EngineStatus } from '@emberline/contracts/fleet';

const styles: Record<EngineStatus, string> = {
  installed: 'bg-emerald-100 text-emerald-900',
  'in-shop': 'bg-amber-100 text-amber-950',
  removed: 'bg-soot-200 text-soot-800',
};

export function StatusBadge({ status }: { status: EngineStatus }) {
  return (
    <span className={`inline-block rounded-full px-2 py-0.5 text-xs font-medium ${styles[status]}`}>
      {engineStatusLabels[status]}
    </span>
  );
}

/** The engine statuses as <option>s, for every select that chooses one. */
export function EngineStatusOptions() {
  return engineStatuses.map((status) => (
    <option key={status} value={status}>
      {engineStatusLabels[status]}
    </option>
  ));
}
