import { seriousViolations } from './axe';
import { expect, signIn, test } from './fixtures';

test('the planner sees VT3-D0103 overdue on its engine page, with what governs and why', async ({
  page,
}) => {
  await signIn(page, 'planner@demo.test');
  await page.goto('/fleet/engine-d0103');
  const card = page.getByTestId('due-card');
  await expect(card.locator('[data-due-state]')).toHaveText(/Overdue/);
  await expect(card).toContainText(
    'Governed by the repeat inspection of HPT stage 1 blades 12 (within 200 cycles)',
  );
  await expect(card).toContainText('9,442');
  await expect(card).toContainText('Open requirements');
  await expect(card).toContainText('Limit reached before the next inspection');
  expect(await seriousViolations(page), 'engine page with its due card').toEqual([]);
});

test('the planner finds VT3-D0103 overdue on the board, books it from today, and the engine page shows the booking', async ({
  page,
  expectHttpError,
}) => {
  expectHttpError(422, '/api/v1/engines/engine-d0103/booking');
  await signIn(page, 'planner@demo.test');
  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: 'Planning board' })
    .click();
  await expect(page.getByRole('heading', { name: 'Planning board' })).toBeVisible();
  // Overdue first; the filter by state is kept in the address.
  await page.getByLabel('State').selectOption('overdue');
  await expect(page).toHaveURL(/state=overdue/);
  const row = page.getByTestId('planning-row').filter({ hasText: 'VT3-D0103' });
  await expect(row.locator('[data-due-state]')).toHaveText(/Overdue/);
  expect(await seriousViolations(page), 'planning board').toEqual([]);
  const download = page.waitForEvent('download');
  await page.getByRole('link', { name: 'Download the list as CSV' }).click();
  const file = await download;
  expect(file.suggestedFilename()).toBe('emberline-planning.csv');
  const text = await (await file.createReadStream()).toArray();
  expect(Buffer.concat(text).toString('utf8')).toMatch(/^engine,customer,model,state,/);
  expect(Buffer.concat(text).toString('utf8')).toContain(
    'VT3-D0103,Corvid Regional Airways (demo)',
  );

  // A day in the past is refused at the field, in words; today is taken.
  await row.getByText('Book…').click();
  const form = row.getByRole('form', { name: 'Booking of VT3-D0103' });
  await form.getByLabel('Planned date').fill('2020-01-01');
  await form.getByRole('button', { name: 'Book' }).click();
  await expect(form.getByText(/A booking cannot be in the past/)).toBeVisible();
  const today = new Date().toISOString().slice(0, 10);
  await form.getByLabel('Planned date').fill(today);
  await form.getByLabel('Note').fill('Borescope slot, line station (invented)');
  await form.getByRole('button', { name: 'Book' }).click();
  await expect(row.locator('summary')).toContainText('Booked for');
  await expect(row.locator('[data-due-state]')).toHaveText(/Overdue/);

  await row.getByRole('link', { name: 'VT3-D0103' }).click();
  await expect(page.getByTestId('due-card')).toBeVisible();
  await expect(page.getByRole('form', { name: 'Booking of VT3-D0103' })).toContainText(
    'Booked for',
  );
});

test('the growing crack of VT3-D0103 shows its trend over three inspections, projected to its limit', async ({
  page,
}) => {
  await signIn(page, 'engineer@demo.test');
  await page.goto('/inspections/inspection-d0103-demo');
  const item = page.getByTestId('finding-item').filter({ hasText: 'crack' }).filter({
    hasText: 'Continues an earlier finding',
  });
  await item.getByText('Continues an earlier finding: show the damage trend').click();
  const chart = item.getByTestId('trend-chart');
  await expect(chart).toBeVisible();
  await expect(chart.locator('.recharts-scatter-symbol')).toHaveCount(3);
  // The limit is the one the finding was judged by: 1.50 mm under D-1, 1.20 mm once the limits
  // spec has published its tightened copy.
  await expect(chart).toContainText(/Projected to reach the repeat limit of (1\.50|1\.20) mm/);
  await expect(chart).toContainText('r²');
});
