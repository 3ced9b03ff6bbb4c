import { useState, type ReactNode } from 'react';
import { UploadQueue, UploadQueueContext } from './upload-queue';

export function UploadQueueProvider({ children }: { children: ReactNode }) {
  const [queue] = useState(() => new UploadQueue());
  return <UploadQueueContext.Provider value={queue}>{children}</UploadQueueContext.Provider>;
}
