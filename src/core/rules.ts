/**
 * Constants shared by the generator and the checker: tolerances of shared/DESIGN.md's
 * guarantees and the laws (gate spacing, shipping precision) both sides must agree on.
 * Every value carries its unit and its reason.
 */

/** Generator version: part of every track and of its id; bump when output changes. */
export const GENERATOR_VERSION = '1.0.0';

/** Shipped coordinates and lengths are rounded to this many decimals of a metre (1 mm). */
export const COORD_DECIMALS = 3;
/** Largest rounding error of one shipped coordinate, metres. */
export const ROUNDING_M = 0.0005;
/** Decimals of shipped curvature (1/m), unit vectors and shares. */
export const FINE_DECIMALS = 6;
/** Decimals of shipped angles in degrees. */
export const ANGLE_DECIMALS = 3;

/** Lap length may differ from lengthM by this share (DESIGN guarantee 2). */
export const LENGTH_TOL = 0.03;
/** Total absolute turning may differ from curvatureBudgetDeg by this share (DESIGN guarantee 2). */
export const TURNING_TOL = 0.05;
/** Net turning must be ±360° within this, degrees (DESIGN guarantee 2). */
export const NET_TURNING_TOL_DEG = 1;

/**
 * Chord over which the checker measures turning and radius on shipped points, metres: long
 * enough that 1 mm rounding moves a measured angle by < 0.05°, short enough to follow a corner.
 */
export const MEASURE_CHORD_M = 3;

/**
 * Gate spacing law: where the road turns, gates come at least every GATE_TURN_DEG of turning,
 * i.e. the wanted gap is clamp(GATE_TURN_RAD / |κ|, gateSpacingM.min, gateSpacingM.max).
 * Common practice, no source: a reward signal every ~10° of turning keeps progress visible in
 * hairpins.
 */
export const GATE_TURN_DEG = 10;
export const GATE_TURN_RAD = (GATE_TURN_DEG * Math.PI) / 180;

/** A gate end may lie this far from its wall face, metres: two rounded points and a rounded vertex. */
export const GATE_ENDPOINT_TOL_M = 4 * ROUNDING_M;

/** Spawn headings must follow the track's heading within this, degrees (common practice, no source). */
export const SPAWN_ALIGN_TOL_DEG = 3;
/** Gap kept between a car's footprint and a wall face at a start pose, metres. */
export const SPAWN_WALL_GAP_M = 0.5;
/** Gap kept between the footprints of neighbouring start poses, metres. */
export const SPAWN_GAP_M = 0.5;
/** Nose of the first car stays this far behind the start line, metres. */
export const SPAWN_LINE_GAP_M = 1;
