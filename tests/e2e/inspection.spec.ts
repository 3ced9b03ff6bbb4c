import type { Page } from '@playwright/test';
import sharp from 'sharp';
import { expect, signIn, test } from './fixtures';

/** Distinct small JPEGs, made here: no photograph is needed. */
async function stills(count: number) {
  return Promise.all(
    Array.from({ length: count }, async (_, index) => ({
      name: `still-${String(index + 1).padStart(2, '0')}.jpg`,
      mimeType: 'image/jpeg',
      buffer: await sharp({
        create: {
          width: 800,
          height: 600,
          channels: 3,
          background: { r: 40 + index * 9, g: 30 + index * 4, b: 20 },
        },
      })
        .jpeg()
        .toBuffer(),
    })),
  );
}

/** Signs in as the inspector and opens a new inspection of VT3-D0104 through its form. */
async function openInspectionOfD0104(page: Page, probeCalibrationDue: string) {
  await signIn(page, 'inspector@demo.test');
  await page.goto('/fleet/engine-d0104');
  await page.getByRole('link', { name: 'New inspection' }).click();
  await page.getByLabel('Qualification reference').fill('DEMO-L2-0099');
  await page.getByLabel('Qualification valid until').fill('2027-12-31');
  await page.getByLabel('Probe (model and serial)').fill('Demo probe VX-6 s/n 7');
  await page.getByLabel('Probe calibration due').fill(probeCalibrationDue);
  await page.getByRole('button', { name: 'Open the inspection' }).click();
  await expect(page.getByRole('heading', { name: /Inspection of VT3-D0104/ })).toBeVisible();
}

test('the inspector opens an inspection, drops 20 images, browses and zooms them, and grabs a video frame', async ({
  page,
}) => {
  test.setTimeout(90_000);
  await openInspectionOfD0104(page, '2020-01-01');

  // An expired calibration is flagged and must be acknowledged with a reason.
  await expect(page.getByText('The probe’s calibration was due on 1 Jan 2020')).toBeVisible();
  await page
    .getByLabel('Why the inspection may go on')
    .fill('Calibration renewed, certificate DEMO-CAL-9 on file');
  await page.getByRole('button', { name: 'Acknowledge' }).click();
  await expect(page.getByText('Acknowledged')).toBeVisible();

  await page.getByLabel('Images to upload').setInputFiles(await stills(20));
  const uploads = page.getByRole('complementary', { name: 'Uploads' });
  await expect(uploads).toContainText('Uploads: finished', { timeout: 60_000 });
  // Once every file is stored the panel folds to its one line, clear of the page's buttons.
  await expect(uploads.getByTestId('upload-list')).toHaveCount(0);
  const submit = page.getByRole('button', { name: /^Submit for review/ });
  await submit.scrollIntoViewIfNeeded();
  const box = (await submit.boundingBox())!;
  const panel = (await uploads.boundingBox())!;
  const overlaps =
    box.x < panel.x + panel.width &&
    panel.x < box.x + box.width &&
    box.y < panel.y + panel.height &&
    panel.y < box.y + box.height;
  expect(overlaps, 'the upload panel covers the submit button').toBe(false);
  await uploads.getByRole('button', { name: /^Uploads: finished/ }).click();
  await expect(uploads.locator('[data-status="done"]')).toHaveCount(20);
  await expect(page.getByTestId('image-strip').getByRole('button')).toHaveCount(20);

  const viewer = page.getByRole('region', { name: 'Image viewer' });
  await expect(viewer).toContainText('image 1 of 20');
  await viewer.focus();
  await page.keyboard.press('ArrowRight');
  await expect(viewer).toContainText('image 2 of 20');
  await page.keyboard.press('ArrowLeft');
  await page.keyboard.press('ArrowLeft');
  await expect(viewer).toContainText('image 20 of 20');
  await expect(page.getByTestId('viewer-resolution')).toHaveText('Preview');
  await viewer.getByRole('button', { name: 'Zoom in' }).click();
  await viewer.getByRole('button', { name: 'Zoom in' }).click();
  await expect(page.getByTestId('viewer-resolution')).toHaveText('Full resolution');
  await expect(viewer.getByRole('img')).toHaveAttribute('src', /\/full$/);
  await page.screenshot({ path: 'test-results/inspection-viewer.png', fullPage: true });

  // A short WebM made in the page from a canvas: the test needs no video file of its own.
  const webm = await page.evaluate(async () => {
    const canvas = document.createElement('canvas');
    canvas.width = 320;
    canvas.height = 240;
    const context = canvas.getContext('2d')!;
    const recorder = new MediaRecorder(canvas.captureStream(25), { mimeType: 'video/webm' });
    const chunks: Blob[] = [];
    recorder.ondataavailable = (event) => chunks.push(event.data);
    const stopped = new Promise((resolve) => (recorder.onstop = resolve));
    recorder.start();
    for (let frame = 0; frame < 25; frame += 1) {
      context.fillStyle = `rgb(${frame * 10}, 80, 40)`;
      context.fillRect(0, 0, 320, 240);
      await new Promise((resolve) => setTimeout(resolve, 40));
    }
    recorder.stop();
    await stopped;
    const bytes = new Uint8Array(await new Blob(chunks, { type: 'video/webm' }).arrayBuffer());
    let binary = '';
    for (const byte of bytes) binary += String.fromCharCode(byte);
    return btoa(binary);
  });
  const recording = {
    name: 'bp3-sweep.webm',
    mimeType: 'video/webm',
    buffer: Buffer.from(webm, 'base64'),
  };
  await page.getByLabel('Probe video (MP4 or WebM)').setInputFiles(recording);
  const video = page.getByLabel('Video bp3-sweep.webm');
  await expect(video).toBeVisible();
  await expect
    .poll(() => video.evaluate((element: HTMLVideoElement) => element.readyState))
    .toBeGreaterThanOrEqual(2);
  await page.getByRole('button', { name: 'Grab this frame' }).click();
  await expect(page.getByText('1 frame sent to the upload queue')).toBeVisible();
  await expect(page.getByTestId('image-strip').getByRole('button')).toHaveCount(21, {
    timeout: 20_000,
  });
  await page.getByTestId('image-strip').getByRole('button').last().click();
  await expect(viewer).toContainText('of bp3-sweep.webm');

  await page.getByRole('button', { name: 'Submit for review…' }).click();
  // The confirmation is not covered by the upload panel.
  const submitNow = page
    .getByRole('region', { name: 'Submit this inspection?' })
    .getByRole('button', { name: 'Submit now' });
  await submitNow.click({ trial: true });
  await submitNow.click();
  await expect(page.getByText('Submitted for review', { exact: true })).toBeVisible();
  await expect(page.getByLabel('Images to upload')).toHaveCount(0);
});

test('a video the browser cannot play is refused with what to convert it to', async ({ page }) => {
  await signIn(page, 'inspector@demo.test');
  await page.goto('/inspections/inspection-d0103-demo');
  await page.getByLabel('Probe video (MP4 or WebM)').setInputFiles({
    name: 'probe.avi',
    mimeType: 'video/x-msvideo',
    buffer: Buffer.from('RIFF0000AVI LIST'),
  });
  await expect(page.getByText('Convert it to MP4 with H.264 video, or to WebM')).toBeVisible();
});

test('the demo inspection shows its invented stills to staff and not to a customer', async ({
  page,
  expectHttpError,
}) => {
  expectHttpError(404, /\/api\/v1\/inspections\/inspection-d0103-demo(\/findings|\/coverage)?$/);
  await signIn(page, 'engineer@demo.test');
  await page.goto('/inspections/inspection-d0103-demo');
  await expect(page.getByTestId('image-strip').getByRole('button')).toHaveCount(6);
  await expect(page.getByLabel('Images to upload')).toHaveCount(0);
  await page.getByRole('button', { name: 'Sign out' }).click();
  // Signed out before the next sign-in: the sign-in page of a session still ending would move on.
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await signIn(page, 'customer@demo.test');
  await page.goto('/inspections/inspection-d0103-demo');
  await expect(
    page.getByText('There is no such inspection, or it is not shared with you.'),
  ).toBeVisible();
});

test('an upload held by the server’s rate limit waits its turn and goes again by itself', async ({
  page,
  expectHttpError,
}) => {
  await openInspectionOfD0104(page, '2027-01-01');

  // The first upload is answered as the server answers past its limit; the rest go through.
  expectHttpError(429, /\/images$/);
  let held = 0;
  await page.route(/\/api\/v1\/inspections\/[^/]+\/images$/, async (route) => {
    if (held > 0) return route.continue();
    held += 1;
    await route.fulfill({
      status: 429,
      headers: { 'Retry-After': '1', 'Content-Type': 'application/json' },
      body: JSON.stringify({
        error: {
          code: 'too_many_requests',
          message: 'Too many uploads from your account: wait 1 second and try again.',
          requestId: 'test',
        },
      }),
    });
  });
  await page.getByLabel('Images to upload').setInputFiles(await stills(2));
  const uploads = page.getByRole('complementary', { name: 'Uploads' });
  await expect(uploads).toContainText('The server asked for a pause: sending again in 1 s');
  await expect(uploads).toContainText('Uploads: finished', { timeout: 30_000 });
  expect(held).toBe(1);
  await expect(page.getByTestId('image-strip').getByRole('button')).toHaveCount(2);
});
