import { seriousViolations } from './axe';
import { expect, signIn, test } from './fixtures';

test('a new inspection starts from the inspector’s record and last probe; a draft is corrected, then voided with a reason', async ({
  page,
}) => {
  const warnings: string[] = [];
  page.on('console', (message) => {
    if (/NaN/.test(message.text())) warnings.push(message.text());
  });
  await signIn(page, 'inspector@demo.test');
  await page.goto('/fleet/engine-d0105');
  await page.getByRole('link', { name: 'New inspection' }).click();

  // The qualification comes from the inspector's record, the probe from their last inspection.
  const qualification = page.getByLabel('Qualification reference');
  await expect(qualification).toHaveValue('DEMO-BSI-L2-0457');
  await expect(page.getByText('From your record; change it if it has been renewed.')).toBeVisible();
  await expect(page.getByLabel('Probe (model and serial)')).not.toHaveValue('');
  await expect(
    page.getByText(/^From your inspection of \d{1,2} [A-Z][a-z]{2} \d{4}/),
  ).toBeVisible();
  // Each date field says the day it holds in the product's one format.
  const date = page.getByLabel('Date of inspection');
  await date.fill('2026-11-02');
  await expect(page.getByTestId('date-echo').first()).toHaveText('Reads 2 Nov 2026');
  // A figure emptied and typed again leaves no NaN behind.
  const csn = page.getByLabel('CSN at inspection');
  const figure = await csn.inputValue();
  await csn.fill('');
  await csn.fill(figure);
  expect(await seriousViolations(page)).toEqual([]);
  await page.getByRole('button', { name: 'Open the inspection' }).click();
  await expect(
    page.getByRole('heading', { name: /Inspection of VT3-D0105, 2 Nov 2026/ }),
  ).toBeVisible();

  // Corrected: the probe's calibration was in fact due before the inspection.
  await page.getByRole('button', { name: 'Correct the particulars' }).click();
  await page.getByLabel('Probe calibration due').fill('2026-10-01');
  await page.getByRole('button', { name: 'Save the corrected particulars' }).click();
  const flag = page.getByText('The probe’s calibration was due on 1 Oct 2026');
  await expect(flag).toBeVisible();
  await page
    .getByLabel('Why the inspection may go on')
    .first()
    .fill('Calibration renewed, certificate DEMO-CAL-40 on file');
  await page.getByRole('button', { name: 'Acknowledge' }).first().click();
  await expect(page.getByText('Acknowledged')).toBeVisible();
  // Corrected again: the flag stands and must be acknowledged anew.
  await page.getByRole('button', { name: 'Correct the particulars' }).click();
  await page.getByLabel('Probe calibration due').fill('2026-10-02');
  await page.getByRole('button', { name: 'Save the corrected particulars' }).click();
  await expect(page.getByText('The probe’s calibration was due on 2 Oct 2026')).toBeVisible();
  await expect(page.getByText('To acknowledge before submission').first()).toBeVisible();
  await expect(page.getByText('Acknowledged')).toHaveCount(0);

  // Started by mistake after all: voided with a reason, and kept.
  await page.getByRole('button', { name: 'Void this inspection…' }).click();
  const voidForm = page.getByRole('form', { name: 'Void this inspection' });
  expect(await seriousViolations(page)).toEqual([]);
  await voidForm.getByLabel('Why it is voided').fill('Opened on the wrong engine');
  await voidForm.getByRole('button', { name: 'Void the inspection' }).click();
  await expect(
    page.getByText(/Voided by Tobias Rennick on .*: Opened on the wrong engine/),
  ).toBeVisible();
  await expect(page.getByRole('button', { name: 'Correct the particulars' })).toHaveCount(0);
  await expect(page.getByRole('button', { name: /Submit/ })).toHaveCount(0);
  await expect(page.getByTestId('inspection-outcome')).toHaveCount(0);
  await page.screenshot({ path: 'test-results/particulars-void.png', fullPage: true });
  expect(warnings, 'NaN warnings in the console').toEqual([]);
});
