/**
 * Which format a track request wants, from the `format` query parameter (first) or the Accept
 * header (RFC 9110 §12.5.1: media ranges with q weights), and conditional requests by ETag.
 */
import { EXPORT_FORMATS } from '../export/index.js';
import { TRACK_FORMATS, type TrackFormat } from './export-query.js';

/** Media type of each track format, in the order negotiation prefers them on a tie. */
export const FORMAT_MEDIA_TYPES: Readonly<Record<TrackFormat, string>> = Object.fromEntries(TRACK_FORMATS.map((f) => [f, EXPORT_FORMATS[f].mediaType])) as Record<TrackFormat, string>;

/** The outcome: a format, or none that the Accept header allows. */
export type Negotiated = { readonly format: TrackFormat } | { readonly format: null; readonly accept: string };

interface MediaRange {
  readonly type: string;
  readonly subtype: string;
  readonly q: number;
  readonly specificity: number;
}

/**
 * Picks the answer's format: the `format` query wins; else the Accept header's most preferred
 * format (json on a tie); else json when there is no Accept header.
 * @example negotiateFormat(undefined, 'text/html,*\/*;q=0.8') // { format: 'json' }
 */
export function negotiateFormat(formatQuery: TrackFormat | undefined, accept: string | undefined): Negotiated {
  if (formatQuery !== undefined) return { format: formatQuery };
  if (accept === undefined || accept.trim() === '') return { format: 'json' };
  const ranges = parseAccept(accept);
  let best: TrackFormat | null = null;
  let bestQ = 0;
  for (const format of TRACK_FORMATS) {
    const q = qualityOf(FORMAT_MEDIA_TYPES[format], ranges);
    if (q > bestQ) {
      best = format;
      bestQ = q;
    }
  }
  return best === null ? { format: null, accept } : { format: best };
}

/**
 * True when an If-None-Match header matches the entity tag (weak comparison, RFC 9110 §13.1.2).
 * @param etag the quoted tag, e.g. `"ab12"`
 */
export function matchesIfNoneMatch(header: string | undefined, etag: string): boolean {
  if (header === undefined) return false;
  const wanted = stripWeak(etag);
  return header.split(',').some((tag) => {
    const t = tag.trim();
    return t === '*' || stripWeak(t) === wanted;
  });
}

function stripWeak(tag: string): string {
  return tag.startsWith('W/') ? tag.slice(2) : tag;
}

// the q of the most specific range that matches the media type (0 when none does)
function qualityOf(mediaType: string, ranges: readonly MediaRange[]): number {
  const [type, subtype] = mediaType.split('/');
  let q = 0;
  let specificity = -1;
  for (const r of ranges) {
    const matches = (r.type === '*' || r.type === type) && (r.subtype === '*' || r.subtype === subtype);
    if (matches && r.specificity > specificity) {
      q = r.q;
      specificity = r.specificity;
    }
  }
  return q;
}

function parseAccept(header: string): MediaRange[] {
  const ranges: MediaRange[] = [];
  for (const part of header.split(',')) {
    const [range, ...params] = part.split(';').map((s) => s.trim().toLowerCase());
    const slash = range.indexOf('/');
    if (slash <= 0 || slash === range.length - 1) continue;
    const type = range.slice(0, slash);
    const subtype = range.slice(slash + 1);
    let q = 1;
    for (const p of params) {
      const m = /^q=([0-9.]+)$/.exec(p);
      if (m !== null) q = Math.min(1, Math.max(0, Number(m[1]) || 0));
    }
    const specificity = (type === '*' ? 0 : 1) + (subtype === '*' ? 0 : 1);
    ranges.push({ type, subtype, q, specificity });
  }
  return ranges;
}
