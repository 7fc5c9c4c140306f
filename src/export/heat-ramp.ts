/**
 * The heat ramp for colouring the road by |curvature|: five stops of our own, from pale straw
 * (straight) to deep plum (the tightest allowed bend), interpolated in the OKLab colour space
 * so equal steps of the input look like equal steps of colour. Lightness falls monotonically
 * along the ramp, so it still reads in greyscale print.
 */
import { fromLinear, hexToRgb, toLinear } from './palette.js';

/** The ramp's stops, sRGB hex, from u = 0 to u = 1 at equal spacing. */
export const HEAT_STOPS = ['#f1ebbb', '#a8d08d', '#3f9c8f', '#3b4f91', '#4a1f5c'] as const;

const STOPS_LAB = HEAT_STOPS.map((hex) => linearToOklab(hexToRgb(hex).map(toLinear) as [number, number, number]));

/**
 * Colour of the ramp at u (clamped to [0, 1]).
 * @returns '#rrggbb'
 * @example heatColour(0) // '#f1ebbb'
 */
export function heatColour(u: number): string {
  const t = Math.min(1, Math.max(0, Number.isFinite(u) ? u : 0)) * (STOPS_LAB.length - 1);
  const k = Math.min(Math.floor(t), STOPS_LAB.length - 2);
  const f = t - k;
  const a = STOPS_LAB[k];
  const b = STOPS_LAB[k + 1];
  const lab: [number, number, number] = [a[0] + f * (b[0] - a[0]), a[1] + f * (b[1] - a[1]), a[2] + f * (b[2] - a[2])];
  return '#' + oklabToLinear(lab).map((c) => channelHex(fromLinear(c))).join('');
}

/** OKLab lightness of a colour (0 black .. 1 white), for tests of the ramp's monotonic lightness. */
export function oklabLightness(hex: string): number {
  return linearToOklab(hexToRgb(hex).map(toLinear) as [number, number, number])[0];
}

function channelHex(c: number): string {
  return Math.round(Math.min(1, Math.max(0, c)) * 255)
    .toString(16)
    .padStart(2, '0');
}

// linear sRGB → OKLab
function linearToOklab([r, g, b]: [number, number, number]): [number, number, number] {
  const l = Math.cbrt(0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b);
  const m = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b);
  const s = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b);
  return [0.2104542553 * l + 0.793617785 * m - 0.0040720468 * s, 1.9779984951 * l - 2.428592205 * m + 0.4505937099 * s, 0.0259040371 * l + 0.7827717662 * m - 0.808675766 * s];
}

// OKLab → linear sRGB
function oklabToLinear([L, a, b]: [number, number, number]): [number, number, number] {
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (L - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return [4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s, -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s, -0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s];
}
