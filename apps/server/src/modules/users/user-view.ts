import type { SessionUser } from '@emberline/contracts/auth';
import type { User, UserStatus } from '@emberline/contracts/users';
import type { UserWithOrganisation } from './users.repository';

export function userStatus(
  row: Pick<UserWithOrganisation, 'disabledAt' | 'passwordHash'>,
): UserStatus {
  if (row.disabledAt) return 'disabled';
  return row.passwordHash ? 'active' : 'invited';
}

/** The contract's view of a user: the hash and other internals never leave the server. */
export function toUser(row: UserWithOrganisation & { activeSessions?: number }): User {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    organisationId: row.organisationId,
    organisationName: row.organisationName,
    status: userStatus(row),
    activeSessions: row.activeSessions ?? 0,
    lastSignInAt: row.lastSignInAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
    authorisation: row.authorisation,
    qualification: row.qualification,
  };
}

export function toSessionUser(row: UserWithOrganisation): SessionUser {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    organisationId: row.organisationId,
    organisationName: row.organisationName,
  };
}
