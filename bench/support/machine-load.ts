import fs from 'node:fs';
import os from 'node:os';

/**
 * How busy the machine and some of its processes were over a stretch of a benchmark, so figures
 * taken on a machine shared with other work can be read: a slow figure on a saturated machine
 * says something else than one on an idle machine. Linux only for the processes (`/proc`).
 */
export interface MachineLoad {
  /** Share of all cores' time spent not idle, 0–1. */
  readonly busyShare: number;
  readonly cores: number;
  /** CPU used by each watched group of processes over the stretch, in cores (1 = one core fully used). */
  readonly groups: ReadonlyMap<string, CpuUse>;
}

export interface CpuUse {
  readonly cores: number;
  /** The part of `cores` spent in the kernel on the processes' behalf (system calls: sockets, copying). */
  readonly kernelCores: number;
}

/** Names a group of processes and answers their ids; asked at the start and the end, so short-lived ones are missed. */
export type WatchedProcesses = ReadonlyMap<string, () => readonly number[]>;

interface CpuMs {
  readonly userMs: number;
  readonly kernelMs: number;
}

interface Sample {
  readonly atMs: number;
  readonly busyMs: number;
  readonly totalMs: number;
  readonly groups: ReadonlyMap<string, CpuMs>;
}

function coreTimes(): { busyMs: number; totalMs: number } {
  let busyMs = 0;
  let totalMs = 0;
  for (const { times } of os.cpus()) {
    const total = times.user + times.nice + times.sys + times.idle + times.irq;
    totalMs += total;
    busyMs += total - times.idle;
  }
  return { busyMs, totalMs };
}

/** Linux counts process times in clock ticks, 100 a second on every common build. */
const CLOCK_TICKS_PER_S = 100;

/** The fields of `/proc/<pid>/stat` after the command name (which may hold spaces), from field 3 on; null once the process is gone. */
function statFields(pid: number): string[] | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    return stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  } catch {
    return null;
  }
}

/** User and system time of one process so far (fields 14 and 15). */
function processCpuMs(pid: number): CpuMs {
  const fields = statFields(pid);
  if (!fields) return { userMs: 0, kernelMs: 0 };
  const ticksToMs = (ticks: string | undefined) => (Number(ticks) / CLOCK_TICKS_PER_S) * 1000;
  return { userMs: ticksToMs(fields[11]), kernelMs: ticksToMs(fields[12]) };
}

function sample(watched: WatchedProcesses): Sample {
  const groups = new Map<string, CpuMs>();
  for (const [name, pids] of watched) {
    const uses = pids().map(processCpuMs);
    groups.set(name, { userMs: uses.reduce((sum, use) => sum + use.userMs, 0), kernelMs: uses.reduce((sum, use) => sum + use.kernelMs, 0) });
  }
  return { atMs: performance.now(), ...coreTimes(), groups };
}

/** The parent of a process (field 4), or null once it is gone. */
export function parentOf(pid: number): number | null {
  const fields = statFields(pid);
  return fields ? Number(fields[1]) : null;
}

/** A process and its children, e.g. a PostgreSQL postmaster and its backends. */
export function processWithChildren(pid: number): number[] {
  const children = fs.readdirSync('/proc').filter((entry) => /^\d+$/.test(entry) && parentOf(Number(entry)) === pid);
  return [pid, ...children.map(Number)];
}

/** Starts watching the machine and the `watched` groups; `stop()` answers the load since. */
export function watchMachineLoad(watched: WatchedProcesses = new Map()): { stop(): MachineLoad } {
  const start = sample(watched);
  return {
    stop() {
      const end = sample(watched);
      const elapsedMs = end.atMs - start.atMs;
      const groups = new Map<string, CpuUse>();
      for (const [name, used] of end.groups) {
        const before = start.groups.get(name) ?? { userMs: 0, kernelMs: 0 };
        const kernelCores = (used.kernelMs - before.kernelMs) / elapsedMs;
        groups.set(name, { cores: (used.userMs - before.userMs) / elapsedMs + kernelCores, kernelCores });
      }
      return { busyShare: (end.busyMs - start.busyMs) / Math.max(1, end.totalMs - start.totalMs), cores: os.cpus().length, groups };
    },
  };
}

/**
 * One line, e.g. "machine 97 % of 2 cores busy: server 0.60 core (0.25 in the kernel), …,
 * everything else 0.40 core"; everything else is what other processes on the machine used.
 */
export function describeMachineLoad({ busyShare, cores, groups }: MachineLoad): string {
  const parts = [...groups].map(([name, use]) => `${name} ${use.cores.toFixed(2)} core (${use.kernelCores.toFixed(2)} in the kernel)`);
  const known = [...groups.values()].reduce((sum, use) => sum + use.cores, 0);
  const rest = Math.max(0, busyShare * cores - known);
  return `machine ${Math.round(busyShare * 100)} % of ${cores} cores busy${parts.length > 0 ? `: ${parts.join(', ')}, everything else ${rest.toFixed(2)} core` : ''}`;
}
