// The validity checker: shared/DESIGN.md "Guarantees", verified on the shipped numbers against
// the track's own params. Exact orientation predicates (Shewchuk 1997, via robust-predicates)
// decide every crossing and point location; monotone chains and uniform grids are the broad phases.
import type { Track, ValidationResult } from '../track.js';
import { checkCorners } from './corners.js';
import { checkCrossings } from './crossings.js';
import { checkGateGeometry } from './gate-geometry.js';
import { checkGateSpacing } from './gates.js';
import { buildGeometry } from './geometry.js';
import { createIssueSink } from './issue-sink.js';
import { checkLapLength } from './lap-length.js';
import { checkNesting } from './nesting.js';
import { checkRadius } from './radius.js';
import { checkSpawns } from './spawns.js';
import { checkStructure } from './structure.js';
import { checkTurning } from './turning.js';
import { checkWallClearance } from './wall-clearance.js';
import { checkWidths } from './widths.js';

/**
 * Check a track against every guarantee of shared/DESIGN.md, on its shipped (1 mm) numbers and
 * against its own `params`. Rules, by issue code: structure; centerline_crossing, wall_crossing,
 * walls_touch, wall_touches_centerline; wall_nesting; net_turning, total_turning; length; width;
 * corner_count, turn_balance, corner_mismatch; min_radius, radius_vs_width; clearance;
 * gate_order, gate_spacing, gate_density, gate_endpoint, gate_forward, gate_crossing;
 * spawn_outside, spawn_ahead, spawn_alignment, spawn_overlap.
 *
 * Structure comes first and, when broken, is all that is reported (the other rules need sound
 * arrays). At most MAX_ISSUES_PER_RULE issues per code; per-point rules report the worst point
 * of each stretch. `at.index` is the centerline point for per-point rules and the position in
 * gates, corners or spawns for theirs; `at.s` is the lap position in metres.
 *
 * Never throws, whatever object it is given; cost O(n log n) for n centerline points.
 * @param track a track as shipped (or uploaded): axes x right, y up, counter-clockwise positive.
 * @returns `{ valid, issues }` with valid === (issues.length === 0).
 * @example
 * const { valid, issues } = validateTrack(track);
 * if (!valid) console.log(issues.map((i) => i.message).join('\n'));
 */
export function validateTrack(track: Track): ValidationResult {
  const sink = createIssueSink();
  try {
    if (!checkStructure(track, sink)) return { valid: false, issues: sink.issues };
    const g = buildGeometry(track);
    const { params } = track;
    const crossed = checkCrossings(g, sink);
    // with crossings the one-vertex nesting test proves nothing; the crossing issues say enough
    if (!crossed) checkNesting(g, sink);
    checkTurning(g, params, sink);
    checkLapLength(g, params, sink);
    checkWidths(g, params, sink);
    checkCorners(g, track.corners, params, sink);
    checkRadius(g, params, track.metrics, sink);
    checkWallClearance(g, params, sink);
    checkGateSpacing(g, track.gates, params, sink);
    checkGateGeometry(g, track.gates, sink);
    checkSpawns(g, track.spawns, track.gates[0], params, sink);
  } catch (err) {
    // a last line of defence: a checker bug must surface as an issue, never as a crash of the caller
    const what = err instanceof Error ? err.message : 'unknown error';
    sink.add({ code: 'structure', message: `track could not be checked: ${what}` });
  }
  return { valid: sink.issues.length === 0, issues: sink.issues };
}
