// Tests for src/export/palette.ts: colour conversions and the palette's own rules.

import { describe, expect, it } from 'vitest';
import { fromLinear, hexToRgb, PALETTE, srgbHexToLinear, toLinear } from '../../src/export/palette.js';

describe('srgbHexToLinear', () => {
  it('keeps black and white, and maps sRGB 128 to linear 0.2158605 (the sRGB transfer function: ((c + 0.055) / 1.055)^2.4)', () => {
    expect(srgbHexToLinear('#000000')).toEqual([0, 0, 0]);
    expect(srgbHexToLinear('#ffffff')).toEqual([1, 1, 1]);
    const [g] = srgbHexToLinear('#808080');
    expect(g).toBeCloseTo(0.2158605, 6);
  });

  it('fromLinear undoes toLinear', () => {
    for (let k = 0; k <= 255; k++) expect(fromLinear(toLinear(k / 255))).toBeCloseTo(k / 255, 12);
  });

  it('refuses anything but #rrggbb', () => {
    expect(() => hexToRgb('red')).toThrow(new RangeError('expected a colour \'#rrggbb\', got "red"'));
    expect(() => hexToRgb('#fff')).toThrow(RangeError);
  });
});

describe('PALETTE', () => {
  it('every entry is #rrggbb', () => {
    for (const hex of Object.values(PALETTE)) expect(hex).toMatch(/^#[0-9a-f]{6}$/);
  });

  // luminance from the linear channels (Rec. 709 weights), contrast (L1 + 0.05) / (L2 + 0.05)
  const luminance = (hex: string): number => {
    const [r, g, b] = srgbHexToLinear(hex);
    return 0.2126 * r + 0.7152 * g + 0.0722 * b;
  };
  const contrast = (a: string, b: string): number => (Math.max(luminance(a), luminance(b)) + 0.05) / (Math.min(luminance(a), luminance(b)) + 0.05);

  it('ink on paper and on the road is easy to read; walls stand out from the road', () => {
    expect(contrast(PALETTE.ink, PALETTE.paper)).toBeGreaterThan(12);
    expect(contrast(PALETTE.ink, PALETTE.road)).toBeGreaterThan(7);
    expect(contrast(PALETTE.wallLeft, PALETTE.road)).toBeGreaterThan(2);
    expect(contrast(PALETTE.wallRight, PALETTE.road)).toBeGreaterThan(2);
  });
});
