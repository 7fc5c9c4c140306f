/**
 * Constants shared by the generator and the checker: tolerances of shared/DESIGN.md's
 * guarantees and the laws (gate spacing, shipping precision) both sides must agree on.
 * Every value carries its unit and its reason.
 */

/** Generator version: part of every track and of its id; bump when output changes. */
export const GENERATOR_VERSION = '1.3.0';

/** Shipped coordinates and lengths are rounded to this many decimals of a metre (1 mm). */
export const COORD_DECIMALS = 3;
/** Largest rounding error of one shipped coordinate, metres. */
export const ROUNDING_M = 0.0005;
/** Decimals of the spline's control points (1 µm: see centerline/control-points.ts for why not 1 mm). */
export const CONTROL_DECIMALS = 6;
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

// --- checker tolerances (src/core/validate): what the generator must keep within ---

/**
 * A wall vertex may lie this far from half width off its centerline point, metres: two rounded
 * points (√2·ROUNDING_M each) and a rounded half width (ROUNDING_M) add up to < 4·ROUNDING_M.
 */
export const WALL_OFFSET_TOL_M = 4 * ROUNDING_M;

/** Shipped curvature may exceed the radius limit by this, 1/m: half a unit of its last decimal. */
export const CURVATURE_ROUNDING = 0.5 * 10 ** -FINE_DECIMALS;

/**
 * A corner's measured turning may differ from its angleDeg by max(CORNER_ANGLE_TOL_DEG,
 * CORNER_ANGLE_TOL_SHARE × angleDeg): the measuring chords see 1 mm rounding as < 0.05° and a
 * corner's ends sit where curvature is small, so 1° or 2% only absorbs where the ends are drawn.
 */
export const CORNER_ANGLE_TOL_DEG = 1;
export const CORNER_ANGLE_TOL_SHARE = 0.02;

/**
 * A gate gap may exceed the mean of the spacing law over it by this share: the checker averages
 * the law between shipped points (6-decimal curvature), the generator between its own samples.
 */
export const GATE_DENSITY_TOL = 0.01;

/** A gate's forward vector must have length 1 within this: 6 shipped decimals per component. */
export const GATE_FORWARD_UNIT_TOL = 1e-5;
/**
 * |forward · (left − right)| may reach this share of the gate's length: its ends are rounded to
 * 1 mm, which tilts a gate of a few metres by well under 1e-3 rad.
 */
export const GATE_FORWARD_PERP_TOL = 1e-3;

/**
 * A spawn footprint may reach this much closer to the start line than SPAWN_LINE_GAP_M, metres:
 * rounded position, heading and gate ends move a footprint corner by a few millimetres.
 */
export const SPAWN_LINE_SLACK_M = 0.01;
