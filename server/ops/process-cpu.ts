import { readdirSync, readFileSync } from 'node:fs';

/**
 * CPU time (user + system) used so far by processes and all their descendants, in ms, read from
 * Linux's /proc. The benchmark divides it by the requests served: unlike latency, that figure
 * barely moves when something else on the machine is busy, and it says what each request costs.
 */
export function cpuTimeMs(rootPids: number[]): number {
  const stats = new Map<number, { parent: number; ticks: number }>();
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      // The command name (field 2) may hold spaces; the fields after its closing parenthesis do not.
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      stats.set(Number(entry), {
        parent: Number(fields[1]),
        ticks: Number(fields[11]) + Number(fields[12]),
      });
    } catch {
      // The process ended while /proc was being read.
    }
  }
  const counted = new Set(rootPids.filter((pid) => stats.has(pid)));
  for (let grew = true; grew;) {
    grew = false;
    for (const [pid, { parent }] of stats) {
      if (!counted.has(pid) && counted.has(parent)) {
        counted.add(pid);
        grew = true;
      }
    }
  }
  // Linux reports these in clock ticks of 1/100 s (USER_HZ) on every architecture Node runs on.
  return [...counted].reduce((sum, pid) => sum + stats.get(pid)!.ticks * 10, 0);
}
