import { Cron } from 'croner';
import type { Logger } from '../../lib/logger';

/** The server's scheduled jobs: a tick every ten minutes, and one at start to catch up. */
export interface Scheduler {
  start(): void;
  stop(): void;
}

/**
 * Runs `tick` every ten minutes (croner) and once at start. The tick itself reads the app's clock
 * and the jobs' last days from SQLite, so what it does depends on the day, not on when the
 * process started: a restart neither repeats a day's work nor skips it.
 */
export function createScheduler(tick: () => unknown, logger: Logger): Scheduler {
  let job: Cron | null = null;
  const run = () => {
    try {
      tick();
    } catch (error) {
      logger.error({ err: error }, 'a scheduled job failed; it runs again on the next tick');
    }
  };
  return {
    start() {
      if (job) return;
      job = new Cron('*/10 * * * *', { protect: true, name: 'emberline-reminders' }, run);
      run();
    },
    stop() {
      job?.stop();
      job = null;
    },
  };
}
