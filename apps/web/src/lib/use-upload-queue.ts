import { useContext, useSyncExternalStore } from 'react';
import { UploadQueueContext, type UploadQueue } from './upload-queue';

/** The upload queue of the app, and its items as they change. */
export function useUploadQueue(): { queue: UploadQueue; items: ReturnType<UploadQueue['items']> } {
  const queue = useContext(UploadQueueContext);
  if (!queue) throw new Error('useUploadQueue is used outside the upload queue provider');
  const items = useSyncExternalStore(queue.subscribe, queue.items);
  return { queue, items };
}
