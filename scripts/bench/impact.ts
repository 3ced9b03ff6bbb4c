import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { EvaluationFinding } from '../../packages/contracts/src/limits';
import { evaluate } from '../../packages/domain/src/limits';
import { createApp } from '../../apps/server/src/app';
import { prepareRuntime } from '../../apps/server/src/bootstrap';
import { loadConfig } from '../../apps/server/src/config/env';
import { rawConnection } from '../../apps/server/src/db/client';
import { DEMO_MODEL_ID, demoModelRows } from '../../apps/server/src/demo/demo-fleet';
import {
  DEMO_DRAFT_LIMIT_SET_ID,
  DEMO_LIMIT_SET_ID,
  demoRules,
} from '../../apps/server/src/demo/demo-limits';
import { createLogger } from '../../apps/server/src/lib/logger';
import {
  currentFindings,
  currentFindingsQuery,
} from '../../apps/server/src/modules/findings/findings.repository';
import { makeDataDir } from '../../apps/server/test/test-app';

const FINDINGS = Number(process.env.BENCH_IMPACT_FINDINGS ?? 200_000);
const PER_INSPECTION = 20;
const RUNS = 5;

/** A deterministic pseudo-random sequence (mulberry32), so that every run measures the same work. */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

// What the synthetic findings are, and how often: a few blade-edge cracks around the demo limits
// (more than three cracked blades would put the whole row beyond limits), vane burns, blade nicks.
const kinds = [
  {
    share: 0.08,
    row: 'hpt1-blade',
    zone: 'leading-edge',
    damage: 'crack',
    field: 'lengthMm',
    max: 1.6,
  },
  { share: 0.46, row: 'hpt1-ngv', zone: 'leading-edge', damage: 'burn', field: 'areaMm2', max: 30 },
  { share: 0.46, row: 'hpt1-blade', zone: 'tip', damage: 'nick', field: 'depthMm', max: 0.6 },
] as const;
const pick = (draw: number) => {
  let sum = 0;
  for (const kind of kinds) if (draw < (sum += kind.share)) return kind;
  return kinds[kinds.length - 1]!;
};

/**
 * 200,000 stored findings on the demo model's engines (one inspection of 20 findings per engine,
 * half of them released, each judged against D-1 as the product stores it), then the impact
 * preview of draft D-2 through HTTP, beside the 1 s budget (QUALITY §4) and the SQL read alone.
 */
export async function benchImpact() {
  const config = loadConfig({
    DEMO: '1',
    DATA_DIR: makeDataDir(),
    LOG_LEVEL: 'silent',
    BCRYPT_COST: '10',
    NODE_ENV: 'production',
    DEMO_IMAGES: '0',
  });
  const runtime = await prepareRuntime(config, createLogger('silent', false));
  const sqlite = rawConnection(runtime.ctx.db);
  const next = random(11);
  const rows = Object.fromEntries(demoModelRows.map((row) => [row.key, { count: row.count }]));
  const insertEngine = sqlite.prepare(
    `INSERT INTO engines (id, serial_number, model_id, organisation_id, tsn, csn, tsn_csn_as_of, status, created_at)
     VALUES (?, ?, ?, 'org-corvid', 10000, 8000, '2026-11-30', 'installed', ?)`,
  );
  const insertInspection = sqlite.prepare(
    `INSERT INTO inspections (id, engine_id, date, reason, csn, tsn, inspector_name, qualification_ref,
       qualification_expires_on, probe, probe_calibration_due_on, rows, state, flags, created_by, created_at)
     VALUES (?, ?, '2026-11-01', 'scheduled', 8000, 10000, 'Bench', 'Q', '2099-01-01', 'P', '2099-01-01',
       '["hpt1-blade","hpt1-ngv"]', ?, '[]', 'user-admin', ?)`,
  );
  const insertFinding = sqlite.prepare(
    `INSERT INTO findings (id, inspection_id, number, image_id, shape, pick_uncertainty_px, row_key,
       position, zone, damage, method, length_mm, area_mm2, depth_mm, uncertainty_mm, uncertainty_mm2,
       series_id, status, evaluation, category, repeat_cycles, repeat_hours, repeat_days, limit_set_id,
       evaluated_at, created_by, created_at, updated_at)
     VALUES (?, ?, ?, 'bench-image', '{"kind":"point","points":[[1,1]]}', 1, ?, ?, ?, ?, 'probe', ?, ?, ?,
       ?, ?, ?, 'recorded', ?, ?, ?, ?, ?, ?, ?, 'user-admin', ?, ?)`,
  );
  const release = sqlite.prepare(
    "UPDATE inspections SET state = 'released', release_revision = 1 WHERE id = ?",
  );
  const now = Date.now();
  const engines = Math.ceil(FINDINGS / PER_INSPECTION);
  // Synthetic rows only: the image and user they name are not created.
  sqlite.pragma('foreign_keys = OFF');
  sqlite.transaction(() => {
    let made = 0;
    for (let engine = 0; engine < engines; engine += 1) {
      const engineId = `bench-engine-${engine}`;
      const inspectionId = `bench-inspection-${engine}`;
      insertEngine.run(engineId, `VT3-B${String(engine).padStart(5, '0')}`, DEMO_MODEL_ID, now);
      // Findings go into a draft (a submitted inspection refuses them, db/triggers.ts); every
      // other inspection is then released.
      insertInspection.run(inspectionId, engineId, 'draft', now);
      const group: EvaluationFinding[] = [];
      for (let number = 1; number <= PER_INSPECTION && made < FINDINGS; number += 1, made += 1) {
        const kind = pick(next());
        const value = next() * kind.max;
        group.push({
          id: `${inspectionId}-f${number}`,
          row: kind.row,
          position: 1 + Math.floor(next() * rows[kind.row]!.count),
          zone: kind.zone,
          damage: kind.damage,
          lengthMm: kind.field === 'lengthMm' ? value : null,
          areaMm2: kind.field === 'areaMm2' ? value : null,
          depthMm: kind.field === 'depthMm' ? value : null,
          widthMm: null,
          count: null,
          uncertaintyMm: kind.field === 'areaMm2' ? null : 0.02,
          uncertaintyMm2: kind.field === 'areaMm2' ? 0.5 : null,
        });
      }
      const stored = evaluate({ rows, rules: demoRules, findings: group }, { explain: false });
      group.forEach((finding, index) => {
        const evaluation = stored.findings[index]!;
        insertFinding.run(
          finding.id,
          inspectionId,
          index + 1,
          finding.row,
          finding.position,
          finding.zone,
          finding.damage,
          finding.lengthMm,
          finding.areaMm2,
          finding.depthMm,
          finding.uncertaintyMm,
          finding.uncertaintyMm2,
          finding.id,
          JSON.stringify(evaluation),
          evaluation.category,
          evaluation.repeatInterval?.cycles ?? null,
          evaluation.repeatInterval?.hours ?? null,
          evaluation.repeatInterval?.days ?? null,
          DEMO_LIMIT_SET_ID,
          now,
          now,
          now,
        );
      });
      if (engine % 2) release.run(inspectionId);
    }
  })();
  sqlite.pragma('foreign_keys = ON');

  const server = http
    .createServer(createApp(runtime.ctx, { webDist: null }))
    .listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1`;
  const login = await fetch(`${origin}/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'engineer@demo.test', password: 'emberline-demo' }),
  });
  const cookie = (login.headers.get('set-cookie') ?? '').split(';')[0]!;
  const api: number[] = [];
  let judged = 0;
  let changed = 0;
  for (let run = 0; run < RUNS; run += 1) {
    const started = performance.now();
    const response = await fetch(`${origin}/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/impact`, {
      headers: { cookie },
    });
    const body = (await response.json()) as { findings: number; changedCount: number };
    api.push(performance.now() - started);
    if (response.status !== 200) throw new Error(`impact answered ${response.status}`);
    judged = body.findings;
    changed = body.changedCount;
  }
  const reads: number[] = [];
  for (let run = 0; run < RUNS; run += 1) {
    const started = performance.now();
    let read = 0;
    for (const { findings } of currentFindings(runtime.ctx.db, DEMO_MODEL_ID))
      read += findings.length;
    if (read < FINDINGS) throw new Error(`read ${read} findings`);
    reads.push(performance.now() - started);
  }
  // The floor under the read: better-sqlite3 stepping through the same query's rows as arrays
  // (an inspection's findings each, as SQLite's JSON text), making nothing of them.
  const { sql: text, params } = currentFindingsQuery(DEMO_MODEL_ID);
  const bare = sqlite.prepare(text).raw(true);
  const scans: number[] = [];
  for (let run = 0; run < RUNS; run += 1) {
    const started = performance.now();
    let read = 0;
    for (const _row of bare.iterate(...params)) read += 1;
    if (read < engines) throw new Error(`scanned ${read} inspections`);
    scans.push(performance.now() - started);
  }
  await new Promise((resolve) => server.close(resolve));
  await runtime.close();
  const median = (samples: number[]) => [...samples].sort((a, b) => a - b)[samples.length >> 1]!;
  const figure = median(api);
  const read = median(reads);
  const scan = median(scans);
  return [
    {
      name: `impact preview, ${(judged / 1000).toFixed(0)}k findings, ${changed} changes (median)`,
      figure: `${figure.toFixed(0)} ms`,
      ceiling: `1000 ms; ${(figure / read).toFixed(2)}× its read (1.5×)`,
      ok: figure < 1000 && figure <= 1.5 * read && judged >= FINDINGS,
    },
    {
      name: `impact preview's SQL read of ${(FINDINGS / 1000).toFixed(0)}k findings`,
      figure: `${read.toFixed(0)} ms`,
      ceiling: `${scan.toFixed(0)} ms raw scan × 3 (${(read / scan).toFixed(2)}×)`,
      ok: read <= 3 * scan,
    },
  ];
}
