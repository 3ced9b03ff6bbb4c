import type { Database } from 'better-sqlite3';
import type { EvaluationFinding } from '../../packages/contracts/src/limits';
import { evaluate } from '../../packages/domain/src/limits';
import { DEMO_MODEL_ID, demoModelRows } from '../../apps/server/src/demo/demo-fleet';
import { DEMO_LIMIT_SET_ID, demoRules } from '../../apps/server/src/demo/demo-limits';

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
 * Stored findings on engines of the demo model for the benchmarks: one inspection of
 * `perInspection` findings per engine (a day apart over two years), each judged against D-1 as the
 * product stores it; every other inspection released, the rest left as drafts or submitted.
 * Synthetic rows only, written straight to SQLite: the image and user they name are not created.
 */
export function seedFindings(
  sqlite: Database,
  options: {
    findings: number;
    perInspection?: number;
    /** Engines to spread the inspections over (by default, one inspection each). */
    engines?: number;
    otherwise: 'draft' | 'submitted';
  },
): { engines: number } {
  const next = random(11);
  const findings = options.findings;
  const perInspection = options.perInspection ?? 20;
  const rows = Object.fromEntries(demoModelRows.map((row) => [row.key, { count: row.count }]));
  const insertEngine = sqlite.prepare(
    `INSERT INTO engines (id, serial_number, model_id, organisation_id, tsn, csn, tsn_csn_as_of, status, created_at)
     VALUES (?, ?, ?, 'org-corvid', 10000, 8000, '2026-11-30', 'installed', ?)`,
  );
  const insertInspection = sqlite.prepare(
    `INSERT INTO inspections (id, engine_id, date, reason, csn, tsn, inspector_name, qualification_ref,
       qualification_expires_on, probe, probe_calibration_due_on, rows, state, flags, created_by, created_at)
     VALUES (?, ?, ?, 'scheduled', 8000, 10000, 'Bench', 'Q', '2099-01-01', 'P', '2099-01-01',
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
  const submit = sqlite.prepare("UPDATE inspections SET state = 'submitted' WHERE id = ?");
  const now = Date.now();
  const inspections = Math.ceil(findings / perInspection);
  const engines = Math.min(options.engines ?? inspections, inspections);
  // Synthetic rows: every finding is drawn on one stand-in image (a row without a file), so that
  // every reference holds and the server opens the file as it opens a real installation's.
  sqlite.pragma('foreign_keys = OFF');
  sqlite.transaction(() => {
    sqlite
      .prepare(
        `INSERT INTO images (id, inspection_id, sha256, format, bytes, width, height, original_name,
           source, thumbnail, thumbnail_type, preview, preview_type, created_by, created_at)
         VALUES ('bench-image', 'bench-inspection-0', ?, 'jpeg', 1, 1, 1, 'bench.jpg', 'upload',
           x'', 'image/webp', x'', 'image/webp', 'user-admin', ?)`,
      )
      .run('0'.repeat(64), now);
    let made = 0;
    for (let engine = 0; engine < engines; engine += 1)
      insertEngine.run(
        `bench-engine-${engine}`,
        `VT3-B${String(engine).padStart(5, '0')}`,
        DEMO_MODEL_ID,
        now,
      );
    for (let inspection = 0; inspection < inspections; inspection += 1) {
      const engine = inspection % engines;
      const engineId = `bench-engine-${engine}`;
      const inspectionId = `bench-inspection-${inspection}`;
      // Findings go into a draft (a submitted inspection refuses them, db/triggers.ts); every
      // other inspection is then released. Two years of inspections, a day apart.
      const date = new Date(Date.UTC(2025, 0, 1) + (inspection % 730) * 86_400_000)
        .toISOString()
        .slice(0, 10);
      insertInspection.run(inspectionId, engineId, date, 'draft', now);
      const group: EvaluationFinding[] = [];
      for (let number = 1; number <= perInspection && made < findings; number += 1, made += 1) {
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
      if (inspection % 2) release.run(inspectionId);
      else if (options.otherwise === 'submitted') submit.run(inspectionId);
    }
  })();
  sqlite.pragma('foreign_keys = ON');
  return { engines };
}
