import type { Role } from '@emberline/contracts/roles';
import { inTransaction, type Db } from '../db/client';
import { hashPassword } from '../modules/auth/passwords';
import { appendAudit } from '../modules/audit/audit.repository';
import { insertOrganisation } from '../modules/organisations/organisations.repository';
import { insertUser } from '../modules/users/users.repository';
import { addDays } from '@emberline/domain/dates';
import { DEMO_MODEL_ID, demoEngines, loadDemoFleet } from './demo-fleet';
import { loadDemoLimits } from './demo-limits';

/** The password of every demo account. */
export const DEMO_PASSWORD = 'emberline-demo';

/**
 * The invented demo scenario: a home organisation that performs borescope inspections, two
 * customer organisations, and their fleet. Every name here is made up for the demo.
 */
export const demoOrganisations = [
  { id: 'org-home', name: 'Ashgrove Hot Section Services (demo)', kind: 'home' },
  { id: 'org-corvid', name: 'Corvid Regional Airways (demo)', kind: 'customer' },
  { id: 'org-pellucid', name: 'Pellucid Aero Leasing (demo)', kind: 'customer' },
] as const;

export const demoUsers: {
  id: string;
  email: string;
  name: string;
  role: Role;
  organisationId: string;
}[] = [
  {
    id: 'user-admin',
    email: 'admin@demo.test',
    name: 'Maren Holt',
    role: 'admin',
    organisationId: 'org-home',
  },
  {
    id: 'user-inspector',
    email: 'inspector@demo.test',
    name: 'Tobias Rennick',
    role: 'inspector',
    organisationId: 'org-home',
  },
  {
    id: 'user-engineer',
    email: 'engineer@demo.test',
    name: 'Priya Castellane',
    role: 'engineer',
    organisationId: 'org-home',
  },
  {
    id: 'user-engineer2',
    email: 'engineer2@demo.test',
    name: 'Anselm Ruddock',
    role: 'engineer',
    organisationId: 'org-home',
  },
  {
    id: 'user-inspector2',
    email: 'inspector2@demo.test',
    name: 'Greta Solberg',
    role: 'inspector',
    organisationId: 'org-home',
  },
  {
    id: 'user-planner',
    email: 'planner@demo.test',
    name: 'Jonah Whitlaw',
    role: 'planner',
    organisationId: 'org-home',
  },
  {
    id: 'user-customer',
    email: 'customer@demo.test',
    name: 'Ilse Marrow',
    role: 'customer',
    organisationId: 'org-corvid',
  },
  {
    id: 'user-customer2',
    email: 'customer2@demo.test',
    name: 'Dario Quennell',
    role: 'customer',
    organisationId: 'org-pellucid',
  },
];

/**
 * The invented authorisations of the demo engineers and qualifications of the demo inspectors,
 * recorded as the demo administrator would (DESIGN §5.5: signing needs a current authorisation).
 */
function demoCredentials(userId: string, today: string) {
  switch (userId) {
    case 'user-engineer':
      return {
        authorisation: {
          ref: 'DEMO-AUTH-E-0112',
          models: [DEMO_MODEL_ID],
          expiresOn: addDays(today, 400),
        },
      };
    case 'user-engineer2':
      return {
        authorisation: {
          ref: 'DEMO-AUTH-E-0087',
          models: [DEMO_MODEL_ID],
          expiresOn: addDays(today, 250),
        },
      };
    case 'user-inspector':
      return { qualification: { ref: 'DEMO-BSI-L2-0457', expiresOn: addDays(today, 300) } };
    case 'user-inspector2':
      return { qualification: { ref: 'DEMO-BSI-L2-0519', expiresOn: addDays(today, 500) } };
    default:
      return {};
  }
}

/** Loads the demo scenario into an empty database, in one transaction. */
export async function loadDemoScenario(
  db: Db,
  options: { bcryptCost: number; now: Date },
): Promise<void> {
  // Every demo account has the same password: one hash (with its own salt) serves them all, and
  // the first start does not spend seconds hashing the same words six times.
  const hash = await hashPassword(DEMO_PASSWORD, options.bcryptCost);
  inTransaction(db, (tx) => {
    for (const organisation of demoOrganisations)
      insertOrganisation(tx, { ...organisation, createdAt: options.now });
    const today = options.now.toISOString().slice(0, 10);
    demoUsers.forEach((user) => {
      insertUser(tx, {
        ...user,
        passwordHash: hash,
        passwordChangedAt: options.now,
        createdAt: options.now,
        ...demoCredentials(user.id, today),
      });
    });
    loadDemoFleet(tx, options.now);
    loadDemoLimits(tx, options.now, addDays(options.now.toISOString().slice(0, 10), -720));
    appendAudit(tx, options.now, {
      actorUserId: null,
      action: 'demo.loaded',
      entityType: 'scenario',
      entityId: 'demo',
      after: {
        organisations: demoOrganisations.length,
        users: demoUsers.length,
        engines: demoEngines.length,
      },
    });
  });
}
