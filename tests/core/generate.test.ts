// Tests for src/core/generate.ts: valid, faithful, reproducible tracks, or a typed refusal.

import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { generateTrack, generateTrackJson, MAX_ATTEMPTS } from '../../src/core/generate.js';
import { InfeasibleError, isInfeasibleError } from '../../src/core/errors.js';
import { LIMITS } from '../../src/core/params/defaults.js';
import type { TrackRequest } from '../../src/core/params/types.js';
import type { Track } from '../../src/core/track.js';
import { turningDistanceBetween, turningSignature } from '../../src/core/metrics/turning-distance.js';
import { validateTrack } from '../../src/core/validate/index.js';
import { independentProblems, perimeter, smallestCircumradius, turning } from '../helpers/independent-check.js';

/** Faithfulness to the request, measured on the shipped numbers (DESIGN guarantee 2 and 3). */
function faithfulnessProblems(t: Track): string[] {
  const p = t.params;
  const out: string[] = [];
  const L = perimeter(t.centerline.points);
  if (Math.abs(L / p.lengthM - 1) > 0.03) out.push(`length ${L} vs ${p.lengthM}`);
  // turning measured on ~3 m chords, so that 1 mm rounding stays below 0.05° per vertex
  const k = Math.max(1, Math.round(3 / t.centerline.spacingM));
  const turn = turning(t.centerline.points, k);
  if (Math.abs(turn.total / p.curvatureBudgetDeg - 1) > 0.05) out.push(`turning ${turn.total} vs budget ${p.curvatureBudgetDeg}`);
  // Hopf's Umlaufsatz (1935): a simple closed curve turns ±360°
  if (Math.abs(Math.abs(turn.net) - 360) > 1) out.push(`net turning ${turn.net}`);
  for (let i = 0; i < t.centerline.points.length; i++) {
    const w = t.centerline.halfWidthLeftM[i] + t.centerline.halfWidthRightM[i];
    if (w < p.widthM.min - 0.001 || w > p.widthM.max + 0.001) {
      out.push(`width ${w} at ${i} outside [${p.widthM.min}, ${p.widthM.max}]`);
      break;
    }
  }
  if (t.corners.length !== p.cornerCount) out.push(`${t.corners.length} corners, asked ${p.cornerCount}`);
  const rights = t.corners.filter((c) => c.direction === 'right').length;
  if (rights !== Math.round(p.turnBalance * p.cornerCount)) out.push(`${rights} right corners`);
  // radius: the shipped curvature, and circles through points ~3 m apart on either side
  // (1 mm rounding moves such a circle's curvature by < 2·2√2·0.5 mm / (3 m)² = 3.2e-4 1/m)
  for (const kappa of t.centerline.curvature) {
    if (Math.abs(kappa) > 1 / p.minCornerRadiusM + 5e-7) {
      out.push(`curvature ${kappa} beyond 1/${p.minCornerRadiusM}`);
      break;
    }
  }
  const h = k * t.centerline.spacingM;
  const r = smallestCircumradius(t.centerline.points, k);
  if (1 / r > 1 / p.minCornerRadiusM + (4 * Math.SQRT2 * 0.0005) / (h * h)) out.push(`circumradius ${r} < ${p.minCornerRadiusM}`);
  return out;
}

function expectGood(t: Track): void {
  expect(validateTrack(t).issues).toEqual([]);
  expect(faithfulnessProblems(t)).toEqual([]);
}

describe('generateTrack', () => {
  it('same request, same bytes; the id is the sha256 of the JSON of every other field', () => {
    const a = generateTrack({ seed: 2026 });
    const b = generateTrack({ seed: 2026 });
    expect(JSON.stringify(a)).toBe(JSON.stringify(b));
    const { id, ...rest } = a;
    expect(id).toBe(createHash('sha256').update(JSON.stringify(rest)).digest('hex'));
    expect(Object.keys(a)).toEqual(['format', 'id', 'seed', 'generatorVersion', 'params', 'attempts', 'centerline', 'walls', 'gates', 'spawns', 'corners', 'metrics']);
  });

  it('generateTrackJson gives exactly the UTF-8 bytes of JSON.stringify(track), owning their buffer', () => {
    for (const request of [{ seed: 11 }, { seed: 'ünïcode seed ⛳', lengthM: 800, cornerCount: 6 }]) {
      const { track, bytes } = generateTrackJson(request);
      expect(new TextDecoder().decode(bytes)).toBe(JSON.stringify(track));
      expect(bytes.byteLength).toBe(bytes.buffer.byteLength);
      expect(track).toEqual(generateTrack(request));
    }
  });

  it('seeds are roots: another seed gives another track; 7 and "7" are different seeds', () => {
    expect(generateTrack({ seed: 7 }).id).not.toBe(generateTrack({ seed: 8 }).id);
    expect(generateTrack({ seed: 7 }).id).not.toBe(generateTrack({ seed: '7' }).id);
  });

  it('the default request: valid, faithful, and its first point is the start line at the origin heading +x', () => {
    const t = generateTrack({ seed: 1 });
    expectGood(t);
    expect(t.centerline.points[0]).toEqual([0, 0]);
    expect(t.centerline.headingDeg[0]).toBe(0);
    expect(t.gates[0].s).toBe(0);
    expect(t.params).toMatchObject({ lengthM: 1500, curvatureBudgetDeg: 900, turnBalance: 0.4, minCornerRadiusM: 15 });
  });

  it('all-left and all-right loops turn +360° and -360°', () => {
    const left = generateTrack({ seed: 3, turnBalance: 0, curvatureBudgetDeg: 360, cornerCount: 5, lengthM: 1800 });
    const right = generateTrack({ seed: 3, turnBalance: 1, curvatureBudgetDeg: 360, cornerCount: 5, lengthM: 1800 });
    expectGood(left);
    expectGood(right);
    expect(left.metrics.netTurningDeg).toBeCloseTo(360, 0);
    expect(right.metrics.netTurningDeg).toBeCloseTo(-360, 0);
    expect(right.corners.every((c) => c.direction === 'right')).toBe(true);
  });

  it('noise 0 keeps the width constant at the middle of the range', () => {
    const t = generateTrack({ seed: 5, noise: 0, widthM: { min: 9, max: 13 } });
    expectGood(t);
    expect(new Set(t.centerline.halfWidthLeftM)).toEqual(new Set([5.5]));
  });

  it('the road width changes by at most 1 in 20 (motorsport practice, REFERENCES.md), measured over 5 m', () => {
    for (let seed = 0; seed < 6; seed++) {
      for (const r of [{ noise: 1, widthM: { min: 3, max: 40 }, minCornerRadiusM: 30, lengthM: 3000 }, { noise: 1 }, { noise: 0.6, widthM: { min: 8, max: 18 }, lengthM: 800, cornerCount: 6 }]) {
        const t = generateTrack({ seed, ...r });
        const h = t.centerline.halfWidthLeftM;
        const n = h.length;
        const k = Math.round(5 / t.centerline.spacingM);
        for (let i = 0; i < n; i++) expect(Math.abs(2 * (h[(i + k) % n] - h[i])) / (k * t.centerline.spacingM)).toBeLessThanOrEqual(1 / 20);
      }
    }
  });

  it('a brute-force O(n²) check with plain floating point agrees on small tracks', () => {
    for (let seed = 0; seed < 4; seed++) {
      const t = generateTrack({ seed, lengthM: 500, curvatureBudgetDeg: 900, cornerCount: 9, minCornerRadiusM: 8, widthM: { min: 6, max: 9 } });
      expect(independentProblems(t)).toEqual([]);
      expectGood(t);
    }
  });

  it('refuses a one-direction loop with a budget other than 360° (Hopf) with a typed error and a hint', () => {
    let err: unknown;
    try {
      generateTrack({ seed: 1, turnBalance: 0, curvatureBudgetDeg: 900 });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InfeasibleError);
    const e = err as InfeasibleError;
    expect(e.reason).toBe('turning_vs_balance');
    expect(e.hint).toMatch(/curvatureBudgetDeg to 360/);
    expect(e.attempts).toBe(0);
  });

  it('refuses corners that need more lap than asked, naming the length they need', () => {
    expect(() => generateTrack({ seed: 1, lengthM: 300, curvatureBudgetDeg: 3000, cornerCount: 30, minCornerRadiusM: 30 })).toThrow(/need at least \d+ m of lap/);
  });

  // the whole allowed space: either a good track or a typed refusal, never an invalid track
  const anyRequest = fc.record({
    seed: fc.oneof(fc.integer({ min: 0, max: 2 ** 32 - 1 }), fc.string({ minLength: 1, maxLength: 64 })),
    lengthM: fc.double({ min: LIMITS.lengthM.min, max: 6000, noNaN: true }),
    widthM: fc.tuple(fc.double({ min: 3, max: 40, noNaN: true }), fc.double({ min: 3, max: 40, noNaN: true })).map(([a, b]) => ({ min: Math.min(a, b), max: Math.max(a, b) })),
    curvatureBudgetDeg: fc.double({ min: 360, max: 7200, noNaN: true }),
    turnBalance: fc.double({ min: 0, max: 1, noNaN: true }),
    cornerCount: fc.option(fc.integer({ min: 3, max: 80 }), { nil: undefined }),
    minCornerRadiusM: fc.double({ min: 2, max: 1000, noNaN: true }),
    noise: fc.double({ min: 0, max: 1, noNaN: true }),
    spawnSlots: fc.integer({ min: 1, max: 64 }),
  });
  test.prop([anyRequest], { numRuns: 40 })('over the whole allowed space: a valid faithful track, or InfeasibleError', (r) => {
    let t: Track;
    try {
      t = generateTrack(r as TrackRequest);
    } catch (e) {
      expect(isInfeasibleError(e)).toBe(true);
      expect((e as InfeasibleError).hint.length).toBeGreaterThan(0);
      return;
    }
    expectGood(t);
  });

  // the same property where most draws are feasible: realistic circuits of every size
  const realistic = fc.record({
    seed: fc.integer({ min: 0, max: 2 ** 32 - 1 }),
    lengthM: fc.double({ min: 600, max: 6000, noNaN: true }),
    cornerCount: fc.integer({ min: 3, max: 30 }),
    perCornerDeg: fc.double({ min: 40, max: 120, noNaN: true }),
    turnBalance: fc.double({ min: 0.15, max: 0.5, noNaN: true }),
    minWidth: fc.double({ min: 6, max: 14, noNaN: true }),
    extraWidth: fc.double({ min: 0, max: 6, noNaN: true }),
    noise: fc.double({ min: 0, max: 1, noNaN: true }),
  });
  // a fixed fast-check seed: about 1 draw in 900 of this space gives up (measured), so a random
  // seed would fail now and then; the rate itself is asserted at scale below
  test.prop([realistic], { numRuns: 30, seed: 20261202 })('realistic requests give valid faithful tracks', (r) => {
    // at most one corner per 60 m of lap (kart tracks and circuits stay well below that), and no
    // direction's corners turning more than 150° on average (real corners rarely pass a hairpin)
    const cornerCount = Math.min(r.cornerCount, Math.max(3, Math.floor(r.lengthM / 60)));
    const minority = Math.round(r.turnBalance * cornerCount);
    const budget = Math.min(r.perCornerDeg * cornerCount, (r.lengthM / 1500) * 1400, 300 * minority + 360, 300 * (cornerCount - minority) - 360);
    const request: TrackRequest = {
      seed: r.seed,
      lengthM: r.lengthM,
      cornerCount,
      curvatureBudgetDeg: Math.max(360 + 40 * cornerCount, budget),
      turnBalance: r.turnBalance,
      widthM: { min: r.minWidth, max: r.minWidth + r.extraWidth },
      minCornerRadiusM: Math.max(12, r.minWidth),
      noise: r.noise,
    };
    let t: Track;
    try {
      t = generateTrack(request);
    } catch (e) {
      // a rule refusal is fine (the draw may break a closed-loop rule); giving up on geometry is not
      expect(isInfeasibleError(e)).toBe(true);
      expect((e as InfeasibleError).reason).not.toBe('no_valid_layout');
      return;
    }
    expectGood(t);
    expect(t.attempts).toBeLessThanOrEqual(MAX_ATTEMPTS);
  });
});

describe('generateTrack at scale', () => {
  // realistic profiles (shared/DESIGN.md and the issue: kart loops, long twisty circuits, narrow
  // and wide roads, all-left and all-right loops, 3 to 40 corners); at least 99% must succeed
  const profiles: Record<string, Omit<TrackRequest, 'seed'>> = {
    kart: { lengthM: 600, curvatureBudgetDeg: 1200, cornerCount: 12, minCornerRadiusM: 8, widthM: { min: 6, max: 8 } },
    circuit: { lengthM: 4600, curvatureBudgetDeg: 1570, cornerCount: 15, turnBalance: 0.4, widthM: { min: 8, max: 18 } },
    twisty: { lengthM: 10000, curvatureBudgetDeg: 4000, cornerCount: 40, turnBalance: 0.45 },
    narrow: { lengthM: 1200, widthM: { min: 4, max: 5 }, minCornerRadiusM: 8 },
    wide: { lengthM: 3000, widthM: { min: 25, max: 30 }, minCornerRadiusM: 20, curvatureBudgetDeg: 1200 },
    allLeft: { lengthM: 2000, curvatureBudgetDeg: 360, turnBalance: 0, cornerCount: 3 },
    allRight: { lengthM: 2000, curvatureBudgetDeg: 360, turnBalance: 1, cornerCount: 8 },
  };
  it('at least 99% of seeds succeed on realistic profiles, and every track is valid', () => {
    let made = 0, failed = 0;
    for (const base of Object.values(profiles)) {
      for (let seed = 100; seed < 115; seed++) {
        try {
          const t = generateTrack({ ...base, seed });
          expect(validateTrack(t).valid).toBe(true);
          made++;
        } catch (e) {
          expect(isInfeasibleError(e)).toBe(true);
          failed++;
        }
      }
    }
    expect(failed / (made + failed)).toBeLessThanOrEqual(0.01);
  });

  it('variety: 24 circuits drawn for the median real circuit differ by a median turning distance >= 1.0 (Arkin et al. 1991)', () => {
    const sigs = [];
    for (let seed = 0; seed < 24; seed++) {
      const t = generateTrack({ ...profiles.circuit, seed });
      sigs.push(turningSignature(new Float64Array(t.centerline.points.flat()), 512));
    }
    const d: number[] = [];
    for (let i = 0; i < sigs.length; i++) for (let j = i + 1; j < sigs.length; j++) d.push(turningDistanceBetween(sigs[i], sigs[j]));
    d.sort((a, b) => a - b);
    // real permanent circuits (an open dataset of 25 centerlines): 1.20; a one-template generator with notches: 0.74
    expect(d[d.length >> 1]).toBeGreaterThanOrEqual(1.0);
  });
});
