import { offsetOf, type Page, type PageQuery } from '@emberline/contracts/paging';
import type {
  Contact,
  ParsedContactInput,
  Organisation,
  OrganisationDetail,
  OrganisationInput,
} from '@emberline/contracts/organisations';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { newId } from '../../lib/ids';
import { appendAudit } from '../audit/audit.repository';
import {
  countEnginesOf,
  deleteContact,
  findContact,
  findContactByEmail,
  findOrganisation,
  findOrganisationByName,
  insertContact,
  insertOrganisation,
  listContacts,
  countOrganisations,
  listOrganisations,
  renameOrganisation,
  type ContactRow,
  type OrganisationRow,
} from './organisations.repository';

const toOrganisation = ({ id, name, kind }: OrganisationRow): Organisation => ({ id, name, kind });
const toContact = (row: ContactRow): Contact => ({
  id: row.id,
  name: row.name,
  email: row.email,
  role: row.role,
  receivesReports: row.receivesReports,
  receivesUrgent: row.receivesUrgent,
  createdAt: row.createdAt.toISOString(),
});

export function createOrganisationsService(ctx: AppContext) {
  const { db } = ctx;

  function mustFind(id: string): OrganisationRow {
    const organisation = findOrganisation(db, id);
    if (!organisation) throw AppError.notFound('There is no such organisation');
    return organisation;
  }

  function assertNameFree(name: string, exceptId?: string) {
    const other = findOrganisationByName(db, name);
    if (other && other.id !== exceptId) {
      throw AppError.conflict(`There is already an organisation called ${name}`, {
        fields: { name: ['That name is taken'] },
        form: [],
      });
    }
  }

  const audit = (
    principal: Principal,
    meta: RequestMeta,
    action: string,
    entityId: string,
    before: unknown,
    after: unknown,
  ) => ({
    actorUserId: principal.user.id,
    action,
    entityType: 'organisation',
    entityId,
    before,
    after,
    requestId: meta.requestId,
    ip: meta.ip,
  });

  return {
    list(query: PageQuery): Page<Organisation> {
      return {
        items: listOrganisations(db, { limit: query.pageSize, offset: offsetOf(query) }).map(
          toOrganisation,
        ),
        total: countOrganisations(db),
        ...query,
      };
    },

    detail(id: string): OrganisationDetail {
      const organisation = mustFind(id);
      return {
        ...toOrganisation(organisation),
        contacts: listContacts(db, id).map(toContact),
        engineCount: countEnginesOf(db, id),
      };
    },

    /** New organisations are customers: there is one home organisation, made at installation. */
    create(principal: Principal, input: OrganisationInput, meta: RequestMeta): OrganisationDetail {
      const id = newId();
      const now = ctx.now();
      inTransaction(db, (tx) => {
        assertNameFree(input.name);
        insertOrganisation(tx, { id, name: input.name, kind: 'customer', createdAt: now });
        appendAudit(
          tx,
          now,
          audit(principal, meta, 'organisation.created', id, null, {
            name: input.name,
            kind: 'customer',
          }),
        );
      });
      return this.detail(id);
    },

    rename(
      principal: Principal,
      id: string,
      input: OrganisationInput,
      meta: RequestMeta,
    ): OrganisationDetail {
      const before = mustFind(id);
      const now = ctx.now();
      inTransaction(db, (tx) => {
        assertNameFree(input.name, id);
        renameOrganisation(tx, id, input.name);
        appendAudit(
          tx,
          now,
          audit(
            principal,
            meta,
            'organisation.renamed',
            id,
            { name: before.name },
            { name: input.name },
          ),
        );
      });
      return this.detail(id);
    },

    addContact(
      principal: Principal,
      id: string,
      input: ParsedContactInput,
      meta: RequestMeta,
    ): Contact {
      mustFind(id);
      const contactId = newId();
      const now = ctx.now();
      inTransaction(db, (tx) => {
        if (findContactByEmail(tx, id, input.email)) {
          throw AppError.conflict(`${input.email} is already a contact of this organisation`, {
            fields: { email: ['Already a contact'] },
            form: [],
          });
        }
        insertContact(tx, { id: contactId, organisationId: id, ...input, createdAt: now });
        appendAudit(tx, now, {
          ...audit(principal, meta, 'contact.added', contactId, null, {
            organisationId: id,
            ...input,
          }),
          entityType: 'report-contact',
        });
      });
      return toContact(findContact(db, id, contactId)!);
    },

    removeContact(principal: Principal, id: string, contactId: string, meta: RequestMeta): void {
      mustFind(id);
      const contact = findContact(db, id, contactId);
      if (!contact) throw AppError.notFound('There is no such contact');
      const now = ctx.now();
      inTransaction(db, (tx) => {
        deleteContact(tx, contactId);
        appendAudit(tx, now, {
          ...audit(principal, meta, 'contact.removed', contactId, toContact(contact), null),
          entityType: 'report-contact',
        });
      });
    },
  };
}
