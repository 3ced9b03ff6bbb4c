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

/** utime and stime of a /proc stat line, in seconds (clock ticks: 100 a second on Linux). */
function statSeconds(stat: string): number {
  // Fields after the command name (which may hold spaces) start at ") "; utime and stime are the
  // 14th and 15th fields of the line.
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

/**
 * CPU time a process has used so far (user + system, from /proc/<pid>/stat, in seconds): the
 * server's own counters, so that a load generator sharing the cores is not charged to it.
 */
export function cpuSeconds(pid: number): number {
  return statSeconds(fs.readFileSync(`/proc/${pid}/stat`, 'utf8'));
}

/**
 * CPU time by kind of thread so far, in seconds: the JavaScript thread ("main"), libvips' workers,
 * and Node's own (libuv's pool, where sharp starts its pipelines and files are written; V8's
 * helpers), from /proc/<pid>/task. Threads that have ended are not counted.
 */
export function cpuSecondsByThread(pid: number): Record<string, number> {
  const byKind: Record<string, number> = {};
  for (const task of fs.readdirSync(`/proc/${pid}/task`)) {
    let stat: string;
    try {
      stat = fs.readFileSync(`/proc/${pid}/task/${task}/stat`, 'utf8');
    } catch {
      continue; // ended meanwhile
    }
    const name = stat.slice(stat.indexOf('(') + 1, stat.lastIndexOf(')'));
    const kind =
      task === String(pid) ? 'main' : name.startsWith('libvips') ? 'libvips' : 'node threads';
    byKind[kind] = (byKind[kind] ?? 0) + statSeconds(stat);
  }
  return byKind;
}

/** What each kind of thread used between two readings of `cpuSecondsByThread`. */
export function threadCpuSince(
  before: Record<string, number>,
  after: Record<string, number>,
): Record<string, number> {
  return Object.fromEntries(
    Object.entries(after).map(([kind, seconds]) => [kind, seconds - (before[kind] ?? 0)]),
  );
}
