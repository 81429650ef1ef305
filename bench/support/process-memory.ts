import fs from 'node:fs';

/** How much memory a process holds, from `/proc/<pid>/status` (Linux only). */
export interface ProcessMemory {
  /** Resident set size now (VmRSS). */
  readonly residentBytes: number;
  /** The highest resident set size since the process started (VmHWM): a high-water mark, so one read after the work catches its peak, however short. */
  readonly peakResidentBytes: number;
}

/** A `Vm…:   1234 kB` line of the status file, in bytes. */
function statusBytes(status: string, field: string, pid: number): number {
  const match = new RegExp(`^${field}:\\s+(\\d+) kB$`, 'm').exec(status);
  if (!match) throw new Error(`/proc/${pid}/status has no ${field} line`);
  return Number(match[1]) * 1024;
}

export function processMemory(pid: number): ProcessMemory {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  return { residentBytes: statusBytes(status, 'VmRSS', pid), peakResidentBytes: statusBytes(status, 'VmHWM', pid) };
}

/** "312.4 MB", in millions of bytes as the other benchmarks print sizes. */
export function describeBytes(bytes: number): string {
  return `${(bytes / 1e6).toFixed(1)} MB`;
}
