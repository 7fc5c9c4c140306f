/**
 * Turns a zod error into the flat issue list every shell reports: one entry per offending
 * field, with a dotted path and a message that names the value and what is allowed. The
 * wording comes from the schemas' own messages (src/schema/messages.ts).
 */
import type { z } from 'zod';
import { ALLOWED_FIELDS } from './messages.js';

/** One offending field: `path` is dotted (`widthM.min`, `gates.3.left.0`), `(root)` for the whole body. */
export interface FieldIssue {
  readonly path: string;
  readonly message: string;
}

/** Path shown for an issue about the whole body. */
export const ROOT_PATH = '(root)';

/**
 * Flattens a zod error into one issue per offending field, in the order zod found them:
 * an unknown-fields issue becomes one entry per unknown field (path ending in its name), and
 * repeated identical entries (one value failing two checks) are kept once.
 * @example formatIssues(trackRequestSchema.safeParse({ widthM: { min: 2 } }).error!)
 *   // [{ path: 'widthM.min', message: 'expected a number from 3 to 40 m, got 2' }]
 */
export function formatIssues(error: z.ZodError): FieldIssue[] {
  const out: FieldIssue[] = [];
  const seen = new Set<string>();
  const push = (path: readonly PropertyKey[], message: string): void => {
    const entry = { path: formatPath(path), message };
    const key = `${entry.path}\u0000${entry.message}`;
    if (seen.has(key)) return;
    seen.add(key);
    out.push(entry);
  };
  for (const issue of error.issues) {
    if (issue.code === 'unrecognized_keys') {
      const at = issue.message.indexOf(ALLOWED_FIELDS);
      const allowed = at >= 0 ? issue.message.slice(at) : '';
      for (const key of issue.keys) push([...issue.path, key], `unknown field ${JSON.stringify(key)}${allowed}`);
    } else {
      push(issue.path, issue.message);
    }
  }
  return out;
}

/** Dotted path of an issue: `['widthM', 'min']` → `widthM.min`, `[]` → `(root)`. */
export function formatPath(path: readonly PropertyKey[]): string {
  return path.length === 0 ? ROOT_PATH : path.map((p) => String(p)).join('.');
}
