import type { APIRequestContext } from '@playwright/test';
import { DEMO_PASSWORD, expect, signIn, test } from './fixtures';

test('an admin invites a planner, reads the invitation in the outbox, and the planner joins through the link', async ({
  page,
  browser,
}) => {
  await signIn(page, 'admin@demo.test');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Admin' }).click();
  await page.getByLabel('Name', { exact: true }).fill('Odile Ferrand');
  await page.getByLabel('E-mail address').fill('odile.ferrand@demo.test');
  await page.getByLabel('Role', { exact: true }).selectOption('planner');
  await page
    .getByLabel('Organisation', { exact: true })
    .selectOption({ label: 'Ashgrove Hot Section Services (demo)' });
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText('Invitation to odile.ferrand@demo.test is on its way')).toBeVisible();
  await expect(page.getByTestId('user-row-odile.ferrand@demo.test')).toContainText('invited');
  await page.screenshot({ path: 'test-results/admin-users.png', fullPage: true });

  await page.getByRole('link', { name: 'Outbox' }).click();
  const invitation = page.getByTestId('outbox-row').filter({ hasText: 'odile.ferrand@demo.test' });
  await expect(invitation).toContainText('Sent', { timeout: 15_000 });
  await page
    .getByRole('list', { name: 'Caught messages' })
    .getByRole('button', { name: /Your Emberline invitation/ })
    .first()
    .click();
  const text = await page.getByTestId('mail-text').innerText();
  const link = /http:\/\/\S+accept-invitation#token=[A-Za-z0-9_-]{43}/.exec(text)?.[0];
  expect(link, 'the invitation carries a link').toBeTruthy();

  const invitee = await browser.newContext();
  const invitePage = await invitee.newPage();
  await invitePage.goto(new URL(link!).pathname + new URL(link!).hash);
  await expect(invitePage.getByText('odile.ferrand@demo.test')).toBeVisible();
  await invitePage.getByLabel('Choose a password').fill('short');
  await invitePage.getByRole('button', { name: 'Join and sign in' }).click();
  await expect(invitePage.getByRole('alert')).toContainText(
    'Choose a password of at least 12 characters',
  );
  await invitePage.getByLabel('Choose a password').fill('planning the next look');
  await invitePage.getByRole('button', { name: 'Join and sign in' }).click();
  await expect(invitePage.getByRole('navigation', { name: 'Main' }).getByRole('link')).toHaveText([
    'Fleet',
    'Findings',
    'Limit library',
    'Planning board',
    'Reports',
  ]);
  await expect(invitePage.getByTestId('signed-in-name')).toHaveText('Odile Ferrand');
  await invitee.close();

  await page.getByRole('link', { name: 'Users' }).click();
  await expect(page.getByTestId('user-row-odile.ferrand@demo.test')).toContainText('active');
  await page.getByRole('link', { name: 'Audit log' }).click();
  await expect(page.getByText('user.invitation-accepted')).toBeVisible();
});

test('an admin disables a user, whose open session ends at once', async ({ page, browser }) => {
  const other = await browser.newContext();
  const otherPage = await other.newPage();
  await signIn(otherPage, 'inspector@demo.test');

  await signIn(page, 'admin@demo.test');
  await page.goto('/admin/users');
  const row = page.getByTestId('user-row-inspector@demo.test');
  await row.getByRole('button', { name: 'Disable' }).click();
  await expect(page.getByText('is disabled and signed out everywhere')).toBeVisible();
  await expect(row).toContainText('disabled');

  await otherPage.reload();
  await expect(otherPage.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await other.close();

  await row.getByRole('button', { name: 'Enable' }).click();
  await expect(row).toContainText('active');
});

test('a user resets a forgotten password through the e-mailed link', async ({
  page,
  playwright,
  baseURL,
}) => {
  // A user of this test's own, so that the demo accounts keep their password for the other tests.
  const api = await playwright.request.newContext({ baseURL });
  await api.post('/api/v1/auth/login', {
    data: { email: 'admin@demo.test', password: DEMO_PASSWORD },
  });
  const invited = await api.post('/api/v1/users', {
    data: {
      email: 'basil.okafor@demo.test',
      name: 'Basil Okafor',
      role: 'planner',
      organisationId: 'org-home',
    },
  });
  expect(invited.status()).toBe(201);
  const inviteToken = await tokenFromOutbox(
    api,
    'basil.okafor@demo.test',
    'Your Emberline invitation',
  );
  const accepted = await api.post('/api/v1/auth/invitations/accept', {
    data: { token: inviteToken, name: 'Basil Okafor', password: 'first chosen passphrase' },
  });
  expect(accepted.status()).toBe(200);

  await page.goto('/sign-in');
  await page.getByRole('link', { name: 'Forgotten your password?' }).click();
  await page.getByLabel('E-mail address').fill('basil.okafor@demo.test');
  await page.getByRole('button', { name: 'Send the reset link' }).click();
  await expect(page.getByText('a reset link is on its way')).toBeVisible();

  await api.post('/api/v1/auth/login', {
    data: { email: 'admin@demo.test', password: DEMO_PASSWORD },
  });
  const resetToken = await tokenFromOutbox(
    api,
    'basil.okafor@demo.test',
    'Reset your Emberline password',
  );
  await api.dispose();

  await page.goto(`/reset-password#token=${resetToken}`);
  await page.getByLabel('New password').fill('planning board at noon');
  await page.getByRole('button', { name: 'Save the new password' }).click();
  await expect(page.getByText('Your password is changed')).toBeVisible();
  await page.getByRole('link', { name: 'Sign in with the new password' }).click();
  await signIn(page, 'basil.okafor@demo.test', 'planning board at noon');
  await expect(page.getByTestId('signed-in-name')).toHaveText('Basil Okafor');
});

async function tokenFromOutbox(
  api: APIRequestContext,
  to: string,
  subject: string,
): Promise<string> {
  for (let attempt = 0; attempt < 50; attempt += 1) {
    const outbox = (await (await api.get('/api/v1/outbox/caught')).json()) as {
      items: { id: string; to: string[]; subject: string }[];
    };
    const item = outbox.items.find((entry) => entry.to.includes(to) && entry.subject === subject);
    if (item) {
      const message = (await (await api.get(`/api/v1/outbox/caught/${item.id}`)).json()) as {
        text: string;
      };
      const token = /#token=([A-Za-z0-9_-]{43})/.exec(message.text)?.[1];
      if (token) return token;
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`no "${subject}" message to ${to}`);
}

test('an admin checks the records: both chains check out, and the key kept with them is named', async ({
  page,
}) => {
  await signIn(page, 'admin@demo.test');
  await page.goto('/admin/records');
  await expect(page.getByText('Every record checks out')).toBeVisible();
  await expect(page.getByText('The records key is kept with the records')).toBeVisible();
  await expect(page.getByText('Audit rows checked')).toBeVisible();
  await page.screenshot({ path: 'test-results/records-check.png', fullPage: true });
});

test('an admin records an engineer’s authorisation to sign, but never their own', async ({
  page,
}) => {
  await signIn(page, 'admin@demo.test');
  await page.goto('/admin/users');
  // The demo's second engineer holds an invented authorisation; the admin renews it.
  const engineer = page.getByTestId('credentials-engineer2@demo.test');
  await expect(engineer).toContainText('Authorisation DEMO-AUTH-E-0087');
  await engineer.getByRole('button', { name: 'Edit' }).click();
  const form = page.getByRole('form', {
    name: 'Authorisation and qualification of Anselm Ruddock',
  });
  // Refused at the fields before anything is sent: a reference and a model are needed.
  await form.getByLabel('Authorisation reference').fill('');
  await form.getByLabel(/Vantor VT-300/).uncheck();
  await form.getByRole('button', { name: 'Save' }).click();
  await expect(form.getByText('Give the reference')).toBeVisible();
  await expect(form.getByText('Name at least one engine model')).toBeVisible();
  await form.getByLabel('Authorisation reference').fill('AUTH-DEMO-7');
  await form.getByLabel('Authorisation expires on').fill('2027-06-30');
  await form.getByLabel(/Vantor VT-300/).check();
  await form.getByRole('button', { name: 'Save' }).click();
  await expect(engineer).toContainText('Authorisation AUTH-DEMO-7');
  await expect(engineer).toContainText('until 30 Jun 2027');
  await expect(page.getByTestId('credentials-admin@demo.test')).toContainText(
    'Recorded by another administrator',
  );
  await page
    .getByRole('heading', { name: 'Authorisations and qualifications' })
    .scrollIntoViewIfNeeded();
  await page.screenshot({ path: 'test-results/admin-credentials.png' });
});
