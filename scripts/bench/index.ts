// Performance benchmarks (QUALITY §4). Each figure is printed beside its ceiling, measured in the
// same run where the ceiling is a measurement. Run after `pnpm build`.
import { execFileSync } from 'node:child_process';
import { benchAnnotation } from './annotation';
import { benchEngineList } from './engine-list';
import { benchEvaluation } from './evaluation';
import { benchFindingsSearch } from './findings-search';
import { benchImpact } from './impact';
import { benchIngest } from './ingest';
import { benchInitialJavaScript } from './initial-javascript';
import { benchPlanning } from './planning';
import { benchReport } from './report';
import { benchSessionCheck } from './session-check';
import { benchVolume } from './volume';

const benches: [string, () => Promise<Result | Result[]>][] = [
  ['initial-javascript', benchInitialJavaScript],
  ['evaluation', benchEvaluation],
  ['session-check', benchSessionCheck],
  ['engine-list', benchEngineList],
  ['impact', benchImpact],
  ['findings-search', benchFindingsSearch],
  ['planning', benchPlanning],
  ['ingest', benchIngest],
  ['annotation', benchAnnotation],
  ['report', benchReport],
  // Minutes of seeding: only when asked for (pnpm bench:volume).
  ['volume', benchVolume],
];
const onRequestOnly = new Set(['volume']);
interface Result {
  name: string;
  figure: string;
  ceiling: string;
  ok: boolean;
}

// BENCH_ONLY=planning,engine-list runs only those. Each runs in a process of its own, so that
// what one leaves behind (a grown heap, code compiled for other objects) does not slow the next.
const only = process.env.BENCH_ONLY?.split(',');
const child = process.env.BENCH_CHILD;
const MARK = 'bench-result: ';
if (child) {
  const bench = benches.find(([name]) => name === child)![1];
  process.stdout.write(`\n${MARK}${JSON.stringify([await bench()].flat())}\n`);
} else {
  const results: Result[] = [];
  for (const [name] of benches) {
    if (only ? !only.includes(name) : onRequestOnly.has(name)) continue;
    const output = execFileSync(process.execPath, ['--import', 'tsx', 'scripts/bench/index.ts'], {
      env: { ...process.env, BENCH_CHILD: name },
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'inherit'],
      maxBuffer: 1 << 26,
    });
    const lines = output.split('\n');
    const mark = lines.find((line) => line.startsWith(MARK));
    if (!mark) throw new Error(`the ${name} benchmark gave no result`);
    const rest = lines
      .filter((line) => line !== mark)
      .join('\n')
      .trim();
    if (rest) console.log(rest);
    results.push(...(JSON.parse(mark.slice(MARK.length)) as Result[]));
  }

  // Columns as wide as their longest entry, so that every row reads straight across.
  const width = (key: 'name' | 'figure' | 'ceiling', heading: string) =>
    Math.max(heading.length, ...results.map((result) => result[key].length)) + 2;
  const [name, figure, ceiling] = [
    width('name', 'benchmark'),
    width('figure', 'figure'),
    width('ceiling', 'ceiling'),
  ];
  console.log(
    `\n${'benchmark'.padEnd(name)}${'figure'.padEnd(figure)}${'ceiling'.padEnd(ceiling)}within`,
  );
  for (const result of results) {
    console.log(
      `${result.name.padEnd(name)}${result.figure.padEnd(figure)}${result.ceiling.padEnd(ceiling)}${result.ok ? 'yes' : 'NO'}`,
    );
  }
  if (results.some((result) => !result.ok)) process.exitCode = 1;
}
