import { inspectionReasonLabels, inspectionStateLabels } from '@emberline/contracts/inspections';
import { Link } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { formatDate } from '../../../lib/format';
import { useInspections } from '../api/inspections';

export function InspectionsList({ engineId }: { engineId: string }) {
  const inspections = useInspections(engineId);
  if (inspections.isPending) return <LoadingLine />;
  if (inspections.error) return <Notice tone="error">{inspections.error.message}</Notice>;
  if (inspections.data.length === 0)
    return <p className="text-sm text-soot-600">No inspection of this engine is recorded yet.</p>;
  return (
    <table className="w-full text-left text-sm">
      <caption className="sr-only">Inspections, newest first</caption>
      <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
        <tr>
          <th scope="col" className="py-2 pr-4">
            Date
          </th>
          <th scope="col" className="py-2 pr-4">
            Reason
          </th>
          <th scope="col" className="py-2 pr-4">
            CSN
          </th>
          <th scope="col" className="py-2 pr-4">
            State
          </th>
          <th scope="col" className="py-2 pr-4">
            Images
          </th>
          <th scope="col" className="py-2">
            Open flags
          </th>
        </tr>
      </thead>
      <tbody>
        {inspections.data.map((inspection) => (
          <tr key={inspection.id} className="border-b border-soot-100">
            <td className="py-2 pr-4">
              <Link
                to={`/inspections/${inspection.id}`}
                className="font-medium text-ember-800 hover:underline"
              >
                {formatDate(inspection.date)}
              </Link>
            </td>
            <td className="py-2 pr-4">{inspectionReasonLabels[inspection.reason]}</td>
            <td className="py-2 pr-4 font-mono">{inspection.csn.toLocaleString('en-GB')}</td>
            <td className="py-2 pr-4">{inspectionStateLabels[inspection.state]}</td>
            <td className="py-2 pr-4 font-mono">{inspection.imageCount}</td>
            <td className="py-2">
              {inspection.flags.filter((flag) => !flag.acknowledgedAt).length}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
