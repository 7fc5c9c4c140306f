// The tracks the exporter tests run on: the default track, a short kart track with six spawns
// and an all-right (clockwise) loop, generated once per test file; plus the closed-form stadium.

import { generateTrack } from '../../src/core/index.js';
import type { Track, TrackRequest } from '../../src/core/index.js';

/** Requests of the generated test tracks, by name. */
export const EXPORT_REQUESTS = {
  default: { seed: 1 },
  kart: { seed: 2, lengthM: 600, curvatureBudgetDeg: 1200, cornerCount: 12, minCornerRadiusM: 8, widthM: { min: 6, max: 8 }, spawnSlots: 6 },
  clockwise: { seed: 3, turnBalance: 1, curvatureBudgetDeg: 360, cornerCount: 4, lengthM: 2000 },
} as const satisfies Record<string, TrackRequest>;

export type ExportTrackName = keyof typeof EXPORT_REQUESTS;

const cache = new Map<ExportTrackName, Track>();

/** The generated track of a name (memoized within the test file). */
export function exportTrack(name: ExportTrackName): Track {
  let track = cache.get(name);
  if (!track) {
    track = generateTrack(EXPORT_REQUESTS[name]);
    cache.set(name, track);
  }
  return track;
}

/** Every generated test track with its name. */
export function exportTracks(): [ExportTrackName, Track][] {
  return (Object.keys(EXPORT_REQUESTS) as ExportTrackName[]).map((name) => [name, exportTrack(name)]);
}
