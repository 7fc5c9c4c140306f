/**
 * Figures of a load run: latency percentiles from every recorded response (exact, no histogram
 * buckets and no coordinated-omission filling), counts by status, and the server's resident memory
 * read from /proc. Used by tests/load/run.ts.
 */
import { readFileSync } from 'node:fs';
export { mulberry32 } from '../helpers/mulberry32.js';

/** Every response of one kind of request. */
export class KindStats {
  readonly latenciesMs: number[] = [];
  readonly statuses = new Map<number, number>();
  /** 2xx/304 answers whose content was wrong (a 304 without If-None-Match, a batch without its manifest, ...). */
  wrong = 0;
  /** Connection errors and timeouts (no answer at all). */
  errors = 0;

  record(status: number, latencyMs: number): void {
    this.latenciesMs.push(latencyMs);
    this.statuses.set(status, (this.statuses.get(status) ?? 0) + 1);
  }

  get count(): number {
    return this.latenciesMs.length;
  }

  /** Answers that are neither 2xx nor 304, by status. */
  failures(): Map<number, number> {
    return new Map([...this.statuses].filter(([s]) => !(s >= 200 && s < 300) && s !== 304));
  }
}

/**
 * The q-quantile of the values by the nearest-rank method (the smallest value with at least
 * q·n values at or below it): common practice for latency percentiles, no source.
 */
export function quantile(values: readonly number[], q: number): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.max(1, Math.ceil(q * sorted.length));
  return sorted[rank - 1];
}

/** Merges the statistics of several kinds. */
export function mergeStats(all: readonly KindStats[]): KindStats {
  const out = new KindStats();
  for (const s of all) {
    out.latenciesMs.push(...s.latenciesMs);
    for (const [status, n] of s.statuses) out.statuses.set(status, (out.statuses.get(status) ?? 0) + n);
    out.wrong += s.wrong;
    out.errors += s.errors;
  }
  return out;
}

/**
 * Resident memory of a process, MiB: VmRSS (now) and VmHWM (the highest RSS since it started)
 * from /proc/<pid>/status (proc(5), Linux man-pages). Worker threads share the process, so this
 * counts the server thread and every generation worker.
 * @returns null when /proc cannot be read (not Linux, or the process is gone)
 */
export function residentMiB(pid: number): { rss: number; hwm: number } | null {
  try {
    const text = readFileSync(`/proc/${pid}/status`, 'utf8');
    const kb = (key: string): number => Number(new RegExp(`^${key}:\\s+(\\d+) kB`, 'm').exec(text)?.[1] ?? Number.NaN);
    return { rss: kb('VmRSS') / 1024, hwm: kb('VmHWM') / 1024 };
  } catch {
    return null;
  }
}

/**
 * CPU time a process has used so far, s: utime + stime, fields 14 and 15 of /proc/<pid>/stat,
 * in clock ticks of `ticksPerS` (getconf CLK_TCK; proc(5), Linux man-pages). All its threads
 * count, so a server with 2 busy workers uses up to 2 s of CPU per second.
 * @returns null when /proc cannot be read
 */
export function cpuSeconds(pid: number, ticksPerS: number): number | null {
  try {
    const text = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // the command name (field 2) may hold spaces; count fields after its closing parenthesis
    const fields = text.slice(text.lastIndexOf(')') + 2).split(' ');
    return (Number(fields[11]) + Number(fields[12])) / ticksPerS;
  } catch {
    return null;
  }
}

/** A number with a fixed count of decimals. */
export function fixed(x: number, decimals = 1): string {
  return Number.isFinite(x) ? x.toFixed(decimals) : '-';
}

