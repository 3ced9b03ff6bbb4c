import { seriousViolations } from './axe';
import { expect, signIn, test } from './fixtures';

test('the sign-in page has no serious accessibility violation', async ({ page }) => {
  await page.goto('/sign-in');
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
});

test('the fleet, engine and inspection pages have no serious accessibility violation', async ({
  page,
}) => {
  await signIn(page, 'inspector@demo.test');
  await page.goto('/fleet');
  await expect(page.getByTestId('engine-row').first()).toBeVisible();
  expect(await seriousViolations(page), 'fleet').toEqual([]);
  await page.goto('/fleet/engine-d0103');
  await expect(page.getByText('Utilization history')).toBeVisible();
  expect(await seriousViolations(page), 'engine').toEqual([]);
  await page.goto('/inspections/inspection-d0103-demo');
  await expect(page.getByTestId('image-strip')).toBeVisible();
  await expect(page.getByTestId('inspection-outcome')).toBeVisible();
  await expect(page.getByRole('toolbar', { name: 'Drawing tools' })).toBeVisible();
  expect(await seriousViolations(page), 'inspection').toEqual([]);
});

test('the admin pages have no serious accessibility violation', async ({ page }) => {
  await signIn(page, 'admin@demo.test');
  for (const path of [
    '/admin/users',
    '/admin/organisations',
    '/admin/engine-models/model-vt300-v1',
    '/admin/audit-log',
    '/admin/outbox',
    '/admin/records',
  ]) {
    await page.goto(path);
    await page.waitForLoadState('networkidle');
    expect(await seriousViolations(page), path).toEqual([]);
  }
});

test('the limit library, a draft with its impact and the rule editor have no serious accessibility violation', async ({
  page,
}) => {
  await signIn(page, 'engineer@demo.test');
  await page.goto('/limits');
  await expect(page.getByRole('row', { name: /D-1/ })).toBeVisible();
  expect(await seriousViolations(page), 'library').toEqual([]);
  await page.goto('/limits/limits-vt300-demo-r2');
  await page.getByRole('button', { name: 'Show the impact' }).click();
  await expect(page.getByTestId('impact-preview')).toBeVisible();
  await page.getByRole('button', { name: /Change rule .*hpt1-blade\.crack\.edges/ }).click();
  await expect(page.getByRole('form', { name: 'Rule Cracks at the blade edges' })).toBeVisible();
  expect(await seriousViolations(page), 'draft').toEqual([]);
});
