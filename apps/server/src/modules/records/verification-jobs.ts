import type { VerificationJob } from '@emberline/contracts/records';
import type { AppContext } from '../../context';
import type { Principal } from '../../http/principal';
import { newId } from '../../lib/ids';
import { createRecordsService } from './records.service';

/**
 * Records checks in the background: one at a time per server, its progress readable while it
 * runs, the last one's result kept until the next starts. At volume a check reads every record
 * and re-hashes every signed original; between pages the server goes on serving.
 */
export function createVerificationJobs(ctx: AppContext) {
  const records = createRecordsService(ctx);
  let latest: VerificationJob | null = null;

  return {
    /** Starts a check, or gives the one already running. */
    start(principal: Principal): VerificationJob {
      if (latest?.state === 'running') return latest;
      const job: VerificationJob = {
        id: newId(),
        state: 'running',
        startedAt: ctx.now().toISOString(),
        finishedAt: null,
        startedBy: principal.user.name,
        progress: { phase: 'signatures', done: 0, total: null },
        result: null,
        error: null,
      };
      latest = job;
      records
        .verify((progress) => {
          job.progress = progress;
        })
        .then(
          (result) => {
            job.result = result;
            job.state = 'done';
            job.progress = { phase: 'done', done: 0, total: null };
          },
          (error: Error) => {
            job.state = 'failed';
            job.error = `The check stopped before the end (${error.message}); start it again, and if it stops again tell your administrator.`;
            ctx.logger.error({ err: error }, 'the records check failed');
          },
        )
        .finally(() => {
          job.finishedAt = ctx.now().toISOString();
        });
      return job;
    },

    latest: (): VerificationJob | null => latest,
  };
}
