import { formatDate } from '../../lib/format';
import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { cautions } from '@emberline/contracts/cautions';
import type { EngineModelSummary } from '@emberline/contracts/fleet';
import { can } from '@emberline/contracts/permissions';
import { Notice } from '../../components/ui/notice';
import { LoadingLine, PageHeader, Panel } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useEngineModels } from '../../features/engine-models/api/engine-models';
import { useLimitSets } from '../../features/limit-sets/api/limit-sets';
import { CopyForm } from '../../features/limit-sets/components/copy-form';
import {
  InventedLabel,
  LimitSetStatusBadge,
} from '../../features/limit-sets/components/limit-set-status';

function ModelRevisions({ model, canEdit }: { model: EngineModelSummary; canEdit: boolean }) {
  const sets = useLimitSets(model.id);
  const navigate = useNavigate();
  const [copying, setCopying] = useState<string | null>(null);
  return (
    <Panel>
      <h2 className="mb-3 text-lg font-semibold">
        {model.name} <span className="text-sm font-normal text-soot-600">v{model.version}</span>
      </h2>
      {sets.isPending ? (
        <LoadingLine />
      ) : sets.error ? (
        <Notice tone="error">{sets.error.message}</Notice>
      ) : sets.data.length === 0 ? (
        <p className="text-sm text-soot-600">
          No revision yet: findings on this model go to review until one is published.
        </p>
      ) : (
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Limit-set revisions of {model.name}</caption>
          <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
            <tr>
              <th scope="col" className="py-2 pr-4">
                Revision
              </th>
              <th scope="col" className="py-2 pr-4">
                State
              </th>
              <th scope="col" className="py-2 pr-4">
                Manual
              </th>
              <th scope="col" className="py-2 pr-4">
                Rules
              </th>
              <th scope="col" className="py-2 pr-4">
                Published
              </th>
              <th scope="col" className="py-2">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {sets.data.map((set) => (
              <tr key={set.id} className="border-b border-soot-100 align-top">
                <td className="py-2 pr-4">
                  <Link
                    to={`/limits/${set.id}`}
                    className="font-medium text-ember-800 hover:underline"
                  >
                    {set.revision}
                  </Link>
                  <div className="text-xs text-soot-600">{set.title}</div>
                  {set.invented ? <InventedLabel /> : null}
                </td>
                <td className="py-2 pr-4">
                  <LimitSetStatusBadge status={set.status} />
                </td>
                <td className="py-2 pr-4">
                  {set.manualReference}
                  {set.effectiveDate ? (
                    <div className="text-xs text-soot-600">
                      effective {formatDate(set.effectiveDate)}
                    </div>
                  ) : null}
                </td>
                <td className="py-2 pr-4 font-mono">{set.ruleCount}</td>
                <td className="py-2 pr-4 text-xs">
                  {set.publishedAt
                    ? `${new Date(set.publishedAt).toLocaleString('en-GB')} by ${set.publishedByName}`
                    : '—'}
                </td>
                <td className="py-2">
                  {canEdit ? (
                    <button
                      type="button"
                      className="text-sm text-ember-800 hover:underline"
                      onClick={() => setCopying(set.id)}
                    >
                      Copy into a new draft…
                    </button>
                  ) : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {copying && sets.data ? (
        <div className="mt-4">
          <CopyForm
            source={sets.data.find((set) => set.id === copying)!}
            onCancel={() => setCopying(null)}
            onCopied={(copy) => void navigate(`/limits/${copy.id}`)}
          />
        </div>
      ) : null}
    </Panel>
  );
}

/** The limit library: every engine model's damage-limit revisions, in force, draft and superseded. */
export function LimitLibraryRoute() {
  return (
    <RequirePermission permission="read:limit-set">
      <LimitLibrary />
    </RequirePermission>
  );
}

function LimitLibrary() {
  const user = useSignedInUser();
  const models = useEngineModels();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Limit library"
        description="Damage-limit revisions per engine model, transcribed from the approved engine manual. One revision is in force for each model; every verdict names the revision it was judged against."
      />
      <Notice tone="caution">{cautions.limits}</Notice>
      {models.isPending ? (
        <LoadingLine />
      ) : models.error ? (
        <Notice tone="error">{models.error.message}</Notice>
      ) : (
        models.data.map((model) => (
          <ModelRevisions key={model.id} model={model} canEdit={can(user.role, 'edit:limit-set')} />
        ))
      )}
    </div>
  );
}
