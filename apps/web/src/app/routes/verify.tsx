import { cautions } from '@emberline/contracts/cautions';
import { useParams } from 'react-router-dom';
import { LoadingLine } from '../../components/ui/page';
import { Notice } from '../../components/ui/notice';
import { AuthCard } from '../../features/auth/components/auth-card';
import { useCheckReportFile, useReportVerification } from '../../features/reports/api/verify';
import { formatDate } from '../../lib/format';

/**
 * The public check of a report (no sign-in): whether the report of a verification code is
 * genuine and current, with only its engine, day and revision; and whether a file one holds is
 * that report, byte for byte.
 */
export function VerifyRoute() {
  const { code = '' } = useParams();
  const verification = useReportVerification(code);
  const check = useCheckReportFile(code);
  return (
    <AuthCard title="Check a report">
      <div className="flex flex-col gap-4 text-sm">
        <p>
          Verification code <span className="font-mono">{code}</span>
        </p>
        {verification.isPending ? <LoadingLine /> : null}
        {verification.error ? <Notice tone="error">{verification.error.message}</Notice> : null}
        {verification.data ? (
          <>
            <Notice
              tone={verification.data.genuine && verification.data.current ? 'success' : 'error'}
              title={
                !verification.data.genuine
                  ? 'Not genuine'
                  : verification.data.current
                    ? 'Genuine and current'
                    : 'Genuine, replaced by a later revision'
              }
            >
              {verification.data.message}
            </Notice>
            <dl className="grid grid-cols-3 gap-2" data-testid="verified-report">
              <div>
                <dt className="text-xs uppercase tracking-wide text-soot-600">Engine</dt>
                <dd className="font-mono font-medium">{verification.data.engineSerialNumber}</dd>
              </div>
              <div>
                <dt className="text-xs uppercase tracking-wide text-soot-600">Inspection</dt>
                <dd className="font-medium">{formatDate(verification.data.inspectionDate)}</dd>
              </div>
              <div>
                <dt className="text-xs uppercase tracking-wide text-soot-600">Revision</dt>
                <dd className="font-medium">{verification.data.revision}</dd>
              </div>
            </dl>
            <label className="flex flex-col gap-1 font-medium">
              Is my copy the signed one? Choose the PDF file
              <input
                type="file"
                accept="application/pdf,.pdf"
                className="text-sm font-normal"
                onChange={(event) => {
                  const file = event.target.files?.[0];
                  if (file) check.mutate(file);
                }}
              />
            </label>
            {check.isPending ? <LoadingLine /> : null}
            {check.error ? <Notice tone="error">{check.error.message}</Notice> : null}
            {check.data ? (
              <Notice tone={check.data.matches ? 'success' : 'error'}>{check.data.message}</Notice>
            ) : null}
          </>
        ) : null}
        <p className="text-xs text-soot-600">{cautions.short}</p>
      </div>
    </AuthCard>
  );
}
