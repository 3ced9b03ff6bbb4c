import fs from 'node:fs';
import path from 'node:path';
import { prepareRuntime } from '../../apps/server/src/bootstrap';
import { rawConnection } from '../../apps/server/src/db/client';
import { createLogger } from '../../apps/server/src/lib/logger';
import { makeDataDir } from '../../apps/server/test/test-app';
import { benchConfig, measureSearches } from './findings-search';
import { seedFindings } from './seed-findings';

const FINDINGS = Number(process.env.BENCH_VOLUME_FINDINGS ?? 2_000_000);
const ENGINES = Number(process.env.BENCH_VOLUME_ENGINES ?? 10_000);

/**
 * Ten times the volume of the other benchmarks: `FINDINGS` recorded findings in inspections of 20
 * over `ENGINES` engines (ten inspections each at the defaults). Recorded, not held to a ceiling:
 * the SQLite file's size, the time to open it as the server does at start-up (migrations checked,
 * the image sweep), and the findings search beside its raw SQL. The planning board at 10,000
 * engines is `BENCH_PLANNING_ENGINES=10000` of the planning benchmark (`pnpm bench:volume`).
 */
export async function benchVolume() {
  const dataDir = makeDataDir();
  const config = benchConfig(dataDir);
  const logger = createLogger('silent', false);
  const first = await prepareRuntime(config, logger);
  const seeding = performance.now();
  seedFindings(rawConnection(first.ctx.db), {
    findings: FINDINGS,
    engines: ENGINES,
    otherwise: 'submitted',
  });
  const seeded = (performance.now() - seeding) / 1000;
  rawConnection(first.ctx.db).pragma('optimize');
  rawConnection(first.ctx.db).pragma('wal_checkpoint(TRUNCATE)');
  await first.close();

  const file = path.join(dataDir, 'emberline.sqlite');
  const bytes = fs.statSync(file).size;
  // A cold open, as after a restart: the page cache of this process is empty.
  const opening = performance.now();
  const runtime = await prepareRuntime(config, logger);
  const opened = performance.now() - opening;
  const results = [
    {
      name: `SQLite file, ${FINDINGS / 1e6}M findings, ${ENGINES} engines (seeded in ${seeded.toFixed(0)} s)`,
      figure: `${(bytes / 1024 / 1024).toFixed(0)} MB`,
      ceiling: 'recorded',
      ok: true,
    },
    {
      name: 'time to open it as the server starts (migrations, sweep)',
      figure: `${opened.toFixed(0)} ms`,
      ceiling: 'recorded',
      ok: true,
    },
    ...(await measureSearches(runtime, {
      label: `${FINDINGS / 1e6}M`,
      warmUp: 1,
      requests: 5,
      budget: null,
    })),
  ];
  await runtime.close();
  fs.rmSync(dataDir, { recursive: true, force: true });
  return results;
}
