// Tests for src/export/heat-ramp.ts: the ramp runs through its stops and its lightness falls
// monotonically, so it reads in greyscale.

import { describe, expect, it } from 'vitest';
import { HEAT_STOPS, heatColour, oklabLightness } from '../../src/export/heat-ramp.js';

describe('heatColour', () => {
  it('passes through its stops at equal spacing', () => {
    HEAT_STOPS.forEach((hex, k) => expect(heatColour(k / (HEAT_STOPS.length - 1))).toBe(hex));
  });

  it('lightness falls strictly from the pale end to the dark end', () => {
    const samples = Array.from({ length: 101 }, (_, k) => oklabLightness(heatColour(k / 100)));
    for (let k = 1; k < samples.length; k++) expect(samples[k]).toBeLessThan(samples[k - 1]);
    // wide enough apart to tell straights from the tightest bends in greyscale
    expect(samples[0] - samples[100]).toBeGreaterThan(0.5);
  });

  it('clamps outside [0, 1] and treats NaN as 0', () => {
    expect(heatColour(-1)).toBe(HEAT_STOPS[0]);
    expect(heatColour(7)).toBe(HEAT_STOPS[HEAT_STOPS.length - 1]);
    expect(heatColour(Number.NaN)).toBe(HEAT_STOPS[0]);
  });

  it('returns #rrggbb', () => {
    for (let k = 0; k <= 20; k++) expect(heatColour(k / 20)).toMatch(/^#[0-9a-f]{6}$/);
  });
});

describe('oklabLightness', () => {
  // OKLab puts white at L = 1 and black at L = 0 by construction
  it('white is 1 and black is 0', () => {
    expect(oklabLightness('#ffffff')).toBeCloseTo(1, 6);
    expect(oklabLightness('#000000')).toBeCloseTo(0, 6);
  });
});
