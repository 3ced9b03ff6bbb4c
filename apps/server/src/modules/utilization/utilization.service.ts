import { pageOfList, type PageQuery } from '@emberline/contracts/paging';
import type {
  UtilizationImportPreview,
  UtilizationListResponse,
  UtilizationRecord,
  UtilizationRecordInput,
} from '@emberline/contracts/fleet';
import { daysBetween } from '@emberline/domain/dates';
import { dailyUtilization, periodsOverlap } from '@emberline/domain/utilization';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction, type DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { newId } from '../../lib/ids';
import { appendAudit } from '../audit/audit.repository';
import { findEngineRow, updateEngine, type EngineListRow } from '../engines/engines.repository';
import { createEnginesService } from '../engines/engines.service';
import { parseUtilizationCsv } from './utilization-csv';
import { insertUtilization, listUtilization, type UtilizationRow } from './utilization.repository';
import { refreshDue } from '../planning/due-basis';
import { countWords, dayWords } from '@emberline/domain/dates';

type Period = Pick<UtilizationRecordInput, 'periodStart' | 'periodEnd'>;

const toRecord = (row: UtilizationRow): UtilizationRecord => ({
  id: row.id,
  periodStart: row.periodStart,
  periodEnd: row.periodEnd,
  cycles: row.cycles,
  hours: row.hours,
  source: row.source,
  createdAt: row.createdAt.toISOString(),
});

/**
 * Why a record cannot be taken, or null: a period in the future, more than 24 hours a day, a period
 * another record already covers, or one that straddles the date the engine's TSN and CSN were
 * given (increments after that date add to them; those before are already counted).
 */
export function refusal(
  record: UtilizationRecordInput,
  engine: Pick<EngineListRow, 'tsnCsnAsOf'>,
  taken: readonly Period[],
  today: string,
): string | null {
  if (record.periodEnd > today)
    return `the period ends in the future (${dayWords(record.periodEnd)})`;
  const days = daysBetween(record.periodStart, record.periodEnd) + 1;
  if (record.hours > 24 * days)
    return `${record.hours} hours is more than 24 hours a day over ${days} day${days === 1 ? '' : 's'}`;
  const clash = taken.find((other) => periodsOverlap(other, record));
  if (clash)
    return `the period overlaps the one recorded from ${dayWords(clash.periodStart)} to ${dayWords(clash.periodEnd)}`;
  if (record.periodStart <= engine.tsnCsnAsOf && record.periodEnd > engine.tsnCsnAsOf) {
    return `the period straddles ${dayWords(engine.tsnCsnAsOf)}, the date TSN and CSN were given: split it at that date`;
  }
  return null;
}

export function createUtilizationService(ctx: AppContext) {
  const { db } = ctx;
  const engines = createEnginesService(ctx);
  const today = () => ctx.now().toISOString().slice(0, 10);

  /** Saves records in one transaction; those after the TSN/CSN date add to TSN and CSN. */
  function save(
    tx: DbOrTx,
    principal: Principal,
    engine: EngineListRow,
    records: UtilizationRecordInput[],
    source: 'form' | 'csv',
    meta: RequestMeta,
  ): void {
    const now = ctx.now();
    insertUtilization(
      tx,
      records.map((record) => ({
        id: newId(),
        engineId: engine.id,
        ...record,
        source,
        createdBy: principal.user.id,
        createdAt: now,
      })),
    );
    const later = records.filter((record) => record.periodStart > engine.tsnCsnAsOf);
    if (later.length > 0) {
      const after = {
        tsn: engine.tsn + later.reduce((sum, record) => sum + record.hours, 0),
        csn: engine.csn + later.reduce((sum, record) => sum + record.cycles, 0),
        tsnCsnAsOf: later.reduce(
          (latest, record) => (record.periodEnd > latest ? record.periodEnd : latest),
          engine.tsnCsnAsOf,
        ),
      };
      updateEngine(tx, engine.id, after);
      appendAudit(tx, now, {
        actorUserId: principal.user.id,
        action: 'engine.tsn-csn-advanced',
        entityType: 'engine',
        entityId: engine.id,
        before: { tsn: engine.tsn, csn: engine.csn, tsnCsnAsOf: engine.tsnCsnAsOf },
        after,
        requestId: meta.requestId,
        ip: meta.ip,
      });
    }
    const first = records.reduce((a, b) => (b.periodStart < a.periodStart ? b : a));
    const last = records.reduce((a, b) => (b.periodEnd > a.periodEnd ? b : a));
    refreshDue(
      ctx,
      tx,
      { engineId: engine.id },
      `${principal.user.name} recorded utilization for ${dayWords(first.periodStart)} – ${dayWords(last.periodEnd)} (${countWords(records.reduce((sum, record) => sum + record.cycles, 0))} cycles, ${countWords(records.reduce((sum, record) => sum + record.hours, 0))} h), which changes the daily rates.`,
    );
    appendAudit(tx, now, {
      actorUserId: principal.user.id,
      action: `utilization.recorded-from-${source}`,
      entityType: 'engine',
      entityId: engine.id,
      after: { records },
      requestId: meta.requestId,
      ip: meta.ip,
    });
  }

  function preview(engine: EngineListRow, bytes: Buffer): UtilizationImportPreview {
    const taken: Period[] = listUtilization(db, engine.id);
    const result: UtilizationImportPreview = { accepted: [], refused: [] };
    for (const line of parseUtilizationCsv(bytes)) {
      const reason = line.reason ?? refusal(line.record!, engine, taken, today());
      if (reason) result.refused.push({ line: line.line, text: line.text.slice(0, 200), reason });
      else {
        result.accepted.push({ ...line.record!, line: line.line });
        taken.push(line.record!);
      }
    }
    return result;
  }

  return {
    list(
      principal: Principal,
      engineId: string,
      query: PageQuery = { page: 1, pageSize: 50 },
    ): UtilizationListResponse {
      engines.visibleEngine(principal, engineId);
      // A few records a month per engine: the daily utilization takes them all.
      const rows = listUtilization(db, engineId);
      return {
        ...pageOfList(rows.map(toRecord).reverse(), query),
        utilization: dailyUtilization(rows),
      };
    },

    add(
      principal: Principal,
      engineId: string,
      input: UtilizationRecordInput,
      meta: RequestMeta,
    ): UtilizationListResponse {
      inTransaction(db, (tx) => {
        const engine = findEngineRow(tx, engineId);
        if (!engine) throw AppError.notFound('There is no such engine');
        const reason = refusal(input, engine, listUtilization(tx, engineId), today());
        if (reason)
          throw AppError.unprocessable(`This input cannot be taken: ${reason}`, {
            form: [reason],
            fields: {},
          });
        save(tx, principal, engine, [input], 'form', meta);
      });
      return this.list(principal, engineId);
    },

    /** What an import would take and refuse, and why. Nothing is saved. */
    preview(principal: Principal, engineId: string, bytes: Buffer): UtilizationImportPreview {
      return preview(engines.visibleEngine(principal, engineId), bytes);
    },

    /** Imports the good lines of a file, checked again here whatever a preview said. */
    import(
      principal: Principal,
      engineId: string,
      bytes: Buffer,
      meta: RequestMeta,
    ): UtilizationImportPreview & { saved: number } {
      return inTransaction(db, (tx) => {
        const engine = findEngineRow(tx, engineId);
        if (!engine) throw AppError.notFound('There is no such engine');
        const result = preview(engine, bytes);
        if (result.accepted.length === 0)
          throw AppError.unprocessable('No line of the file can be taken; nothing was imported.', {
            refused: result.refused,
          });
        save(
          tx,
          principal,
          engine,
          result.accepted.map(({ line: _line, ...record }) => record),
          'csv',
          meta,
        );
        return { ...result, saved: result.accepted.length };
      });
    },
  };
}
