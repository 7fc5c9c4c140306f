import type { TrackParams } from '../params/types.js';
import { SPAWN_GAP_M, SPAWN_LINE_GAP_M, SPAWN_WALL_GAP_M } from '../rules.js';

/** Extra sideways room a two-column grid keeps for curvature and width changes, metres. */
export const GRID_SIDE_MARGIN_M = 0.3;

/** How the start poses are laid out: in one file, or staggered in two columns. */
export interface GridLayout {
  readonly columns: 1 | 2;
  /** Sideways offset of the columns from the centerline, metres (0 for one file). */
  readonly lateralM: number;
  /** Distance of each pose's centre behind the start line, metres. */
  readonly behindM: Float64Array;
  /** Road length the grid takes behind the line, metres. */
  readonly lengthM: number;
}

/**
 * Lays out `spawnSlots` poses for a `car` on the narrowest road `widthM.min`: two staggered
 * columns (alternating sides, each car half a row behind the one before) where both columns fit
 * with SPAWN_GAP_M between them and SPAWN_WALL_GAP_M to the walls, else one file; the first nose
 * SPAWN_LINE_GAP_M behind the line. Pure arithmetic on the parameters, so it can be checked
 * before any geometry.
 */
export function gridLayout(p: TrackParams): GridLayout {
  const { lengthM: carL, widthM: carW } = p.car;
  const lateral = (carW + SPAWN_GAP_M) / 2 + 0.25;
  const two = p.spawnSlots > 1 && p.widthM.min / 2 >= lateral + carW / 2 + SPAWN_WALL_GAP_M + GRID_SIDE_MARGIN_M;
  const step = two ? Math.max(0.75 * carL, (carL + SPAWN_GAP_M) / 2) : 1.5 * carL;
  const behindM = new Float64Array(p.spawnSlots);
  for (let k = 0; k < p.spawnSlots; k++) behindM[k] = SPAWN_LINE_GAP_M + carL / 2 + k * step;
  return { columns: two ? 2 : 1, lateralM: two ? lateral : 0, behindM, lengthM: behindM[p.spawnSlots - 1] + carL / 2 };
}

/** A start pose before rounding: centre, heading (radians), lap position and sideways offset. */
export interface PlacedSpawn {
  readonly x: number;
  readonly y: number;
  readonly headingRad: number;
  readonly s: number;
  readonly lateralM: number;
}

/**
 * Places the grid on a closed centerline sampled evenly (points, unit tangents, left normals):
 * pose k at lap position lengthM - behind_k, the columns alternating left then right.
 */
export function placeSpawns(grid: GridLayout, points: Float64Array, tangents: Float64Array, normals: Float64Array, spacingM: number): PlacedSpawn[] {
  const n = points.length / 2;
  const lapM = n * spacingM;
  const out: PlacedSpawn[] = [];
  for (let k = 0; k < grid.behindM.length; k++) {
    const s = lapM - grid.behindM[k];
    const x = s / spacingM;
    const i = Math.floor(x) % n;
    const j = (i + 1) % n;
    const t = x - Math.floor(x);
    const lat = grid.columns === 2 ? (k % 2 === 0 ? grid.lateralM : -grid.lateralM) : 0;
    const tx = lerp(tangents[2 * i], tangents[2 * j], t), ty = lerp(tangents[2 * i + 1], tangents[2 * j + 1], t);
    const nx = lerp(normals[2 * i], normals[2 * j], t), ny = lerp(normals[2 * i + 1], normals[2 * j + 1], t);
    const nn = Math.sqrt(nx * nx + ny * ny);
    out.push({
      x: lerp(points[2 * i], points[2 * j], t) + (lat * nx) / nn,
      y: lerp(points[2 * i + 1], points[2 * j + 1], t) + (lat * ny) / nn,
      headingRad: Math.atan2(ty, tx),
      s,
      lateralM: lat,
    });
  }
  return out;
}

function lerp(a: number, b: number, t: number): number {
  return a + (b - a) * t;
}
