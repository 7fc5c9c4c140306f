// Tests for src/export/svg.ts: the drawing is well-formed XML (fast-xml-parser's validator and
// parser), holds one element per gate, spawn and corner, both walls and the road, a round scale
// bar near a fifth of the width, a title with the track's figures, and keeps the track's shape.

import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import type { Track } from '../../src/core/index.js';
import { HEAT_STOPS, heatColour } from '../../src/export/heat-ramp.js';
import { escapeXml, SCALE_BAR_LENGTHS_M, scaleBarLengthM, trackToSvg } from '../../src/export/svg.js';
import { exportTracks } from '../helpers/export-tracks.js';
import { cloneTrack, moveTrack, stadiumTrack } from '../helpers/synthetic-track.js';

/** A parsed element: tag, attributes, children in document order, and its own text. */
interface El {
  readonly tag: string;
  readonly attrs: Readonly<Record<string, string>>;
  readonly children: readonly El[];
  readonly text: string;
}

const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '', preserveOrder: true, parseAttributeValue: false, parseTagValue: false, trimValues: false });

/** Checks well-formedness with the parser's validator, then parses into El trees. */
function parseSvg(svg: string): El {
  const valid = XMLValidator.validate(svg);
  if (valid !== true) throw new Error(`not well-formed XML: ${JSON.stringify(valid.err)}`);
  const roots = toEls(parser.parse(svg) as unknown[]);
  expect(roots.map((r) => r.tag)).toEqual(['svg']);
  return roots[0];
}

function toEls(nodes: readonly unknown[]): El[] {
  const out: El[] = [];
  for (const node of nodes as Record<string, unknown>[]) {
    const tag = Object.keys(node).find((k) => k !== ':@');
    if (tag === undefined || tag === '#text') continue;
    const raw = node[tag] as Record<string, unknown>[];
    out.push({ tag, attrs: (node[':@'] ?? {}) as Record<string, string>, children: toEls(raw), text: raw.map((c) => (typeof c['#text'] === 'string' ? c['#text'] : '')).join('') });
  }
  return out;
}

function all(root: El, pred: (el: El) => boolean): El[] {
  const found: El[] = [];
  const walk = (el: El): void => {
    if (pred(el)) found.push(el);
    el.children.forEach(walk);
  };
  walk(root);
  return found;
}

function byId(root: El, id: string): El {
  const found = all(root, (el) => el.attrs.id === id);
  expect(found, `#${id}`).toHaveLength(1);
  return found[0];
}

const hasId = (root: El, id: string): boolean => all(root, (el) => el.attrs.id === id).length > 0;
const textOf = (el: El): string => all(el, (e) => e.tag === 'text').map((t) => t.text).join('\n');
const numbers = (s: string): number[] => s.trim().split(/[\s,]+/).map(Number);

/** Every point of a path's data, as numbers (M, L and Z commands only). */
function pathPoints(d: string): [number, number][] {
  const nums = numbers(d.replace(/[MLZ]/g, ' '));
  return Array.from({ length: nums.length / 2 }, (_, i) => [nums[2 * i], nums[2 * i + 1]]);
}

describe.each(exportTracks())('svg of the %s track', (_name, track: Track) => {
  const svg = trackToSvg(track, { widthPx: 600 });
  const root = parseSvg(svg);
  const [vx, vy, vw, vh] = numbers(root.attrs.viewBox);

  it('is a standalone SVG document of the requested width, undistorted', () => {
    expect(root.attrs.xmlns).toBe('http://www.w3.org/2000/svg');
    expect(Number(root.attrs.width)).toBe(600);
    // width / height in pixels and in the viewBox agree (one scale for x and y)
    expect((vw / vh) / (600 / Number(root.attrs.height))).toBeCloseTo(1, 3);
    expect(root.attrs['data-track-id']).toBe(track.id);
  });

  it('the viewBox holds the whole track, which fills the width (y flipped: a point (x, y) is drawn at (x, -y))', () => {
    const xs = [...track.walls.left, ...track.walls.right].map((p) => p[0]);
    const ys = [...track.walls.left, ...track.walls.right].map((p) => -p[1]);
    const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
    expect(minX).toBeGreaterThan(vx);
    expect(maxX).toBeLessThan(vx + vw);
    expect(minY).toBeGreaterThan(vy);
    expect(maxY).toBeLessThan(vy + vh);
    // the track's bounds set the aspect: it spans the width between margins, and the height
    // adds no more than the title and legend bands (under 200 px at 600 px wide)
    expect((maxX - minX) / vw).toBeGreaterThan(0.8);
    expect(((vh - (maxY - minY)) * 600) / vw).toBeLessThan(200);
    // centred on the wall solids, which reach thicknessM beyond the faces
    expect(Math.abs((minX + maxX) / 2 - (vx + vw / 2))).toBeLessThan(track.walls.thicknessM);
  });

  it('draws the road and both walls through the wall faces', () => {
    const road = byId(root, 'lw-road');
    const roadPaths = all(road, (el) => el.tag === 'path');
    expect(roadPaths).toHaveLength(1);
    expect(roadPaths[0].attrs['fill-rule']).toBe('evenodd');
    expect(pathPoints(roadPaths[0].attrs.d)).toHaveLength(2 * track.walls.left.length);
    for (const side of ['left', 'right'] as const) {
      const wall = byId(root, `lw-wall-${side}`);
      expect(wall.tag).toBe('path');
      const pts = pathPoints(wall.attrs.d);
      // the face, then the outer side: two closed rings of one vertex per face point
      expect(wall.attrs.d.match(/M/g)).toHaveLength(2);
      expect(pts).toHaveLength(2 * track.walls[side].length);
      const [x, y] = track.walls[side][7];
      const tol = 10 ** -Number(/\.(\d+)/.exec(wall.attrs.d)?.[1].length ?? 0);
      expect(Math.abs(pts[7][0] - x)).toBeLessThanOrEqual(tol);
      expect(Math.abs(pts[7][1] + y)).toBeLessThanOrEqual(tol);
    }
  });

  it('one element per gate in order; the start/finish line is a checker band, not a colour', () => {
    const gates = byId(root, 'lw-gates').children;
    expect(gates.map((g) => Number(g.attrs['data-index']))).toEqual(track.gates.map((g) => g.index));
    expect(gates[0].attrs.class).toBe('gate start');
    expect(all(gates[0], (el) => el.attrs.fill === 'url(#lw-checker)')).toHaveLength(1);
    expect(hasId(root, 'lw-checker')).toBe(true);
    expect(gates.slice(1).every((g) => g.tag === 'line' && g.attrs.class === 'gate')).toBe(true);
  });

  it('one small oriented car per spawn, turned by the heading (negated: SVG turns clockwise)', () => {
    const spawns = byId(root, 'lw-spawns').children;
    expect(spawns).toHaveLength(track.spawns.length);
    for (const [k, el] of spawns.entries()) {
      const spawn = track.spawns[k];
      expect(el.attrs['data-index']).toBe(String(spawn.index));
      const [, angle] = /rotate\(([-\d.e]+)\)/.exec(el.attrs.transform) ?? [];
      expect(Number(angle)).toBeCloseTo(-spawn.headingDeg, 3);
      expect(el.children.filter((c) => c.tag === 'rect')).toHaveLength(2);
    }
  });

  it('numbers every corner from 1 at its apex, outside the road', () => {
    const corners = byId(root, 'lw-corners').children;
    expect(corners).toHaveLength(track.corners.length);
    expect(corners.map((c) => textOf(c))).toEqual(track.corners.map((c) => String(c.index + 1)));
    const maxHalf = Math.max(...track.centerline.halfWidthLeftM, ...track.centerline.halfWidthRightM);
    for (const [k, el] of corners.entries()) {
      const circle = el.children.find((c) => c.tag === 'circle')!;
      const [cx, cy] = [Number(circle.attrs.cx), -Number(circle.attrs.cy)];
      const corner = track.corners[k];
      // nearest centerline point inside the corner's span is farther than the road's half width
      const inSpan = track.centerline.points.filter((_, i) => {
        const s = track.centerline.s[i];
        return corner.sStart <= corner.sEnd ? s >= corner.sStart && s <= corner.sEnd : s >= corner.sStart || s <= corner.sEnd;
      });
      const nearest = Math.min(...inSpan.map(([x, y]) => Math.hypot(x - cx, y - cy)));
      expect(nearest).toBeGreaterThan(Math.min(...track.centerline.halfWidthLeftM, ...track.centerline.halfWidthRightM));
      expect(nearest).toBeLessThan(maxHalf + track.walls.thicknessM + 30 * (vw / 600));
    }
  });

  it('a scale bar of a round length near a fifth of the drawing, labelled in metres', () => {
    const bar = byId(root, 'lw-scale-bar');
    const length = Number(bar.attrs['data-length-m']);
    expect(SCALE_BAR_LENGTHS_M).toContain(length);
    expect(textOf(bar)).toBe(`${length} m`);
    expect(length).toBe(scaleBarLengthM(vw));
    expect(length / vw).toBeGreaterThan(0.08);
    expect(length / vw).toBeLessThan(0.45);
    // the bar is drawn that long in the drawing's metres
    const widths = bar.children.filter((c) => c.tag === 'rect').map((r) => Number(r.attrs.width));
    expect(widths.reduce((a, b) => a + b, 0)).toBeCloseTo(length, 1);
  });

  it('a title with the id prefix, length, corner count and difficulty, and an arrow for the direction of travel', () => {
    const title = textOf(byId(root, 'lw-legend'));
    expect(title).toContain(`Track ${track.id.slice(0, 8)}`);
    expect(title).toContain(`${Math.round(track.metrics.lengthM)} m`);
    expect(title).toContain(`${track.metrics.cornerCount} corners`);
    expect(title).toContain(`difficulty ${track.metrics.difficulty.toFixed(1)} / 10`);
    expect(all(root, (el) => el.tag === 'title')[0].text).toContain(track.id.slice(0, 8));
    const arrow = all(byId(root, 'lw-direction'), (el) => el.tag === 'path')[0];
    expect(arrow.attrs['marker-end']).toBe('url(#lw-arrowhead)');
    // the arrow starts ahead of the start line and points along the first heading
    const pts = pathPoints(arrow.attrs.d);
    const [dx, dy] = [pts[1][0] - pts[0][0], -(pts[1][1] - pts[0][1])];
    const h = (track.centerline.headingDeg[0] * Math.PI) / 180;
    expect(dx * Math.cos(h) + dy * Math.sin(h)).toBeGreaterThan(0);
  });

  it('heat: the road in patches coloured from the ramp, straights at its pale end, with a key', () => {
    const heat = parseSvg(trackToSvg(track, { widthPx: 600, heat: true }));
    const patches = all(byId(heat, 'lw-road'), (el) => el.tag === 'path');
    expect(patches.length).toBeGreaterThan(2 * track.corners.length);
    const ramp = new Set(Array.from({ length: 24 }, (_, k) => heatColour(k / 23)));
    expect(patches.every((p) => ramp.has(p.attrs.fill))).toBe(true);
    expect(patches.some((p) => p.attrs.fill === HEAT_STOPS[0])).toBe(true);
    // every road quad is in exactly one patch: n + 2 points per patch of n quads, closed
    const quads = patches.reduce((sum, p) => sum + pathPoints(p.attrs.d).length / 2 - 1, 0);
    expect(quads).toBe(track.walls.left.length);
    expect(hasId(heat, 'lw-heat-key')).toBe(true);
    expect(textOf(byId(heat, 'lw-legend'))).toContain(`|curvature| 0 → 1/${track.params.minCornerRadiusM} m⁻¹`);
  });
});

describe('svg options and text', () => {
  const stadium = stadiumTrack({ spawnSlots: 4 });

  it('showGates, showSpawns, showCorners and showLegend leave their parts out (the start line stays)', () => {
    const root = parseSvg(trackToSvg(stadium, { showGates: false, showSpawns: false, showCorners: false, showLegend: false }));
    expect(byId(root, 'lw-gates').children.map((g) => g.attrs['data-index'])).toEqual(['0']);
    expect(hasId(root, 'lw-spawns')).toBe(false);
    expect(hasId(root, 'lw-corners')).toBe(false);
    expect(hasId(root, 'lw-legend')).toBe(false);
    expect(Number(root.attrs.width)).toBe(800);
  });

  it('widthPx outside 200..4000 is refused', () => {
    expect(() => trackToSvg(stadium, { widthPx: 100 })).toThrow(new RangeError('widthPx must be a number from 200 to 4000, got 100'));
    expect(() => trackToSvg(stadium, { widthPx: Number.NaN })).toThrow(RangeError);
  });

  it('text from the track is escaped: a seed with markup and control characters stays well-formed', () => {
    const track = cloneTrack(stadium);
    track.seed = 'a<b>&"c\'\u0001\uD800';
    track.id = 'id"<&>';
    const svg = trackToSvg(track as Track);
    const root = parseSvg(svg);
    expect(root.attrs['data-track-id']).toBe('id"<&>');
    // the seed shows as a JSON string, so control characters and lone surrogates show escaped
    expect(textOf(byId(root, 'lw-legend'))).toContain('seed "a<b>&\\"c\'\\u0001\\ud800"');
  });

  it('the same track gives the same text', () => {
    expect(trackToSvg(stadium, { heat: true })).toBe(trackToSvg(stadium, { heat: true }));
  });

  it('a long narrow track standing upright is shrunk to at most 1.5 times as tall as wide, plus the bands', () => {
    const upright = moveTrack(stadiumTrack({ straightM: 1000, radiusM: 30 }), 1, 0, 0);
    const root = parseSvg(trackToSvg(upright, { widthPx: 400 }));
    const [, , vw, vh] = numbers(root.attrs.viewBox);
    expect(vh / vw).toBeGreaterThan(1.5);
    expect(Number(root.attrs.height)).toBeLessThan(400 * 1.5 + 200);
    expect(Number(root.attrs.height)).toBeGreaterThan(400 * 1.5);
  });
});

describe('scaleBarLengthM', () => {
  it.each([
    [50, 10],
    [480, 100],
    [600, 100],
    [800, 200],
    [2400, 500],
    [40_000, 5000],
  ])('a drawing %d m wide gets a %d m bar', (width, bar) => {
    expect(scaleBarLengthM(width)).toBe(bar);
  });
});

describe('escapeXml', () => {
  it('escapes the five XML specials and replaces characters XML cannot hold', () => {
    expect(escapeXml(`<a href="x">&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&amp;&apos;&lt;/a&gt;');
    expect(escapeXml('tab\tnew\nline\u0000\u001f\uFFFE\uDC00')).toBe('tab\tnew\nline\uFFFD\uFFFD\uFFFD\uFFFD');
    // a surrogate pair is one valid character and stays
    expect(escapeXml('flag \u{1F3C1}')).toBe('flag \u{1F3C1}');
  });
});
