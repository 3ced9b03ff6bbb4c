// Creates the first administrator of an installation started with DEMO=0, and prints a single-use
// link to choose the password. Usage:
//   pnpm create-admin --email ops@example.org --name "Full Name" --organisation "Home organisation"
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { emailSchema } from '@emberline/contracts/auth';
import { loadConfig } from '../config/env';
import { inTransaction, openDatabase } from '../db/client';
import { runMigrations } from '../db/migrate';
import { newId } from '../lib/ids';
import { createLogger } from '../lib/logger';
import { loadRecordsKey } from '../lib/records/records-key';
import { appendAudit } from '../modules/audit/audit.repository';
import { publicOrigin } from '../modules/auth/auth.service';
import { issueUserToken } from '../modules/auth/user-tokens.service';
import {
  insertOrganisation,
  listOrganisations,
} from '../modules/organisations/organisations.repository';
import { findUserByEmail, insertUser } from '../modules/users/users.repository';

const { values } = parseArgs({
  options: {
    email: { type: 'string' },
    name: { type: 'string' },
    organisation: { type: 'string' },
  },
});
const email = emailSchema.safeParse(values.email ?? '');
if (!email.success || !values.name) {
  console.error(
    'Usage: pnpm create-admin --email ops@example.org --name "Full Name" [--organisation "Home organisation"]',
  );
  process.exit(1);
}

const config = loadConfig();
fs.mkdirSync(config.dataDir, { recursive: true });
const handle = openDatabase(
  path.join(config.dataDir, 'emberline.sqlite'),
  loadRecordsKey(config, createLogger('error', false)).key,
);
runMigrations(handle.db);
if (findUserByEmail(handle.db, email.data)) {
  console.error(`${email.data} already has an account.`);
  process.exit(1);
}
const now = new Date();
const token = inTransaction(handle.db, (tx) => {
  let home = listOrganisations(tx).find((organisation) => organisation.kind === 'home');
  if (!home) {
    if (!values.organisation)
      throw new Error('There is no home organisation yet: give its name with --organisation');
    home = { id: newId(), name: values.organisation, kind: 'home', createdAt: now };
    insertOrganisation(tx, home);
  }
  const id = newId();
  insertUser(tx, {
    id,
    email: email.data,
    name: values.name!,
    role: 'admin',
    organisationId: home.id,
    createdAt: now,
  });
  appendAudit(tx, now, {
    actorUserId: null,
    action: 'user.created-from-command-line',
    entityType: 'user',
    entityId: id,
    after: { email: email.data, role: 'admin' },
  });
  return issueUserToken(tx, id, 'invitation', now);
});
handle.close();
console.warn(
  `Created ${email.data}. Open this link within 7 days to choose the password:\n${publicOrigin(config.publicOrigins, config.port)}/accept-invitation#token=${token}`,
);
