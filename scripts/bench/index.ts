// Performance benchmarks (QUALITY §4). Each figure is printed beside its ceiling, measured in the
// same run where the ceiling is a measurement. Run after `pnpm build`.
import { benchAnnotation } from './annotation';
import { benchEngineList } from './engine-list';
import { benchEvaluation } from './evaluation';
import { benchImpact } from './impact';
import { benchIngest } from './ingest';
import { benchInitialJavaScript } from './initial-javascript';
import { benchPlanning } from './planning';
import { benchReport } from './report';
import { benchSessionCheck } from './session-check';

const benches: [string, () => Promise<Result | Result[]>][] = [
  ['initial-javascript', benchInitialJavaScript],
  ['evaluation', benchEvaluation],
  ['session-check', benchSessionCheck],
  ['engine-list', benchEngineList],
  ['impact', benchImpact],
  ['planning', benchPlanning],
  ['ingest', benchIngest],
  ['annotation', benchAnnotation],
  ['report', benchReport],
];
interface Result {
  name: string;
  figure: string;
  ceiling: string;
  ok: boolean;
}

// BENCH_ONLY=planning,engine-list runs only those.
const only = process.env.BENCH_ONLY?.split(',');
const results: Result[] = [];
for (const [name, bench] of benches)
  if (!only || only.includes(name)) results.push(...[await bench()].flat());

console.log(`\n${'benchmark'.padEnd(60)}${'figure'.padEnd(16)}${'ceiling'.padEnd(30)}within`);
for (const result of results) {
  console.log(
    `${result.name.padEnd(60)}${result.figure.padEnd(16)}${result.ceiling.padEnd(30)}${result.ok ? 'yes' : 'NO'}`,
  );
}
if (results.some((result) => !result.ok)) process.exitCode = 1;
