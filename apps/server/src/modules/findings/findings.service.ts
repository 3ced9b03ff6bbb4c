import type {
  CalibrationSnapshot,
  Finding,
  FindingListResponse,
  ParsedFindingInput,
  SeriesEntry,
} from '@emberline/contracts/findings';
import type { Category, FindingEvaluation } from '@emberline/contracts/limits';
import type { ImagePoint } from '@emberline/contracts/measurement';
import {
  assertShape,
  calibrationPoints,
  measure,
  pointsOffImage,
} from '@emberline/domain/measurement';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction, type DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import { seesInspection } from '../../http/record-access';
import type { Principal } from '../../http/principal';
import { newId } from '../../lib/ids';
import { appendAudit } from '../audit/audit.repository';
import { findImageMeta, type ImageMeta } from '../images/images.repository';
import { listCoverage } from '../coverage/coverage.repository';
import { coverageOf } from '../coverage/coverage.service';
import {
  draftInspection,
  inspectionModelRows,
  visibleInspection,
} from '../inspections/inspection-access';
import type { InspectionRow } from '../inspections/inspections.repository';
import {
  earlierFindings,
  findFinding,
  insertFinding,
  listFindings,
  listSuccessors,
  nextFindingNumber,
  seriesFindings,
  updateFinding,
  type FindingRecord,
  type FindingRow,
} from './findings.repository';
import { evaluateInspection, inspectionOutcome } from './inspection-evaluation';

/** A 422 that names the form field it is about, so that the form can show it there. */
function invalid(field: string, message: string): AppError {
  return AppError.unprocessable(message, { fields: { [field]: [message] }, form: [] });
}

export function toFinding(row: FindingRow): Finding {
  return {
    id: row.id,
    number: row.number,
    inspectionId: row.inspectionId,
    imageId: row.imageId,
    shape: row.shape,
    calibration: row.calibration as CalibrationSnapshot | null,
    pickUncertaintyPx: row.pickUncertaintyPx,
    row: row.rowKey,
    position: row.position,
    zone: row.zone,
    damage: row.damage as Finding['damage'],
    method: row.method,
    mmPerPx: row.mmPerPx,
    lengthMm: row.lengthMm,
    areaMm2: row.areaMm2,
    perimeterMm: row.perimeterMm,
    maxExtentMm: row.maxExtentMm,
    uncertaintyMm: row.uncertaintyMm,
    uncertaintyMm2: row.uncertaintyMm2,
    widthMm: row.widthMm,
    depthMm: row.depthMm,
    count: row.count,
    notes: row.notes,
    previousFindingId: row.previousFindingId,
    seriesId: row.seriesId,
    status: row.status,
    voidReason: row.voidReason,
    voidedAt: row.voidedAt?.toISOString() ?? null,
    evaluation: row.status === 'recorded' ? (row.evaluation as FindingEvaluation | null) : null,
    limitSetId: row.limitSetId,
    limitSetRevision: row.limitSetRevision,
    evaluatedAt: row.evaluatedAt?.toISOString() ?? null,
    createdByName: row.createdByName,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

type Measured = Pick<
  FindingRecord,
  | 'calibration'
  | 'mmPerPx'
  | 'lengthMm'
  | 'areaMm2'
  | 'perimeterMm'
  | 'maxExtentMm'
  | 'uncertaintyMm'
  | 'uncertaintyMm2'
>;

function assertInside(points: readonly ImagePoint[], image: ImageMeta, field: string): void {
  const problem = pointsOffImage(points, image.width, image.height);
  if (problem) throw invalid(field, problem);
}

/**
 * The measurements of a finding. Method `image`: computed here from the shape and the calibration
 * (DESIGN §5.1), whatever the client sent. Method `probe`: the values as entered, each with its
 * uncertainty. The calibration is kept as a snapshot with the size of the image it was made on.
 */
function measureFinding(db: DbOrTx, input: ParsedFindingInput, image: ImageMeta): Measured {
  assertShape(input.shape);
  assertInside(input.shape.points, image, 'shape');
  let snapshot: CalibrationSnapshot | null = null;
  if (input.calibration) {
    const sourceId = input.calibrationImageId ?? image.id;
    const source = sourceId === image.id ? image : findImageMeta(db, sourceId);
    if (!source || source.inspectionId !== image.inspectionId)
      throw invalid(
        'calibrationImageId',
        'The calibration comes from an image that is not in this inspection',
      );
    if (source.width !== image.width || source.height !== image.height)
      throw invalid(
        'calibration',
        `The calibration was made on an image of ${source.width}×${source.height} pixels and this one is ${image.width}×${image.height}: calibrate on this image, or reuse a calibration from an image of the same size`,
      );
    assertInside(calibrationPoints(input.calibration), image, 'calibration');
    snapshot = {
      calibration: input.calibration,
      imageId: source.id,
      imageWidth: source.width,
      imageHeight: source.height,
    };
  }
  const none = {
    mmPerPx: null,
    lengthMm: null,
    areaMm2: null,
    perimeterMm: null,
    maxExtentMm: null,
    uncertaintyMm: null,
    uncertaintyMm2: null,
  };
  if (input.method === 'probe') {
    const linear = input.lengthMm ?? input.widthMm ?? input.depthMm;
    if (linear !== null && input.uncertaintyMm === null)
      throw invalid(
        'uncertaintyMm',
        'Give the probe’s uncertainty (mm) for the values it measured',
      );
    if (input.areaMm2 !== null && input.uncertaintyMm2 === null)
      throw invalid(
        'uncertaintyMm2',
        'Give the probe’s uncertainty (mm²) for the area it measured',
      );
    return {
      ...none,
      calibration: snapshot,
      lengthMm: input.lengthMm,
      areaMm2: input.areaMm2,
      perimeterMm: input.perimeterMm,
      maxExtentMm: input.maxExtentMm,
      uncertaintyMm: input.uncertaintyMm,
      uncertaintyMm2: input.uncertaintyMm2,
    };
  }
  if (input.shape.kind === 'point') return { ...none, calibration: snapshot };
  if (!input.calibration)
    throw invalid(
      'calibration',
      `Calibrate the image first: a ${input.shape.kind} measured on the image needs a calibration`,
    );
  return {
    ...measure(input.calibration, input.shape, input.pickUncertaintyPx),
    calibration: snapshot,
  };
}

function auditView(
  finding: Pick<
    FindingRecord,
    | 'number'
    | 'rowKey'
    | 'position'
    | 'zone'
    | 'damage'
    | 'method'
    | 'lengthMm'
    | 'areaMm2'
    | 'widthMm'
    | 'depthMm'
    | 'count'
    | 'previousFindingId'
  >,
) {
  return {
    number: finding.number,
    row: finding.rowKey,
    position: finding.position,
    zone: finding.zone,
    damage: finding.damage,
    method: finding.method,
    lengthMm: finding.lengthMm,
    areaMm2: finding.areaMm2,
    widthMm: finding.widthMm,
    depthMm: finding.depthMm,
    count: finding.count,
    previousFindingId: finding.previousFindingId,
  };
}

export function createFindingsService(ctx: AppContext) {
  const { db } = ctx;

  /** Checks where a finding is and what it links to; returns its measurements and series. */
  function prepare(
    inspection: InspectionRow,
    input: ParsedFindingInput,
    self: FindingRecord | null,
  ): Measured & { seriesId: string | null } {
    const image = findImageMeta(db, input.imageId);
    if (!image || image.inspectionId !== inspection.id)
      throw invalid('imageId', 'The image is not in this inspection');
    if (!inspection.rows.includes(input.row))
      throw invalid('row', `The row ${input.row} is not listed for this inspection`);
    const row = inspectionModelRows(db, inspection).find(
      (candidate) => candidate.key === input.row,
    )!;
    if (input.position > row.count)
      throw invalid(
        'position',
        `Position ${input.position} is outside ${row.key}, which has positions 1 to ${row.count}`,
      );
    if (!row.zones.includes(input.zone))
      throw invalid(
        'zone',
        `${row.key} has no zone "${input.zone}"; its zones are ${row.zones.join(', ')}`,
      );
    const coverage = listCoverage(db, inspection.id).find((item) => item.rowKey === row.key);
    if (coverage?.noDamageFound)
      throw invalid(
        'row',
        `${row.key} is recorded as "no damage found"; change its coverage before recording a finding there`,
      );
    const measured = measureFinding(db, input, image);

    let seriesId: string | null = null;
    if (input.previousFindingId) {
      const previous = findFinding(db, input.previousFindingId);
      const earlier = previous
        ? earlierFindings(
            db,
            inspection.engineId,
            { inspectionId: inspection.id, date: inspection.date, createdAt: inspection.createdAt },
            { row: input.row, position: input.position, damage: input.damage },
          ).some((candidate) => candidate.finding.id === previous.id)
        : false;
      if (!previous || !earlier)
        throw invalid(
          'previousFindingId',
          'The linked finding must be the same damage (row, position and damage type) recorded in an earlier inspection of this engine',
        );
      const taken = listFindings(db, inspection.id).find(
        (finding) =>
          finding.status === 'recorded' &&
          finding.previousFindingId === previous.id &&
          finding.id !== self?.id,
      );
      if (taken)
        throw invalid(
          'previousFindingId',
          `F${taken.number} of this inspection already continues that finding`,
        );
      seriesId = previous.seriesId;
    }
    return { ...measured, seriesId };
  }

  /** Gives a finding's successors (in later inspections) the series of the finding they continue. */
  function relinkSeries(tx: DbOrTx, findingId: string, seriesId: string): void {
    const queue = [findingId];
    while (queue.length > 0) {
      const id = queue.shift()!;
      for (const next of listSuccessors(tx, id)) {
        updateFinding(tx, next.id, { seriesId });
        queue.push(next.id);
      }
    }
  }

  function editableFinding(
    principal: Principal,
    id: string,
  ): { finding: FindingRow; inspection: InspectionRow } {
    const finding = findFinding(db, id);
    if (!finding) throw AppError.notFound('There is no such finding');
    const inspection = draftInspection(db, principal, finding.inspectionId);
    if (finding.status === 'void')
      throw AppError.conflict('This finding is void and cannot change');
    return { finding, inspection };
  }

  function visibleFinding(principal: Principal, id: string): FindingRow {
    const finding = findFinding(db, id);
    if (!finding) throw AppError.notFound('There is no such finding');
    visibleInspection(db, principal, finding.inspectionId, 'There is no such finding');
    return finding;
  }

  const service = {
    list(principal: Principal, inspectionId: string): FindingListResponse {
      const inspection = visibleInspection(db, principal, inspectionId);
      return {
        items: listFindings(db, inspectionId).map(toFinding),
        outcome: inspectionOutcome(
          db,
          inspectionId,
          coverageOf(db, inspection, inspectionModelRows(db, inspection)),
        ),
      };
    },

    detail(principal: Principal, id: string): Finding {
      return toFinding(visibleFinding(principal, id));
    },

    record(
      principal: Principal,
      inspectionId: string,
      input: ParsedFindingInput,
      meta: RequestMeta,
    ): Finding {
      const inspection = draftInspection(db, principal, inspectionId);
      const prepared = prepare(inspection, input, null);
      const id = newId();
      const now = ctx.now();
      inTransaction(db, (tx) => {
        const number = nextFindingNumber(tx, inspectionId);
        const record = {
          id,
          inspectionId,
          number,
          imageId: input.imageId,
          shape: input.shape,
          pickUncertaintyPx: input.pickUncertaintyPx,
          rowKey: input.row,
          position: input.position,
          zone: input.zone,
          damage: input.damage,
          method: input.method,
          ...prepared,
          calibration: prepared.calibration,
          widthMm: input.widthMm,
          depthMm: input.depthMm,
          count: input.count,
          notes: input.notes,
          previousFindingId: input.previousFindingId,
          seriesId: prepared.seriesId ?? id,
          status: 'recorded' as const,
          createdBy: principal.user.id,
          createdAt: now,
          updatedAt: now,
        };
        insertFinding(tx, record);
        evaluateInspection(tx, inspectionId, now);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'finding.recorded',
          entityType: 'finding',
          entityId: id,
          after: { inspectionId, ...auditView(record), category: findFinding(tx, id)!.category },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return toFinding(findFinding(db, id)!);
    },

    update(
      principal: Principal,
      id: string,
      input: ParsedFindingInput,
      meta: RequestMeta,
    ): Finding {
      const { finding, inspection } = editableFinding(principal, id);
      const prepared = prepare(inspection, input, finding);
      const now = ctx.now();
      const seriesId = prepared.seriesId ?? finding.id;
      inTransaction(db, (tx) => {
        const changes = {
          imageId: input.imageId,
          shape: input.shape,
          pickUncertaintyPx: input.pickUncertaintyPx,
          rowKey: input.row,
          position: input.position,
          zone: input.zone,
          damage: input.damage,
          method: input.method,
          ...prepared,
          widthMm: input.widthMm,
          depthMm: input.depthMm,
          count: input.count,
          notes: input.notes,
          previousFindingId: input.previousFindingId,
          seriesId,
          updatedAt: now,
        };
        updateFinding(tx, id, changes);
        if (seriesId !== finding.seriesId) relinkSeries(tx, id, seriesId);
        evaluateInspection(tx, inspection.id, now);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'finding.updated',
          entityType: 'finding',
          entityId: id,
          before: { ...auditView(finding), category: finding.category },
          after: {
            ...auditView({ ...changes, number: finding.number }),
            category: findFinding(tx, id)!.category,
          },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return toFinding(findFinding(db, id)!);
    },

    /** A finding recorded by mistake is voided with a reason, never deleted; the rest are judged again. */
    void(principal: Principal, id: string, reason: string, meta: RequestMeta): Finding {
      const { finding, inspection } = editableFinding(principal, id);
      const now = ctx.now();
      inTransaction(db, (tx) => {
        updateFinding(tx, id, {
          status: 'void',
          voidReason: reason,
          voidedAt: now,
          voidedBy: principal.user.id,
          evaluation: null,
          category: null,
          updatedAt: now,
        });
        evaluateInspection(tx, inspection.id, now);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'finding.voided',
          entityType: 'finding',
          entityId: id,
          before: { status: 'recorded', category: finding.category },
          after: { status: 'void', reason },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return toFinding(findFinding(db, id)!);
    },

    /** Earlier findings of the same engine that may be this damage seen again (same row, position, damage). */
    seriesCandidates(
      principal: Principal,
      inspectionId: string,
      match: { row: string; position: number; zone?: string; damage: string },
    ): SeriesEntry[] {
      const inspection = visibleInspection(db, principal, inspectionId);
      return earlierFindings(
        db,
        inspection.engineId,
        { inspectionId, date: inspection.date, createdAt: inspection.createdAt },
        match,
      ).map(toSeriesEntry);
    },

    /** The damage series a finding belongs to, oldest first: how the damage has grown. */
    series(principal: Principal, id: string): SeriesEntry[] {
      const finding = visibleFinding(principal, id);
      // One engine's series: its inspections share the organisation of this one.
      const { organisationId } = visibleInspection(db, principal, finding.inspectionId);
      return seriesFindings(db, finding.seriesId)
        .filter((entry) =>
          seesInspection(principal, {
            organisationId,
            releaseRevision: entry.inspection.releaseRevision,
          }),
        )
        .map(toSeriesEntry);
    },
  };
  return service;
}

function toSeriesEntry(entry: {
  finding: FindingRecord;
  inspection: { id: string; date: string; csn: number; tsn: number };
}): SeriesEntry {
  const { finding, inspection } = entry;
  return {
    findingId: finding.id,
    number: finding.number,
    inspectionId: inspection.id,
    inspectionDate: inspection.date,
    csn: inspection.csn,
    tsn: inspection.tsn,
    row: finding.rowKey,
    position: finding.position,
    zone: finding.zone,
    damage: finding.damage as SeriesEntry['damage'],
    lengthMm: finding.lengthMm,
    areaMm2: finding.areaMm2,
    depthMm: finding.depthMm,
    uncertaintyMm: finding.uncertaintyMm,
    uncertaintyMm2: finding.uncertaintyMm2,
    category: (finding.category as Category | null) ?? null,
    seriesId: finding.seriesId,
  };
}
