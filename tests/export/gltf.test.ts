// Tests for src/export/gltf.ts: every glb passes the reference glTF validator (gltf-validator)
// with no errors and no warnings, and read back with @gltf-transform/core it holds the track:
// road and wall vertices on the track's points, closed and outward-facing wall solids, one
// trigger box per gate in order, one posed node per spawn.

import { test as propTest, fc } from '@fast-check/vitest';
import { WebIO } from '@gltf-transform/core';
import type { Document, Node } from '@gltf-transform/core';
import { validateBytes } from 'gltf-validator';
import type { ValidationReport } from 'gltf-validator';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Point, Track } from '../../src/core/index.js';
import { GATE_DEPTH_M, gateNodeName, headingQuaternion, spawnNodeName, trackToGlb } from '../../src/export/gltf.js';
import { exportTracks } from '../helpers/export-tracks.js';
import { stadiumTrack } from '../helpers/synthetic-track.js';

type Vec3 = [number, number, number];

/**
 * Float32 holds a coordinate to half an ulp: |x| · 2^-24 (IEEE 754 binary32, 24-bit
 * significand). The tolerance allows one ulp, and 1e-6 m near zero.
 */
function f32Tol(expected: number): number {
  return Math.max(1e-6, Math.abs(expected) * 2 ** -23);
}

function expectClose(actual: ArrayLike<number>, expected: ArrayLike<number>, what: string, tol = f32Tol): void {
  for (let k = 0; k < expected.length; k++) {
    if (!(Math.abs(actual[k] - expected[k]) <= tol(expected[k]))) throw new Error(`${what}[${k}]: ${actual[k]} differs from ${expected[k]}`);
  }
}

/**
 * The glTF writer leaves out a rotation within 1e-5 of the identity quaternion (per component,
 * @gltf-transform/core's MathUtils.eq default), so a heading within ~0.001° of 0 reads back as 0:
 * a direction then differs by up to 2e-5 (sin of twice the half angle).
 */
const ROTATION_TOL = (): number => 2e-5;

/** The track plane (x, y) on the glTF ground: (x, 0, -y), the mapping the exporter documents. */
const ground = (p: Point, heightM = 0): Vec3 => [p[0], heightM, 0 - p[1]];

/** Rotates v by the unit quaternion [x, y, z, w]: v + 2w(q×v) + 2q×(q×v). */
function rotate(q: readonly number[], v: Vec3): Vec3 {
  const [x, y, z, w] = q;
  const t = cross([x, y, z], v).map((c) => 2 * c) as Vec3;
  const u = cross([x, y, z], t);
  return [v[0] + w * t[0] + u[0], v[1] + w * t[1] + u[1], v[2] + w * t[2] + u[2]];
}

function cross(a: readonly number[], b: readonly number[]): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

const sub = (a: readonly number[], b: readonly number[]): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: readonly number[], b: readonly number[]): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];

interface MeshData {
  readonly positions: Float32Array;
  readonly normals: Float32Array;
  readonly indices: Uint16Array | Uint32Array;
}

function meshOf(node: Node): MeshData {
  const primitives = node.getMesh()?.listPrimitives() ?? [];
  expect(primitives).toHaveLength(1);
  const p = primitives[0];
  return {
    positions: p.getAttribute('POSITION')!.getArray() as Float32Array,
    normals: p.getAttribute('NORMAL')!.getArray() as Float32Array,
    indices: p.getIndices()!.getArray() as Uint16Array | Uint32Array,
  };
}

const vertex = (a: ArrayLike<number>, i: number): Vec3 => [a[3 * i], a[3 * i + 1], a[3 * i + 2]];

/**
 * Checks a closed, consistently wound solid: after welding vertices at bit-equal positions,
 * every directed edge occurs once and its reverse once (an oriented closed 2-manifold).
 * @returns the enclosed volume, signed by the divergence theorem (> 0: faces wind outward)
 */
function closedVolume(mesh: MeshData): number {
  const key = (i: number): string => vertex(mesh.positions, i).join(',');
  const weld = new Map<string, number>();
  const id = (i: number): number => {
    const k = key(i);
    if (!weld.has(k)) weld.set(k, weld.size);
    return weld.get(k)!;
  };
  const edges = new Map<string, number>();
  const origin = vertex(mesh.positions, 0);
  let volume6 = 0;
  for (let t = 0; t < mesh.indices.length; t += 3) {
    const [a, b, c] = [mesh.indices[t], mesh.indices[t + 1], mesh.indices[t + 2]];
    const [wa, wb, wc] = [id(a), id(b), id(c)];
    for (const [u, v] of [[wa, wb], [wb, wc], [wc, wa]]) edges.set(`${u}>${v}`, (edges.get(`${u}>${v}`) ?? 0) + 1);
    const pa = sub(vertex(mesh.positions, a), origin);
    volume6 += dot(pa, cross(sub(vertex(mesh.positions, b), origin), sub(vertex(mesh.positions, c), origin)));
  }
  for (const [edge, count] of edges) {
    const [u, v] = edge.split('>');
    if (count !== 1 || edges.get(`${v}>${u}`) !== 1) throw new Error(`edge ${edge} used ${count} times, reverse ${edges.get(`${v}>${u}`) ?? 0} times`);
  }
  return volume6 / 6;
}

/** Smallest cosine between a triangle's geometric normal and the normals of its vertices. */
function worstNormalAgreement(mesh: MeshData): number {
  let worst = 1;
  for (let t = 0; t < mesh.indices.length; t += 3) {
    const [a, b, c] = [mesh.indices[t], mesh.indices[t + 1], mesh.indices[t + 2]];
    const pa = vertex(mesh.positions, a);
    const n = cross(sub(vertex(mesh.positions, b), pa), sub(vertex(mesh.positions, c), pa));
    const len = Math.hypot(...n);
    for (const v of [a, b, c]) worst = Math.min(worst, dot(n, vertex(mesh.normals, v)) / len);
  }
  return worst;
}

/** Closed polyline length. */
function perimeter(p: readonly Point[]): number {
  let sum = 0;
  for (let i = 0; i < p.length; i++) sum += Math.hypot(p[(i + 1) % p.length][0] - p[i][0], p[(i + 1) % p.length][1] - p[i][1]);
  return sum;
}

/** Signed turning of a closed polyline, radians: +2π counter-clockwise, -2π clockwise. */
function signedTurns(p: readonly Point[]): number[] {
  const n = p.length;
  return p.map((_, i) => {
    const a = p[(i + n - 1) % n], b = p[i], c = p[(i + 1) % n];
    return Math.atan2((b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0]), (b[0] - a[0]) * (c[0] - b[0]) + (b[1] - a[1]) * (c[1] - b[1]));
  });
}

/**
 * Volume of a wall solid from its face alone: a band of width t along a closed polygon with
 * mitred corners has area t·P + t²·Σ tan(αᵢ/2) on the side the polygon turns away from, and
 * t·P − t²·Σ tan(αᵢ/2) on the side it turns towards (αᵢ the signed turn at vertex i; elementary
 * geometry: each mitre adds a kite of area t² tan(α/2)). The wall solid stands heightM tall.
 */
function expectedWallVolume(face: readonly Point[], t: number, h: number, side: 'left' | 'right'): number {
  const kites = signedTurns(face).reduce((sum, a) => sum + Math.tan(a / 2), 0);
  // turning left (kites > 0) bends the face towards the left side
  return h * (t * perimeter(face) + (side === 'left' ? -1 : 1) * t * t * kites);
}

async function readGlb(bytes: Uint8Array): Promise<Document> {
  return new WebIO().readBinary(bytes);
}

function child(parent: Node, name: string): Node {
  const found = parent.listChildren().find((n) => n.getName() === name);
  if (!found) throw new Error(`no node ${name} under ${parent.getName()}`);
  return found;
}

const CASES: [string, () => Track][] = [...exportTracks().map(([name, track]) => [name, () => track] as [string, () => Track]), ['stadium', () => stadiumTrack({ spawnSlots: 3 })]];

describe.each(CASES)('glb of the %s track', (_name, make) => {
  let track: Track;
  let bytes: Uint8Array;
  let doc: Document;
  let root: Node;
  let report: ValidationReport;
  beforeAll(async () => {
    track = make();
    bytes = await trackToGlb(track);
    doc = await readGlb(bytes);
    root = doc.getRoot().getDefaultScene()!.listChildren()[0];
    report = await validateBytes(bytes, { maxIssues: 0, writeTimestamp: false });
  });

  it('passes the reference glTF validator with no errors and no warnings', () => {
    const problems = report.issues.messages.filter((m) => m.severity <= 1).map((m) => `${m.code} ${m.pointer ?? ''}: ${m.message}`);
    expect(problems).toEqual([]);
    expect(report.issues.numErrors).toBe(0);
    expect(report.issues.numWarnings).toBe(0);
  });

  it('is a glb with one buffer and the track in the asset extras', () => {
    // GLB header: magic "glTF", version 2, total length (glTF 2.0 binary container)
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    expect(new TextDecoder().decode(bytes.subarray(0, 4))).toBe('glTF');
    expect(view.getUint32(4, true)).toBe(2);
    expect(view.getUint32(8, true)).toBe(bytes.byteLength);
    expect(doc.getRoot().listBuffers()).toHaveLength(1);
    expect(doc.getRoot().getAsset().extras).toEqual({
      trackId: track.id,
      seed: track.seed,
      generatorVersion: track.generatorVersion,
      format: 'lapwright.track/1',
      gateOrder: track.gates.map((g) => `gate-${String(g.index).padStart(4, '0')}`),
      axes: 'metres; glTF (x, y, z) = track (x, 0, -y); node +X = direction of travel',
    });
    expect(root.getName()).toBe('track');
    expect(root.listChildren().map((n) => n.getName())).toEqual(['road', 'wall-left', 'wall-right', 'gates', 'spawns']);
  });

  it('road: vertex 2i on the left wall face, 2i + 1 on the right one, all normals +Y, triangles facing up', () => {
    const road = meshOf(child(root, 'road'));
    const n = track.walls.left.length;
    expect(road.positions.length).toBe(6 * n);
    expectClose(road.positions, track.walls.left.flatMap((p, i) => [...ground(p), ...ground(track.walls.right[i])]), 'road position');
    expect([...road.normals]).toEqual(Array.from({ length: 2 * n }, () => [0, 1, 0]).flat());
    expect(road.indices.length).toBe(6 * n);
    expect(worstNormalAgreement(road)).toBeGreaterThan(0.999);
  });

  it.each(['left', 'right'] as const)('wall-%s: a closed solid on the face polyline, heightM tall, thicknessM thick, facing outward', (side) => {
    const wall = meshOf(child(root, `wall-${side}`));
    const face = track.walls[side];
    const { heightM: h, thicknessM: t } = track.walls;
    const n = face.length;
    // face side first: bottom and top vertex per face point
    expectClose(wall.positions.subarray(0, 6 * n), face.flatMap((p) => [...ground(p), ...ground(p, h)]), `wall-${side} face position`);
    // outer side: thicknessM from the face on the wall's side of the road
    for (let i = 0; i < n; i++) {
      const [ox, , oz] = vertex(wall.positions, 2 * n + 2 * i);
      const [px, py] = face[i];
      const [qx, qy] = face[(i + 1) % n];
      const away = Math.hypot(ox - px, -oz - py);
      const leftOfTravel = (qx - px) * (-oz - py) - (qy - py) * (ox - px);
      if (!(away > t - 1e-4 && away < 2 * t && (side === 'left' ? leftOfTravel > 0 : leftOfTravel < 0))) throw new Error(`outer vertex ${i} at ${away} m on the wrong side`);
    }
    expect(Math.min(...wall.positions.filter((_, k) => k % 3 === 1))).toBe(0);
    expect(Math.max(...wall.positions.filter((_, k) => k % 3 === 1))).toBe(Math.fround(h));
    const volume = closedVolume(wall);
    expect(volume).toBeGreaterThan(0);
    expect(Math.abs(volume / expectedWallVolume(face, t, h, side) - 1)).toBeLessThan(1e-3);
    expect(worstNormalAgreement(wall)).toBeGreaterThan(0.9);
  });

  it('gates: one node per gate in order, each a box across the road from wall face to wall face', () => {
    const gates = child(root, 'gates').listChildren();
    expect(gates.map((n) => n.getName())).toEqual(track.gates.map(gateNodeName));
    for (const [k, node] of gates.entries()) {
      const gate = track.gates[k];
      expect(node.getExtras()).toEqual({ index: gate.index, s: gate.s });
      const box = meshOf(node);
      expect(closedVolume(box)).toBeGreaterThan(0);
      const q = node.getRotation();
      const origin = node.getTranslation();
      // the box's local +X turns into the gate's forward direction on the ground
      expectClose(rotate(q, [1, 0, 0]), ground(gate.forward), `${node.getName()} forward`, ROTATION_TOL);
      // in the node's frame the box is GATE_DEPTH_M deep, wall-tall, and its ends hold left and right
      const inverse = [-q[0], -q[1], -q[2], q[3]];
      const local = (p: Point): Vec3 => rotate(inverse, sub(ground(p), origin));
      const xs = box.positions.filter((_, i) => i % 3 === 0), ys = box.positions.filter((_, i) => i % 3 === 1), zs = box.positions.filter((_, i) => i % 3 === 2);
      expect(Math.max(...xs) - Math.min(...xs)).toBeCloseTo(GATE_DEPTH_M, 6);
      expect([Math.min(...ys), Math.max(...ys)]).toEqual([0, Math.fround(track.walls.heightM)]);
      const ends = [local(gate.left), local(gate.right)];
      for (const end of ends) {
        expect(Math.abs(end[0])).toBeLessThanOrEqual(GATE_DEPTH_M / 2);
        expect(Math.abs(end[1])).toBeLessThan(1e-9);
      }
      expectClose([Math.min(...zs), Math.max(...zs)], [ends[0][2], ends[1][2]], `${node.getName()} ends`);
    }
  });

  it('spawns: one empty node per pose, at the position, turned to the heading', () => {
    const spawns = child(root, 'spawns').listChildren();
    expect(spawns.map((n) => n.getName())).toEqual(track.spawns.map(spawnNodeName));
    for (const [k, node] of spawns.entries()) {
      const spawn = track.spawns[k];
      expect(node.getMesh()).toBeNull();
      expect(node.getTranslation()).toEqual(ground(spawn.position));
      const θ = (spawn.headingDeg * Math.PI) / 180;
      expectClose(rotate(node.getRotation(), [1, 0, 0]), [Math.cos(θ), 0, -Math.sin(θ)], `${node.getName()} forward`, ROTATION_TOL);
      expect(node.getExtras()).toEqual({ index: spawn.index, s: spawn.s, headingDeg: spawn.headingDeg, lateralM: spawn.lateralM });
    }
  });
});

describe('glb export', () => {
  it('the same track gives the same bytes', async () => {
    const track = stadiumTrack();
    expect(Buffer.from(await trackToGlb(track)).equals(Buffer.from(await trackToGlb(track)))).toBe(true);
  });

  it('gateDepthM sets the trigger boxes\' depth; a depth that is not positive is refused', async () => {
    const doc = await readGlb(await trackToGlb(stadiumTrack(), { gateDepthM: 0.5 }));
    const box = meshOf(doc.getRoot().listNodes().find((n) => n.getName() === 'gate-0003')!);
    const xs = box.positions.filter((_, i) => i % 3 === 0);
    expect(Math.max(...xs) - Math.min(...xs)).toBeCloseTo(0.5, 6);
    await expect(trackToGlb(stadiumTrack(), { gateDepthM: 0 })).rejects.toThrow(new RangeError('gateDepthM must be a positive number of metres, got 0'));
    await expect(trackToGlb(stadiumTrack(), { gateDepthM: Number.NaN })).rejects.toThrow(RangeError);
  });

  it('a lap of over 8192 points needs 32-bit indices and still validates', async () => {
    // wall solids hold 8 vertices per centerline point: 20 000 points pass the 16-bit limit
    const track = stadiumTrack({ straightM: 3200, radiusM: 300 });
    expect(track.centerline.points.length).toBeGreaterThan(65_536 / 8);
    const bytes = await trackToGlb(track);
    const report = await validateBytes(bytes, { maxIssues: 0, writeTimestamp: false });
    expect([report.issues.numErrors, report.issues.numWarnings]).toEqual([0, 0]);
    const wall = meshOf((await readGlb(bytes)).getRoot().listNodes().find((n) => n.getName() === 'wall-right')!);
    expect(wall.indices).toBeInstanceOf(Uint32Array);
    expect(closedVolume(wall)).toBeGreaterThan(0);
  });
});

describe('headingQuaternion', () => {
  // a heading θ points along (cos θ, sin θ) in the track plane, which lies on the glTF ground as
  // (cos θ, 0, -sin θ); local +X must turn into exactly that
  propTest.prop([fc.double({ min: -180, max: 180, noNaN: true })])('turns +X into the heading on the glTF ground', (headingDeg) => {
    const θ = (headingDeg * Math.PI) / 180;
    const q = headingQuaternion(headingDeg);
    expect(Math.hypot(...q)).toBeCloseTo(1, 12);
    const [x, y, z] = rotate(q, [1, 0, 0]);
    expect(x).toBeCloseTo(Math.cos(θ), 12);
    expect(y).toBeCloseTo(0, 12);
    expect(z).toBeCloseTo(-Math.sin(θ), 12);
  });

  it('quarter turns: 90° points along -Z (track +y), -90° along +Z', () => {
    expect(rotate(headingQuaternion(90), [1, 0, 0]).map((c) => Math.round(c * 1e12) / 1e12 + 0)).toEqual([0, 0, -1]);
    expect(rotate(headingQuaternion(-90), [1, 0, 0]).map((c) => Math.round(c * 1e12) / 1e12 + 0)).toEqual([0, 0, 1]);
  });
});
