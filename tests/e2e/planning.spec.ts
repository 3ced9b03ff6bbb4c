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
  expect(await seriousViolations(page), 'engine page with its due card').toEqual([]);
});
