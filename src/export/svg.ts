/**
 * A track as an SVG drawing for people: the road between both wall solids, the progress gates
 * (the start/finish line as a checker band), the spawn poses as small cars, an arrow for the
 * direction of travel, numbered corners, a scale bar in metres and a title with the track's
 * figures; optionally the road coloured by |curvature|. Light background and patterns that
 * survive greyscale print: nothing is told by colour alone.
 *
 * Axes: SVG user units are metres, with y flipped (SVG y runs down): a track point (x, y) is
 * drawn at (x, -y). Text and line widths are sized in pixels of the requested width and
 * converted to metres, so the drawing reads the same at any track size.
 *
 *   ┌──────────────────────────────────────┐
 *   │ title: id, length, corners, difficulty│  title band
 *   │            track drawing             │
 *   │ scale bar · key (· heat ramp)        │  legend band
 *   └──────────────────────────────────────┘
 */
import type { Point, Track } from '../core/index.js';
import { HEAT_STOPS, heatColour } from './heat-ramp.js';
import { PALETTE } from './palette.js';
import { wallOutline } from './wall-outline.js';

/** Options of the SVG drawing. */
export interface SvgOptions {
  /** Width of the drawing in pixels (the height follows the track's shape). Default 800; 200..4000. */
  readonly widthPx?: number;
  /** Colour the road by |curvature| (0 → straight, darkest → the request's tightest radius). Default false. */
  readonly heat?: boolean;
  /** Number the corners at their apex. Default true. */
  readonly showCorners?: boolean;
  /** Draw the progress gates (the start/finish line is always drawn). Default true. */
  readonly showGates?: boolean;
  /** Draw the spawn poses. Default true. */
  readonly showSpawns?: boolean;
  /** Title band (id, length, corners, difficulty) and legend band (scale bar, key). Default true. */
  readonly showLegend?: boolean;
}

/** Default width of the drawing, pixels. */
export const SVG_DEFAULT_WIDTH_PX = 800;
/** Allowed drawing widths, pixels. */
export const SVG_WIDTH_LIMITS_PX = { min: 200, max: 4000 } as const;
/** Round lengths the scale bar may take, metres. */
export const SCALE_BAR_LENGTHS_M = [10, 20, 50, 100, 200, 500, 1000, 2000, 5000] as const;
/** Share of the drawing's width the scale bar aims at. */
export const SCALE_BAR_SHARE = 0.2;

/** Tallest drawing area for a given width: a long narrow track is shrunk to this, not stretched down the page. */
const MAX_ASPECT = 1.5;
/** Quantisation steps of the heat colouring (consecutive points in one step share a patch). */
const HEAT_STEPS = 24;
/** Width of the heat ramp in the key, pixels. */
const HEAT_KEY_PX = 84;
/** Assumed advance of one character, in ems, for laying out text (generous for common sans faces). */
const CHAR_EM = 0.6;

// sizes in pixels of the requested width
const PX = {
  margin: 14,
  cornerReach: 26,
  title: 15,
  text: 11.5,
  line: 17,
  legendRow: 18,
  gate: 1,
  wall: 1.3,
  arrow: 2.6,
  arrowLength: 70,
  arrowLead: 24,
  cornerRadius: 8.5,
  cornerGap: 3,
  cornerText: 10.5,
  startDepth: 6,
  swatch: 12,
  scaleBarHeight: 6,
};

const FONT = "system-ui, 'Segoe UI', 'DejaVu Sans', Helvetica, Arial, sans-serif";

/**
 * Draws a track as a standalone SVG document. Pure: reads only the track.
 * @param track a generated or validated track (format lapwright.track/1)
 * @returns the SVG text (media type image/svg+xml), well-formed XML
 * @throws RangeError when widthPx is outside 200..4000
 * @example await writeFile('track.svg', trackToSvg(generateTrack({ seed: 1 }), { widthPx: 600, heat: true }))
 */
export function trackToSvg(track: Track, options: SvgOptions = {}): string {
  const widthPx = options.widthPx ?? SVG_DEFAULT_WIDTH_PX;
  if (!(widthPx >= SVG_WIDTH_LIMITS_PX.min && widthPx <= SVG_WIDTH_LIMITS_PX.max)) throw new RangeError(`widthPx must be a number from ${SVG_WIDTH_LIMITS_PX.min} to ${SVG_WIDTH_LIMITS_PX.max}, got ${widthPx}`);
  const show = { corners: options.showCorners ?? true, gates: options.showGates ?? true, spawns: options.showSpawns ?? true, legend: options.showLegend ?? true, heat: options.heat ?? false };

  const { thicknessM } = track.walls;
  const outerLeft = wallOutline(track.walls.left, thicknessM, 'left').outer;
  const outerRight = wallOutline(track.walls.right, thicknessM, 'right').outer;
  const bounds = boundsOf([outerLeft, outerRight, flat(track.walls.left), flat(track.walls.right)]);
  const layout = layOut(track, bounds, widthPx, show);
  const d = new Draw(layout.pxM, layout.decimals);

  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${layout.widthPx}" height="${layout.heightPx}" viewBox="${d.n(layout.view.x)} ${d.n(layout.view.y)} ${d.n(layout.view.w)} ${d.n(layout.view.h)}" role="img" aria-labelledby="lw-title" data-track-id="${escapeXml(track.id)}" font-family="${escapeXml(FONT)}">`,
    `<title id="lw-title">${escapeXml(titleText(track))}</title>`,
    `<desc>${escapeXml('Drawn by lapwright. Units: metres; y points up in the track, down in this drawing.')}</desc>`,
    defs(d),
    `<rect id="lw-paper" x="${d.n(layout.view.x)}" y="${d.n(layout.view.y)}" width="${d.n(layout.view.w)}" height="${d.n(layout.view.h)}" fill="${PALETTE.paper}"/>`,
    show.heat ? heatRoad(track, d) : `<g id="lw-road"><path class="road" d="${d.ring(flat(track.walls.left))} ${d.ring(flat(track.walls.right))}" fill="${PALETTE.road}" fill-rule="evenodd"/></g>`,
    `<g id="lw-walls">`,
    // the solid at true size, outlined in its own colour so a thin wall still shows at a small scale
    `<path id="lw-wall-left" class="wall" d="${d.ring(flat(track.walls.left))} ${d.ring(outerLeft)}" fill="${PALETTE.wallLeft}" fill-rule="evenodd" stroke="${PALETTE.wallLeft}" stroke-width="${d.n(PX.wall * d.m)}" stroke-linejoin="round"/>`,
    `<path id="lw-wall-right" class="wall" d="${d.ring(flat(track.walls.right))} ${d.ring(outerRight)}" fill="${PALETTE.wallRight}" fill-rule="evenodd" stroke="${PALETTE.wallRight}" stroke-width="${d.n(PX.wall * d.m)}" stroke-linejoin="round"/>`,
    `</g>`,
    gatesGroup(track, d, show.gates),
    directionArrow(track, d),
  );
  if (show.spawns) parts.push(spawnsGroup(track, d));
  if (show.corners) parts.push(cornersGroup(track, d));
  if (show.legend) parts.push(legendGroup(d, layout));
  parts.push('</svg>');
  return parts.join('\n') + '\n';
}

/**
 * The scale bar's length for a drawing width: the round length closest (by ratio) to
 * SCALE_BAR_SHARE of it.
 * @param drawingWidthM width of the track's drawing, metres
 * @example scaleBarLengthM(480) // 100
 */
export function scaleBarLengthM(drawingWidthM: number): number {
  const aim = drawingWidthM * SCALE_BAR_SHARE;
  let best: number = SCALE_BAR_LENGTHS_M[0];
  for (const len of SCALE_BAR_LENGTHS_M) if (Math.abs(Math.log(len / aim)) < Math.abs(Math.log(best / aim))) best = len;
  return best;
}

/**
 * Escapes text for XML content and attribute values, and replaces characters XML 1.0 cannot
 * hold (control characters, lone surrogates) with U+FFFD.
 * @example escapeXml('a<b & "c"') // 'a&lt;b &amp; &quot;c&quot;'
 */
export function escapeXml(text: string): string {
  return text.replace(/[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '\uFFFD').replace(/[&<>"']/g, (c) => ENTITIES[c]);
}

const ENTITIES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' };

interface Bounds {
  readonly minX: number;
  readonly minY: number;
  readonly maxX: number;
  readonly maxY: number;
}

interface Layout {
  readonly widthPx: number;
  readonly heightPx: number;
  /** pixels per metre */
  readonly pxM: number;
  readonly decimals: number;
  /** the viewBox, metres (y already flipped) */
  readonly view: { readonly x: number; readonly y: number; readonly w: number; readonly h: number };
  readonly titleLines: readonly string[];
  readonly legendRows: readonly (readonly KeyItem[])[];
  /** top of the legend band, SVG y in metres */
  readonly legendTop: number;
  /** length of the scale bar, metres */
  readonly scaleM: number;
}

interface KeyItem {
  readonly kind: 'scale' | 'wall-left' | 'wall-right' | 'gate' | 'start' | 'spawn' | 'direction' | 'heat';
  readonly label: string;
  readonly widthPx: number;
}

// sizes the drawing: track area scaled to the width (or to MAX_ASPECT), bands above and below
function layOut(track: Track, bounds: Bounds, widthPx: number, show: { corners: boolean; legend: boolean; heat: boolean; spawns: boolean; gates: boolean }): Layout {
  const margin = PX.margin + (show.corners ? PX.cornerReach : 0);
  const bw = Math.max(bounds.maxX - bounds.minX, 1e-3);
  const bh = Math.max(bounds.maxY - bounds.minY, 1e-3);
  const pxM = Math.min((widthPx - 2 * margin) / bw, (MAX_ASPECT * widthPx - 2 * margin) / bh);
  const inner = widthPx - 2 * PX.margin;
  const titleLines = show.legend ? wrapTokens(titleTokens(track), inner, PX.title, 2).concat(wrapTokens(subtitleTokens(track), inner, PX.text, 3)) : [];
  const scaleM = scaleBarLengthM(widthPx / pxM);
  const legendRows = show.legend ? flowRows(keyItems(track, scaleM, pxM, show), inner) : [];
  const titleBand = titleLines.length > 0 ? PX.margin + PX.title + (titleLines.length - 1) * PX.line : 0;
  const legendBand = legendRows.length * PX.legendRow + (legendRows.length > 0 ? PX.margin / 2 : 0);
  const heightPx = Math.ceil(titleBand + 2 * margin + bh * pxM + legendBand);
  const w = widthPx / pxM;
  const h = heightPx / pxM;
  // centre the track across the width; the title band sits on top
  const x = (bounds.minX + bounds.maxX) / 2 - w / 2;
  const y = -bounds.maxY - (margin + titleBand) / pxM;
  // coordinates to 1/10 px at least, never finer than 1 mm (the shipping precision)
  const decimals = Math.min(3, Math.max(0, Math.ceil(Math.log10(10 * pxM))));
  return { widthPx, heightPx, pxM, decimals, view: { x, y, w, h }, titleLines, legendRows, legendTop: y + h - legendBand / pxM, scaleM };
}

function titleText(track: Track): string {
  return `${titleTokens(track).join(' · ')} — ${subtitleTokens(track).join(' · ')}`;
}

function titleTokens(track: Track): string[] {
  const m = track.metrics;
  return [`Track ${track.id.slice(0, 8)}`, `${fixed(m.lengthM, 0)} m`, `${m.cornerCount} corner${m.cornerCount === 1 ? '' : 's'}`, `difficulty ${fixed(m.difficulty, 1)} / 10`];
}

function subtitleTokens(track: Track): string[] {
  const m = track.metrics;
  const seed = typeof track.seed === 'string' ? JSON.stringify(track.seed.length > 24 ? track.seed.slice(0, 23) + '…' : track.seed) : String(track.seed);
  return [
    `width ${fixed(m.width.min, 1)}–${fixed(m.width.max, 1)} m`,
    `tightest radius ${fixed(m.minRadiusM, 1)} m`,
    `turning ${fixed(m.totalTurningDeg, 0)}°`,
    `${m.gateCount} gates`,
    `${track.spawns.length} spawn${track.spawns.length === 1 ? '' : 's'}`,
    `seed ${seed}`,
    `generator ${track.generatorVersion}`,
  ];
}

// the key's entries with their widths in pixels (swatch or bar, gap, label, space after)
function keyItems(track: Track, scaleM: number, pxM: number, show: { heat: boolean; spawns: boolean; gates: boolean }): KeyItem[] {
  const item = (kind: KeyItem['kind'], label: string, swatchPx = PX.swatch): KeyItem => ({ kind, label, widthPx: swatchPx + 5 + textWidth(label, PX.text) + 16 });
  const items = [
    item('scale', `${scaleM} m`, scaleM * pxM),
    item('wall-left', 'left wall'),
    item('wall-right', 'right wall'),
    item('start', 'start/finish'),
  ];
  if (show.gates) items.push(item('gate', 'gate'));
  if (show.spawns && track.spawns.length > 0) items.push(item('spawn', 'spawn'));
  items.push(item('direction', 'direction', 17));
  if (show.heat) items.push(item('heat', `|curvature| 0 → 1/${fixed(track.params.minCornerRadiusM, 1)} m⁻¹`, HEAT_KEY_PX));
  return items;
}

// rows of key items that fit the width, in order
function flowRows(items: readonly KeyItem[], widthPx: number): KeyItem[][] {
  const rows: KeyItem[][] = [[]];
  let used = 0;
  for (const it of items) {
    const w = it.widthPx;
    if (used + w > widthPx && rows[rows.length - 1].length > 0) {
      rows.push([]);
      used = 0;
    }
    rows[rows.length - 1].push(it);
    used += w;
  }
  return rows;
}

// greedy line breaking of ' · '-joined tokens by estimated width
function wrapTokens(tokens: readonly string[], widthPx: number, fontPx: number, maxLines: number): string[] {
  const lines: string[] = [];
  for (const token of tokens) {
    const last = lines.length - 1;
    if (last >= 0 && (textWidth(lines[last] + ' · ' + token, fontPx) <= widthPx || lines.length >= maxLines)) lines[last] += ' · ' + token;
    else lines.push(token);
  }
  return lines;
}

function textWidth(text: string, fontPx: number): number {
  return [...text].length * CHAR_EM * fontPx;
}

function defs(d: Draw): string {
  const cell = (PX.startDepth / 2) * d.m;
  const stops = Array.from({ length: 9 }, (_, k) => `<stop offset="${k / 8}" stop-color="${heatColour(k / 8)}"/>`).join('');
  return [
    '<defs>',
    // two rows of squares across the start/finish band
    `<pattern id="lw-checker" patternUnits="userSpaceOnUse" width="${d.n(2 * cell)}" height="${d.n(2 * cell)}"><rect width="${d.n(2 * cell)}" height="${d.n(2 * cell)}" fill="${PALETTE.startLine}"/><rect width="${d.n(cell)}" height="${d.n(cell)}" fill="${PALETTE.ink}"/><rect x="${d.n(cell)}" y="${d.n(cell)}" width="${d.n(cell)}" height="${d.n(cell)}" fill="${PALETTE.ink}"/></pattern>`,
    `<marker id="lw-arrowhead" viewBox="0 0 10 10" refX="3" refY="5" markerWidth="3.2" markerHeight="3.2" orient="auto" markerUnits="strokeWidth"><path d="M0,0 L10,5 L0,10 Z" fill="${PALETTE.ink}"/></marker>`,
    `<linearGradient id="lw-heat-ramp" x1="0" x2="1" y1="0" y2="0">${stops}</linearGradient>`,
    '</defs>',
  ].join('');
}

// the road in patches of equal heat step, each patch the quads between consecutive points
function heatRoad(track: Track, d: Draw): string {
  const { left, right } = track.walls;
  const n = left.length;
  const limit = 1 / track.params.minCornerRadiusM;
  const step = track.centerline.curvature.map((k) => Math.round(Math.min(1, Math.abs(k) / limit) * (HEAT_STEPS - 1)));
  // start at a change of step so no patch wraps past the first point
  const first = Math.max(0, step.findIndex((s, i) => s !== step[(i + n - 1) % n]));
  const patches: string[] = [];
  for (let k = 0; k < n; ) {
    const start = (first + k) % n;
    let len = 1;
    while (k + len < n && step[(first + k + len) % n] === step[start]) len++;
    const idx = Array.from({ length: len + 1 }, (_, j) => (start + j) % n);
    const pts = [...idx.map((i) => left[i]), ...idx.reverse().map((i) => right[i])];
    const colour = heatColour(step[start] / (HEAT_STEPS - 1));
    // the stroke in the fill's colour closes hairline seams between patches
    patches.push(`<path class="road heat" d="${d.ring(flat(pts))}" fill="${colour}" stroke="${colour}" stroke-width="${d.n(0.6 * d.m)}" stroke-linejoin="round"/>`);
    k += len;
  }
  return `<g id="lw-road" data-heat-limit="${limit}">${patches.join('')}</g>`;
}

function gatesGroup(track: Track, d: Draw, showGates: boolean): string {
  const out: string[] = [`<g id="lw-gates" stroke="${PALETTE.gate}" stroke-width="${d.n(PX.gate * d.m)}" stroke-linecap="butt">`];
  for (const gate of track.gates) {
    if (gate.index === 0) {
      // start/finish: a checker band across the road, long side from the left wall to the right
      const [lx, ly] = d.p(gate.left);
      const [rx, ry] = d.p(gate.right);
      const len = Math.hypot(rx - lx, ry - ly);
      const depth = PX.startDepth * d.m;
      const angle = (Math.atan2(ry - ly, rx - lx) * 180) / Math.PI;
      out.push(
        `<g class="gate start" data-index="0" data-s="${gate.s}" transform="translate(${d.n((lx + rx) / 2)} ${d.n((ly + ry) / 2)}) rotate(${fixed(angle, 2)})"><rect x="${d.n(-len / 2)}" y="${d.n(-depth / 2)}" width="${d.n(len)}" height="${d.n(depth)}" fill="url(#lw-checker)" stroke="${PALETTE.ink}" stroke-width="${d.n(0.6 * d.m)}"/></g>`,
      );
    } else if (showGates) {
      const [lx, ly] = d.p(gate.left);
      const [rx, ry] = d.p(gate.right);
      out.push(`<line class="gate" data-index="${gate.index}" data-s="${gate.s}" x1="${d.n(lx)}" y1="${d.n(ly)}" x2="${d.n(rx)}" y2="${d.n(ry)}"/>`);
    }
  }
  out.push('</g>');
  return out.join('');
}

// an arrow along the centerline just after the start line, in the direction of travel
function directionArrow(track: Track, d: Draw): string {
  const { points, spacingM } = track.centerline;
  const n = points.length;
  const lead = Math.max(1, Math.round((PX.arrowLead * d.m) / spacingM));
  const len = Math.max(2, Math.round((PX.arrowLength * d.m) / spacingM));
  const span = Math.min(len, Math.floor(n / 4));
  const pts = Array.from({ length: span + 1 }, (_, j) => points[(lead + j) % n]);
  return `<g id="lw-direction"><path d="${d.line(flat(pts))}" fill="none" stroke="${PALETTE.ink}" stroke-width="${d.n(PX.arrow * d.m)}" stroke-linecap="round" stroke-linejoin="round" marker-end="url(#lw-arrowhead)"/></g>`;
}

function spawnsGroup(track: Track, d: Draw): string {
  const { lengthM, widthM } = track.params.car;
  const nose = lengthM / 4;
  const outline = Math.min(0.25, 0.8 * d.m);
  const cars = track.spawns.map((spawn) => {
    const [x, y] = d.p(spawn.position);
    // SVG rotates clockwise with y down: a counter-clockwise heading is a negative angle
    return (
      `<g class="spawn" data-index="${spawn.index}" transform="translate(${d.n(x)} ${d.n(y)}) rotate(${fixed(-spawn.headingDeg, 3)})">` +
      `<rect x="${d.n(-lengthM / 2)}" y="${d.n(-widthM / 2)}" width="${d.n(lengthM)}" height="${d.n(widthM)}" fill="${PALETTE.spawn}" stroke="${PALETTE.paper}" stroke-width="${d.n(outline)}"/>` +
      `<rect x="${d.n(lengthM / 2 - nose)}" y="${d.n(-widthM / 2)}" width="${d.n(nose)}" height="${d.n(widthM)}" fill="${PALETTE.spawnNose}"/></g>`
    );
  });
  return `<g id="lw-spawns">${cars.join('')}</g>`;
}

// each corner's number in a circle just outside the road at its apex (the point of largest |curvature|)
function cornersGroup(track: Track, d: Draw): string {
  const c = track.centerline;
  const n = c.points.length;
  const r = PX.cornerRadius * d.m;
  const labels = track.corners.map((corner) => {
    const apex = apexIndex(track, corner.sStart, corner.sEnd);
    const h = (c.headingDeg[apex] * Math.PI) / 180;
    // outside of the bend: right of travel for a left corner, left for a right corner
    const side = corner.direction === 'left' ? -1 : 1;
    const half = side > 0 ? c.halfWidthLeftM[apex] : c.halfWidthRightM[apex];
    const reach = half + track.walls.thicknessM + PX.cornerGap * d.m + r;
    const [px, py] = c.points[apex % n];
    const [x, y] = d.p([px - side * reach * Math.sin(h), py + side * reach * Math.cos(h)]);
    return `<g class="corner" data-index="${corner.index}" data-direction="${corner.direction}"><circle cx="${d.n(x)}" cy="${d.n(y)}" r="${d.n(r)}"/><text x="${d.n(x)}" y="${d.n(y)}" dy="0.35em" fill="${PALETTE.ink}" stroke="none">${corner.index + 1}</text></g>`;
  });
  return `<g id="lw-corners" fill="${PALETTE.paper}" stroke="${PALETTE.ink}" stroke-width="${d.n(1.2 * d.m)}" font-size="${d.n(PX.cornerText * d.m)}" font-weight="bold" text-anchor="middle">${labels.join('')}</g>`;
}

/** Index of the point of largest |curvature| with s in [sStart, sEnd] (wrapping past the start line). */
function apexIndex(track: Track, sStart: number, sEnd: number): number {
  const c = track.centerline;
  const n = c.points.length;
  const i0 = Math.round(sStart / c.spacingM);
  const count = ((Math.round(sEnd / c.spacingM) - i0 + n) % n) + 1;
  let best = ((i0 % n) + n) % n;
  for (let k = 0; k < count; k++) {
    const i = (((i0 + k) % n) + n) % n;
    if (Math.abs(c.curvature[i]) > Math.abs(c.curvature[best])) best = i;
  }
  return best;
}

function legendGroup(d: Draw, layout: Layout): string {
  const m = d.m;
  const left = layout.view.x + PX.margin * m;
  const out: string[] = [`<g id="lw-legend" fill="${PALETTE.ink}" font-size="${d.n(PX.text * m)}">`];
  layout.titleLines.forEach((line, k) => {
    const size = k === 0 ? PX.title : PX.text;
    const y = layout.view.y + (PX.margin + PX.title + (k === 0 ? 0 : PX.line * k - 2)) * m;
    out.push(`<text class="${k === 0 ? 'title' : 'subtitle'}" x="${d.n(left)}" y="${d.n(y)}" font-size="${d.n(size * m)}"${k === 0 ? ' font-weight="bold"' : ''}>${escapeXml(line)}</text>`);
  });
  layout.legendRows.forEach((row, r) => {
    let x = left;
    const mid = layout.legendTop + (r + 0.5) * PX.legendRow * m;
    for (const item of row) {
      out.push(keyItem(item, x, mid, d, layout.scaleM));
      x += item.widthPx * m;
    }
  });
  out.push('</g>');
  return out.join('');
}

function keyItem(item: KeyItem, x: number, mid: number, d: Draw, scaleM: number): string {
  const m = d.m;
  const s = PX.swatch * m;
  const label = (lx: number, text = item.label) => `<text x="${d.n(lx)}" y="${d.n(mid)}" dy="0.35em">${escapeXml(text)}</text>`;
  const box = (fill: string, extra = '') => `<rect x="${d.n(x)}" y="${d.n(mid - s / 2)}" width="${d.n(s)}" height="${d.n(s)}" fill="${fill}" stroke="${PALETTE.ink}" stroke-width="${d.n(0.6 * m)}"${extra}/>`;
  switch (item.kind) {
    case 'scale': {
      // two halves, dark and light, outlined: reads in greyscale
      const h = PX.scaleBarHeight * m;
      const y = mid - h / 2;
      return (
        `<g id="lw-scale-bar" data-length-m="${scaleM}">` +
        `<rect x="${d.n(x)}" y="${d.n(y)}" width="${d.n(scaleM / 2)}" height="${d.n(h)}" fill="${PALETTE.ink}"/>` +
        `<rect x="${d.n(x + scaleM / 2)}" y="${d.n(y)}" width="${d.n(scaleM / 2)}" height="${d.n(h)}" fill="${PALETTE.paper}" stroke="${PALETTE.ink}" stroke-width="${d.n(0.8 * m)}"/>` +
        `${label(x + scaleM + 5 * m)}</g>`
      );
    }
    case 'wall-left':
      return `<g class="key">${box(PALETTE.wallLeft)}${label(x + s + 5 * m)}</g>`;
    case 'wall-right':
      return `<g class="key">${box(PALETTE.wallRight)}${label(x + s + 5 * m)}</g>`;
    case 'start':
      return `<g class="key">${box('url(#lw-checker)')}${label(x + s + 5 * m)}</g>`;
    case 'gate':
      return `<g class="key"><line x1="${d.n(x + s / 2)}" y1="${d.n(mid - s / 2)}" x2="${d.n(x + s / 2)}" y2="${d.n(mid + s / 2)}" stroke="${PALETTE.gate}" stroke-width="${d.n(1.5 * m)}"/>${label(x + s + 5 * m)}</g>`;
    case 'spawn':
      return `<g class="key"><rect x="${d.n(x)}" y="${d.n(mid - s / 4)}" width="${d.n(s)}" height="${d.n(s / 2)}" fill="${PALETTE.spawn}"/><rect x="${d.n(x + 0.75 * s)}" y="${d.n(mid - s / 4)}" width="${d.n(s / 4)}" height="${d.n(s / 2)}" fill="${PALETTE.spawnNose}"/>${label(x + s + 5 * m)}</g>`;
    case 'direction':
      return `<g class="key"><path d="M${d.n(x)},${d.n(mid)} L${d.n(x + 9 * m)},${d.n(mid)}" stroke="${PALETTE.ink}" stroke-width="${d.n(PX.arrow * m)}" marker-end="url(#lw-arrowhead)"/>${label(x + 22 * m)}</g>`;
    case 'heat': {
      const w = HEAT_KEY_PX * m;
      return `<g class="key" id="lw-heat-key"><rect x="${d.n(x)}" y="${d.n(mid - s / 2)}" width="${d.n(w)}" height="${d.n(s)}" fill="url(#lw-heat-ramp)" stroke="${PALETTE.ink}" stroke-width="${d.n(0.6 * m)}" data-stops="${HEAT_STOPS.join(' ')}"/>${label(x + w + 6 * m)}</g>`;
    }
  }
}

/** Number formatting and point mapping at one scale. */
class Draw {
  /** metres per pixel */
  readonly m: number;
  private readonly decimals: number;

  constructor(pxM: number, decimals: number) {
    this.m = 1 / pxM;
    this.decimals = decimals;
  }

  /** a number at the drawing's precision, never "-0" */
  n(x: number): string {
    return fixed(x, this.decimals);
  }

  /** track plane → SVG user space (metres, y down) */
  p(pt: Point): [number, number] {
    return [pt[0], 0 - pt[1]];
  }

  /** closed path through flat [x, y, …] track coordinates */
  ring(xy: Float64Array): string {
    return this.line(xy) + ' Z';
  }

  /** open path through flat [x, y, …] track coordinates */
  line(xy: Float64Array): string {
    const parts: string[] = [];
    for (let i = 0; i < xy.length; i += 2) parts.push(`${this.n(xy[i])},${this.n(0 - xy[i + 1])}`);
    return `M${parts[0]} L${parts.slice(1).join(' ')}`;
  }
}

/** x rounded to `decimals`, trailing zeros dropped, never "-0". */
function fixed(x: number, decimals: number): string {
  const f = 10 ** decimals;
  const r = Math.round(x * f) / f;
  return String(r === 0 ? 0 : r);
}

function flat(points: readonly Point[]): Float64Array {
  const out = new Float64Array(2 * points.length);
  for (let i = 0; i < points.length; i++) {
    out[2 * i] = points[i][0];
    out[2 * i + 1] = points[i][1];
  }
  return out;
}

function boundsOf(sets: readonly Float64Array[]): Bounds {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const xy of sets) {
    for (let i = 0; i < xy.length; i += 2) {
      minX = Math.min(minX, xy[i]);
      maxX = Math.max(maxX, xy[i]);
      minY = Math.min(minY, xy[i + 1]);
      maxY = Math.max(maxY, xy[i + 1]);
    }
  }
  return { minX, minY, maxX, maxY };
}
