import type { Page } from '@playwright/test';
import { seriousViolations } from './axe';
import { DEMO_PASSWORD, expect, signIn, test } from './fixtures';

const D0201 = 'inspection-d0201-demo';

/** Signs in the open signing dialog, after checking that it states what the signature means. */
async function sign(page: Page, button: string, meaning: RegExp) {
  const dialog = page.getByRole('dialog');
  await expect(dialog).toBeVisible();
  await expect(dialog).toContainText(meaning);
  await dialog.getByLabel('Your password, to sign').fill(DEMO_PASSWORD);
  await dialog.getByRole('button', { name: button, exact: true }).click();
  await expect(dialog).toBeHidden();
}

test('the inspector who recorded the findings may not disposition them', async ({
  page,
  expectHttpError,
}) => {
  expectHttpError(403, '/dispositions');
  await signIn(page, 'inspector@demo.test');
  await page.goto(`/review/${D0201}`);
  await expect(page.getByText('Not available to your role')).toBeVisible();
  const findings = await page.request.get(`/api/v1/inspections/${D0201}/findings`);
  const first = ((await findings.json()) as { items: { id: string }[] }).items[0]!;
  const refused = await page.request.post(`/api/v1/findings/${first.id}/dispositions`, {
    data: {
      decision: { kind: 'serviceable' },
      rationale: 'Trying to sign my own finding',
      password: DEMO_PASSWORD,
    },
    headers: { Origin: new URL(page.url()).origin },
  });
  expect(refused.status()).toBe(403);
});

test('the engineer works through VT3-D0201 from the queue: signs each finding (one by concession), corrects one, accepts the flag, signs the outcome and releases; the customer sees the decisions', async ({
  page,
}) => {
  test.setTimeout(120_000);
  await signIn(page, 'engineer@demo.test');
  const fleetRow = page.getByTestId('engine-row').filter({ hasText: 'VT3-D0201' });
  await expect(fleetRow.getByTestId('awaiting-disposition')).toHaveText(
    /Awaiting disposition, beyond limits/,
  );
  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: 'Review queue' })
    .click();
  await expect(page.getByRole('heading', { name: 'Review queue' })).toBeVisible();
  const row = page.getByTestId('queue-row').filter({ hasText: 'VT3-D0201' });
  await expect(row).toContainText('Beyond limits');
  await expect(row).toContainText('5 findings to decide, 1 flag to accept');
  expect(await seriousViolations(page), 'review queue').toEqual([]);
  await row.getByRole('link', { name: 'VT3-D0201' }).click();

  await expect(page.getByRole('heading', { name: /Review of VT3-D0201/ })).toBeVisible();
  await expect(page.getByTestId('finding-review')).toBeVisible();
  expect(await seriousViolations(page), 'disposition screen').toEqual([]);

  // The keyboard moves between findings.
  await page.keyboard.press('n');
  await expect(page.getByTestId('finding-review').getByRole('heading', { level: 3 })).toContainText(
    'F2',
  );
  await page.keyboard.press('p');
  await expect(page.getByTestId('finding-review').getByRole('heading', { level: 3 })).toContainText(
    'F1',
  );

  // Each finding in turn; F2 (a repeat inspection) kept in service by concession, which the
  // form names and which needs its reference. S opens the signing dialog.
  for (const number of [1, 2, 3, 4, 5]) {
    await expect(
      page.getByTestId('finding-review').getByRole('heading', { level: 3 }),
    ).toContainText(`F${number}`);
    const concession = page.getByText('This decision is a concession');
    if (number === 2) {
      await expect(concession).toBeHidden();
      await page.getByLabel('Decision on F2').selectOption('serviceable');
      await expect(concession).toBeVisible();
      await page.getByLabel('Concession reference (needed)').fill('INVENTED-TCH-0042');
      await page.getByLabel('Rationale').fill('Burn within the blend-repair capability (invented)');
      await page.getByRole('button', { name: /Sign the disposition/ }).click();
    } else {
      await page.getByLabel('Rationale').fill(`As the verdict calls for (F${number})`);
      // A review verdict has no default: keeping it in service is a concession too.
      if (await concession.isVisible())
        await page.getByLabel('Concession reference (needed)').fill('INVENTED-TCH-0043');
      await page.getByRole('heading', { name: /Review of VT3-D0201/ }).click();
      await page.keyboard.press('s');
    }
    await sign(
      page,
      'Sign',
      /compared this finding with the damage limits .* under my authorisation/,
    );
  }
  await expect(page.getByTestId('review-finding').filter({ hasText: 'To decide' })).toHaveCount(0);

  // F4 corrected: both stay, the newer one current.
  await page.getByTestId('review-finding').filter({ hasText: 'F4' }).click();
  await page.getByRole('button', { name: 'Correct this disposition…' }).click();
  await page.getByLabel('Rationale').fill('Worded again after a second look');
  await page
    .getByLabel('Why the earlier decision is corrected')
    .fill('The first rationale named the wrong vane');
  await page.getByRole('button', { name: /Sign the correction/ }).click();
  await sign(page, 'Sign', /under my authorisation/);
  await expect(page.getByTestId('finding-dispositions').locator('li')).toHaveCount(2);

  // The lapsed probe calibration is accepted with a note, and the outcome signed.
  await page
    .getByLabel(/The probe’s calibration was due/)
    .fill('Measurements cross-checked on the reference still; accepted (invented)');
  await page.getByRole('button', { name: 'Sign the outcome…' }).click();
  await sign(page, 'Sign the outcome', /I sign the inspection outcome stated/);
  await expect(page.getByText(/Outcome signed by Priya Castellane/)).toBeVisible();

  await page.getByRole('button', { name: 'Release to the owner…' }).click();
  await sign(page, 'Sign the release', /I release this dispositioned inspection/);
  await expect(page.getByText(/Released \(revision 1\) by Priya Castellane/)).toBeVisible();

  await page.goto('/fleet');
  await expect(fleetRow).toBeVisible();
  await expect(fleetRow.getByTestId('awaiting-disposition')).toHaveCount(0);

  // The owner sees the released inspection with its signed decisions.
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await signIn(page, 'customer2@demo.test');
  await page.goto(`/inspections/${D0201}`);
  const decisions = page.getByTestId('decisions-summary');
  await expect(decisions.locator('tbody tr')).toHaveCount(5);
  await expect(decisions).toContainText('Concession INVENTED-TCH-0042');
  await expect(decisions).toContainText('Released (revision 1) by Priya Castellane');

  // The signed report downloads: a PDF named for the engine and the day.
  const download = page.waitForEvent('download');
  await decisions
    .getByRole('link', { name: 'Download the signed report, revision 1 (PDF)' })
    .click();
  const file = await download;
  expect(file.suggestedFilename()).toMatch(/^emberline-VT3-D0201-\d{4}-\d{2}-\d{2}-rev1\.pdf$/);
  const bytes = Buffer.concat(await (await file.createReadStream()).toArray());
  expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');

  // Its code checks out on the public page, which shows the engine, the day and the revision only.
  await decisions.getByRole('link', { name: /check it \(code / }).click();
  await expect(page.getByRole('heading', { name: 'Check a report' })).toBeVisible();
  await expect(page.getByText('Genuine and current', { exact: true })).toBeVisible();
  await expect(page.getByTestId('verified-report')).toContainText('VT3-D0201');
  await page.getByLabel(/Is my copy the signed one/).setInputFiles({
    name: 'report.pdf',
    mimeType: 'application/pdf',
    buffer: bytes,
  });
  await expect(page.getByText('The file is the signed report, byte for byte.')).toBeVisible();
  expect(await seriousViolations(page), 'report check page').toEqual([]);

  // The owner's Reports list it, and the inspection logs the e-mail that carried it.
  await page.goto('/reports');
  await expect(page.getByTestId('report-row').filter({ hasText: 'VT3-D0201' })).toHaveCount(1);
  await page.goto(`/inspections/${D0201}`);
  await expect(page.getByRole('table', { name: 'Delivery log' })).toContainText(
    'Signed report, revision 1',
  );

  // Another customer gets nothing of it.
  await page.goto('/fleet');
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await signIn(page, 'customer@demo.test');
  const refused = await page.request.get(`/api/v1/inspections/${D0201}/report`);
  expect(refused.status()).toBe(404);
});
