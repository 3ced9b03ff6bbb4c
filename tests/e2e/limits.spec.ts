import { seriousViolations } from './axe';
import { expect, signIn, test } from './fixtures';

// The demo's invented revision D-1 is in force; the blade-edge crack on VT3-D0103 (1.34 mm in the
// open demo inspection) is within its 1.5 mm repeat limit. A copy with the limit at 1.2 mm must
// show that finding leaving repeat inspection, and once published the inspection page must say so.
test('the engineer copies the demo revision, tightens a crack limit, checks the impact and publishes', async ({
  page,
  expectHttpError,
}) => {
  test.setTimeout(60_000);
  // Publishing with a wrong password is refused first.
  expectHttpError(422, /\/publication$/);
  // No request with an empty id (the draft screen once asked for /engine-models//limit-sets).
  const emptyIds: string[] = [];
  page.on('request', (request) => {
    if (/\/api\/v1\/.*\/\//.test(request.url())) emptyIds.push(request.url());
  });
  await signIn(page, 'engineer@demo.test');
  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: 'Limit library' })
    .click();
  await expect(page.getByRole('heading', { name: 'Limit library' })).toBeVisible();
  await expect(page.getByText('The demo limits are invented').first()).toBeVisible();
  await page.screenshot({ path: 'test-results/limits-library.png', fullPage: true });

  const inForce = page.getByRole('row', { name: /D-1.*In force/ });
  await inForce.getByRole('button', { name: 'Copy into a new draft…' }).click();
  const copy = page.getByRole('form', { name: 'Copy revision D-1 into a new draft' });
  await copy.getByLabel('Revision', { exact: true }).fill('D-3');
  await copy.getByLabel('Title').fill('Invented demo limits, tightened blade-edge cracks');
  await copy.getByRole('button', { name: 'Make the draft' }).click();
  await expect(page.getByRole('heading', { name: 'Revision D-3' })).toBeVisible();
  await expect(page.getByText('Draft', { exact: true })).toBeVisible();
  await page.getByRole('button', { name: 'Change the particulars…' }).click();
  const particulars = page.getByRole('form', { name: 'Particulars of revision D-3' });
  await particulars.getByLabel('Effective date').fill('2027-01-15');
  await particulars.getByRole('button', { name: 'Save the particulars' }).click();
  await expect(particulars).toHaveCount(0);
  await expect(page.getByText('15 Jan 2027')).toBeVisible();

  // A repeat limit below the serviceable one is refused in words before anything is sent.
  await page.getByRole('button', { name: /Change rule .*hpt1-blade\.crack\.edges/ }).click();
  const editor = page.getByRole('form', { name: 'Rule Cracks at the blade edges' });
  await editor.getByLabel('Repeat inspection up to (mm)').fill('0.4');
  await editor.getByRole('button', { name: 'Save the rule' }).click();
  await expect(
    editor.getByText(/repeat limit \(0\.4 mm\) is below the serviceable limit/),
  ).toBeVisible();
  await editor.screenshot({ path: 'test-results/limits-rule-editor.png' });
  await editor.getByLabel('Repeat inspection up to (mm)').fill('1.2');
  await editor.getByRole('button', { name: 'Save the rule' }).click();
  await expect(editor).toHaveCount(0);
  await expect(page.getByTestId('rule-hpt1-blade.crack.edges')).toContainText('1.2 mm');
  const table = (await page.getByTestId('rules-table').boundingBox())!;
  await page.screenshot({
    path: 'test-results/limits-rules.png',
    fullPage: true,
    clip: { x: 0, y: table.y - 80, width: 1280, height: 700 },
  });

  await page.getByRole('button', { name: 'Show the impact' }).click();
  const impact = page.getByTestId('impact-preview');
  const changes = page.getByTestId('impact-changes');
  // Other specs may have left blade cracks in open inspections: the count is read, not assumed.
  // The open inspection's crack; the released one before it (1.30 mm) is listed too.
  const open = changes.getByRole('row', { name: /VT3-D0103/ }).filter({ hasText: 'open' });
  await expect(open).toBeVisible();
  await expect(
    changes.getByRole('row', { name: /VT3-D0103/ }).filter({ hasText: 'released' }),
  ).toBeVisible();
  const listed = (await changes.getByRole('row').count()) - 1;
  await expect(impact).toContainText(`${listed} change${listed === 1 ? '' : 's'} on`);
  const crack = open;
  await expect(crack).toContainText('F1');
  await expect(crack.locator('[data-category]').first()).toHaveAttribute(
    'data-category',
    'repeat-inspection',
  );
  await expect(crack.locator('[data-category]').last()).toHaveAttribute(
    'data-category',
    'beyond-limits',
  );
  await expect(page.getByTestId('impact-engines')).toContainText('VT3-D0103');
  await impact.screenshot({ path: 'test-results/limits-impact.png' });

  // What the draft changes against D-1, field by field.
  await expect(page.getByTestId('rule-change')).toHaveCount(1);
  await expect(page.getByTestId('rule-change')).toContainText('Changed: Cracks at the blade edges');
  await expect(page.getByTestId('rule-change')).toContainText(
    'Repeat inspection up to: 1.5 mm → 1.2 mm',
  );

  // Its author cannot check it, and it cannot be published unchecked.
  await expect(page.getByTestId('limit-check')).toContainText('You made or changed this draft');
  await expect(page.getByRole('button', { name: 'Publish…' })).toBeDisabled();
  await expect(page.getByRole('button', { name: 'Sign the check…' })).toBeDisabled();
  const draftUrl = page.url();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();

  // A second engineer signs the independent check.
  await signIn(page, 'engineer2@demo.test');
  await page.goto(draftUrl);
  await page.getByRole('button', { name: 'Sign the check…' }).click();
  const check = page.getByRole('form', { name: 'Check revision D-3' });
  await expect(check).toContainText('takes effect on 15 Jan 2027');
  await check.getByLabel(/Your password/).fill('emberline-demo');
  await check.getByRole('button', { name: 'Sign the check of D-3' }).click();
  await expect(page.getByTestId('limit-check')).toContainText('Checked by Anselm Ruddock');
  expect(emptyIds).toEqual([]);
  expect(await seriousViolations(page), 'limit draft, checked').toEqual([]);
  await page.screenshot({ path: 'test-results/limits-checked.png', fullPage: true });
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await signIn(page, 'engineer@demo.test');
  await page.goto(draftUrl);

  await page.getByRole('button', { name: 'Publish…' }).click();
  const publish = page.getByRole('form', { name: 'Publish revision D-3' });
  await publish.getByLabel(/Your password/).fill('not my password');
  await publish.getByRole('button', { name: 'Publish D-3' }).click();
  await expect(publish.getByText('Not your password')).toBeVisible();
  await publish.getByLabel(/Your password/).fill('emberline-demo');
  await publish.getByRole('button', { name: 'Publish D-3' }).click();
  await expect(page.getByText('In force', { exact: true })).toBeVisible();
  await expect(page.getByTestId('published-by')).toContainText('Priya Castellane');
  await expect(
    page.getByRole('button', { name: /Change rule .*hpt1-blade\.crack\.edges/ }),
  ).toHaveCount(0);

  // The open demo inspection is judged again: its crack is now beyond limits under D-3.
  await page.goto('/inspections/inspection-d0103-demo');
  const blades = page.getByTestId('row-hpt1-blade');
  const item = blades.getByTestId('finding-item').filter({ hasText: 'F1' });
  await expect(item.locator('[data-category]')).toHaveAttribute('data-category', 'beyond-limits');
  await expect(item).toContainText(
    'over the repeat limit 1.20 mm (revision D-3, Cracks at the blade edges)',
  );
  await expect(page.getByTestId('inspection-outcome')).toContainText('revision D-3');
  await page.screenshot({ path: 'test-results/limits-after-publish.png', fullPage: true });

  await page.goto('/limits');
  await expect(page.getByRole('row', { name: /D-1.*Superseded/ })).toBeVisible();
});

test('an inspector reads the library but changes nothing, and a customer does not see it', async ({
  page,
}) => {
  await signIn(page, 'inspector@demo.test');
  await page.goto('/limits');
  await expect(page.getByRole('heading', { name: 'Limit library' })).toBeVisible();
  await expect(page.getByRole('button', { name: /Copy into a new draft/ })).toHaveCount(0);
  await page.getByRole('link', { name: 'D-2' }).click();
  await expect(page.getByTestId('rules-table')).toBeVisible();
  await expect(page.getByRole('button', { name: /Change rule/ })).toHaveCount(0);
  await expect(page.getByRole('link', { name: 'Export CSV' })).toBeVisible();

  await page.getByRole('button', { name: 'Sign out' }).click();
  // Signed out before the next sign-in: the sign-in page of a session still ending would move on.
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await signIn(page, 'customer@demo.test');
  await page.goto('/limits');
  await expect(page.getByText('Not available to your role')).toBeVisible();
});

test('the engineer imports a CSV into a draft: a bad file is refused line by line, a good one replaces the rules', async ({
  page,
}) => {
  await signIn(page, 'engineer@demo.test');
  await page.goto('/limits/limits-vt300-demo-r2');
  const csv = await (
    await page.request.get('/api/v1/limit-sets/limits-vt300-demo-r1/export?format=csv')
  ).text();
  const lines = csv.split('\r\n');
  // The third line with a unit no rule can have (the unit is the seventh column).
  const cells = lines[2]!.split(',');
  cells[6] = 'furlong';
  const bad = [lines[0], lines[1], cells.join(',')].join('\n');
  const file = page.getByLabel('Rules file (CSV or JSON)');
  await file.setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
  const preview = page.getByTestId('import-preview');
  await expect(preview).toContainText('1 rule would be taken, 1 refused');
  await expect(preview.getByRole('row', { name: /^3 unit is not one of/ })).toBeVisible();
  await expect(page.getByRole('button', { name: /^Replace the/ })).toBeDisabled();

  await file.setInputFiles({ name: 'd-1.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
  await expect(preview).toContainText(`${lines.length - 1} rules would be taken, 0 refused`);
  await page.getByRole('button', { name: /^Replace the \d+ rules with these/ }).click();
  await expect(
    page.getByText(`The draft now has the ${lines.length - 1} rules of the file.`),
  ).toBeVisible();
  // D-1's blade-edge crack limit is back in the draft: 1.5 mm rather than D-2's 1.2 mm.
  await expect(page.getByTestId('rule-hpt1-blade.crack.edges')).toContainText('1.5 mm');
});
