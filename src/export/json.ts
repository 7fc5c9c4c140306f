/**
 * The track as JSON, the primary format: the Track object as it is, keys in the generator's
 * order, so the bytes (and the id inside) are the ones the core produced.
 */
import type { Track } from '../core/index.js';

/** Options of the JSON export. */
export interface JsonOptions {
  /** Indent by two spaces. Default false (one line). */
  readonly pretty?: boolean;
}

/**
 * Writes a track as JSON text ending in a newline.
 * @example JSON.parse(trackToJson(track)).id === track.id
 */
export function trackToJson(track: Track, options: JsonOptions = {}): string {
  return (options.pretty ? JSON.stringify(track, null, 2) : JSON.stringify(track)) + '\n';
}
