import type { Issue, IssueCode } from '../errors.js';

/**
 * Issues kept per rule (per code): a broken upload should yield a readable list, not 10^5 lines.
 * The first ones found along the lap are kept.
 */
export const MAX_ISSUES_PER_RULE = 8;

/** Collects issues, keeping at most `maxPerCode` of each code in the order they were added. */
export interface IssueSink {
  readonly issues: Issue[];
  /** Keep the issue unless its code is full; returns whether it was kept. */
  add(issue: Issue): boolean;
  /** Whether `code` already holds its quota (rules may stop looking). */
  full(code: IssueCode): boolean;
}

/**
 * A fresh sink.
 * @param maxPerCode issues kept per code (default {@link MAX_ISSUES_PER_RULE}).
 * @example
 * const sink = createIssueSink();
 * sink.add({ code: 'length', message: 'lap 1400 m differs from 1500 m by more than 3%' });
 */
export function createIssueSink(maxPerCode = MAX_ISSUES_PER_RULE): IssueSink {
  const counts = new Map<IssueCode, number>();
  const issues: Issue[] = [];
  return {
    issues,
    add(issue) {
      const c = counts.get(issue.code) ?? 0;
      if (c >= maxPerCode) return false;
      counts.set(issue.code, c + 1);
      issues.push(issue);
      return true;
    },
    full(code) {
      return (counts.get(code) ?? 0) >= maxPerCode;
    },
  };
}

/**
 * A number for messages and issue fields: at most `decimals` decimals, no trailing zeros, no -0,
 * so that messages read `6.2 m` and stay identical across machines whose last bits may differ.
 * @example num(6.2000001); // 6.2
 */
export function num(x: number, decimals = 3): number {
  if (!Number.isFinite(x)) return x;
  const r = Number(x.toFixed(decimals));
  return r === 0 ? 0 : r;
}

/** Indices of the worst (largest) entry of each run of consecutive entries > 0, in index order, at most `max`. */
export function worstOfRuns(excess: Float64Array, max: number): number[] {
  const out: number[] = [];
  let worst = -1;
  for (let i = 0; i <= excess.length && out.length < max; i++) {
    const bad = i < excess.length && excess[i] > 0;
    if (bad) {
      if (worst < 0 || excess[i] > excess[worst]) worst = i;
    } else if (worst >= 0) {
      out.push(worst);
      worst = -1;
    }
  }
  return out;
}
