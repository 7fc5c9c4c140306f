/**
 * lapwright's own colours, shared by the exporters: sRGB hex for drawings (svg) and the same
 * colours as linear factors for glTF materials (glTF's baseColorFactor is linear).
 */

/** Named colours, sRGB hex. */
export const PALETTE = {
  /** background of drawings: warm off-white, prints as paper */
  paper: '#f6f4ee',
  /** text, outlines, arrows */
  ink: '#1d232b',
  /** road surface in drawings: light so it prints */
  road: '#c5c8ce',
  /** road surface in 3D */
  asphalt: '#50555e',
  /** left wall (the driver's left) */
  wallLeft: '#c8553d',
  /** right wall */
  wallRight: '#2e6f95',
  /** progress gate lines in drawings */
  gate: '#5f6b7a',
  /** gate trigger volumes in 3D (translucent) */
  gateVolume: '#8fd3c8',
  /** start/finish line: light squares (the dark ones are ink) */
  startLine: '#fbfaf5',
  /** start/finish trigger volume in 3D */
  startVolume: '#f2c14e',
  /** spawn car body */
  spawn: '#1d232b',
  /** spawn car nose */
  spawnNose: '#f2c14e',
} as const;

/**
 * sRGB hex colour to linear RGB factors in [0, 1] (the sRGB transfer function).
 * @example srgbHexToLinear('#ffffff') // [1, 1, 1]
 */
export function srgbHexToLinear(hex: string): [number, number, number] {
  const [r, g, b] = hexToRgb(hex);
  return [toLinear(r), toLinear(g), toLinear(b)];
}

/**
 * '#rrggbb' to channels in [0, 1].
 * @throws RangeError for anything but '#rrggbb'
 */
export function hexToRgb(hex: string): [number, number, number] {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new RangeError(`expected a colour '#rrggbb', got ${JSON.stringify(hex)}`);
  return [parseInt(m[1], 16) / 255, parseInt(m[2], 16) / 255, parseInt(m[3], 16) / 255];
}

/** sRGB channel in [0, 1] to linear light. */
export function toLinear(c: number): number {
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** Linear light in [0, 1] to an sRGB channel. */
export function fromLinear(c: number): number {
  return c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055;
}
