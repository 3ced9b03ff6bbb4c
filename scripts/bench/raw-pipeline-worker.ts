// The raw pipeline of the ingest benchmark, in a process of its own so that its peak memory is its
// own: the same renditions (lib/images), the same parallelism, no HTTP, no database.
import fs from 'node:fs';
import path from 'node:path';
import { processImage } from '../../apps/server/src/lib/images/image-pipeline';
import { cpuSecondsByThread, peakRssBytes, threadCpuSince } from './memory';

const [directory, parallelText] = process.argv.slice(2);
const files = fs.readdirSync(directory!).map((name) => path.join(directory!, name));
const parallel = Number(parallelText ?? 2);

const started = performance.now();
const cpuBefore = process.cpuUsage();
const threadsBefore = cpuSecondsByThread(process.pid);
let next = 0;
await Promise.all(
  Array.from({ length: parallel }, async () => {
    while (next < files.length) {
      const file = files[next++]!;
      await processImage(file);
    }
  }),
);
const seconds = (performance.now() - started) / 1000;
const cpu = process.cpuUsage(cpuBefore);
process.stdout.write(
  JSON.stringify({
    images: files.length,
    seconds,
    cpuSeconds: (cpu.user + cpu.system) / 1e6,
    threads: threadCpuSince(threadsBefore, cpuSecondsByThread(process.pid)),
    peakRss: peakRssBytes(process.pid),
  }),
);
