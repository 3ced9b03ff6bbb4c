import { dayWords } from '@emberline/domain/dates';
import type { BeyondAction, FindingEvaluation } from '@emberline/contracts/limits';
import { permissionGrants } from '@emberline/contracts/permissions';
import type { AppContext } from '../../context';
import type { DbOrTx } from '../../db/client';
import { queueMail } from '../../lib/email/outbox';
import { publicOrigin } from '../auth/auth.service';
import { listFindings } from '../findings/findings.repository';
import { inspectionModelRows } from '../inspections/inspection-access';
import type { InspectionRow } from '../inspections/inspections.repository';
import { listActiveHomeUsers } from '../users/users.repository';
import { beyondLimitsAlertEmail, removalOrderedEmail } from './review-emails';
import { urgentNoticeEmail } from '../reports/report-emails';
import { contactsFor } from '../organisations/organisations.repository';

/**
 * Alerts the home organisation's reviewers, inside the submission's transaction, when a submitted
 * inspection holds a beyond-limits verdict: the message exists exactly when the submission does.
 */
export function alertBeyondLimits(
  ctx: Pick<AppContext, 'config' | 'now'>,
  tx: DbOrTx,
  inspection: InspectionRow,
  submittedBy: string,
): void {
  const beyond = listFindings(tx, inspection.id).filter(
    (finding) => finding.status === 'recorded' && finding.category === 'beyond-limits',
  );
  if (beyond.length === 0) return;
  const reviewers = listActiveHomeUsers(tx, permissionGrants['review:inspection']);
  if (reviewers.length === 0) return;
  const rows = new Map(inspectionModelRows(tx, inspection).map((row) => [row.key, row.label]));
  queueMail(ctx, tx, {
    kind: 'alert',
    ...beyondLimitsAlertEmail({
      to: reviewers.map((user) => user.email),
      engineSerialNumber: inspection.engineSerialNumber,
      inspectionDate: inspection.date,
      submittedBy,
      findings: beyond.map((finding) => ({
        number: finding.number,
        where: `${rows.get(finding.rowKey) ?? finding.rowKey} ${finding.position}, ${finding.zone.replace(/-/g, ' ')}`,
        action: (finding.evaluation as unknown as FindingEvaluation | null)?.beyondAction ?? null,
      })),
      link: `${publicOrigin(ctx.config.publicOrigins, ctx.config.port)}/review/${inspection.id}`,
    }),
    record: {
      type: 'inspection',
      id: inspection.id,
      label: `Inspection of ${inspection.engineSerialNumber} on ${dayWords(inspection.date)}`,
    },
  });
}

/**
 * Tells the planners, inside the outcome's transaction, that a signed outcome calls for removals.
 */
export function alertRemovalOrdered(
  ctx: Pick<AppContext, 'config' | 'now'>,
  tx: DbOrTx,
  inspection: InspectionRow,
  signedBy: string,
  removals: BeyondAction[],
): void {
  if (removals.length === 0) return;
  // Before the next flight: the owner's contacts for urgent notices hear of it at once.
  const grounding = removals.filter((action) => action.kind === 'remove-before-next-flight');
  const urgent = contactsFor(tx, inspection.organisationId, 'urgent');
  if (grounding.length > 0 && urgent.length > 0)
    queueMail(ctx, tx, {
      kind: 'urgent',
      ...urgentNoticeEmail({
        to: urgent.map((contact) => contact.email),
        engineSerialNumber: inspection.engineSerialNumber,
        inspectionDate: inspection.date,
        removals: grounding,
        link: `${publicOrigin(ctx.config.publicOrigins, ctx.config.port)}/fleet/${inspection.engineId}`,
      }),
      record: {
        type: 'inspection',
        id: inspection.id,
        label: `Inspection of ${inspection.engineSerialNumber} on ${dayWords(inspection.date)}`,
      },
    });
  const planners = listActiveHomeUsers(tx, permissionGrants['plan:inspection']);
  if (planners.length === 0) return;
  queueMail(ctx, tx, {
    kind: 'removal',
    ...removalOrderedEmail({
      to: planners.map((user) => user.email),
      engineSerialNumber: inspection.engineSerialNumber,
      inspectionDate: inspection.date,
      signedBy,
      removals,
      link: `${publicOrigin(ctx.config.publicOrigins, ctx.config.port)}/planning?state=overdue`,
    }),
    record: {
      type: 'inspection',
      id: inspection.id,
      label: `Inspection of ${inspection.engineSerialNumber} on ${dayWords(inspection.date)}`,
    },
  });
}
