import { eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { jobRuns } from '../../db/schema';

/** The last day a scheduled job ran for (`YYYY-MM-DD`), or null when it never has. */
export function lastRunDay(db: DbOrTx, job: string): string | null {
  return db.select().from(jobRuns).where(eq(jobRuns.job, job)).get()?.lastDay ?? null;
}

export function markRun(db: DbOrTx, job: string, day: string, at: Date): void {
  db.insert(jobRuns)
    .values({ job, lastDay: day, ranAt: at })
    .onConflictDoUpdate({ target: jobRuns.job, set: { lastDay: day, ranAt: at } })
    .run();
}
