import type {
  RuleChange,
  LimitFileFormat,
  LimitImportPreview,
  LimitSet,
  ParsedLimitSetCopyInput,
  LimitSetImpact,
  LimitSetSummary,
} from '@emberline/contracts/limit-sets';
import type { Rule } from '@emberline/contracts/limits';
import { limitCheckContent, publicationContent } from '@emberline/domain/signature-content';
import { ruleProblems, validateRuleZones, validateRules } from '@emberline/domain/rules';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import { appendSignature } from '../records/signature-writer';
import type { Principal } from '../../http/principal';
import { canonicalSha256 } from '../../lib/canonical';
import { newId } from '../../lib/ids';
import { appendAudit, listHistory } from '../audit/audit.repository';
import { signaturesOf } from '../records/records.repository';
import { confirmPassword } from '../auth/password-check';
import { findEngineModel, listModelRows } from '../engine-models/engine-models.repository';
import { currentFindings, findingRefs } from '../findings/findings.repository';
import { evaluateInspection } from '../findings/inspection-evaluation';
import { draftInspectionIds } from '../inspections/inspections.repository';
import {
  findLimitSet,
  insertLimitSet,
  insertRules,
  listLimitSets,
  listRules,
  publishLimitSet,
  replaceRules,
  updateLimitSet,
  type LimitSetRow,
} from './limit-sets.repository';
import { findingKey, limitSetImpact } from './limit-set-impact';
import { parseRulesFile, rulesToCsv } from './limit-set-file';
import { ruleName } from '@emberline/domain/verdict-words';

export function toLimitSetSummary(row: LimitSetRow): LimitSetSummary {
  return {
    id: row.id,
    modelId: row.modelId,
    revision: row.revision,
    title: row.title,
    status: row.status,
    manualReference: row.manualReference,
    effectiveDate: row.effectiveDate,
    invented: row.invented,
    ruleCount: row.ruleCount,
    basedOnId: row.basedOnId,
    publishedAt: row.publishedAt?.toISOString() ?? null,
    publishedByName: row.publishedByName,
    contentSha256: row.contentSha256,
    createdAt: row.createdAt.toISOString(),
  };
}

/** The content a publication signs: the revision and its rules, hashed as RFC 8785 JSON. */
export function limitSetContent(
  row: Pick<
    LimitSetRow,
    'modelId' | 'revision' | 'title' | 'manualReference' | 'effectiveDate' | 'invented'
  >,
  rules: readonly Rule[],
) {
  return {
    modelId: row.modelId,
    revision: row.revision,
    title: row.title,
    manualReference: row.manualReference,
    effectiveDate: row.effectiveDate,
    invented: row.invented,
    // A rule without a title hashes as it did before rules had titles, so that revisions
    // published then still verify.
    rules: rules.map(({ title, ...rest }) => (title ? { ...rest, title } : rest)),
  };
}

/** The limit library: staff read it (the route policy keeps customers out); engineers change drafts. */
export function createLimitSetsService(ctx: AppContext) {
  const { db } = ctx;

  function draft(id: string): LimitSetRow {
    const row = findLimitSet(db, id);
    if (!row) throw AppError.notFound('There is no such limit-set revision');
    if (row.status !== 'draft')
      throw AppError.conflict(
        'This revision is published or superseded and cannot change: copy it into a new draft instead.',
      );
    return row;
  }

  /** Rules checked against the model: a limit for every rule, units that fit, rows and zones it has. */
  function checkRules(modelId: string, rules: readonly Rule[]): void {
    const rows = listModelRows(db, modelId);
    validateRules(rules, new Set(rows.map((row) => row.key)));
    validateRuleZones(rules, new Map(rows.map((row) => [row.key, row.zones])));
  }

  /**
   * The draft as a limit-check would sign it, refused (422) when it cannot be checked yet or by
   * this engineer. Read before the password check, to refuse early, and again inside the signing
   * transaction, so that the signature covers what is there when it is written.
   */
  function checkable(principal: Principal, id: string) {
    const row = draft(id);
    if (!row.effectiveDate)
      throw AppError.unprocessable(
        'Give the draft its effective date before it is checked: the check covers it.',
        { fields: { effectiveDate: ['Give the effective date'] }, form: [] },
      );
    const rules = listRules(db, id);
    if (rules.length === 0)
      throw AppError.unprocessable('A revision without rules cannot be checked');
    checkRules(row.modelId, rules);
    const untitled = rules.filter((rule) => !rule.title).map((rule) => rule.id);
    if (untitled.length > 0)
      throw AppError.unprocessable(
        `Give every rule a short title before the check (people read rules by it): ${untitled.length === 1 ? 'rule' : 'rules'} ${untitled.slice(0, 10).join(', ')}${untitled.length > 10 ? ` and ${untitled.length - 10} more` : ''} ${untitled.length === 1 ? 'has' : 'have'} none.`,
      );
    if (editorsOf(row).includes(principal.user.id))
      throw AppError.unprocessable(
        'You made or changed this draft: another engineer checks it against the manual.',
      );
    return { row, rules };
  }

  /** The draft as publication would put it in force, refused (422) when it cannot be yet. */
  function publishable(id: string) {
    const row = draft(id);
    const rules = listRules(db, id);
    if (rules.length === 0)
      throw AppError.unprocessable('A revision without rules cannot be published');
    checkRules(row.modelId, rules);
    if (!row.effectiveDate)
      throw AppError.unprocessable(
        'Give the draft its effective date, have it checked, then publish.',
      );
    if (!currentCheck(row, rules))
      throw AppError.unprocessable(
        'This draft has no independent check of its present content: an engineer who did not make or change it signs the check first (any change clears it).',
      );
    return { row, rules };
  }

  /** Revision numbers are unique per model. */
  function refuseTakenRevision(modelId: string, revision: string, ownId: string | null): void {
    if (listLimitSets(db, modelId).some((row) => row.revision === revision && row.id !== ownId))
      throw AppError.unprocessable(`Revision ${revision} already exists for this engine model`, {
        fields: { revision: ['This revision already exists'] },
        form: [],
      });
  }

  /** The actions that change a draft: whoever did one may not check it, and one clears a check. */
  const editing = new Set([
    'limit-set.copied',
    'limit-set.particulars-changed',
    'limit-set.rules-replaced',
  ]);

  /** Who made the draft or changed it. */
  function editorsOf(row: LimitSetRow): string[] {
    const edits = listHistory(db, [{ entityType: 'limit-set', ids: [row.id] }]).filter((entry) =>
      editing.has(entry.action),
    );
    return [
      ...new Set(
        [row.createdBy, ...edits.map((entry) => entry.actorUserId)].filter((id): id is string =>
          Boolean(id),
        ),
      ),
    ];
  }

  /**
   * The check that stands for a revision as it is now: the latest limit-check signature, if it
   * covers the present content and (for a draft) no change was recorded after it.
   */
  function currentCheck(row: LimitSetRow, rules: readonly Rule[]) {
    const latest = signaturesOf(db, 'limit-check', row.id).at(-1);
    if (!latest) return null;
    const covered = (latest.content as { contentSha256?: string }).contentSha256;
    if (covered !== canonicalSha256(limitSetContent(row, rules))) return null;
    if (row.status === 'draft') {
      // The audit log's order, not the clock: a change after the check clears it.
      const history = listHistory(db, [{ entityType: 'limit-set', ids: [row.id] }]);
      let checkedAt = -1;
      history.forEach((entry, index) => {
        if (entry.action === 'limit-set.checked') checkedAt = index;
      });
      if (checkedAt === -1) return null;
      if (history.slice(checkedAt + 1).some((entry) => editing.has(entry.action))) return null;
    }
    return latest;
  }

  /** What a draft changes against the revision it was copied from, rule by rule. */
  function changesOf(row: LimitSetRow, rules: readonly Rule[]): RuleChange[] {
    if (!row.basedOnId) return [];
    const before = new Map(listRules(db, row.basedOnId).map((rule) => [rule.id, rule]));
    const after = new Map(rules.map((rule) => [rule.id, rule]));
    const changes: RuleChange[] = [];
    for (const rule of rules) {
      const old = before.get(rule.id);
      if (!old) {
        changes.push({ ruleId: rule.id, title: ruleName(rule), kind: 'added', fields: [] });
        continue;
      }
      const fields = [...new Set([...Object.keys(old), ...Object.keys(rule)])]
        .filter(
          (field) =>
            JSON.stringify(old[field as keyof Rule] ?? null) !==
            JSON.stringify(rule[field as keyof Rule] ?? null),
        )
        .map((field) => ({
          field,
          from: old[field as keyof Rule] ?? null,
          to: rule[field as keyof Rule] ?? null,
        }));
      if (fields.length)
        changes.push({ ruleId: rule.id, title: ruleName(rule), kind: 'changed', fields });
    }
    for (const rule of before.values())
      if (!after.has(rule.id))
        changes.push({ ruleId: rule.id, title: ruleName(rule), kind: 'removed', fields: [] });
    return changes;
  }

  return {
    list(modelId: string): LimitSetSummary[] {
      if (!findEngineModel(db, modelId)) throw AppError.notFound('There is no such engine model');
      return listLimitSets(db, modelId).map(toLimitSetSummary);
    },

    detail(id: string): LimitSet {
      const row = findLimitSet(db, id);
      if (!row) throw AppError.notFound('There is no such limit-set revision');
      const rules = listRules(db, id);
      const check = currentCheck(row, rules);
      return {
        ...toLimitSetSummary(row),
        rules,
        check: check ? { signerName: check.signer.name, signedAt: check.signedAt } : null,
        editorIds: row.status === 'draft' ? editorsOf(row) : [],
        changes: changesOf(row, rules),
        basedOnRevision: row.basedOnId ? (findLimitSet(db, row.basedOnId)?.revision ?? null) : null,
      };
    },

    /**
     * The independent check of a draft (DESIGN §5.5): an engineer who neither made nor changed it
     * signs that its rules, as they are now, were checked against the manual. Any later change
     * clears it; publication needs it.
     */
    async check(
      principal: Principal,
      id: string,
      password: string,
      meta: RequestMeta,
    ): Promise<LimitSet> {
      checkable(principal, id);
      await confirmPassword(ctx, principal, password, meta, 'signing the check needs it again');
      const now = ctx.now();
      inTransaction(db, (tx) => {
        // Read again inside the write: a change saved while the password was checked is seen.
        const { row, rules } = checkable(principal, id);
        const contentSha256 = canonicalSha256(limitSetContent(row, rules));
        const signature = appendSignature(ctx, tx, {
          kind: 'limit-check',
          subjectId: id,
          signer: {
            id: principal.user.id,
            name: principal.user.name,
            role: principal.user.role,
            authorisationRef: null,
          },
          content: limitCheckContent({
            limitSetId: id,
            modelId: row.modelId,
            revision: row.revision,
            contentSha256,
          }),
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'limit-set.checked',
          entityType: 'limit-set',
          entityId: id,
          after: { revision: row.revision, contentSha256, signatureSha256: signature.sha256 },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(id);
    },

    /** Changes a draft's revision number, title, manual reference or effective date. */
    updateParticulars(
      principal: Principal,
      id: string,
      input: ParsedLimitSetCopyInput,
      meta: RequestMeta,
    ): LimitSet {
      const row = draft(id);
      refuseTakenRevision(row.modelId, input.revision, id);
      const now = ctx.now();
      inTransaction(db, (tx) => {
        updateLimitSet(tx, id, input);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'limit-set.particulars-changed',
          entityType: 'limit-set',
          entityId: id,
          before: {
            revision: row.revision,
            title: row.title,
            manualReference: row.manualReference,
            effectiveDate: row.effectiveDate,
          },
          after: input,
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(id);
    },

    /** A new draft with the rules of an existing revision. */
    copy(
      principal: Principal,
      sourceId: string,
      input: ParsedLimitSetCopyInput,
      meta: RequestMeta,
    ): LimitSet {
      const source = findLimitSet(db, sourceId);
      if (!source) throw AppError.notFound('There is no such limit-set revision');
      refuseTakenRevision(source.modelId, input.revision, null);
      const id = newId();
      const now = ctx.now();
      const rules = listRules(db, sourceId);
      inTransaction(db, (tx) => {
        insertLimitSet(tx, {
          id,
          modelId: source.modelId,
          ...input,
          status: 'draft',
          // Copied limits stay marked as invented until an engineer replaces them.
          invented: source.invented,
          basedOnId: source.id,
          createdBy: principal.user.id,
          createdAt: now,
        });
        insertRules(tx, id, rules);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'limit-set.copied',
          entityType: 'limit-set',
          entityId: id,
          after: { from: source.id, revision: input.revision, rules: rules.length },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(id);
    },

    /** Replaces the rules of a draft, checked against the engine model first. */
    replaceRules(principal: Principal, id: string, rules: Rule[], meta: RequestMeta): LimitSet {
      const row = draft(id);
      checkRules(row.modelId, rules);
      const before = listRules(db, id);
      const now = ctx.now();
      inTransaction(db, (tx) => {
        replaceRules(tx, id, rules);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'limit-set.rules-replaced',
          entityType: 'limit-set',
          entityId: id,
          before: { rules: before },
          after: { rules },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(id);
    },

    /** What publishing the draft would change on the current findings of the model's engines. */
    impact(id: string): LimitSetImpact {
      const row = draft(id);
      const rules = listRules(db, id);
      checkRules(row.modelId, rules);
      const impact = limitSetImpact({
        limitSetId: id,
        modelRows: listModelRows(db, row.modelId),
        rules,
        revisions: new Map(listLimitSets(db, row.modelId).map((set) => [set.id, set.revision])),
        current: currentFindings(db, row.modelId),
      });
      const refs = findingRefs(db, impact.changes);
      return {
        ...impact,
        changes: impact.changes.map((change) => {
          const ref = refs.get(findingKey(change));
          return {
            ...change,
            findingId: ref?.id ?? '',
            before: { ...change.before, ruleId: ref?.ruleId ?? null },
          };
        }),
      };
    },

    /** The revision as a file: JSON in the contract's shape, or CSV one rule a line. */
    exportFile(id: string, format: LimitFileFormat): { name: string; type: string; body: string } {
      const set = this.detail(id);
      const base = `limits-${set.modelId}-${set.revision}`.replace(/[^A-Za-z0-9._-]+/g, '-');
      if (format === 'csv')
        return {
          name: `${base}.csv`,
          type: 'text/csv; charset=utf-8',
          body: rulesToCsv(set.rules),
        };
      const file = {
        revision: set.revision,
        title: set.title,
        manualReference: set.manualReference,
        effectiveDate: set.effectiveDate,
        invented: set.invented,
        rules: set.rules,
      };
      return {
        name: `${base}.json`,
        type: 'application/json; charset=utf-8',
        body: `${JSON.stringify(file, null, 2)}\n`,
      };
    },

    /**
     * Reads an import file against the draft's model: each rule taken, or refused with its line and
     * reason (the schema, then the model's rows, zones and units). Saves nothing.
     */
    previewImport(id: string, format: LimitFileFormat, bytes: Buffer): LimitImportPreview {
      const row = draft(id);
      const lines = parseRulesFile(format, bytes);
      const parsed = lines.filter((line) => line.rule);
      const problems = ruleProblems(
        parsed.map((line) => line.rule!),
        listModelRows(db, row.modelId),
      );
      const refusedByModel = new Map(
        parsed.flatMap((line, index) =>
          problems[index] ? [[line.line, problems[index]] as const] : [],
        ),
      );
      const accepted: LimitImportPreview['accepted'] = [];
      const refused: LimitImportPreview['refused'] = [];
      for (const line of lines) {
        const reason = line.reason ?? refusedByModel.get(line.line) ?? null;
        if (reason || !line.rule)
          refused.push({ line: line.line, text: line.text, reason: reason! });
        else accepted.push({ line: line.line, rule: line.rule });
      }
      if (lines.length === 0) refused.push({ line: 0, text: '', reason: 'the file has no rules' });
      return { format, accepted, refused, currentRuleCount: row.ruleCount };
    },

    /** Replaces the draft's rules with the file's, all or nothing: one refused line and none is taken. */
    importRules(
      principal: Principal,
      id: string,
      format: LimitFileFormat,
      bytes: Buffer,
      meta: RequestMeta,
    ): LimitSet {
      const preview = this.previewImport(id, format, bytes);
      if (preview.refused.length > 0) {
        const lines = preview.refused.map((line) =>
          line.line === 0
            ? line.reason
            : `${format === 'csv' ? 'line' : 'rule'} ${line.line}: ${line.reason}`,
        );
        throw AppError.unprocessable(
          `Nothing was imported: ${preview.refused.length} ${preview.refused.length === 1 ? 'entry is' : 'entries are'} refused (${lines.slice(0, 5).join('; ')}${lines.length > 5 ? '; …' : ''})`,
          { fields: {}, form: lines },
        );
      }
      return this.replaceRules(
        principal,
        id,
        preview.accepted.map((line) => line.rule),
        meta,
      );
    },

    /**
     * Puts a draft in force: the engineer's password again, the SHA-256 of the canonical JSON of
     * the revision recorded, the revision in force superseded, and every draft inspection of the
     * model's engines judged again against the new one; submitted and later ones keep their
     * revision and show that a newer one is in force.
     */
    async publish(
      principal: Principal,
      id: string,
      password: string,
      meta: RequestMeta,
    ): Promise<LimitSet> {
      publishable(id);
      await confirmPassword(ctx, principal, password, meta, 'publishing needs it again');
      const now = ctx.now();
      inTransaction(db, (tx) => {
        // Read again inside the write: a change saved while the password was checked is seen.
        const { row, rules } = publishable(id);
        const contentSha256 = canonicalSha256(limitSetContent(row, rules));
        const reopened = draftInspectionIds(tx, row.modelId);
        publishLimitSet(tx, id, row.modelId, { at: now, by: principal.user.id, contentSha256 });
        const signature = appendSignature(ctx, tx, {
          kind: 'publication',
          subjectId: id,
          signer: {
            id: principal.user.id,
            name: principal.user.name,
            role: principal.user.role,
            authorisationRef: null,
          },
          content: publicationContent({
            limitSetId: id,
            modelId: row.modelId,
            revision: row.revision,
            contentSha256,
          }),
        });
        for (const inspectionId of reopened) evaluateInspection(tx, inspectionId, now);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'limit-set.published',
          entityType: 'limit-set',
          entityId: id,
          after: {
            revision: row.revision,
            contentSha256,
            signatureSha256: signature.sha256,
            reevaluatedInspections: reopened.length,
          },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(id);
    },
  };
}
