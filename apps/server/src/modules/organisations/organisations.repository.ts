import { asc, desc, eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { organisations } from '../../db/schema';

export type OrganisationRow = typeof organisations.$inferSelect;

export function listOrganisations(db: DbOrTx): OrganisationRow[] {
  return db
    .select()
    .from(organisations)
    .orderBy(desc(organisations.kind), asc(organisations.name))
    .all();
}

export function findOrganisation(db: DbOrTx, id: string): OrganisationRow | undefined {
  return db.select().from(organisations).where(eq(organisations.id, id)).get();
}

export function insertOrganisation(db: DbOrTx, row: typeof organisations.$inferInsert): void {
  db.insert(organisations).values(row).run();
}
