import { offsetOf, type Page, type PageQuery } from '@emberline/contracts/paging';
import { can, organisationKindOf } from '@emberline/contracts/permissions';
import { roleLabels, type Role } from '@emberline/contracts/roles';
import type {
  CredentialsInput,
  InviteUserInput,
  InviteUserResponse,
  UpdateUserInput,
  User,
} from '@emberline/contracts/users';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction, type DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { queueMail } from '../../lib/email/outbox';
import { newId } from '../../lib/ids';
import { appendAudit } from '../audit/audit.repository';
import { invitationEmail } from '../auth/auth-emails';
import { publicOrigin } from '../auth/auth.service';
import { revokeUserSessions } from '../auth/sessions.repository';
import { issueUserToken } from '../auth/user-tokens.service';
import { findEngineModel } from '../engine-models/engine-models.repository';
import { findOrganisation, type OrganisationRow } from '../organisations/organisations.repository';
import {
  countUsers,
  findUserByEmail,
  findUserById,
  insertUser,
  listUsersWithSessionCounts,
  updateUser,
  type UserWithOrganisation,
} from './users.repository';
import { toUser, userStatus } from './user-view';

function auditView(user: UserWithOrganisation) {
  return {
    email: user.email,
    name: user.name,
    role: user.role,
    organisationId: user.organisationId,
    status: userStatus(user),
  };
}

/** Customers belong to a customer organisation; every other role to the home organisation. */
function assertRoleFitsOrganisation(
  role: Role,
  organisation: OrganisationRow | undefined,
): OrganisationRow {
  if (!organisation) {
    throw AppError.unprocessable('That organisation does not exist', {
      fields: { organisationId: ['Choose an organisation from the list'] },
      form: [],
    });
  }
  const kind = organisationKindOf(role);
  if (organisation.kind !== kind) {
    const message =
      kind === 'home'
        ? `A ${role} belongs to the home organisation, not to the customer ${organisation.name}`
        : `A customer user belongs to a customer organisation, not to ${organisation.name}`;
    throw AppError.unprocessable(message, { fields: { organisationId: [message] }, form: [] });
  }
  return organisation;
}

export function createUsersService(ctx: AppContext) {
  const { db, config } = ctx;

  function mustFind(id: string): UserWithOrganisation {
    const user = findUserById(db, id);
    if (!user) throw AppError.notFound('There is no such user');
    return user;
  }

  /** Queues the invitation e-mail with the link, in the transaction that issued its token. */
  function queueInvitation(
    tx: DbOrTx,
    user: { id: string; email: string; name: string; role: Role; organisationName: string },
    invitedBy: string,
    token: string,
  ): string {
    const link = `${publicOrigin(config.publicOrigins, config.port)}/accept-invitation#token=${token}`;
    return queueMail(ctx, tx, {
      kind: 'invitation',
      ...invitationEmail({
        to: user.email,
        name: user.name,
        role: user.role,
        organisationName: user.organisationName,
        invitedBy,
        link,
      }),
      record: { type: 'user', id: user.id, label: `Invitation of ${user.name}` },
    });
  }

  return {
    list(query: PageQuery): Page<User> {
      return {
        items: listUsersWithSessionCounts(db, ctx.now(), {
          limit: query.pageSize,
          offset: offsetOf(query),
        }).map(toUser),
        total: countUsers(db),
        ...query,
      };
    },

    invite(principal: Principal, input: InviteUserInput, meta: RequestMeta): InviteUserResponse {
      const organisation = assertRoleFitsOrganisation(
        input.role,
        findOrganisation(db, input.organisationId),
      );
      const now = ctx.now();
      const id = newId();
      const mailId = inTransaction(db, (tx) => {
        if (findUserByEmail(tx, input.email)) {
          throw AppError.conflict('That e-mail address already has an account', {
            fields: { email: ['That e-mail address already has an account'] },
            form: [],
          });
        }
        insertUser(tx, {
          id,
          email: input.email,
          name: input.name,
          role: input.role,
          organisationId: input.organisationId,
          createdAt: now,
        });
        const secret = issueUserToken(tx, id, 'invitation', now);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'user.invited',
          entityType: 'user',
          entityId: id,
          after: {
            email: input.email,
            name: input.name,
            role: input.role,
            organisationId: input.organisationId,
          },
          requestId: meta.requestId,
          ip: meta.ip,
        });
        return queueInvitation(
          tx,
          { ...input, id, organisationName: organisation.name },
          principal.user.name,
          secret,
        );
      });
      return { user: toUser(mustFind(id)), mailId };
    },

    resendInvitation(principal: Principal, id: string, meta: RequestMeta): InviteUserResponse {
      const user = mustFind(id);
      if (userStatus(user) !== 'invited')
        throw AppError.conflict('This user has already accepted the invitation or is disabled');
      const now = ctx.now();
      const mailId = inTransaction(db, (tx) => {
        const secret = issueUserToken(tx, id, 'invitation', now);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'user.invitation-resent',
          entityType: 'user',
          entityId: id,
          requestId: meta.requestId,
          ip: meta.ip,
        });
        return queueInvitation(tx, user, principal.user.name, secret);
      });
      return { user: toUser(user), mailId };
    },

    /**
     * Records an engineer's authorisation to sign and an inspector's qualification. Set by an
     * administrator other than their holder: nobody grants themselves the authority to sign.
     */
    setCredentials(
      principal: Principal,
      id: string,
      input: CredentialsInput,
      meta: RequestMeta,
    ): User {
      const before = mustFind(id);
      if (before.id === principal.user.id)
        throw AppError.forbidden(
          'Your own authorisation and qualification are recorded by another administrator.',
        );
      const refuse = (field: string, message: string) =>
        AppError.unprocessable(message, { fields: { [field]: [message] }, form: [] });
      if (input.authorisation && !can(before.role, 'review:inspection'))
        throw refuse(
          'authorisation',
          `A ${roleLabels[before.role].toLowerCase()} does not sign dispositions: an authorisation is for engineers.`,
        );
      if (input.qualification && !can(before.role, 'create:inspection'))
        throw refuse(
          'qualification',
          `A ${roleLabels[before.role].toLowerCase()} does not inspect: a qualification is for inspectors.`,
        );
      const unknown = input.authorisation?.models.find((model) => !findEngineModel(db, model));
      if (unknown)
        throw refuse('authorisation', `There is no engine model "${unknown}" to authorise.`);
      const now = ctx.now();
      inTransaction(db, (tx) => {
        updateUser(tx, id, {
          authorisation: input.authorisation,
          qualification: input.qualification,
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'user.credentials-changed',
          entityType: 'user',
          entityId: id,
          before: { authorisation: before.authorisation, qualification: before.qualification },
          after: input,
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return toUser(mustFind(id));
    },

    update(principal: Principal, id: string, input: UpdateUserInput, meta: RequestMeta): User {
      const before = mustFind(id);
      const self = before.id === principal.user.id;
      if (self && input.disabled)
        throw AppError.unprocessable('You cannot disable your own account');
      if (self && input.role && input.role !== before.role) {
        throw AppError.unprocessable('You cannot change your own role; ask another administrator');
      }
      const role = input.role ?? before.role;
      const organisationId = input.organisationId ?? before.organisationId;
      if (input.role || input.organisationId)
        assertRoleFitsOrganisation(role, findOrganisation(db, organisationId));
      const now = ctx.now();
      inTransaction(db, (tx) => {
        const disabledAt =
          input.disabled === undefined
            ? before.disabledAt
            : input.disabled
              ? (before.disabledAt ?? now)
              : null;
        updateUser(tx, id, { name: input.name ?? before.name, role, organisationId, disabledAt });
        if (disabledAt && !before.disabledAt) revokeUserSessions(tx, id, now, 'account-disabled');
        // Moving a user to another organisation ends their sessions: what they may see changes.
        if (organisationId !== before.organisationId)
          revokeUserSessions(tx, id, now, 'organisation-changed');
        const after = findUserById(tx, id);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'user.updated',
          entityType: 'user',
          entityId: id,
          before: auditView(before),
          after: after ? auditView(after) : null,
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      const [refreshed] = listUsersWithSessionCounts(db, now, { id });
      return toUser(refreshed ?? mustFind(id));
    },

    endSessions(principal: Principal, id: string, meta: RequestMeta): { ended: number } {
      mustFind(id);
      const now = ctx.now();
      const ended = inTransaction(db, (tx) => {
        const count = revokeUserSessions(tx, id, now, 'ended-by-admin');
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'user.sessions-ended',
          entityType: 'user',
          entityId: id,
          after: { ended: count },
          requestId: meta.requestId,
          ip: meta.ip,
        });
        return count;
      });
      return { ended };
    },
  };
}
