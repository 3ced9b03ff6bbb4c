import { useMutation, useQuery } from '@tanstack/react-query';
import type { ReportFileCheck, ReportVerification } from '@emberline/contracts/reports';
import { api } from '../../../lib/api-client';

const path = (code: string) => `/verify/${encodeURIComponent(code)}`;

/** What a verification code says of its report: anyone may ask, signed in or not. */
export function useReportVerification(code: string) {
  return useQuery({
    queryKey: ['verify', code],
    queryFn: () => api.get<ReportVerification>(path(code)),
    retry: false,
  });
}

/** Whether a file is, byte for byte, the report of a code. */
export function useCheckReportFile(code: string) {
  return useMutation({
    mutationFn: (file: File) =>
      api.upload<ReportFileCheck>(`${path(code)}/file`, file, 'application/pdf'),
  });
}
