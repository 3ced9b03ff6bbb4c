// Performance benchmarks (QUALITY §4). Each figure is printed beside its ceiling, measured in the
// same run where the ceiling is a measurement. Run after `pnpm build`.
import { benchInitialJavaScript } from './initial-javascript';
import { benchSessionCheck } from './session-check';

const results = [await benchInitialJavaScript(), await benchSessionCheck()];

console.log('\nbenchmark                                   figure          ceiling         within');
for (const result of results) {
  console.log(
    `${result.name.padEnd(44)}${result.figure.padEnd(16)}${result.ceiling.padEnd(16)}${result.ok ? 'yes' : 'NO'}`,
  );
}
if (results.some((result) => !result.ok)) process.exitCode = 1;
