import { expect, signIn, test } from './fixtures';

test('the planner filters the fleet, keeps the view in the address, and opens an engine', async ({
  page,
}) => {
  await signIn(page, 'planner@demo.test');
  await page.getByRole('link', { name: 'Fleet' }).click();
  await expect(page.getByTestId('engine-row')).toHaveCount(10);

  await page
    .getByRole('combobox', { name: 'Owner' })
    .selectOption({ label: 'Corvid Regional Airways (demo)' });
  await expect(page.getByTestId('engine-row')).toHaveCount(6);
  await page.getByRole('combobox', { name: 'Status' }).selectOption('installed');
  await expect(page.getByTestId('engine-row')).toHaveCount(5);
  await page.getByRole('button', { name: /^CSN/ }).click();
  await expect(page.getByRole('columnheader', { name: /CSN/ })).toHaveAttribute(
    'aria-sort',
    'descending',
  );
  await expect(page.getByTestId('engine-row').first()).toContainText('VT3-D0105');
  await page.getByRole('button', { name: /^CSN/ }).click();
  await expect(page.getByRole('columnheader', { name: /CSN/ })).toHaveAttribute(
    'aria-sort',
    'ascending',
  );
  await expect(page.getByTestId('engine-row').first()).toContainText('VT3-D0103');
  await page.getByLabel('Search serial or aircraft').fill('CRA');
  await expect(page.getByTestId('engine-row')).toHaveCount(2);
  await expect(page).toHaveURL(/organisationId=org-corvid/);
  await expect(page).toHaveURL(/q=CRA/);

  // The address alone reproduces the view.
  await page.reload();
  await expect(page.getByTestId('engine-row')).toHaveCount(2);
  await expect(page.getByLabel('Search serial or aircraft')).toHaveValue('CRA');

  await page.getByText('Columns', { exact: true }).click();
  await page.getByRole('checkbox', { name: 'Model' }).uncheck();
  await expect(page.getByRole('columnheader', { name: /Model/ })).toHaveCount(0);
  await expect(page).toHaveURL(/hide=modelName/);
  await page.getByText('Columns', { exact: true }).click();
  await page.screenshot({ path: 'test-results/fleet-filtered.png', fullPage: true });

  await page.getByRole('link', { name: 'VT3-D0102' }).click();
  await expect(page.getByRole('heading', { name: 'Engine VT3-D0102' })).toBeVisible();
  await expect(page.getByText('Cycles per day')).toBeVisible();
  // Twelve months and, after the first of the month, the days of this month up to yesterday.
  const partialMonth = new Date().getUTCDate() > 1 ? 1 : 0;
  await expect(
    page.getByRole('table', { name: /Utilization history/ }).getByRole('row'),
  ).toHaveCount(1 + 12 + partialMonth);
});

test('the planner records a period and imports a CSV after seeing what it will take', async ({
  page,
}) => {
  await signIn(page, 'planner@demo.test');
  await page.goto('/fleet/engine-d0201');
  const csv = [
    'period_start,period_end,cycles,hours',
    '2024-10-01,2024-10-31,110,231',
    '2024-11-01,2024-11-30,abc,200',
  ].join('\n');
  await page
    .getByLabel('Utilization CSV file')
    .setInputFiles({ name: 'old-months.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
  const preview = page.getByTestId('import-preview');
  await expect(preview).toContainText('1 line will be taken; 1 refused');
  await expect(preview).toContainText('Line 3: cycles is not a number');
  await page.getByRole('button', { name: 'Import 1 good line' }).click();
  await expect(page.getByText('Imported 1 period.')).toBeVisible();
  await expect(page.getByRole('table', { name: /Utilization history/ })).toContainText(
    '1 Oct 2024',
  );
});

test('a customer sees only their own engines, and another organisation’s engine is not found', async ({
  page,
  expectHttpError,
}) => {
  expectHttpError(404, '/api/v1/engines/engine-d0201');
  await signIn(page, 'customer@demo.test');
  await page.goto('/fleet');
  await expect(page.getByTestId('engine-row')).toHaveCount(6);
  await expect(page.getByText('Pellucid Aero Leasing')).toHaveCount(0);
  await expect(page.getByRole('combobox', { name: 'Owner' })).toHaveCount(0);
  await expect(page.getByRole('link', { name: 'Add engine' })).toHaveCount(0);
  await page.goto('/fleet/engine-d0201');
  await expect(
    page.getByText('There is no such engine, or it is not shared with you.'),
  ).toBeVisible();
});

test('the admin creates an engine model with rows and an engine on it', async ({
  page,
  expectHttpError,
}) => {
  // The second engine of the same serial number is refused at the field.
  expectHttpError(409, '/api/v1/engines');
  await signIn(page, 'admin@demo.test');
  await page.goto('/admin/engine-models');
  await page.getByRole('link', { name: 'New engine model' }).click();
  await page.getByLabel('Model name').fill('Orrin OT-12 (demo model)');
  const first = page.getByTestId('model-row-0');
  await first.getByLabel('Key').fill('hpt1-ngv');
  await first.getByLabel('Name').fill('HPT 1 nozzle guide vanes');
  await first.getByLabel('Kind').selectOption('vane');
  await first.getByLabel('Positions').fill('32');
  await first.getByLabel('Borescope ports').fill('P-2, P-3');
  await page.getByRole('button', { name: 'Add a row' }).click();
  const second = page.getByTestId('model-row-1');
  await second.getByLabel('Key').fill('hpt1-blade');
  await second.getByLabel('Name').fill('HPT 1 blades');
  await second.getByLabel('Kind').selectOption('blade');
  await second.getByLabel('Positions').fill('58');
  await page.getByRole('button', { name: 'Create the model' }).click();
  await expect(page.getByRole('heading', { name: 'Orrin OT-12 (demo model) v1' })).toBeVisible();

  await page.goto('/fleet');
  await page.getByRole('link', { name: 'Add engine' }).click();
  await page.getByLabel('Serial number').fill('OT12-D0001');
  await page.getByLabel('Engine model').selectOption({ label: 'Orrin OT-12 (demo model) v1' });
  await page.getByLabel('Owner').selectOption({ label: 'Pellucid Aero Leasing (demo)' });
  await page.getByLabel('TSN (hours)').fill('120.5');
  await page.getByLabel('CSN (cycles)').fill('64');
  await page.getByRole('button', { name: 'Add engine' }).click();
  await expect(page.getByRole('heading', { name: 'Engine OT12-D0001' })).toBeVisible();
  await expect(
    page.getByText('Orrin OT-12 (demo model) v1 · Pellucid Aero Leasing (demo)'),
  ).toBeVisible();

  await page.goto('/fleet');
  await page.getByRole('link', { name: 'Add engine' }).click();
  await page.getByLabel('Serial number').fill('OT12-D0001');
  await page.getByLabel('Engine model').selectOption({ label: 'Orrin OT-12 (demo model) v1' });
  await page.getByLabel('Owner').selectOption({ label: 'Corvid Regional Airways (demo)' });
  await page.getByLabel('TSN (hours)').fill('1');
  await page.getByLabel('CSN (cycles)').fill('1');
  await page.getByRole('button', { name: 'Add engine' }).click();
  await expect(page.getByText('This serial number is already in the fleet')).toBeVisible();
});
