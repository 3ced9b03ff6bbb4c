import { cautions } from '@emberline/contracts/cautions';
import { inspectionReasonLabels, type InspectionReason } from '@emberline/contracts/inspections';
import type { Organisation } from '@emberline/contracts/organisations';
import {
  deliveryStateLabels,
  type ParsedReportListQuery,
  type ReportListItem,
  type ReportListQuery,
} from '@emberline/contracts/reports';
import { decisionKindLabels } from '@emberline/contracts/review';
import { Download } from 'lucide-react';
import { Link } from 'react-router-dom';
import { Select } from '../../../components/ui/field';
import { LoadingLine } from '../../../components/ui/page';
import { Pager } from '../../../components/ui/pager';
import { Notice } from '../../../components/ui/notice';
import { formatDate, formatDateTime } from '../../../lib/format';
import { reportUrl, useReports } from '../api/reports';

const deliveryTone: Record<ReportListItem['delivery'], string> = {
  sent: 'text-emerald-900',
  'on-its-way': 'text-soot-800',
  failed: 'text-amber-900',
  'needs-attention': 'font-medium text-red-900',
  none: 'text-soot-700',
};

/**
 * Every issued report the caller may see, newest release first, each with its PDF, its check
 * link, where its e-mail stands and whether a later revision replaced it.
 */
export function ReportsTable({
  query,
  onChange,
  owners,
}: {
  query: ParsedReportListQuery;
  onChange: (changes: Partial<ReportListQuery>) => void;
  /** Owners to filter by; null for a customer, who only sees their own. */
  owners: Organisation[] | null;
}) {
  const reports = useReports(query);
  return (
    <section className="flex flex-col gap-4" aria-label="Reports">
      {owners ? (
        <label className="flex w-72 flex-col gap-1 text-sm font-medium">
          Owner
          <Select
            value={query.organisationId ?? ''}
            onChange={(event) =>
              onChange({ organisationId: event.target.value || undefined, page: 1 })
            }
          >
            <option value="">Every owner</option>
            {owners
              .filter((owner) => owner.kind === 'customer')
              .map((owner) => (
                <option key={owner.id} value={owner.id}>
                  {owner.name}
                </option>
              ))}
          </Select>
        </label>
      ) : null}
      {reports.isPending ? (
        <LoadingLine />
      ) : reports.error ? (
        <Notice tone="error">{reports.error.message}</Notice>
      ) : reports.data.items.length === 0 ? (
        <Notice>
          No report has been issued yet. A report is issued when an engineer releases an inspection,
          and e-mailed to the owner’s contacts for reports.
        </Notice>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-soot-200 bg-white">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-soot-200 bg-soot-50 text-xs uppercase text-soot-600">
              <tr>
                <th className="px-3 py-2">Engine</th>
                {owners ? <th className="px-3 py-2">Owner</th> : null}
                <th className="px-3 py-2">Inspection</th>
                <th className="px-3 py-2">Outcome</th>
                <th className="px-3 py-2">Revision</th>
                <th className="px-3 py-2">Released</th>
                <th className="px-3 py-2">E-mail</th>
                <th className="px-3 py-2">Report</th>
              </tr>
            </thead>
            <tbody>
              {reports.data.items.map((item) => (
                <tr
                  key={`${item.inspectionId}-${item.revision}`}
                  className="border-b border-soot-100 align-top"
                  data-testid="report-row"
                >
                  <td className="px-3 py-2">
                    <Link
                      to={`/fleet/${item.engineId}`}
                      className="font-mono font-medium text-ember-800 hover:underline"
                    >
                      {item.engineSerialNumber}
                    </Link>
                    <span className="block text-xs text-soot-600">{item.modelName}</span>
                  </td>
                  {owners ? <td className="px-3 py-2">{item.organisationName}</td> : null}
                  <td className="px-3 py-2">
                    <Link
                      to={`/inspections/${item.inspectionId}`}
                      className="text-ember-800 hover:underline"
                    >
                      {formatDate(item.inspectionDate)}
                    </Link>
                    <span className="block text-xs text-soot-600">
                      {inspectionReasonLabels[item.reason as InspectionReason] ?? item.reason}
                    </span>
                  </td>
                  <td className="px-3 py-2">{decisionKindLabels[item.outcome]}</td>
                  <td className="px-3 py-2">
                    {item.revision}
                    {item.current ? null : (
                      <span className="block text-xs text-soot-700">replaced by a later one</span>
                    )}
                  </td>
                  <td className="px-3 py-2">
                    {formatDateTime(item.releasedAt)}
                    <span className="block text-xs text-soot-600">by {item.releasedByName}</span>
                  </td>
                  <td className={`px-3 py-2 ${deliveryTone[item.delivery]}`}>
                    {deliveryStateLabels[item.delivery]}
                  </td>
                  <td className="px-3 py-2">
                    <a
                      href={reportUrl(item.inspectionId, item.revision)}
                      download
                      className="inline-flex items-center gap-1 font-medium text-ember-800 hover:underline"
                    >
                      <Download className="size-4" aria-hidden />
                      PDF
                      <span className="sr-only">
                        {' '}
                        of {item.engineSerialNumber}, {formatDate(item.inspectionDate)}, revision{' '}
                        {item.revision}
                      </span>
                    </a>
                    <Link
                      to={`/verify/${item.verificationCode}`}
                      className="block text-xs text-ember-800 hover:underline"
                    >
                      Check it
                    </Link>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <Pager
            page={query.page}
            pageSize={query.pageSize}
            total={reports.data.total}
            noun={['report', 'reports']}
            onPage={(page) => onChange({ page })}
          />
        </div>
      )}
      <p className="text-xs text-soot-600">{cautions.dispositions}</p>
    </section>
  );
}
