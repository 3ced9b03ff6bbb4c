import { seriousViolations } from './axe';
import { DEMO_PASSWORD, expect, signIn, test } from './fixtures';

// What each demo role should find in the main navigation (DESIGN §2 roles, §8 screen names).
const expectedNavigation: Record<string, string[]> = {
  'admin@demo.test': [
    'Fleet',
    'Review queue',
    'Findings',
    'Limit library',
    'Planning board',
    'Reports',
    'Admin',
  ],
  'inspector@demo.test': ['Fleet', 'Findings', 'Limit library', 'Reports'],
  'engineer@demo.test': [
    'Fleet',
    'Review queue',
    'Findings',
    'Limit library',
    'Planning board',
    'Reports',
  ],
  'planner@demo.test': ['Fleet', 'Findings', 'Limit library', 'Planning board', 'Reports'],
  'customer@demo.test': ['Fleet', 'Findings', 'Reports'],
  'customer2@demo.test': ['Fleet', 'Findings', 'Reports'],
};

for (const [email, items] of Object.entries(expectedNavigation)) {
  test(`${email} signs in, sees the navigation of the role, and signs out`, async ({ page }) => {
    await signIn(page, email);
    const navigation = page.getByRole('navigation', { name: 'Main' });
    await expect(navigation.getByRole('link')).toHaveText(items);
    await expect(page.getByRole('contentinfo')).toContainText('it does not approve');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
    await page.goto('/fleet');
    await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  });
}

test('a wrong password is refused with a message beside the form', async ({
  page,
  expectHttpError,
}) => {
  expectHttpError(401, '/api/v1/auth/login');
  await page.goto('/sign-in');
  await page.getByLabel('E-mail address').fill('planner@demo.test');
  await page.getByLabel('Password').fill(`${DEMO_PASSWORD}-wrong`);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('not right');
});

test('an empty form is refused at the fields without a request', async ({ page }) => {
  await page.goto('/sign-in');
  const signIns: string[] = [];
  page.on('request', (request) => {
    if (request.url().includes('/api/v1/auth/login')) signIns.push(request.method());
  });
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByText('Enter an e-mail address such as name@example.com')).toBeVisible();
  await expect(page.getByText('Enter your password')).toBeVisible();
  expect(signIns, 'sign-in requests sent').toEqual([]);
});

test('a customer sent to an admin page is told it is not for their role', async ({ page }) => {
  await signIn(page, 'customer@demo.test');
  await page.goto('/admin/users');
  await expect(page.getByText('Not available to your role')).toBeVisible();
});

test('an unknown address shows the not-found page', async ({ page }) => {
  await signIn(page, 'inspector@demo.test');
  await page.goto('/no-such-page');
  await expect(page.getByRole('heading', { name: 'Page not found' })).toBeVisible();
});

test('a customer finds their own engines’ signed reports, and when each engine is due as released', async ({
  page,
}) => {
  await signIn(page, 'customer@demo.test');
  await page.getByRole('link', { name: 'Reports' }).click();
  await expect(page.getByRole('heading', { name: 'Reports' })).toBeVisible();
  const rows = page.getByTestId('report-row');
  await expect(rows).toHaveCount(2);
  for (const row of await rows.all()) {
    await expect(row).toContainText('VT3-D0103');
    await expect(row.getByRole('link', { name: /^PDF/ })).toBeVisible();
  }
  expect(await seriousViolations(page), 'reports').toEqual([]);

  // The fleet shows each engine's next due date; the engine says it is as released.
  await page.getByRole('link', { name: 'Fleet' }).click();
  await expect(page.getByRole('columnheader', { name: /Next due/ })).toBeVisible();
  await page.getByRole('link', { name: 'VT3-D0103' }).click();
  await expect(page.getByTestId('due-card')).toContainText('As of the latest released inspection');
});

test('a demo installation says so before and after signing in', async ({ page }) => {
  const banner = page.getByRole('note', { name: 'Demo installation' });
  await page.goto('/sign-in');
  await expect(banner).toContainText('password is published');
  await signIn(page, 'planner@demo.test');
  await expect(banner).toBeVisible();
  await page.goto('/fleet/engine-d0103');
  await expect(banner).toContainText('Never use it for a real engine');
});
