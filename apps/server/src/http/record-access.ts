import { can } from '@emberline/contracts/permissions';
import type { Principal } from './principal';

/**
 * The one record-level access rule (the customer tenancy rule), on top of the route's permission:
 * a caller holding `read:all-organisations` sees every record; anyone else sees only their own
 * organisation's engines, and of its inspections only those released at least once (a
 * correction after release keeps the earlier release in view until the next one). A record the caller may
 * not see answers 404, never the record.
 */
export interface RecordScope {
  /** Only records of this organisation; null for every organisation. */
  organisationId: string | null;
  /** Only released inspections (and what belongs to them). */
  releasedOnly: boolean;
}

/** The scope of the caller's lists: a repository filter. */
export function recordScope(principal: Principal): RecordScope {
  return can(principal.user.role, 'read:all-organisations')
    ? { organisationId: null, releasedOnly: false }
    : { organisationId: principal.user.organisationId, releasedOnly: true };
}

/** Whether the caller may see an engine (or another record of an organisation). */
export function seesOrganisationRecord(
  principal: Principal,
  record: { organisationId: string },
): boolean {
  const scope = recordScope(principal);
  return scope.organisationId === null || scope.organisationId === record.organisationId;
}

/** Whether the caller may see an inspection, and what belongs to it (images, findings, reports). */
export function seesInspection(
  principal: Principal,
  inspection: { organisationId: string; releaseRevision: number },
): boolean {
  const scope = recordScope(principal);
  return (
    seesOrganisationRecord(principal, inspection) &&
    (!scope.releasedOnly || inspection.releaseRevision > 0)
  );
}
