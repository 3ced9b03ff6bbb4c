import { useState, type ReactNode } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { Toaster } from 'sonner';
import { DemoBanner } from '../features/installation/components/demo-banner';
import { createQueryClient } from '../lib/query-client';
import { UploadQueueProvider } from '../lib/upload-queue-provider';

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(createQueryClient);
  return (
    <QueryClientProvider client={queryClient}>
      <DemoBanner />
      <UploadQueueProvider>{children}</UploadQueueProvider>
      <Toaster position="bottom-right" richColors />
    </QueryClientProvider>
  );
}
