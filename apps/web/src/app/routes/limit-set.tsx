import { useState } from 'react';
import { ArrowLeft } from 'lucide-react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { cautions } from '@emberline/contracts/cautions';
import type { Rule } from '@emberline/contracts/limits';
import { ruleName } from '@emberline/domain/verdict-words';
import { can } from '@emberline/contracts/permissions';
import { Button } from '../../components/ui/button';
import { Notice } from '../../components/ui/notice';
import { LoadingLine, PageHeader, Panel } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useEngineModel } from '../../features/engine-models/api/engine-models';
import {
  exportUrl,
  useImpact,
  useLimitSet,
  useLimitSets,
  useReplaceRules,
} from '../../features/limit-sets/api/limit-sets';
import { CopyForm, EditParticularsForm } from '../../features/limit-sets/components/copy-form';
import { RecordHistory } from '../../features/audit/components/record-history';
import { ImpactPanel } from '../../features/limit-sets/components/impact-panel';
import { ImportPanel } from '../../features/limit-sets/components/import-panel';
import {
  InventedLabel,
  LimitSetStatusBadge,
} from '../../features/limit-sets/components/limit-set-status';
import { formatDate, formatDateTime } from '../../lib/format';
import { PublishForm } from '../../features/limit-sets/components/publish-form';
import { DraftChanges } from '../../features/limit-sets/components/draft-changes';
import { RuleEditor } from '../../features/limit-sets/components/rule-editor';
import { RulesTable } from '../../features/limit-sets/components/rules-table';
import { blankRule, fromRule, type RuleForm } from '../../features/limit-sets/lib/rule-form';

export function LimitSetRoute() {
  const { limitSetId = '' } = useParams();
  return (
    <RequirePermission permission="read:limit-set">
      <LimitSetPage key={limitSetId} id={limitSetId} />
    </RequirePermission>
  );
}

interface Editing {
  form: RuleForm;
  /** The rule's place in the list; null for a new rule. */
  index: number | null;
}

function LimitSetPage({ id }: { id: string }) {
  const user = useSignedInUser();
  const navigate = useNavigate();
  const set = useLimitSet(id);
  const model = useEngineModel(set.data?.modelId ?? null);
  const siblings = useLimitSets(set.data?.modelId ?? '');
  const replace = useReplaceRules(id);
  const [editing, setEditing] = useState<Editing | null>(null);
  const [copying, setCopying] = useState(false);
  const [renaming, setRenaming] = useState(false);
  const [signing, setSigning] = useState<'check' | 'publish' | null>(null);
  const [impactAsked, setImpactAsked] = useState(false);
  const impact = useImpact(id, impactAsked && set.data?.status === 'draft');

  if (set.isPending) return <LoadingLine />;
  if (set.error) return <Notice tone="error">{set.error.message}</Notice>;
  const data = set.data;
  const editable = data.status === 'draft' && can(user.role, 'edit:limit-set');
  const rows = model.data?.rows ?? [];
  const inForce = siblings.data?.find((item) => item.status === 'published') ?? null;
  const mine = data.editorIds.includes(user.id);
  const canCheck = Boolean(data.effectiveDate) && !mine && data.rules.length > 0;

  const save = (rules: Rule[]) =>
    replace.mutate(rules, {
      onSuccess: () => {
        setEditing(null);
        // The rules changed: an impact shown before is out of date.
        setImpactAsked(false);
      },
    });

  return (
    <div className="flex flex-col gap-6">
      <Link
        to="/limits"
        className="inline-flex items-center gap-1 text-sm text-ember-800 hover:underline"
      >
        <ArrowLeft className="size-4" aria-hidden /> Limit library
      </Link>
      <PageHeader
        title={`Revision ${data.revision}`}
        description={`${data.title} · ${model.data?.name ?? data.modelId}`}
        actions={
          <>
            <a
              href={exportUrl(id, 'csv')}
              download
              className="rounded-md border border-soot-300 bg-white px-3.5 py-2 text-sm font-medium hover:bg-soot-100"
            >
              Export CSV
            </a>
            <a
              href={exportUrl(id, 'json')}
              download
              className="rounded-md border border-soot-300 bg-white px-3.5 py-2 text-sm font-medium hover:bg-soot-100"
            >
              Export JSON
            </a>
            {can(user.role, 'edit:limit-set') ? (
              <Button type="button" variant="secondary" onClick={() => setCopying(true)}>
                Copy into a new draft…
              </Button>
            ) : null}
          </>
        }
      />
      <Notice tone="caution">{cautions.limits}</Notice>
      {copying ? (
        <CopyForm
          source={data}
          onCancel={() => setCopying(false)}
          onCopied={(copy) => void navigate(`/limits/${copy.id}`)}
        />
      ) : null}
      <Panel>
        {renaming ? (
          <div className="mb-4">
            <EditParticularsForm draft={data} onDone={() => setRenaming(false)} />
          </div>
        ) : null}
        <dl className="grid gap-3 text-sm md:grid-cols-3">
          <div>
            <dt className="text-xs uppercase tracking-wide text-soot-600">State</dt>
            <dd className="mt-1 flex flex-wrap items-center gap-2">
              <LimitSetStatusBadge status={data.status} />
              {data.invented ? <InventedLabel /> : null}
            </dd>
          </div>
          <div>
            <dt className="text-xs uppercase tracking-wide text-soot-600">Manual transcribed</dt>
            <dd className="mt-1">{data.manualReference}</dd>
          </div>
          <div>
            <dt className="text-xs uppercase tracking-wide text-soot-600">Effective</dt>
            <dd className="mt-1">
              {data.effectiveDate ? formatDate(data.effectiveDate) : 'not given'}
            </dd>
          </div>
          <div>
            <dt className="text-xs uppercase tracking-wide text-soot-600">Published</dt>
            <dd className="mt-1" data-testid="published-by">
              {data.publishedAt
                ? `${new Date(data.publishedAt).toLocaleString('en-GB')} by ${data.publishedByName}`
                : 'not yet'}
            </dd>
          </div>
          <div className="md:col-span-2">
            <dt className="text-xs uppercase tracking-wide text-soot-600">
              SHA-256 of the revision (RFC 8785 JSON)
            </dt>
            <dd className="mt-1 break-all font-mono text-xs">{data.contentSha256 ?? '—'}</dd>
          </div>
        </dl>
        {editable && !renaming ? (
          <Button
            type="button"
            variant="secondary"
            className="mt-3"
            onClick={() => setRenaming(true)}
          >
            Change the particulars…
          </Button>
        ) : null}
      </Panel>

      {editable ? (
        <Panel>
          <h2 className="mb-1 text-lg font-semibold">Check and publish</h2>
          <p className="mb-3 text-sm text-soot-600">
            Before it goes in force, see what this draft would change on the current findings of the
            model’s engines{inForce ? `, against revision ${inForce.revision} in force` : ''}.
          </p>
          <div className="mb-3 flex gap-2">
            <Button
              type="button"
              variant="secondary"
              busy={impact.isFetching}
              onClick={() => (impactAsked ? void impact.refetch() : setImpactAsked(true))}
            >
              {impactAsked ? 'Check the impact again' : 'Show the impact'}
            </Button>
            <Button
              type="button"
              variant="secondary"
              onClick={() => setSigning('check')}
              disabled={signing !== null || !canCheck}
            >
              Sign the check…
            </Button>
            <Button
              type="button"
              onClick={() => setSigning('publish')}
              disabled={signing !== null || !data.check || !data.effectiveDate}
            >
              Publish…
            </Button>
          </div>
          <p className="mb-3 text-sm" data-testid="limit-check">
            {data.check
              ? `Checked by ${data.check.signerName}, ${formatDateTime(data.check.signedAt)}: it can be published.`
              : !data.effectiveDate
                ? 'Give the draft its effective date (Change the particulars…); then an engineer who did not make or change it signs the check, and it can be published.'
                : mine
                  ? 'You made or changed this draft: another engineer signs its check before it can be published.'
                  : 'Not checked yet: an engineer who did not make or change this draft signs the check before it can be published. Any change clears the check.'}
          </p>
          {impact.error ? <Notice tone="error">{impact.error.message}</Notice> : null}
          {impact.data ? (
            <ImpactPanel
              impact={impact.data}
              rowLabel={(key) => rows.find((row) => row.key === key)?.label ?? key}
              ruleTitle={(id) => {
                const rule = data.rules.find((item) => item.id === id);
                return rule ? ruleName(rule) : id;
              }}
            />
          ) : null}
          {signing ? (
            <div className="mt-4">
              <PublishForm
                key={signing}
                kind={signing}
                limitSetId={id}
                revision={data.revision}
                effectiveDate={data.effectiveDate}
                inForce={inForce?.revision ?? null}
                onCancel={() => setSigning(null)}
              />
            </div>
          ) : null}
        </Panel>
      ) : null}

      {data.status === 'draft' && data.basedOnRevision ? (
        <Panel>
          <DraftChanges
            changes={data.changes}
            basedOn={data.basedOnRevision}
            rowLabel={(key) => rows.find((row) => row.key === key)?.label ?? key}
            unitOf={(ruleId) => data.rules.find((rule) => rule.id === ruleId)?.unit ?? 'mm'}
          />
        </Panel>
      ) : null}

      <Panel>
        <div className="mb-3 flex items-center justify-between gap-2">
          <h2 className="text-lg font-semibold">Rules ({data.rules.length})</h2>
          {editable && rows.length > 0 ? (
            <Button
              type="button"
              variant="secondary"
              onClick={() =>
                setEditing({
                  form: blankRule(rows[0]!, `rule-${data.rules.length + 1}`),
                  index: null,
                })
              }
            >
              Add a rule
            </Button>
          ) : null}
        </div>
        {!editable && data.status !== 'draft' ? (
          <p className="mb-3 text-sm text-soot-600">
            A {data.status === 'published' ? 'published' : 'superseded'} revision never changes:
            copy it into a new draft to make the next one.
          </p>
        ) : null}
        {editing ? (
          <div className="mb-4">
            <RuleEditor
              key={editing.index ?? 'new'}
              initial={editing.form}
              isNew={editing.index === null}
              rows={rows}
              otherRules={data.rules.filter((_, index) => index !== editing.index)}
              saving={replace.isPending}
              serverError={replace.error?.message ?? ''}
              onCancel={() => {
                replace.reset();
                setEditing(null);
              }}
              onSave={(rule) =>
                save(
                  editing.index === null
                    ? [...data.rules, rule]
                    : data.rules.map((item, index) => (index === editing.index ? rule : item)),
                )
              }
            />
          </div>
        ) : null}
        <RulesTable
          rules={data.rules}
          rowLabels={new Map(rows.map((row) => [row.key, row.label]))}
          onEdit={
            editable
              ? (rule) => setEditing({ form: fromRule(rule), index: data.rules.indexOf(rule) })
              : undefined
          }
          onRemove={
            editable
              ? (rule) => {
                  if (window.confirm(`Remove the rule “${ruleName(rule)}” from this draft?`))
                    save(data.rules.filter((item) => item !== rule));
                }
              : undefined
          }
        />
      </Panel>

      {editable ? (
        <Panel>
          <h2 className="mb-3 text-lg font-semibold">Import rules from a file</h2>
          <ImportPanel limitSetId={id} />
        </Panel>
      ) : null}
      <Panel>
        <RecordHistory kind="limit-sets" id={id} />
      </Panel>
    </div>
  );
}
