import { seriousViolations } from './axe';
import { expect, signIn, test } from './fixtures';

test('an engineer finds every HPT stage 1 blade crack of the fleet, sorts them by length and opens the largest', async ({
  page,
}) => {
  await signIn(page, 'engineer@demo.test');
  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: 'Findings' })
    .click();
  await expect(page.getByRole('heading', { name: 'Findings' })).toBeVisible();
  const filters = page.getByRole('group', { name: 'Filters' });
  await filters.getByLabel('Row').selectOption({ label: 'HPT stage 1 blades' });
  await filters.getByLabel('Damage').selectOption({ label: 'crack' });
  await expect(page).toHaveURL(/row=hpt1-blade/);
  await expect(page).toHaveURL(/damage=crack/);

  // Every crack the fleet holds on that row: as many rows as the search's own count says.
  const rows = page.getByTestId('finding-row');
  await expect(rows.first()).toContainText('HPT stage 1 blades');
  const api = await page.request.get('/api/v1/findings?row=hpt1-blade&damage=crack&pageSize=100');
  const { total } = (await api.json()) as { total: number };
  expect(total).toBeGreaterThanOrEqual(2);
  await expect(rows).toHaveCount(total);
  await expect(page.getByText(`${total} findings`)).toBeVisible();
  for (const row of await rows.all()) await expect(row).toContainText('crack');
  await expect(rows.filter({ hasText: 'VT3-D0103' }).first()).toBeVisible();
  await expect(rows.filter({ hasText: 'VT3-D0201' }).first()).toBeVisible();

  // Largest first, in mm and in.
  await page.getByRole('button', { name: 'Length' }).click();
  await expect(page).toHaveURL(/sort=lengthMm/);
  await expect(page.getByRole('columnheader', { name: 'Length' })).toHaveAttribute(
    'aria-sort',
    'descending',
  );
  const lengths = (await rows.locator('td:nth-child(5)').allInnerTexts()).map((text) =>
    Number(text.split(' mm')[0]),
  );
  expect(lengths).toEqual([...lengths].sort((a, b) => b - a));
  await expect(rows.first().locator('td:nth-child(5)')).toContainText(' in');
  expect(await seriousViolations(page), 'findings search').toEqual([]);

  // The largest opens on the still it was measured on.
  const engine = (await rows.first().locator('td').first().innerText()).split('\n')[0]!;
  await rows
    .first()
    .getByRole('link', { name: /^Open F\d+/ })
    .click();
  await expect(page).toHaveURL(/\/inspections\/[^?]+\?finding=/);
  await expect(
    page.getByRole('heading', { name: new RegExp(`Inspection of ${engine}`) }),
  ).toBeVisible();
});

test('a customer’s search holds only their own released findings', async ({ page }) => {
  await signIn(page, 'customer@demo.test');
  await page.goto('/findings');
  await expect(page.getByRole('heading', { name: 'Findings' })).toBeVisible();
  const rows = page.getByTestId('finding-row');
  await expect(rows.first()).toBeVisible();
  for (const row of await rows.all()) await expect(row).toContainText('VT3-D0103');
  await expect(page.getByRole('group', { name: 'Filters' }).getByLabel('Owner')).toHaveCount(0);
});
