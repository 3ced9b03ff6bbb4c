import { useEffect, useRef } from 'react';
import { verificationPhaseLabels } from '@emberline/contracts/records';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { formatCount, formatDateTime } from '../../../lib/format';
import { useLatestVerification, useStartVerification } from '../api/records';

/**
 * The records check: every signature and audit row walked, hashed and its seal recomputed, and
 * each broken record named in words. It runs in the background on the server (at volume it
 * takes minutes); opening the screen starts one, and the screen follows its progress. The chain
 * head is what reports print, so that a cut-off tail shows when the two are compared.
 */
export function RecordsCheck() {
  const latest = useLatestVerification();
  const start = useStartVerification();
  const started = useRef(false);
  useEffect(() => {
    if (started.current || latest.isPending || latest.error) return;
    started.current = true;
    if (latest.data?.state !== 'running') start.mutate();
  }, [latest.isPending, latest.error, latest.data, start]);

  if (latest.error) return <Notice tone="error">{latest.error.message}</Notice>;
  if (start.error) return <Notice tone="error">{start.error.message}</Notice>;
  const job = latest.data;
  if (!job || job.state === 'running') {
    const progress = job?.progress;
    return (
      <div className="flex flex-col gap-2" aria-live="polite">
        <LoadingLine label="Checking every record…" />
        {progress ? (
          <p className="text-sm text-soot-700">
            {verificationPhaseLabels[progress.phase]}
            {progress.done > 0 || progress.total
              ? `: ${formatCount(progress.done)}${progress.total ? ` of ${formatCount(progress.total)}` : ''}`
              : ''}
            . The check goes on if you leave this page.
          </p>
        ) : null}
      </div>
    );
  }
  if (job.state === 'failed' || !job.result)
    return (
      <div className="flex flex-col gap-3">
        <Notice tone="error">{job.error ?? 'The check stopped before the end.'}</Notice>
        <div>
          <Button variant="secondary" busy={start.isPending} onClick={() => start.mutate()}>
            Check again
          </Button>
        </div>
      </div>
    );
  const result = job.result;
  return (
    <div className="flex flex-col gap-4">
      {result.keyInsideDataDir ? (
        <Notice tone="caution" title="The records key is kept with the records">
          It was made inside the data directory, so whoever can write there could forge a record and
          seal it again undetected. Set RECORDS_KEY_FILE to a key kept elsewhere.
        </Notice>
      ) : null}
      {result.ok ? (
        <Notice tone="success" title="Every record checks out">
          {formatCount(result.checked.signatures)} signatures and{' '}
          {formatCount(result.checked.auditRows)} audit rows are present, unchanged and sealed with
          the records key; {formatCount(result.checked.dispositions)} current dispositions match the
          findings they sign, and {formatCount(result.checked.originals)} signed originals hash as
          signed.
        </Notice>
      ) : (
        <Notice tone="error" title={`${result.problems.length} records do not check out`}>
          <ul className="mt-1 list-disc pl-5">
            {result.problems.map((problem) => (
              <li key={`${problem.kind}-${problem.id}-${problem.message}`}>{problem.message}</li>
            ))}
          </ul>
        </Notice>
      )}
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm text-soot-700">
        <dt>Signatures checked</dt>
        <dd>{formatCount(result.checked.signatures)}</dd>
        <dt>Audit rows checked</dt>
        <dd>{formatCount(result.checked.auditRows)}</dd>
        <dt>Current dispositions compared</dt>
        <dd>{formatCount(result.checked.dispositions)}</dd>
        <dt>Signed originals re-hashed</dt>
        <dd>{formatCount(result.checked.originals)}</dd>
        <dt>Chain head</dt>
        <dd className="break-all font-mono text-xs">
          {result.head ? `${result.head.seq} · ${result.head.sha256}` : 'no signature yet'}
        </dd>
      </dl>
      <p className="text-xs text-soot-600">
        Checked from {formatDateTime(job.startedAt)}
        {job.finishedAt ? ` to ${formatDateTime(job.finishedAt)}` : ''}, started by {job.startedBy}.
      </p>
      <div>
        <Button variant="secondary" busy={start.isPending} onClick={() => start.mutate()}>
          Check again
        </Button>
      </div>
    </div>
  );
}
