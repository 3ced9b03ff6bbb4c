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
  await item.getByText('Show the damage trend').click();
  const chart = item.getByTestId('trend-chart');
  await expect(chart).toBeVisible();
  await expect(chart.locator('.recharts-scatter-symbol')).toHaveCount(3);
  // The limit is the one the finding was judged by: 1.50 mm under D-1, 1.20 mm once the limits
  // spec has published its tightened copy.
  await expect(chart).toContainText(/Projected to reach the repeat limit of (1\.50|1\.20) mm/);
  await expect(chart).toContainText('r²');

  // "Continues an earlier finding" leads to it, in its own inspection.
  await item.getByRole('link', { name: /an earlier finding \(F\d+\)/ }).click();
  await expect(page).toHaveURL(/\/inspections\/inspection-d0103-h2\?finding=/);

  // The engine page shows the same trend for its open requirement.
  await page.goto('/fleet/engine-d0103');
  const trends = page.getByRole('region', { name: /Damage trend of F\d+/ });
  await expect(trends.getByTestId('trend-chart').locator('.recharts-scatter-symbol')).toHaveCount(
    3,
  );
});

test('the calendar shows the same engines on the same days as the list', async ({ page }) => {
  await signIn(page, 'planner@demo.test');
  await page.goto('/planning');
  const rows = page.getByTestId('planning-row');
  await expect(rows.first()).toBeVisible();
  const listed = new Map<string, string>();
  for (const row of await rows.all()) {
    const serial = (await row.getByRole('link').first().textContent())!.trim();
    // An engine without a due date (one added by another spec, unknown) shows none.
    const cell = row.locator('[data-due-date]');
    const due = (await cell.count()) ? await cell.getAttribute('data-due-date') : null;
    if (due) listed.set(serial, due);
  }
  // The month of VT3-D0102's due date (due soon, so near today whatever the day the demo loads).
  const month = listed.get('VT3-D0102')!;
  await page.getByRole('link', { name: 'Month' }).click();
  await expect(page).toHaveURL(/view=month/);
  await page.goto(`/planning?view=month&on=${month}`);
  const days = page.getByTestId('calendar-day');
  await expect(days.first()).toBeVisible();
  const shown = await days.evaluateAll((cells) => cells.map((cell) => cell.dataset.day!));
  const expected = [...listed]
    .filter(([, due]) => shown.includes(due))
    .map(([serial, due]) => `${serial} ${due}`)
    .sort();
  const entries = page.locator('[data-testid="calendar-entry"][data-kind="inspection"]');
  await expect(entries).toHaveCount(expected.length);
  const placed = (
    await entries.evaluateAll((items) =>
      items.map(
        (item) =>
          `${item.getAttribute('data-engine')} ${item.closest<HTMLElement>('[data-day]')!.dataset.day}`,
      ),
    )
  ).sort();
  expect(placed).toEqual(expected);
  expect(placed).toContain(`VT3-D0102 ${month}`);
  expect(await seriousViolations(page), 'planning calendar').toEqual([]);

  // The week view of the same day shows it too, and the filters apply to the calendar alike.
  await page.getByRole('link', { name: 'Week' }).click();
  await expect(page.locator('[data-engine="VT3-D0102"]')).toBeVisible();
  await page.getByLabel('State').selectOption('ok');
  await expect(page).toHaveURL(/state=ok/);
  await expect(page.locator('[data-engine="VT3-D0102"]')).toHaveCount(0);
});
