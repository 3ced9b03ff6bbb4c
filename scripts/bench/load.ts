// pnpm bench:load: the built server under load from autocannon on 127.0.0.1, bounded in count and
// time: signed-in JSON reads, thumbnails, uploads four at a time, and a flood of sign-ins. Prints
// p50/p99 latency, answers by status, and the server's resident memory; exits 1 on any 5xx.
// Run after `pnpm build`.
import fs from 'node:fs';
import os from 'node:os';
import autocannon from 'autocannon';
import sharp from 'sharp';
import { oneFileEnvelope } from '../lib/multipart';
import {
  freePort,
  openInspectionOverHttp,
  signInCookie,
  startServerProcess,
} from '../lib/server-process';
import { peakRssBytes } from './memory';

const DURATION_S = Number(process.env.BENCH_LOAD_SECONDS ?? 8);

function currentRssBytes(pid: number): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmRSS:\s+(\d+) kB/.exec(status)?.[1] ?? 0) * 1024;
}

interface Scenario {
  name: string;
  options: autocannon.Options;
}

interface Row {
  name: string;
  requests: number;
  p50: number;
  p99: number;
  statuses: Record<string, number>;
  errors: number;
  rssMb: number;
}

async function run(scenario: Scenario, pid: number): Promise<Row> {
  const result = await autocannon({ ...scenario.options });
  const statuses: Record<string, number> = {};
  for (const [key, count] of Object.entries(result.statusCodeStats ?? {}))
    statuses[key] = (count as { count: number }).count;
  return {
    name: scenario.name,
    requests: result.requests.total,
    p50: result.latency.p50,
    p99: result.latency.p99,
    statuses,
    errors: result.errors + result.timeouts,
    rssMb: currentRssBytes(pid) / 1e6,
  };
}

/** Distinct stills as a probe's (1600 × 1200 JPEG, sensor-like noise), one multipart body each. */
async function uploadBodies(count: number) {
  return Promise.all(
    Array.from({ length: count }, async (_, index) => {
      const image = await sharp({
        create: {
          width: 1600,
          height: 1200,
          channels: 3,
          background: '#553311',
          noise: { type: 'gaussian', mean: 80 + index, sigma: 12 },
        },
      })
        .jpeg({ quality: 88 })
        .toBuffer();
      const { contentType, head, tail } = oneFileEnvelope(`load-${index}.jpg`);
      return { contentType, body: Buffer.concat([head, image, tail]) };
    }),
  );
}

const dataDir = fs.mkdtempSync(`${os.tmpdir()}/emberline-load-`);
const port = await freePort();
const base = `http://127.0.0.1:${port}/api/v1`;
const server = await startServerProcess(dataDir, port, { DEMO_IMAGES: '1' });
const pid = server.pid!;
try {
  const planner = await signInCookie(base, 'planner@demo.test');
  const inspector = await signInCookie(base, 'inspector@demo.test');
  const demo = (await (
    await fetch(`${base}/inspections/inspection-d0103-demo`, { headers: { cookie: inspector } })
  ).json()) as { images: { id: string }[] };
  const thumbnails = demo.images.map((image) => `/api/v1/images/${image.id}/thumbnail`);
  const inspectionId = await openInspectionOverHttp(base, inspector, {
    inspectorName: 'Load Bench',
    engineId: 'engine-d0104',
    csn: 9000,
    tsn: 13000,
  });
  const uploads = await uploadBodies(80);
  const url = `http://127.0.0.1:${port}`;
  const common = { url, duration: DURATION_S, workers: 0 };
  let uploadIndex = 0;
  let thumbnailIndex = 0;
  const scenarios: Scenario[] = [
    {
      name: 'signed-in JSON reads (planning, engines, inspections)',
      options: {
        ...common,
        connections: 8,
        amount: 20_000,
        requests: [
          { method: 'GET', path: '/api/v1/planning', headers: { cookie: planner } },
          { method: 'GET', path: '/api/v1/engines?pageSize=25', headers: { cookie: planner } },
          { method: 'GET', path: '/api/v1/inspections', headers: { cookie: planner } },
        ],
      },
    },
    {
      name: `thumbnails (${thumbnails.length} of the demo)`,
      options: {
        ...common,
        connections: 8,
        amount: 20_000,
        requests: [
          {
            method: 'GET',
            setupRequest: (request) => ({
              ...request,
              path: thumbnails[thumbnailIndex++ % thumbnails.length]!,
              headers: { cookie: inspector },
            }),
          },
        ],
      },
    },
    {
      name: 'uploads of 1600 × 1200 stills, four at a time',
      options: {
        ...common,
        connections: 4,
        amount: uploads.length,
        requests: [
          {
            method: 'POST',
            path: `/api/v1/inspections/${inspectionId}/images`,
            setupRequest: (request) => {
              const upload = uploads[uploadIndex++ % uploads.length]!;
              return {
                ...request,
                headers: {
                  cookie: inspector,
                  'content-type': upload.contentType,
                },
                body: upload.body,
              };
            },
          },
        ],
      },
    },
    {
      name: 'sign-in flood (wrong passwords, one address)',
      options: {
        ...common,
        connections: 16,
        amount: 400,
        requests: [
          {
            method: 'POST',
            path: '/api/v1/auth/login',
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({ email: 'engineer@demo.test', password: 'not-the-password' }),
          },
        ],
      },
    },
  ];
  const rows: Row[] = [];
  for (const scenario of scenarios) rows.push(await run(scenario, pid));
  const peak = peakRssBytes(pid) / 1e6;
  console.log(
    `\n${'load'.padEnd(56)}${'requests'.padStart(9)}${'p50 ms'.padStart(8)}${'p99 ms'.padStart(8)}  ${'answers'.padEnd(30)}${'RSS MB'.padStart(7)}`,
  );
  for (const row of rows)
    console.log(
      `${row.name.padEnd(56)}${String(row.requests).padStart(9)}${String(row.p50).padStart(8)}${String(row.p99).padStart(8)}  ${Object.entries(
        row.statuses,
      )
        .map(([status, count]) => `${status}×${count}`)
        .join(' ')
        .padEnd(30)}${row.rssMb.toFixed(0).padStart(7)}`,
    );
  console.log(`server peak RSS ${peak.toFixed(0)} MB`);
  const serverErrors = rows.flatMap((row) =>
    Object.entries(row.statuses)
      .filter(([status]) => status.startsWith('5'))
      .map(([status, count]) => `${row.name}: ${count} × ${status}`),
  );
  const failures = rows
    .filter((row) => row.errors > 0)
    .map((row) => `${row.name}: ${row.errors} errors`);
  if (serverErrors.length || failures.length) {
    console.log(`NOT within: ${[...serverErrors, ...failures].join('; ')}`);
    process.exitCode = 1;
  } else console.log('No 5xx answer and no connection error under any load.');
} finally {
  server.kill('SIGKILL');
}
