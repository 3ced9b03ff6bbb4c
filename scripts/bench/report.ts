import http from 'node:http';
import type { AddressInfo } from 'node:net';
import sharp from 'sharp';
import { createApp } from '../../apps/server/src/app';
import { prepareRuntime } from '../../apps/server/src/bootstrap';
import { loadConfig } from '../../apps/server/src/config/env';
import { createReviewService } from '../../apps/server/src/modules/review/review.service';
import { buildReport } from '../../apps/server/src/modules/reports/report-builder';
import { createLogger } from '../../apps/server/src/lib/logger';
import { makeDataDir } from '../../apps/server/test/test-app';

const FINDINGS = 40;
const RUNS = 3;
const BUDGET_MS = 3000;

const median = (values: number[]) =>
  [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

/**
 * The report of an inspection with 40 findings, each on its own 12 MP still (4000 × 3000, noise
 * like a dim borescope scene), every image drawn over with its finding: rendered as a release
 * renders it, beside the same document without the images, against the 3 s budget.
 */
export async function benchReport() {
  const config = loadConfig({
    DEMO: '1',
    DATA_DIR: makeDataDir(),
    LOG_LEVEL: 'silent',
    BCRYPT_COST: '10',
    NODE_ENV: 'production',
    DEMO_IMAGES: '0',
  });
  const runtime = await prepareRuntime(config, createLogger('silent', false));
  const server = http
    .createServer(createApp(runtime.ctx, { webDist: null }))
    .listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1`;
  const signIn = async (email: string) => {
    const response = await fetch(`${origin}/auth/login`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email, password: 'emberline-demo' }),
    });
    return (response.headers.get('set-cookie') ?? '').split(';')[0]!;
  };
  const call = async (cookie: string, method: string, path: string, body?: unknown) => {
    const response = await fetch(`${origin}${path}`, {
      method,
      headers: { cookie, 'Content-Type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const json = (await response.json()) as Record<string, unknown>;
    if (response.status >= 300)
      throw new Error(`${method} ${path} answered ${response.status}: ${JSON.stringify(json)}`);
    return json;
  };
  const inspector = await signIn('inspector@demo.test');
  const engineer = await signIn('engineer@demo.test');
  const inspection = await call(inspector, 'POST', '/inspections', {
    engineId: 'engine-d0102',
    date: new Date().toISOString().slice(0, 10),
    reason: 'scheduled',
    csn: 14_000,
    tsn: 22_500,
    inspectorName: 'Tobias Rennick',
    qualificationRef: 'BSI-L2-0457',
    qualificationExpiresOn: '2099-03-31',
    probe: 'Demo probe VX-6 s/n 118',
    probeCalibrationDueOn: '2099-09-30',
    rows: ['hpt1-ngv', 'hpt1-blade'],
  });
  const id = inspection.id as string;

  const noise = await sharp({
    create: {
      width: 4000,
      height: 3000,
      channels: 3,
      background: '#553311',
      noise: { type: 'gaussian', mean: 90, sigma: 12 },
    },
  })
    .raw()
    .toBuffer();
  for (let index = 0; index < FINDINGS; index += 1) {
    const band = Buffer.alloc(4000 * 3 * 8, (index * 37) % 256);
    band.copy(noise, index * 60 * 4000 * 3);
    const jpeg = await sharp(noise, { raw: { width: 4000, height: 3000, channels: 3 } })
      .jpeg({ quality: 88 })
      .toBuffer();
    const form = new FormData();
    form.append('files', new Blob([jpeg], { type: 'image/jpeg' }), `still-${index}.jpg`);
    const uploaded = await fetch(`${origin}/inspections/${id}/images`, {
      method: 'POST',
      headers: { cookie: inspector },
      body: form,
    });
    const image = ((await uploaded.json()) as { images: { id: string }[] }).images[0]!;
    await call(inspector, 'POST', `/inspections/${id}/findings`, {
      imageId: image.id,
      shape: {
        kind: 'polyline',
        points: [
          [1200, 1500],
          [1240 + index, 1500],
        ],
      },
      // 1,600 px between two reference points 10 mm apart.
      calibration: { kind: 'reference', p1: [1000, 2000], p2: [2600, 2000], lengthMm: 10 },
      row: index % 2 ? 'hpt1-blade' : 'hpt1-ngv',
      position: 1 + Math.floor(index / 2),
      zone: 'leading-edge',
      damage: 'crack',
      method: 'image',
    });
  }
  for (const row of ['hpt1-ngv', 'hpt1-blade'])
    await call(inspector, 'PUT', `/inspections/${id}/coverage/${row}`, {
      status: 'full',
      viewedPositions: [],
      noDamageFound: false,
      reason: '',
    });
  const flags = (await call(inspector, 'GET', `/inspections/${id}`)).flags as { code: string }[];
  for (const flag of flags)
    await call(inspector, 'POST', `/inspections/${id}/flags/${flag.code}/acknowledgement`, {
      note: 'Benchmark',
    });
  await call(inspector, 'POST', `/inspections/${id}/submission`);
  const findings = (await call(engineer, 'GET', `/inspections/${id}/findings`)).items as {
    id: string;
    evaluation: { category: string; repeatInterval: unknown };
  }[];
  for (const finding of findings)
    await call(engineer, 'POST', `/findings/${finding.id}/dispositions`, {
      decision:
        finding.evaluation.category === 'serviceable'
          ? { kind: 'serviceable' }
          : finding.evaluation.category === 'repeat-inspection'
            ? { kind: 'repeat-inspection', repeatInterval: finding.evaluation.repeatInterval }
            : {
                kind: 'remove',
                action: { kind: 'remove-before-next-flight', cycles: null, hours: null },
              },
      rationale: 'Benchmark',
      concessionRef: null,
      password: 'emberline-demo',
    });
  const left = (await call(engineer, 'GET', `/inspections/${id}/dispositions`)).left as {
    flags: { code: string }[];
  };
  await call(engineer, 'POST', `/inspections/${id}/outcome`, {
    password: 'emberline-demo',
    flagAcceptances: left.flags.map((flag) => ({ code: flag.code, note: 'Benchmark' })),
  });

  const me = (await call(engineer, 'GET', '/auth/me')).user as Parameters<
    ReturnType<typeof createReviewService>['review']
  >[0]['user'];
  const review = createReviewService(runtime.ctx).review({ user: me, sessionId: 'bench' }, id);
  const request = {
    inspectionId: id,
    review,
    revision: 1,
    verificationCode: 'BenchmarkCode0000000000',
    verifyUrl: 'http://127.0.0.1/verify/BenchmarkCode0000000000',
    nextDue: 'not computed in the benchmark',
  };
  const timed = async (images: boolean) => {
    const samples: number[] = [];
    let bytes = 0;
    for (let run = 0; run < RUNS; run += 1) {
      const started = performance.now();
      bytes = (await buildReport(runtime.ctx, request, { images })).length;
      samples.push(performance.now() - started);
    }
    return { ms: median(samples), bytes };
  };
  const plain = await timed(false);
  const full = await timed(true);
  server.close();
  await runtime.close();
  if (process.env.BENCH_DETAIL)
    console.log(
      `report: ${FINDINGS} findings; with images ${(full.bytes / 1e6).toFixed(1)} MB, without ${(plain.bytes / 1e6).toFixed(2)} MB`,
    );
  return {
    name: `report PDF, ${FINDINGS} findings on ${FINDINGS} annotated 12 MP images (median ms)`,
    figure: full.ms.toFixed(0),
    ceiling: `${BUDGET_MS} budget; no images ${plain.ms.toFixed(0)}`,
    ok: full.ms <= BUDGET_MS,
  };
}
