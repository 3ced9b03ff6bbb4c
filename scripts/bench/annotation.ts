import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium } from '@playwright/test';
import sharp from 'sharp';
import {
  freePort,
  openInspectionOverHttp,
  signInCookie,
  startServerProcess,
} from '../lib/server-process';

const FINDINGS = Number(process.env.BENCH_FINDINGS ?? 200);
const CLICKS = 30;

const percentile = (samples: number[], p: number) => {
  const sorted = [...samples].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
};

/** An inspection with one 4000×3000 still and 200 findings drawn on it, through the API. */
async function seed(base: string, cookie: string): Promise<string> {
  const json = { 'Content-Type': 'application/json', cookie };
  const id = await openInspectionOverHttp(base, cookie, { inspectorName: 'Bench' });
  const still = await sharp({
    create: {
      width: 4000,
      height: 3000,
      channels: 3,
      background: '#553311',
      noise: { type: 'gaussian', mean: 90, sigma: 12 },
    },
  })
    .jpeg({ quality: 85 })
    .toBuffer();
  const form = new FormData();
  form.append(
    'files',
    new Blob([new Uint8Array(still)], { type: 'image/jpeg' }),
    'bench-4000x3000.jpg',
  );
  const uploaded = (await (
    await fetch(`${base}/inspections/${id}/images`, {
      method: 'POST',
      headers: { cookie },
      body: form,
    })
  ).json()) as {
    images: { id: string }[];
  };
  const imageId = uploaded.images[0]!.id;
  for (let index = 0; index < FINDINGS; index += 1) {
    const x = 200 + (index % 20) * 180;
    const y = 200 + Math.floor(index / 20) * 260;
    const polygon = index % 2 === 1;
    const response = await fetch(`${base}/inspections/${id}/findings`, {
      method: 'POST',
      headers: json,
      body: JSON.stringify({
        imageId,
        shape: polygon
          ? {
              kind: 'polygon',
              points: [
                [x, y],
                [x + 90, y + 10],
                [x + 100, y + 90],
                [x + 10, y + 110],
              ],
            }
          : {
              kind: 'polyline',
              points: [
                [x, y],
                [x + 40, y + 60],
                [x + 70, y + 150],
              ],
            },
        calibration: { kind: 'reference', p1: [100, 2900], p2: [900, 2900], lengthMm: 8 },
        row: 'hpt1-blade',
        position: (index % 64) + 1,
        zone: 'leading-edge',
        damage: polygon ? 'coating-loss' : 'crack',
        method: 'image',
      }),
    });
    if (response.status !== 201) throw new Error(`finding ${index} answered ${response.status}`);
  }
  return id;
}

/**
 * The annotation page in Chromium with 200 findings on a 4000×3000 image: frame time while panning
 * and zooming (p95), and the time from a click to the new vertex painted (p95). Targets: 16 ms and
 * 50 ms (issue 7). Headless Chromium here rasterises in software (no GPU).
 */
export async function benchAnnotation() {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-annotation-'));
  const port = await freePort();
  const server = await startServerProcess(dataDir, port);
  const origin = `http://127.0.0.1:${port}`;
  const cookie = await signInCookie(`${origin}/api/v1`, 'inspector@demo.test');
  const inspectionId = await seed(`${origin}/api/v1`, cookie);
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu'],
  });
  try {
    const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
    const [name, value] = cookie.split('=') as [string, string];
    await context.addCookies([{ name, value, url: origin }]);
    const page = await context.newPage();
    await page.goto(`${origin}/inspections/${inspectionId}`);
    await page
      .locator('[data-shape]')
      .nth(FINDINGS - 1)
      .waitFor({ state: 'attached', timeout: 30_000 });
    const area = page.getByTestId('drawing-area');
    await area.scrollIntoViewIfNeeded();
    const box = (await area.boundingBox())!;
    const centre = { x: box.x + box.width / 2, y: box.y + box.height / 2 };

    // Frame times: requestAnimationFrame deltas while the image is dragged and wheel-zoomed.
    // In-page scripts go as text: tsx would otherwise wrap their functions in a helper the page lacks.
    await page.evaluate(`(() => {
      window.benchFrames = [];
      window.benchRunning = true;
      let last = performance.now();
      const tick = (now) => {
        window.benchFrames.push(now - last);
        last = now;
        if (window.benchRunning) requestAnimationFrame(tick);
      };
      requestAnimationFrame(tick);
    })()`);
    // The display's own frame interval, measured at rest: no frame can be shorter than this.
    await page.waitForTimeout(1000);
    const idle = (await page.evaluate(
      '(() => { const idle = window.benchFrames.slice(2); window.benchFrames = []; return idle; })()',
    )) as number[];
    for (let round = 0; round < 4; round += 1) {
      await page.mouse.move(centre.x, centre.y);
      await page.mouse.wheel(0, -240);
      await page.mouse.down();
      for (let step = 0; step < 30; step += 1)
        await page.mouse.move(centre.x + step * 8 * (round % 2 ? -1 : 1), centre.y + step * 4);
      await page.mouse.up();
      await page.mouse.wheel(0, 240);
    }
    const frames = (await page.evaluate(
      '(() => { window.benchRunning = false; return window.benchFrames.slice(2); })()',
    )) as number[];
    await page.getByRole('button', { name: 'Fit' }).click();
    // Fit animates back; the clicks go where the image is once it has stopped.
    await page.waitForTimeout(600);
    const fitted = (await area.boundingBox())!;

    // Click to vertex: from the pointer press to the frame after the new handle is in the page.
    await page.getByRole('button', { name: /^Line/ }).click();
    const latencies: number[] = [];
    for (let index = 0; index < CLICKS; index += 1) {
      await page.evaluate(`(() => {
        const before = document.querySelectorAll('[data-vertex]').length;
        window.benchPainted = new Promise((resolve) => {
          const observer = new MutationObserver(() => {
            if (document.querySelectorAll('[data-vertex]').length !== before) {
              observer.disconnect();
              requestAnimationFrame(() => resolve(performance.now() - window.benchPressedAt));
            }
          });
          observer.observe(document.body, { childList: true, subtree: true });
        });
        window.addEventListener('pointerdown', () => (window.benchPressedAt = performance.now()), { once: true, capture: true });
      })()`);
      await page.mouse.click(fitted.x + 40 + index * 12, fitted.y + 40 + (index % 5) * 20);
      latencies.push(
        (await page.evaluate(
          `(async () => await Promise.race([window.benchPainted, new Promise((_, fail) => setTimeout(() => fail(new Error('click ${index} drew no vertex')), 5000))]))()`,
        )) as number,
      );
    }
    const frameP95 = percentile(frames, 95);
    const interval = percentile(idle, 50);
    const clickP95 = percentile(latencies, 95);
    return [
      {
        name: `annotation frame time p95, ${FINDINGS} shapes, 4000×3000 (ms)`,
        figure: frameP95.toFixed(1),
        // A frame's time is a whole number of display frames: at 60 Hz the shortest is 16.7 ms, so
        // the 16 ms target means that 95 % of frames are painted within one display interval.
        ceiling: `16 (target); 1 frame = ${interval.toFixed(1)}`,
        ok: frameP95 <= Math.max(16, interval + 1),
      },
      {
        name: 'annotation click to vertex p95 (ms)',
        figure: clickP95.toFixed(1),
        ceiling: '50 (target)',
        ok: clickP95 <= 50,
      },
    ];
  } finally {
    await browser.close();
    server.kill('SIGTERM');
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}
