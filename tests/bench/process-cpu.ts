/**
 * CPU time of other processes on Linux, from /proc/PID/stat (utime + stime, in clock ticks of
 * 1/100 s, the kernel's USER_HZ on Linux): how the benchmark tells what the load generator, the
 * server processes and the database each cost per request. NaN where /proc is not there.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';

const TICKS_PER_SECOND = 100;

/** Fields of /proc/PID/stat after the command name (which may hold spaces), or undefined. */
function statFields(pid: number): string[] | undefined {
  try {
    const text = readFileSync(`/proc/${pid}/stat`, 'utf8');
    return text.slice(text.lastIndexOf(')') + 2).split(' ');
  } catch {
    return undefined; // the process has ended
  }
}

/** CPU seconds used so far by these processes (those that ended count nothing). */
export function cpuSeconds(pids: readonly number[]): number {
  if (!existsSync('/proc/self/stat')) return Number.NaN;
  let ticks = 0;
  for (const pid of pids) {
    const f = statFields(pid);
    // After the name: state(0) ppid(1) … utime(11) stime(12).
    if (f) ticks += Number(f[11]) + Number(f[12]);
  }
  return ticks / TICKS_PER_SECOND;
}

/** The process and its children (one level: PostgreSQL's postmaster and its backends). */
export function withChildren(pid: number): number[] {
  if (!existsSync('/proc')) return [pid];
  const children = readdirSync('/proc')
    .filter((name) => /^\d+$/.test(name))
    .map(Number)
    .filter((p) => statFields(p)?.[1] === String(pid));
  return [pid, ...children];
}

/**
 * CPU seconds every process of the machine has used since boot, from /proc/stat's first line
 * (user, nice, system, irq, softirq and steal ticks): a benchmark subtracts its own share to see
 * what other work took of the cores while it ran. NaN where /proc is not there.
 */
export function machineBusySeconds(): number {
  if (!existsSync('/proc/stat')) return Number.NaN;
  const [, user, nice, system, , , irq, softirq, steal] = readFileSync('/proc/stat', 'utf8')
    .split('\n')[0]!
    .trim()
    .split(/\s+/)
    .map(Number);
  return (user! + nice! + system! + irq! + softirq! + steal!) / TICKS_PER_SECOND;
}
