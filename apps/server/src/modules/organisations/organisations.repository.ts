import { asc, count, desc, eq, and } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { engines, organisations, reportContacts } from '../../db/schema';

export type OrganisationRow = typeof organisations.$inferSelect;
export type ContactRow = typeof reportContacts.$inferSelect;

/** The organisations, the home one first, by name; a page of them when `page` is given. */
export function listOrganisations(
  db: DbOrTx,
  page?: { limit: number; offset: number },
): OrganisationRow[] {
  const ordered = db
    .select()
    .from(organisations)
    .orderBy(desc(organisations.kind), asc(organisations.name), asc(organisations.id));
  return page ? ordered.limit(page.limit).offset(page.offset).all() : ordered.all();
}

export function countOrganisations(db: DbOrTx): number {
  return db.select({ n: count() }).from(organisations).get()?.n ?? 0;
}

export function findOrganisation(db: DbOrTx, id: string): OrganisationRow | undefined {
  return db.select().from(organisations).where(eq(organisations.id, id)).get();
}

/** How names are compared for sameness: without regard to case or Unicode form. */
const sameName = (name: string) => name.normalize('NFKC').toLocaleLowerCase('en-GB');

/**
 * The organisation of that name, without regard to case ("Corvid Regional" and "corvid regional"
 * are one). Organisations are few: they are compared here, where the case folding is Unicode's.
 */
export function findOrganisationByName(db: DbOrTx, name: string): OrganisationRow | undefined {
  const wanted = sameName(name);
  return db
    .select()
    .from(organisations)
    .all()
    .find((organisation) => sameName(organisation.name) === wanted);
}

export function insertOrganisation(db: DbOrTx, row: typeof organisations.$inferInsert): void {
  db.insert(organisations).values(row).run();
}

export function renameOrganisation(db: DbOrTx, id: string, name: string): void {
  db.update(organisations).set({ name }).where(eq(organisations.id, id)).run();
}

export function countEnginesOf(db: DbOrTx, organisationId: string): number {
  return (
    db.select({ n: count() }).from(engines).where(eq(engines.organisationId, organisationId)).get()
      ?.n ?? 0
  );
}

export function listContacts(db: DbOrTx, organisationId: string): ContactRow[] {
  return db
    .select()
    .from(reportContacts)
    .where(eq(reportContacts.organisationId, organisationId))
    .orderBy(asc(reportContacts.name))
    .all();
}

export function findContact(
  db: DbOrTx,
  organisationId: string,
  id: string,
): ContactRow | undefined {
  return db
    .select()
    .from(reportContacts)
    .where(and(eq(reportContacts.organisationId, organisationId), eq(reportContacts.id, id)))
    .get();
}

export function findContactByEmail(
  db: DbOrTx,
  organisationId: string,
  email: string,
): ContactRow | undefined {
  return db
    .select()
    .from(reportContacts)
    .where(and(eq(reportContacts.organisationId, organisationId), eq(reportContacts.email, email)))
    .get();
}

export function insertContact(db: DbOrTx, row: typeof reportContacts.$inferInsert): void {
  db.insert(reportContacts).values(row).run();
}

export function deleteContact(db: DbOrTx, id: string): void {
  db.delete(reportContacts).where(eq(reportContacts.id, id)).run();
}

/** The contacts of an organisation that get reports, or urgent notices. */
export function contactsFor(
  db: DbOrTx,
  organisationId: string,
  purpose: 'reports' | 'urgent',
): ContactRow[] {
  return listContacts(db, organisationId).filter((contact) =>
    purpose === 'reports' ? contact.receivesReports : contact.receivesUrgent,
  );
}
