// Times validateTrack on the synthetic stadium (tests/helpers/synthetic-track.ts) scaled to 1500 and
// 8000 centerline points at 1 m spacing, and on the same tracks with every rule's work per stage.
// Run by hand: node --import tsx tests/bench/validate.bench.ts
// The generator checks every track it ships, so the target is about 1.5 ms at 1500 points on one core.

import { validateTrack } from '../../src/core/validate/index.js';
import type { Track } from '../../src/core/track.js';
import { stadiumTrack } from '../helpers/synthetic-track.js';
import { fmt, time } from './geometry-bench-util.js';

const WARMUP = 200;
const ITERATIONS = 500;

/** A stadium of perimeter lengthM: radius R, straights (lengthM − 2πR) / 2. */
function stadiumOf(lengthM: number, radiusM: number, spawnSlots: number): Track {
  return stadiumTrack({ straightM: (lengthM - 2 * Math.PI * radiusM) / 2, radiusM, spawnSlots });
}

function main(): void {
  const cases = [
    { name: 'stadium 1500 pts, 1 spawn', track: stadiumOf(1500, 100, 1) },
    { name: 'stadium 1500 pts, 16 spawns', track: stadiumOf(1500, 100, 16) },
    { name: 'stadium 8000 pts, 1 spawn', track: stadiumOf(8000, 300, 1) },
  ];
  for (const { name, track } of cases) {
    const result = validateTrack(track);
    if (!result.valid) throw new Error(`${name}: fixture is not valid: ${result.issues[0].message}`);
    const stats = time(() => validateTrack(track).issues.length, WARMUP, ITERATIONS);
    console.log(`${name.padEnd(30)} ${track.centerline.points.length} points, ${track.gates.length} gates: ${fmt(stats)}`);
  }
}

main();
