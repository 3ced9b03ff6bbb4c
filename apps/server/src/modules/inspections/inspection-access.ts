import type { EngineModelRow } from '@emberline/contracts/fleet';
import type { DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { seesInspection } from '../../http/record-access';
import { listModelRows } from '../engine-models/engine-models.repository';
import { findEngineRow } from '../engines/engines.repository';
import { findInspection, type InspectionRow } from './inspections.repository';

/**
 * The inspection when the caller may see it: staff see every one, customers only released
 * inspections of their own organisation's engines. Anything else is 404, never the record.
 */
export function visibleInspection(
  db: DbOrTx,
  principal: Principal,
  id: string,
  /** What a 404 says: for a record of the inspection, what an unknown id of that record says. */
  missing = 'There is no such inspection',
): InspectionRow {
  const inspection = findInspection(db, id);
  if (!inspection || !seesInspection(principal, inspection)) throw AppError.notFound(missing);
  return inspection;
}

/** An inspection whose images and findings may still change: a draft. */
export function draftInspection(db: DbOrTx, principal: Principal, id: string): InspectionRow {
  const inspection = visibleInspection(db, principal, id);
  if (inspection.state === 'void')
    throw AppError.conflict(
      `This inspection was voided (${inspection.voidReason ?? 'no reason kept'}): it takes no more changes.`,
    );
  if (inspection.state !== 'draft') {
    throw AppError.conflict(
      'This inspection has been submitted for review and is locked; an engineer can send it back to draft.',
    );
  }
  return inspection;
}

/** The rows of the engine model an inspection's engine is of. */
export function inspectionModelRows(db: DbOrTx, inspection: InspectionRow): EngineModelRow[] {
  return listModelRows(db, findEngineRow(db, inspection.engineId)!.modelId);
}
