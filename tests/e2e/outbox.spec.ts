import os from 'node:os';
import path from 'node:path';
import fs from 'node:fs';
import { caughtMailStore } from '../../apps/server/src/lib/email/caught-mail';
import { startSmtpFake, type SmtpFake } from '../../apps/server/src/lib/email/smtp-fake';
import { expect, signIn, test } from './fixtures';
import { RELAY_PORT, RELAYED_PORT } from './servers';

// This server sends through a relay that is down until the test starts it.
test.use({ baseURL: `http://localhost:${RELAYED_PORT}` });

let relay: SmtpFake | null = null;
test.afterEach(async () => {
  await relay?.close();
  relay = null;
});

test('an admin sees a failed message, its error and next attempt, and sends it once the mail server is back', async ({
  page,
}) => {
  await signIn(page, 'admin@demo.test');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Admin' }).click();
  await page.getByLabel('Name', { exact: true }).fill('Rhosyn Vale');
  await page.getByLabel('E-mail address').fill('rhosyn.vale@demo.test');
  await page.getByLabel('Role', { exact: true }).selectOption('inspector');
  await page
    .getByLabel('Organisation', { exact: true })
    .selectOption({ label: 'Ashgrove Hot Section Services (demo)' });
  await page.getByRole('button', { name: 'Send invitation', exact: true }).click();
  await expect(page.getByText('Invitation to rhosyn.vale@demo.test is on its way')).toBeVisible();

  await page.getByRole('link', { name: 'Outbox' }).click();
  const row = page.getByTestId('outbox-row').filter({ hasText: 'rhosyn.vale@demo.test' });
  await expect(row).toContainText('Failed, will retry', { timeout: 15_000 });
  await expect(row).toContainText('ECONNREFUSED');
  await row.getByRole('button', { name: 'Your Emberline invitation' }).click();
  const detail = page.getByRole('article', { name: 'Message: Your Emberline invitation' });
  await expect(detail).toContainText('Next attempt');
  await expect(detail).toContainText('ECONNREFUSED');
  await expect(detail).toContainText('rhosyn.vale@demo.test: not yet sent');
  await page.screenshot({ path: 'test-results/outbox-failed.png', fullPage: true });

  // The mail server comes back; the admin does not wait for the next attempt.
  const mailDir = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-relay-')), 'mail');
  relay = await startSmtpFake(mailDir, RELAY_PORT);
  await detail.getByRole('button', { name: 'Send now' }).click();
  await expect(detail.locator('[data-state="sent"]')).toBeVisible({ timeout: 15_000 });
  await expect(detail).toContainText('rhosyn.vale@demo.test: sent');
  await expect(row).toContainText('Sent');
  const caught = await caughtMailStore(mailDir).list();
  expect(caught.filter((item) => item.to.includes('rhosyn.vale@demo.test'))).toHaveLength(1);
  await page.screenshot({ path: 'test-results/outbox-sent.png', fullPage: true });

  // An address the mail server refuses for good waits for a person, and every admin page says so.
  await page.getByRole('link', { name: 'Users' }).click();
  await page.getByLabel('Name', { exact: true }).fill('Tam Orrin');
  await page.getByLabel('E-mail address').fill('tam.orrin@gone.invalid');
  await page.getByLabel('Role', { exact: true }).selectOption('planner');
  await page
    .getByLabel('Organisation', { exact: true })
    .selectOption({ label: 'Ashgrove Hot Section Services (demo)' });
  await page.getByRole('button', { name: 'Send invitation', exact: true }).click();
  await expect(page.getByText('Invitation to tam.orrin@gone.invalid is on its way')).toBeVisible();
  await page.getByRole('link', { name: 'Outbox' }).click();
  const refused = page.getByTestId('outbox-row').filter({ hasText: 'tam.orrin@gone.invalid' });
  await expect(refused).toContainText('Needs attention', { timeout: 15_000 });
  await expect(refused).toContainText('550');
  await page.reload();
  await expect(page.getByRole('alert')).toContainText('1 e-mail could not be delivered');
  await page.getByRole('alert').getByRole('link', { name: 'Open the outbox' }).click();
  await expect(page.getByTestId('outbox-row')).toHaveCount(1);
  await expect(page.getByLabel('State')).toHaveValue('needs-attention');
});
