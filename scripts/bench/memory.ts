import fs from 'node:fs';

/** Peak resident set size of a process (VmHWM in /proc), in bytes; 0 where /proc has none. */
export function peakRssBytes(pid: number): number {
  try {
    const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
    const match = /VmHWM:\s+(\d+) kB/.exec(status);
    return match ? Number(match[1]) * 1024 : 0;
  } catch {
    return 0;
  }
}
