// Tests for src/schema/track.ts: the structural shape of an uploaded track (geometry is the checker's job).

import { describe, expect, expectTypeOf, it } from 'vitest';
import type { z } from 'zod';
import { generateTrack, resolveParams, TRACK_FORMAT } from '../../src/core/index.js';
import type { Track } from '../../src/core/index.js';
import { formatIssues } from '../../src/schema/issues.js';
import { MAX_TRACK_ARRAY_ENTRIES, trackSchema } from '../../src/schema/track.js';

/**
 * A structurally complete track whose numbers mean nothing (four points, one gate, one spawn,
 * one corner): the shape check must accept it, the checker would not.
 */
function shapeOnlyTrack(): Record<string, any> {
  // fresh arrays per field, so a test that breaks one field breaks only that one
  const square = () => [[0, 0], [10, 0], [10, 10], [0, 10]];
  const four = () => [0, 1, 2, 3];
  return {
    format: TRACK_FORMAT,
    id: 'ab12',
    seed: 7,
    generatorVersion: '1.2.0',
    params: resolveParams({ seed: 7 }),
    attempts: 1,
    centerline: {
      spacingM: 10,
      lengthM: 40,
      spline: { kind: 'cubic-closed', knots: 'chord-length', controlPoints: square() },
      points: square(),
      s: four(),
      headingDeg: four(),
      curvature: four(),
      halfWidthLeftM: four(),
      halfWidthRightM: four(),
    },
    walls: { heightM: 1.2, thicknessM: 0.5, left: square(), right: square() },
    gates: [{ index: 0, s: 0, left: [0, 1], right: [0, -1], forward: [1, 0] }],
    spawns: [{ index: 0, position: [-3, 0], headingDeg: 0, s: 37, lateralM: 0 }],
    corners: [{ index: 0, direction: 'left', angleDeg: 90, minRadiusM: 20, sStart: 5, sEnd: 15 }],
    metrics: {
      lengthM: 40,
      totalTurningDeg: 360,
      netTurningDeg: 360,
      rightCornerShare: 0,
      rightTurningShare: 0,
      minRadiusM: 20,
      width: { min: 2, max: 2 },
      minClearanceM: 5,
      cornerCount: 1,
      gateCount: 1,
      vehicleMinRadiusM: 5.33,
      cornerRadiusFloorM: 15,
      referenceLapTimeS: 4,
      averageSpeedMps: 10,
      minSpeedMps: 9,
      maxSpeedMps: 11,
      brakingTimeS: 1,
      driveLapTimeS: 4,
      maxLateralDeviationM: 0.1,
      minWallMarginM: 1,
      sensorCoverage: 1,
      sensorGateCoverage: 1,
      difficulty: 1,
    },
  };
}

function issuesOf(value: unknown) {
  const result = trackSchema.safeParse(value);
  if (result.success) throw new Error('expected the track to be refused');
  return formatIssues(result.error);
}

describe('trackSchema: accepted', () => {
  it('a generated track, after a JSON round trip, parses to equal JSON', () => {
    const json = JSON.parse(JSON.stringify(generateTrack({ seed: 7 })));
    expect(trackSchema.parse(json)).toEqual(json);
  });

  it('a structurally complete track is accepted whatever its geometry', () => {
    expect(trackSchema.safeParse(shapeOnlyTrack()).success).toBe(true);
  });

  it('extra fields are tolerated at the top level and in nested objects, and kept', () => {
    const track = shapeOnlyTrack();
    track.notes = 'hand-edited';
    track.centerline.elevationM = [0, 0, 0, 0];
    track.gates[0].reward = 1;
    track.params.addedLater = true;
    const parsed = trackSchema.parse(track) as Record<string, any>;
    expect([parsed.notes, parsed.centerline.elevationM, parsed.gates[0].reward, parsed.params.addedLater]).toEqual(['hand-edited', [0, 0, 0, 0], 1, true]);
  });

  it(`arrays of exactly ${MAX_TRACK_ARRAY_ENTRIES} entries are accepted`, () => {
    const track = shapeOnlyTrack();
    track.centerline.s = new Array(MAX_TRACK_ARRAY_ENTRIES).fill(0);
    expect(trackSchema.safeParse(track).success).toBe(true);
  });

  it('string seeds are accepted', () => {
    const track = shapeOnlyTrack();
    track.seed = 'lap-1';
    track.params.seed = 'lap-1';
    expect(trackSchema.safeParse(track).success).toBe(true);
  });
});

describe('trackSchema: refused with the path of each malformed field', () => {
  it('wrong format, missing fields, bad tuples, unknown corner direction', () => {
    const track = shapeOnlyTrack();
    track.format = 'lapwright.track/2';
    delete track.walls;
    track.centerline.points[2] = [10, 10, 0];
    track.centerline.spline.controlPoints[1] = [10, '0'];
    track.gates[0].forward = { x: 1, y: 0 };
    track.corners[0].direction = 'up';
    track.metrics.gateCount = 1.5;
    expect(issuesOf(track)).toMatchInlineSnapshot(`
      [
        {
          "message": "expected "lapwright.track/1", got "lapwright.track/2"",
          "path": "format",
        },
        {
          "message": "expected a finite number, got "0"",
          "path": "centerline.spline.controlPoints.1.1",
        },
        {
          "message": "expected a point [x, y] of two finite numbers, got an array of 3 items",
          "path": "centerline.points.2",
        },
        {
          "message": "expected an object {heightM, thicknessM, left, right}, got nothing",
          "path": "walls",
        },
        {
          "message": "expected a point [x, y] of two finite numbers, got an object",
          "path": "gates.0.forward",
        },
        {
          "message": "expected "left" or "right", got "up"",
          "path": "corners.0.direction",
        },
        {
          "message": "expected a non-negative integer, got 1.5",
          "path": "metrics.gateCount",
        },
      ]
    `);
  });

  it('non-finite numbers are refused (programmatic callers can send them)', () => {
    const track = shapeOnlyTrack();
    track.centerline.points[0] = [Number.NaN, 0];
    track.centerline.curvature[3] = Infinity;
    expect(issuesOf(track).map((i) => i.path)).toEqual(['centerline.points.0.0', 'centerline.curvature.3']);
  });

  it(`arrays longer than ${MAX_TRACK_ARRAY_ENTRIES} entries are refused`, () => {
    const track = shapeOnlyTrack();
    track.walls.left = new Array(MAX_TRACK_ARRAY_ENTRIES + 1).fill([0, 0]);
    expect(issuesOf(track)).toEqual([{ path: 'walls.left', message: `expected an array of at most ${MAX_TRACK_ARRAY_ENTRIES} points [x, y], got an array of ${MAX_TRACK_ARRAY_ENTRIES + 1} items` }]);
  });

  it('params must be resolved: every field present and in range', () => {
    const track = shapeOnlyTrack();
    delete track.params.cornerCount;
    track.params.widthM = { min: 10 };
    track.params.noise = 3;
    expect(issuesOf(track)).toMatchInlineSnapshot(`
      [
        {
          "message": "expected a number from 3 to 40 m, got nothing",
          "path": "params.widthM.max",
        },
        {
          "message": "expected an integer from 3 to 80, got nothing",
          "path": "params.cornerCount",
        },
        {
          "message": "expected a number from 0 to 1, got 3",
          "path": "params.noise",
        },
      ]
    `);
  });

  it('a body that is not an object is refused at (root)', () => {
    expect(issuesOf([])).toEqual([{ path: '(root)', message: `expected a track object (format ${TRACK_FORMAT}), got an array of 0 items` }]);
  });
});

describe('type compatibility with the core', () => {
  it('what the schema accepts is a Track (validateTrack can take it as is)', () => {
    expectTypeOf<z.output<typeof trackSchema>>().toExtend<Track>();
    expectTypeOf<keyof typeof trackSchema.shape>().toEqualTypeOf<keyof Track>();
  });
});
