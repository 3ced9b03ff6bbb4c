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

/**
 * CPU time a process has used so far (user + system, from /proc/<pid>/stat, in seconds): the
 * server's own counters, so that a load generator sharing the cores is not charged to it.
 */
export function cpuSeconds(pid: number): number {
  const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
  // Fields after the command name (which may hold spaces) start at ") "; utime and stime are the
  // 14th and 15th fields of the line, in clock ticks (100 a second on Linux).
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100;
}
