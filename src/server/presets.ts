/**
 * Named difficulty presets, from gentle to brutal: a ready curriculum. Each is a complete set of
 * request parameters that passes the feasibility rules (radius above half the widest road plus
 * the wall; a one-direction loop turns exactly 360 degrees) and generates for any seed; the
 * tests generate every preset for several seeds.
 *
 * Where they sit against real venues (shared/REFERENCES.md): gentle to technical stay inside
 * what permanent circuits show (widths 9–18 m, radii 14 m and up, up to ~1500 degrees over
 * 15 corners); fierce and brutal deliberately leave it, with kart-track widths (6–10 m) and
 * tighter, denser corners than any circuit, to push an agent past what it will meet.
 */
import type { TrackRequestBody } from '../schema/params.js';

/** One preset: a name of our own, one line on what it trains, and its parameters (no seed). */
export interface Preset {
  readonly name: string;
  readonly description: string;
  readonly params: Omit<TrackRequestBody, 'seed'>;
}

/** The presets, easiest first. */
export const PRESETS: readonly Preset[] = [
  {
    name: 'gentle',
    description: 'A wide counter-clockwise loop with four sweeping left-handers: first laps, learning to stay between the walls.',
    params: { lengthM: 1200, widthM: { min: 14, max: 18 }, curvatureBudgetDeg: 360, turnBalance: 0, cornerCount: 4, minCornerRadiusM: 40, noise: 0.1 },
  },
  {
    name: 'steady',
    description: 'Wide road, six open corners, one of them turning the other way: smooth steering in both directions.',
    params: { lengthM: 1800, widthM: { min: 12, max: 16 }, curvatureBudgetDeg: 640, turnBalance: 0.2, cornerCount: 6, minCornerRadiusM: 28, noise: 0.2 },
  },
  {
    name: 'lively',
    description: 'Ten corners of mixed direction at medium radius: braking before corners starts to matter.',
    params: { lengthM: 2400, widthM: { min: 11, max: 14 }, curvatureBudgetDeg: 1000, turnBalance: 0.3, cornerCount: 10, minCornerRadiusM: 20, noise: 0.3 },
  },
  {
    name: 'technical',
    description: 'A circuit-like lap: fifteen corners, about 1500 degrees of turning, road 9–12 m wide.',
    params: { lengthM: 3000, widthM: { min: 9, max: 12 }, curvatureBudgetDeg: 1500, turnBalance: 0.4, cornerCount: 15, minCornerRadiusM: 14, noise: 0.35 },
  },
  {
    name: 'fierce',
    description: 'Narrow and busy: twenty-one corners down to 11 m radius on a 7–10 m road, beyond most circuits.',
    params: { lengthM: 3200, widthM: { min: 7, max: 10 }, curvatureBudgetDeg: 2100, turnBalance: 0.45, cornerCount: 21, minCornerRadiusM: 11, noise: 0.4 },
  },
  {
    name: 'brutal',
    description: 'Twenty-eight tight corners split evenly left and right on a 6–9 m road: a stress test, not a circuit.',
    params: { lengthM: 3600, widthM: { min: 6, max: 9 }, curvatureBudgetDeg: 2700, turnBalance: 0.5, cornerCount: 28, minCornerRadiusM: 9, noise: 0.45 },
  },
];

/**
 * The preset of that name.
 * @example findPreset('gentle')?.params.lengthM // 1200
 */
export function findPreset(name: string): Preset | undefined {
  return PRESETS.find((p) => p.name === name);
}
