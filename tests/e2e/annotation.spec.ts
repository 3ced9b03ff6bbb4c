import type { Locator, Page } from '@playwright/test';
import { expect, signIn, test } from './fixtures';

/** A new draft inspection on VT3-D0104 with two of the demo's invented stills, through the API. */
async function inspectionWithDemoStills(page: Page): Promise<string> {
  const created = await page.request.post('/api/v1/inspections', {
    data: {
      engineId: 'engine-d0104',
      date: new Date().toISOString().slice(0, 10),
      reason: 'scheduled',
      csn: 11_032,
      tsn: 15_440,
      inspectorName: 'Tobias Rennick',
      qualificationRef: 'DEMO-BSI-L2-0457',
      qualificationExpiresOn: '2099-01-01',
      probe: 'Demo probe VX-6, s/n DEMO-118',
      probeCalibrationDueOn: '2099-01-01',
      rows: ['hpt1-ngv', 'hpt1-blade'],
    },
  });
  expect(created.status()).toBe(201);
  const { id, flags } = await created.json();
  // Whatever the new inspection was flagged for (TSN/CSN against the invented utilization) is
  // acknowledged here: the flags have their own test.
  for (const flag of flags as { code: string }[])
    await page.request.post(`/api/v1/inspections/${id}/flags/${flag.code}/acknowledgement`, {
      data: { note: 'Checked against the demo log book' },
    });
  const demo = await (await page.request.get('/api/v1/inspections/inspection-d0103-demo')).json();
  const wanted = ['hpt1-ngv-pos04.jpg', 'hpt1-blade-pos12.jpg'];
  const files = [];
  for (const name of wanted) {
    const image = demo.images.find((item: { originalName: string }) => item.originalName === name);
    const original = await page.request.get(`/api/v1/images/${image.id}/original`);
    files.push({ name, mimeType: 'image/jpeg', buffer: await original.body() });
  }
  for (const file of files) {
    const uploaded = await page.request.post(`/api/v1/inspections/${id}/images`, {
      multipart: { files: file },
    });
    expect(uploaded.status()).toBe(201);
  }
  return id;
}

/** Clicks the image point (x, y) of a 1600×1200 still on the drawing area. */
async function clickAt(area: Locator, x: number, y: number) {
  await area.scrollIntoViewIfNeeded();
  const box = (await area.boundingBox())!;
  await area.page().mouse.click(box.x + (x / 1600) * box.width, box.y + (y / 1200) * box.height);
}

test('the inspector calibrates, draws a burn outline and a crack line, records both, marks coverage and submits', async ({
  page,
}) => {
  await signIn(page, 'inspector@demo.test');
  const id = await inspectionWithDemoStills(page);
  await page.goto(`/inspections/${id}`);
  const area = page.getByTestId('drawing-area');
  await expect(area).toBeVisible();
  const strip = page.getByTestId('image-strip');
  const findingForm = page.getByRole('form', { name: 'Record the finding' });

  // The burn still: calibrate on the drawn 4 mm reference gauge.
  await strip.getByRole('button', { name: /hpt1-ngv-pos04/ }).click();
  await page.getByRole('button', { name: /Reference scale/ }).click();
  await clickAt(area, 120, 1100);
  await clickAt(area, 520, 1100);
  await page.getByLabel('True distance').fill('4');
  await page.getByRole('button', { name: 'Use this scale' }).click();
  await expect(page.getByTestId('calibration-state')).toHaveText(
    'Reference of 4 mm · saved with this still',
  );
  // The scale is kept with the still: it is there after a reload, before any finding.
  await page.reload();
  await strip.getByRole('button', { name: /hpt1-ngv-pos04/ }).click();
  await expect(page.getByTestId('calibration-state')).toHaveText(
    'Reference of 4 mm · saved with this still',
  );

  // Outline the burn patch.
  await page.getByRole('button', { name: /^Outline/ }).click();
  for (const [x, y] of [
    [600, 560],
    [680, 420],
    [820, 385],
    [960, 420],
    [1040, 560],
    [960, 700],
    [820, 735],
    [680, 700],
  ] as const)
    await clickAt(area, x, y);
  await page.getByRole('button', { name: 'Finish shape' }).click();
  await expect(page.getByTestId('live-area')).toContainText('mm²');
  await findingForm.getByRole('combobox', { name: 'Row', exact: true }).selectOption('hpt1-ngv');
  await findingForm.getByLabel(/^Position/).fill('4');
  await findingForm.getByRole('combobox', { name: 'Damage', exact: true }).selectOption('burn');
  await expect(page.getByTestId('live-verdict')).toBeVisible();
  const burnArea = (await page.getByTestId('live-area').textContent())!;
  const burnVerdict = (await page
    .getByTestId('live-verdict')
    .locator('[data-category]')
    .getAttribute('data-category'))!;
  // Its depth, read off the probe in inches, is kept in mm (1 in = 25.4 mm, NIST SP 811).
  await findingForm.getByRole('radio', { name: 'inches' }).check();
  await findingForm.getByLabel('Depth (in)').fill('0.01');
  await findingForm.getByRole('radio', { name: 'millimetres' }).check();
  await expect(findingForm.getByLabel('Depth (mm)')).toHaveValue('0.254');
  await page.screenshot({ path: 'test-results/annotation-burn.png' });
  await page.getByRole('button', { name: 'Record finding' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'F1 recorded' })).toBeVisible();
  const recorded = await (await page.request.get(`/api/v1/inspections/${id}/findings`)).json();
  expect(recorded.items[0].depthMm).toBeCloseTo(0.254, 9);

  // The crack still: a scale carries over only between stills of one size and one port.
  await strip.getByRole('button', { name: /hpt1-blade-pos12/ }).click();
  const reuse = page.getByLabel('Reuse the scale of a still of the same size and port');
  await expect(reuse).toBeVisible();
  const tagForm = page.getByRole('form', { name: 'Row and position shown' });
  await tagForm.getByLabel('Port').fill('Igniter port, left');
  await tagForm.getByRole('button', { name: 'Save tag' }).click();
  await expect(reuse).toBeHidden();
  await tagForm.getByLabel('Port').fill('');
  await tagForm.getByRole('button', { name: 'Save tag' }).click();
  await reuse.selectOption({ label: 'hpt1-ngv-pos04.jpg' });
  await expect(page.getByTestId('calibration-state')).toHaveText(
    'Reference of 4 mm, reused from hpt1-ngv-pos04.jpg · saved with this still',
  );
  await page.getByRole('button', { name: /^Line/ }).click();
  await clickAt(area, 760, 420);
  await clickAt(area, 790, 475);
  await clickAt(area, 825, 535);
  await area.press('Enter');
  await expect(page.getByTestId('live-length')).toContainText('mm');
  await findingForm.getByRole('combobox', { name: 'Row', exact: true }).selectOption('hpt1-blade');
  await findingForm.getByLabel(/^Position/).fill('12');
  await findingForm.getByRole('combobox', { name: 'Damage', exact: true }).selectOption('crack');
  const crackLength = (await page.getByTestId('live-length').textContent())!;
  await page.getByRole('button', { name: 'Record finding' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'F2 recorded' })).toBeVisible();
  await page.screenshot({ path: 'test-results/annotation-crack.png', fullPage: true });

  // What the page showed while drawing is what the server computed and stored.
  const stored = await (await page.request.get(`/api/v1/inspections/${id}/findings`)).json();
  const [burn, crack] = stored.items;
  expect(burnArea).toContain(`${burn.areaMm2.toFixed(2)} mm² ± ${burn.uncertaintyMm2.toFixed(2)}`);
  expect(burn.evaluation.category).toBe(burnVerdict);
  expect(crackLength).toContain(
    `${crack.lengthMm.toFixed(3)} mm ± ${crack.uncertaintyMm.toFixed(3)}`,
  );
  expect(crack.calibration.imageId).not.toBe(crack.imageId);

  // The stage rings mark the two positions by their verdicts; a click filters the list.
  const bladeRow = page.getByTestId('row-hpt1-blade');
  await expect(bladeRow.locator('[data-position="12"]')).toHaveAttribute(
    'data-category',
    crack.evaluation.category,
  );
  await expect(page.getByTestId('row-hpt1-ngv').locator('[data-position="4"]')).toHaveAttribute(
    'data-category',
    burn.evaluation.category,
  );
  await bladeRow.locator('[data-position="12"] path').click();
  await expect(bladeRow.getByTestId('finding-item')).toHaveCount(1);

  // A wrong position is corrected in place: the drawing stays, the ring and the store follow.
  await bladeRow.getByRole('button', { name: 'Correct F2…' }).click();
  const correction = page.getByRole('form', { name: 'Correct F2' });
  await correction.getByLabel(/^Position/).fill('');
  await correction.getByRole('button', { name: 'Save F2' }).click();
  await expect(correction.getByText('enter the position number')).toBeVisible();
  await correction.getByLabel(/^Position/).fill('13');
  await correction.screenshot({ path: 'test-results/annotation-correct.png' });
  await correction.getByRole('button', { name: 'Save F2' }).click();
  await expect(correction).toHaveCount(0);
  await expect(bladeRow.locator('[data-position="13"]')).toHaveAttribute(
    'data-category',
    crack.evaluation.category,
  );
  await expect(bladeRow.locator('[data-position="12"]')).toHaveAttribute('data-category', 'none');
  const corrected = await (await page.request.get(`/api/v1/findings/${crack.id}`)).json();
  expect(corrected.position).toBe(13);
  expect(corrected.lengthMm).toBe(crack.lengthMm);

  // Coverage: both rows fully viewed; the outcome loses its gaps.
  await expect(page.getByTestId('inspection-outcome')).toContainText('Not fully viewed');
  for (const row of ['HPT stage 1 nozzle guide vanes', 'HPT stage 1 blades']) {
    const form = page.getByRole('form', { name: `Coverage of ${row}` });
    // Nothing is chosen before the inspector chooses; a choice not saved says so.
    await expect(form.getByLabel('Fully viewed')).not.toBeChecked();
    await form.getByLabel('Fully viewed').check();
    await expect(form.getByText('Not saved', { exact: false })).toBeVisible();
    await form.getByRole('button', { name: /Save coverage/ }).click();
    await expect(form.getByText('Not saved', { exact: false })).toHaveCount(0);
    await expect(
      page.getByRole('heading', { name: new RegExp(`${row}.*Fully viewed`) }),
    ).toBeVisible();
  }
  await expect(page.getByTestId('inspection-outcome')).not.toContainText('Not fully viewed');
  await expect(page.getByLabel('Before it goes')).toContainText('2 findings recorded');

  // The confirmation sums up what goes: findings by verdict, rows, flags.
  await page.getByRole('button', { name: 'Submit for review…' }).click();
  const confirm = page.getByRole('region', { name: 'Submit this inspection?' });
  await expect(confirm.getByRole('list', { name: 'What goes for review' })).toContainText(
    /2 findings: /,
  );
  await expect(confirm).toContainText('Every listed row is fully viewed or its gap explained.');
  await confirm.getByRole('button', { name: 'Submit now' }).click();
  await expect(page.getByText('Submitted for review', { exact: true })).toBeVisible();
  await expect(page.getByRole('toolbar', { name: 'Drawing tools' })).toHaveCount(0);
  await page.screenshot({ path: 'test-results/annotation-submitted.png', fullPage: true });
});

test('every drawing tool can be chosen and used from the keyboard', async ({ page }) => {
  await signIn(page, 'inspector@demo.test');
  const id = await inspectionWithDemoStills(page);
  await page.goto(`/inspections/${id}`);
  const area = page.getByTestId('drawing-area');
  await area.focus();
  const tools = page.getByRole('toolbar', { name: 'Drawing tools' });

  // Reference scale: R, two points picked with the keyboard cursor, the distance typed.
  await page.keyboard.press('r');
  await expect(tools.getByRole('button', { name: /Reference scale/ })).toHaveAttribute(
    'aria-pressed',
    'true',
  );
  await page.keyboard.press('Space');
  for (let step = 0; step < 10; step += 1) await page.keyboard.press('Shift+ArrowRight');
  await page.keyboard.press('Space');
  await page.keyboard.type('4');
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('calibration-state')).toHaveText(
    'Reference of 4 mm · saved with this still',
  );

  // Line: L, three points, Enter; Ctrl+Z takes the last point back, Ctrl+Y restores it.
  await area.focus();
  await page.keyboard.press('l');
  await page.keyboard.press('Space');
  await page.keyboard.press('Shift+ArrowDown');
  await page.keyboard.press('Space');
  await page.keyboard.press('Shift+ArrowRight');
  await page.keyboard.press('Space');
  await page.keyboard.press('Control+z');
  await page.keyboard.press('Control+y');
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('live-length')).toContainText('mm');

  // Outline: O, three points, Enter; Point: P, Space.
  await page.keyboard.press('o');
  for (const key of ['Space', 'Shift+ArrowRight', 'Space', 'Shift+ArrowDown', 'Space', 'Enter'])
    await page.keyboard.press(key);
  await expect(page.getByTestId('live-area')).toContainText('mm²');
  await page.keyboard.press('p');
  await page.keyboard.press('Space');
  await expect(tools.getByRole('button', { name: /^Point/ })).toHaveAttribute(
    'aria-pressed',
    'true',
  );

  // Plane: C and four corners.
  await page.keyboard.press('c');
  for (const key of [
    'Space',
    'Shift+ArrowRight',
    'Space',
    'Shift+ArrowDown',
    'Space',
    'Shift+ArrowLeft',
    'Space',
  ])
    await page.keyboard.press(key);
  await expect(page.getByLabel('Width (corner 1 to 2)')).toBeFocused();
  await page.keyboard.type('2');
  await page.getByLabel('Height (2 to 3)').focus();
  await page.keyboard.type('2');
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('calibration-state')).toHaveText(
    'Plane 2 × 2 mm · saved with this still',
  );

  // The letters work with the focus anywhere but in a text field: on a tool button here.
  await tools.getByRole('button', { name: /Pan and zoom/ }).focus();
  await page.keyboard.press('l');
  await expect(tools.getByRole('button', { name: /^Line/ })).toHaveAttribute(
    'aria-pressed',
    'true',
  );
  // Typed into a field, a letter stays a letter.
  const notes = page.getByRole('form', { name: 'Record the finding' }).getByLabel(/Notes/);
  await notes.fill('');
  await notes.press('v');
  await expect(notes).toHaveValue('v');
  await expect(tools.getByRole('button', { name: /^Line/ })).toHaveAttribute(
    'aria-pressed',
    'true',
  );
});

test('a finding follows the still’s tag, and one placed elsewhere is recorded only when the inspector says so', async ({
  page,
}) => {
  await signIn(page, 'inspector@demo.test');
  const id = await inspectionWithDemoStills(page);
  const detail = await (await page.request.get(`/api/v1/inspections/${id}`)).json();
  const blade = detail.images.find(
    (image: { originalName: string }) => image.originalName === 'hpt1-blade-pos12.jpg',
  );
  const tagged = await page.request.patch(`/api/v1/images/${blade.id}`, {
    data: { rowKey: 'hpt1-blade', position: 2 },
  });
  expect(tagged.status()).toBe(200);
  await page.goto(`/inspections/${id}`);
  const area = page.getByTestId('drawing-area');
  const findingForm = page.getByRole('form', { name: 'Record the finding' });
  // First the untagged vane still, with the form set to another row, then the tagged blade still.
  await page
    .getByTestId('image-strip')
    .getByRole('button', { name: /hpt1-ngv-pos04/ })
    .click();
  await findingForm.getByRole('combobox', { name: 'Row', exact: true }).selectOption('hpt1-ngv');
  await findingForm.getByLabel(/^Position/).fill('9');
  await page
    .getByTestId('image-strip')
    .getByRole('button', { name: /hpt1-blade-pos12/ })
    .click();
  await expect(findingForm.getByRole('combobox', { name: 'Row', exact: true })).toHaveValue(
    'hpt1-blade',
  );
  await expect(findingForm.getByLabel(/^Position/)).toHaveValue('2');

  // Draw a crack, then move it to another blade: the form asks once.
  await page.getByRole('button', { name: /^Line/ }).click();
  await clickAt(area, 760, 420);
  await clickAt(area, 825, 535);
  await area.press('Enter');
  await findingForm.getByRole('combobox', { name: 'Damage', exact: true }).selectOption('crack');
  await findingForm.getByLabel(/^Position/).fill('3');
  const notice = findingForm.getByText('Not where the still is tagged');
  await expect(notice).toBeVisible();
  await expect(page.getByRole('button', { name: 'Record finding' })).toBeDisabled();
  await findingForm.getByRole('button', { name: /all the same/ }).click();
  await expect(findingForm.getByText('You said it belongs there.')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Record finding' })).toBeEnabled();
});
