import { AsyncLocalStorage } from 'node:async_hooks';

interface Writes {
  /** Transactions of this request that committed. */
  committed: number;
  /** How deep inside `inTransaction` the request is now (an inner one is a savepoint). */
  depth: number;
}

const requestWrites = new AsyncLocalStorage<Writes>();

/** Runs one request with its own count of committed transactions (app.ts, first middleware). */
export function trackRequestWrites(next: () => void): void {
  requestWrites.run({ committed: 0, depth: 0 }, next);
}

/** Counts `commit` as a change of this request when it is an outermost transaction that returned. */
export function countCommit<T>(commit: () => T): T {
  const writes = requestWrites.getStore();
  if (!writes) return commit();
  writes.depth += 1;
  try {
    const result = commit();
    if (writes.depth === 1) writes.committed += 1;
    return result;
  } finally {
    writes.depth -= 1;
  }
}

/** Whether something this request did was saved: then an error answer must not say otherwise. */
export function requestSavedAChange(): boolean {
  return (requestWrites.getStore()?.committed ?? 0) > 0;
}
