import type { EngineDue } from '@emberline/contracts/planning';
import { decisionSchema } from '@emberline/contracts/review';
import { dueStatus, type DueInspection } from '@emberline/domain/due-status';
import type { outcomeContent, releaseContent } from '@emberline/domain/signature-content';
import type { AppContext } from '../../context';
import type { DbOrTx } from '../../db/client';
import type { Principal } from '../../http/principal';
import { findEngineModel, listModelRows } from '../engine-models/engine-models.repository';
import type { EngineListRow } from '../engines/engines.repository';
import { createEnginesService } from '../engines/engines.service';
import { listUtilization } from '../utilization/utilization.repository';
import {
  coverageOfInspections,
  findingPlaces,
  outcomeSignaturesOf,
  signaturesById,
  signedInspections,
} from './planning.repository';

type OutcomeContent = ReturnType<typeof outcomeContent>;
type ReleaseContent = ReturnType<typeof releaseContent>;

/** "Today" in the installation's time zone, as `YYYY-MM-DD`. */
export function todayIn(timeZone: string, now: Date): string {
  return new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(now);
}

/**
 * The inspections of an engine with the decisions their counting outcome signed: the current
 * outcome, or, while a correction after release waits, the outcome of the latest release.
 */
function dueInspections(db: DbOrTx, engineId: string): DueInspection[] {
  const rows = signedInspections(db, engineId);
  const releases = new Map(
    signaturesById(
      db,
      rows.flatMap((row) => (row.releaseSignatureId ? [row.releaseSignatureId] : [])),
    ).map((signature) => [signature.subjectId, signature]),
  );
  const outcomes = outcomeSignaturesOf(
    db,
    rows.map((row) => row.id),
  );
  const counting = rows.flatMap((row) => {
    const release = releases.get(row.id);
    const outcome = row.outcomeSignatureId
      ? outcomes.find((signature) => signature.id === row.outcomeSignatureId)
      : outcomes.find(
          (signature) =>
            signature.sha256 ===
            (release?.content as ReleaseContent | undefined)?.outcomeSignatureSha256,
        );
    return outcome ? [{ row, outcome, content: outcome.content as OutcomeContent }] : [];
  });
  const places = new Map(
    findingPlaces(
      db,
      counting.flatMap((item) => item.content.dispositions.map((entry) => entry.findingId)),
    ).map((place) => [place.id, place]),
  );
  const coverage = coverageOfInspections(
    db,
    counting.map((item) => item.row.id),
  );
  return counting.map(({ row, outcome, content }) => ({
    id: row.id,
    date: row.date,
    csn: row.csn,
    tsn: row.tsn,
    outcomeSignedAt: outcome.signedAt,
    coverage: coverage
      .filter((item) => item.inspectionId === row.id)
      .map((item) => ({
        row: item.row,
        status: item.status,
        viewedPositions: item.viewedPositions,
      })),
    decisions: content.dispositions.flatMap((entry) => {
      const place = places.get(entry.findingId);
      return place
        ? [
            {
              findingId: entry.findingId,
              seriesId: place.seriesId,
              row: place.row,
              position: place.position,
              decision: decisionSchema.parse(entry.decision),
            },
          ]
        : [];
    }),
  }));
}

export function createPlanningService(ctx: AppContext) {
  const { db, config } = ctx;
  const engines = createEnginesService(ctx);

  /** The due status of an engine the caller may see (DESIGN §5.6), computed when read. */
  function due(engine: EngineListRow): EngineDue {
    const model = findEngineModel(db, engine.modelId)!;
    const baseline = engine.shopRelease
      ? { kind: 'shop-release' as const, ...engine.shopRelease }
      : engine.preFleetInspection
        ? { kind: 'pre-fleet' as const, ...engine.preFleetInspection }
        : null;
    return {
      ...dueStatus({
        today: todayIn(config.timeZone, ctx.now()),
        rows: listModelRows(db, engine.modelId),
        standardInterval: model.standardInterval ?? null,
        engine: {
          status: engine.status,
          csn: engine.csn,
          tsn: engine.tsn,
          tsnCsnAsOf: engine.tsnCsnAsOf,
          baseline,
        },
        utilization: listUtilization(db, engine.id),
        inspections: dueInspections(db, engine.id),
        awaitingBeyondLimits: Boolean(engine.awaitingBeyondLimits),
        soon: config.dueSoon,
      }),
      trendWarnings: [],
      booking: null,
    };
  }

  return {
    engineDue(principal: Principal, engineId: string): EngineDue {
      return due(engines.visibleEngine(principal, engineId));
    },
  };
}
