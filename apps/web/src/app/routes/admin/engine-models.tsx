import { Link } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine, Panel } from '../../../components/ui/page';
import { useEngineModels } from '../../../features/engine-models/api/engine-models';

export function AdminEngineModelsRoute() {
  const models = useEngineModels();
  return (
    <Panel>
      <div className="mb-4 flex items-center justify-between">
        <h2 className="text-lg font-semibold">Engine models</h2>
        <Link
          to="/admin/engine-models/new"
          className="rounded-md bg-ember-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-ember-800"
        >
          New engine model
        </Link>
      </div>
      {models.isPending ? (
        <LoadingLine />
      ) : models.error ? (
        <Notice tone="error">{models.error.message}</Notice>
      ) : (
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Engine models</caption>
          <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
            <tr>
              <th scope="col" className="py-2 pr-4">
                Model
              </th>
              <th scope="col" className="py-2 pr-4">
                Version
              </th>
              <th scope="col" className="py-2 pr-4">
                Rows
              </th>
              <th scope="col" className="py-2 pr-4">
                Engines
              </th>
              <th scope="col" className="py-2">
                Notes
              </th>
            </tr>
          </thead>
          <tbody>
            {models.data.map((model) => (
              <tr key={model.id} className="border-b border-soot-100">
                <td className="py-2 pr-4">
                  <Link
                    to={`/admin/engine-models/${model.id}`}
                    className="font-medium text-ember-800 hover:underline"
                  >
                    {model.name}
                  </Link>
                </td>
                <td className="py-2 pr-4">v{model.version}</td>
                <td className="py-2 pr-4 font-mono">{model.rowCount}</td>
                <td className="py-2 pr-4 font-mono">{model.engineCount}</td>
                <td className="py-2 text-soot-600">{model.notes}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </Panel>
  );
}
