import type { IssueSink } from './issue-sink.js';

/** Fewest centerline points a track may have. */
export const MIN_POINTS = 8;

/**
 * Largest coordinate magnitude accepted, metres: far beyond any track (20 km laps), and small
 * enough that spans, squared distances and exact orientation predicates stay finite and exact.
 */
export const MAX_COORD_M = 1e9;

type Loose = Record<string, unknown> | undefined;

/**
 * Rule 'structure': the track has the shape every other rule relies on. Point and per-point
 * arrays have one entry per centerline point (at least {@link MIN_POINTS}); every number is
 * finite; consecutive centerline points differ; `s` increases strictly from 0 and stays below
 * `centerline.lengthM`; there is at least one gate; there are `params.spawnSlots` spawns;
 * `centerline.spacingM` > 0; params and metrics the rules read are finite and in range.
 *
 * Never throws, whatever it is given: anything that is not shaped like a track is an issue.
 * @returns true when the structure is sound (the other rules may run).
 */
export function checkStructure(track: unknown, sink: IssueSink): boolean {
  const before = sink.issues.length;
  const fail = (message: string, index?: number): boolean =>
    sink.add({ code: 'structure', message, ...(index === undefined ? {} : { at: { index } }) });
  const t = asObject(track);
  if (!t) {
    fail('track is not an object');
    return false;
  }
  const cl = asObject(t.centerline);
  const walls = asObject(t.walls);
  const params = asObject(t.params);
  if (!cl) fail('centerline is missing');
  if (!walls) fail('walls are missing');
  if (!params) fail('params are missing');
  if (!cl || !walls || !params) return false;

  const points = cl.points;
  if (!isList(points) || points.length < MIN_POINTS) {
    fail(`centerline.points needs at least ${MIN_POINTS} points, got ${isList(points) ? points.length : 'none'}`);
    return false;
  }
  const n = points.length;
  pointList('centerline.points', points, n, fail);
  pointList('walls.left', walls.left, n, fail);
  pointList('walls.right', walls.right, n, fail);
  for (const name of ['s', 'headingDeg', 'curvature', 'halfWidthLeftM', 'halfWidthRightM'] as const) {
    numberList(`centerline.${name}`, cl[name], n, fail);
  }
  positive('centerline.spacingM', cl.spacingM, fail);
  positive('centerline.lengthM', cl.lengthM, fail);
  if (sink.issues.length > before) return false;

  // lap positions and distinct consecutive points: headings and lookups by s rely on them
  const s = cl.s as ArrayLike<number>;
  const lap = cl.lengthM as number;
  if (Math.abs(s[0]) > S_ORIGIN_TOL_M) fail(`centerline.s[0] is ${s[0]} m, must be 0 (the start line)`, 0);
  for (let i = 1; i < n; i++) {
    if (!(s[i] > s[i - 1]) && !fail(`centerline.s must increase: s[${i}] = ${s[i]} m after ${s[i - 1]} m`, i)) break;
  }
  if (!(s[n - 1] < lap)) fail(`centerline.s[${n - 1}] = ${s[n - 1]} m must stay below centerline.lengthM ${lap} m`, n - 1);
  const pts = points as ArrayLike<ArrayLike<number>>;
  for (let i = 0; i < n; i++) {
    const a = pts[i], b = pts[i + 1 === n ? 0 : i + 1];
    if (a[0] === b[0] && a[1] === b[1] && !fail(`centerline points ${i} and ${(i + 1) % n} coincide`, i)) break;
  }

  checkParams(params, fail);
  const metrics = asObject(t.metrics);
  if (!metrics || !Number.isFinite(metrics.minRadiusM)) fail('metrics.minRadiusM must be a finite number');
  checkGates(t.gates, fail);
  checkSpawns(t.spawns, params.spawnSlots, fail);
  checkCorners(t.corners, fail);
  return sink.issues.length === before;
}

/** s[0] may differ from 0 by this, metres: it ships rounded to 1 mm like every length. */
const S_ORIGIN_TOL_M = 0.0005;

// returns false once the structure quota is full, so loops over huge inputs can stop
type Fail = (message: string, index?: number) => boolean;

function checkParams(p: Record<string, unknown>, fail: Fail): void {
  for (const name of ['lengthM', 'curvatureBudgetDeg', 'minCornerRadiusM'] as const) positive(`params.${name}`, p[name], fail);
  for (const name of ['turnBalance', 'cornerCount', 'clearanceM'] as const) finite(`params.${name}`, p[name], fail);
  for (const name of ['widthM', 'gateSpacingM'] as const) {
    const r = asObject(p[name]);
    finite(`params.${name}.min`, r?.min, fail);
    finite(`params.${name}.max`, r?.max, fail);
  }
  positive('params.gateSpacingM.min', asObject(p.gateSpacingM)?.min, fail);
  const wall = asObject(p.wall);
  finite('params.wall.thicknessM', wall?.thicknessM, fail);
  const car = asObject(p.car);
  positive('params.car.lengthM', car?.lengthM, fail);
  positive('params.car.widthM', car?.widthM, fail);
  if (!Number.isInteger(p.spawnSlots)) fail(`params.spawnSlots must be an integer, got ${show(p.spawnSlots)}`);
}

function checkGates(gates: unknown, fail: Fail): void {
  if (!isList(gates) || gates.length < 1) {
    fail('gates: need at least one gate (gate 0 is the start line)');
    return;
  }
  for (let i = 0; i < gates.length; i++) {
    const g = asObject(gates[i]);
    if (!g || !Number.isFinite(g.index) || !Number.isFinite(g.s) || !isPoint(g.left) || !isPoint(g.right) || !isPoint(g.forward)) {
      if (!fail(`gates[${i}] needs finite index, s, left, right and forward`, i)) return;
    }
  }
}

function checkSpawns(spawns: unknown, slots: unknown, fail: Fail): void {
  if (!isList(spawns)) {
    fail('spawns must be a list');
    return;
  }
  if (spawns.length !== slots) fail(`spawns: ${spawns.length} given, params.spawnSlots is ${show(slots)}`);
  for (let i = 0; i < spawns.length; i++) {
    const p = asObject(spawns[i]);
    if (!p || !isPoint(p.position) || !Number.isFinite(p.headingDeg) || !Number.isFinite(p.s)) {
      if (!fail(`spawns[${i}] needs a finite position, headingDeg and s`, i)) return;
    }
  }
}

function checkCorners(corners: unknown, fail: Fail): void {
  if (!isList(corners)) {
    fail('corners must be a list');
    return;
  }
  for (let i = 0; i < corners.length; i++) {
    const c = asObject(corners[i]);
    const ok = c && (c.direction === 'left' || c.direction === 'right') &&
      Number.isFinite(c.angleDeg) && Number.isFinite(c.minRadiusM) && Number.isFinite(c.sStart) && Number.isFinite(c.sEnd);
    if (!ok && !fail(`corners[${i}] needs direction 'left' or 'right' and finite angleDeg, minRadiusM, sStart and sEnd`, i)) return;
  }
}

function pointList(name: string, list: unknown, n: number, fail: Fail): void {
  if (!isList(list) || list.length !== n) {
    fail(`${name} has ${isList(list) ? list.length : 'no'} points, centerline.points has ${n}`);
    return;
  }
  for (let i = 0; i < n; i++) {
    if (!isPoint(list[i]) && !fail(`${name}[${i}] is not a finite [x, y] pair within ±${MAX_COORD_M} m`, i)) return;
  }
}

function numberList(name: string, list: unknown, n: number, fail: Fail): void {
  if (!isList(list) || list.length !== n) {
    fail(`${name} has ${isList(list) ? list.length : 'no'} entries, centerline.points has ${n}`);
    return;
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(list[i]) && !fail(`${name}[${i}] is not a finite number: ${show(list[i])}`, i)) return;
  }
}

function positive(name: string, v: unknown, fail: Fail): void {
  if (!(typeof v === 'number' && Number.isFinite(v) && v > 0)) fail(`${name} must be a finite number > 0, got ${show(v)}`);
}

function finite(name: string, v: unknown, fail: Fail): void {
  if (!Number.isFinite(v)) fail(`${name} must be a finite number, got ${show(v)}`);
}

function asObject(v: unknown): Loose {
  return v !== null && typeof v === 'object' ? (v as Record<string, unknown>) : undefined;
}

function isList(v: unknown): v is ArrayLike<unknown> {
  // arrays and typed arrays only: both index and iterate the way the rules do
  return Array.isArray(v) || (ArrayBuffer.isView(v) && !(v instanceof DataView));
}

function isPoint(p: unknown): boolean {
  if (p === null || typeof p !== 'object') return false;
  const x = (p as ArrayLike<unknown>)[0], y = (p as ArrayLike<unknown>)[1];
  return typeof x === 'number' && typeof y === 'number' && Math.abs(x) <= MAX_COORD_M && Math.abs(y) <= MAX_COORD_M;
}

// never call toString on foreign values: it may throw or run arbitrary code
function show(v: unknown): string {
  return typeof v === 'number' ? String(v) : typeof v === 'string' ? JSON.stringify(v.slice(0, 40)) : typeof v;
}
