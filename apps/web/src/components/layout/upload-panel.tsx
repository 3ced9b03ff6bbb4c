import { useState } from 'react';
import type { UploadStatus } from '../../lib/upload-queue';
import { useUploadQueue } from '../../lib/use-upload-queue';

const labels: Record<UploadStatus, string> = {
  queued: 'Waiting',
  uploading: 'Uploading',
  done: 'Stored',
  duplicate: 'Already there',
  refused: 'Refused',
  failed: 'Failed',
  cancelled: 'Cancelled',
};

/** The uploads of this session, on every page, so that the inspector can move on while they go. */
export function UploadPanel() {
  const { queue, items } = useUploadQueue();
  // Open while files go or need a look; once all are stored it folds to its one line, unless
  // the inspector opened or closed it by hand.
  const [choice, setChoice] = useState<boolean | null>(null);
  if (items.length === 0) return null;
  const active = items.filter(
    (item) => item.status === 'queued' || item.status === 'uploading',
  ).length;
  const problems = items.filter(
    (item) => item.status === 'refused' || item.status === 'failed',
  ).length;
  const open = choice ?? (active > 0 || problems > 0);
  const setOpen = setChoice;
  return (
    <>
      {/* Room below the page, so that whatever the panel floats over can be scrolled clear of it. */}
      <div aria-hidden className={open ? 'h-[27rem]' : 'h-16'} />
      <aside
        aria-label="Uploads"
        className="fixed bottom-16 right-4 z-40 w-96 max-w-[calc(100vw-2rem)] rounded-lg border border-soot-300 bg-white shadow-xl"
      >
        <div className="flex items-center justify-between border-b border-soot-200 px-4 py-2">
          <button
            type="button"
            className="text-sm font-semibold"
            aria-expanded={open}
            onClick={() => setOpen(!open)}
          >
            Uploads: {active > 0 ? `${active} in progress` : 'finished'}
            {problems > 0 ? `, ${problems} need a look` : ''}
          </button>
          <button
            type="button"
            className="text-xs text-ember-800 hover:underline"
            onClick={() => queue.clearFinished()}
          >
            Clear finished
          </button>
        </div>
        {open ? (
          <ul
            className="max-h-72 divide-y divide-soot-100 overflow-y-auto text-sm"
            data-testid="upload-list"
          >
            {items.map((item) => (
              <li key={item.id} className="px-4 py-2" data-status={item.status}>
                <div className="flex items-center justify-between gap-2">
                  <span className="truncate font-medium" title={item.name}>
                    {item.name}
                  </span>
                  <span className="shrink-0 text-xs text-soot-600">{labels[item.status]}</span>
                </div>
                {item.status === 'uploading' ? (
                  <progress
                    className="mt-1 h-1.5 w-full accent-ember-600"
                    value={item.progress}
                    max={1}
                    aria-label={`Progress of ${item.name}`}
                  />
                ) : null}
                {item.message ? (
                  <p
                    className={`mt-1 text-xs ${item.status === 'queued' ? 'text-soot-700' : 'text-red-800'}`}
                  >
                    {item.message}
                  </p>
                ) : null}
                <div className="mt-1 flex gap-3 text-xs">
                  {item.status === 'uploading' || item.status === 'queued' ? (
                    <button
                      type="button"
                      className="text-ember-800 hover:underline"
                      onClick={() => queue.cancel(item.id)}
                    >
                      Cancel
                    </button>
                  ) : null}
                  {item.status === 'failed' || item.status === 'cancelled' ? (
                    <button
                      type="button"
                      className="text-ember-800 hover:underline"
                      onClick={() => queue.retry(item.id)}
                    >
                      Retry
                    </button>
                  ) : null}
                </div>
              </li>
            ))}
          </ul>
        ) : null}
      </aside>
    </>
  );
}
