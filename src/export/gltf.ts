/**
 * A track as a binary glTF 2.0 file (.glb, one buffer): the road surface, both wall solids, a
 * thin trigger box per progress gate and an empty node per spawn pose, ready for a game engine
 * or a simulator.
 *
 * Axes: glTF is metres, +Y up, right-handed. The track's plane (x right, y up) lies on the
 * ground as glTF (x, 0, -y), so looking down from +Y the track reads as it does on paper, and
 * counter-clockwise stays counter-clockwise. A heading θ (degrees counter-clockwise from +x) is
 * a rotation about +Y by θ: a node's local +X is the direction of travel, local +Y is up and
 * local +Z is the driver's right.
 *
 *   scene "lapwright-<id>"
 *   └─ track                         extras: id, seed, generatorVersion, format
 *      ├─ road                       mesh between the wall faces, normals +Y
 *      ├─ wall-left, wall-right      closed solids: face, outer side, top, bottom
 *      ├─ gates                      gate-0000 … in order; each a box 0.1 m deep, extras {index, s}
 *      └─ spawns                     spawn-00 … empty nodes: translation + rotation
 */
import { Document, WebIO } from '@gltf-transform/core';
import type { Buffer as GltfBuffer, Material, Node } from '@gltf-transform/core';
import type { Gate, Point, Spawn, Track } from '../core/index.js';
import { PALETTE, srgbHexToLinear } from './palette.js';
import { type WallSide, wallOutline } from './wall-outline.js';

/** Options of the glb export. */
export interface GlbOptions {
  /** Depth of each gate's trigger box along the direction of travel, metres. Default 0.1. */
  readonly gateDepthM?: number;
}

/** Default depth of a gate's trigger box along the direction of travel, metres. */
export const GATE_DEPTH_M = 0.1;

/** Largest vertex count a 16-bit index buffer can address. */
const MAX_U16_VERTICES = 65_536;

/**
 * Builds the glb of a track. Pure: reads only the track, writes nothing.
 * @param track a generated or validated track (format lapwright.track/1)
 * @returns the .glb bytes (media type model/gltf-binary)
 * @throws RangeError when the walls have fewer than 3 vertices or gateDepthM is not positive
 * @example await writeFile('track.glb', await trackToGlb(generateTrack({ seed: 1 })))
 */
export async function trackToGlb(track: Track, options: GlbOptions = {}): Promise<Uint8Array> {
  const gateDepthM = options.gateDepthM ?? GATE_DEPTH_M;
  if (!(gateDepthM > 0 && Number.isFinite(gateDepthM))) throw new RangeError(`gateDepthM must be a positive number of metres, got ${gateDepthM}`);

  const doc = new Document();
  const buffer = doc.createBuffer('lapwright');
  const materials = createMaterials(doc);
  const { heightM, thicknessM } = track.walls;

  const root = doc.createNode('track').setExtras({ id: track.id, seed: track.seed, generatorVersion: track.generatorVersion, format: track.format });
  root.addChild(meshNode(doc, buffer, 'road', roadGeometry(track.walls.left, track.walls.right), materials.road));
  root.addChild(meshNode(doc, buffer, 'wall-left', wallGeometry(track.walls.left, thicknessM, heightM, 'left'), materials.wallLeft));
  root.addChild(meshNode(doc, buffer, 'wall-right', wallGeometry(track.walls.right, thicknessM, heightM, 'right'), materials.wallRight));

  const gates = doc.createNode('gates');
  for (const gate of track.gates) gates.addChild(gateNode(doc, buffer, gate, gateDepthM, heightM, gate.index === 0 ? materials.startVolume : materials.gateVolume));
  root.addChild(gates);
  const spawns = doc.createNode('spawns');
  for (const spawn of track.spawns) spawns.addChild(spawnNode(doc, spawn));
  root.addChild(spawns);

  doc.getRoot().setDefaultScene(doc.createScene(`lapwright-${track.id.slice(0, 8)}`).addChild(root));
  const asset = doc.getRoot().getAsset();
  asset.generator = `lapwright (generatorVersion ${track.generatorVersion})`;
  asset.extras = {
    trackId: track.id,
    seed: track.seed,
    generatorVersion: track.generatorVersion,
    format: track.format,
    gateOrder: track.gates.map(gateNodeName),
    axes: 'metres; glTF (x, y, z) = track (x, 0, -y); node +X = direction of travel',
  };
  return new WebIO().writeBinary(doc);
}

/** Node name of a gate: `gate-0007`. */
export function gateNodeName(gate: Pick<Gate, 'index'>): string {
  return `gate-${String(gate.index).padStart(4, '0')}`;
}

/** Node name of a spawn pose: `spawn-03`. */
export function spawnNodeName(spawn: Pick<Spawn, 'index'>): string {
  return `spawn-${String(spawn.index).padStart(2, '0')}`;
}

/** A track plane point (x, y) as glTF (x, 0, -y). */
export function toGltfPosition(p: Point, heightM = 0): [number, number, number] {
  return [p[0], heightM, 0 - p[1]];
}

/**
 * Rotation about +Y by a heading (degrees counter-clockwise from +x in the track plane), as a
 * glTF quaternion [x, y, z, w]: it turns local +X into glTF (cos θ, 0, -sin θ).
 */
export function headingQuaternion(headingDeg: number): [number, number, number, number] {
  const half = (headingDeg * Math.PI) / 360;
  return [0, Math.sin(half), 0, Math.cos(half)];
}

/** Positions, normals and triangle indices of one mesh, glTF axes. */
interface Geometry {
  readonly positions: Float32Array;
  readonly normals: Float32Array;
  readonly indices: Uint16Array | Uint32Array;
}

// the ring between the two wall faces: vertex 2i on the left face, 2i + 1 on the right face
function roadGeometry(left: readonly Point[], right: readonly Point[]): Geometry {
  const n = left.length;
  if (right.length !== n) throw new RangeError(`wall faces need one vertex per centerline point, got ${n} left and ${right.length} right`);
  const b = new GeometryBuilder(2 * n, 6 * n);
  for (let i = 0; i < n; i++) {
    b.vertex(left[i][0], 0, left[i][1], 0, 1, 0);
    b.vertex(right[i][0], 0, right[i][1], 0, 1, 0);
  }
  // counter-clockwise in the track plane is counter-clockwise seen from +Y: left, right, next right
  b.strip(0, n, 'b-a');
  return b.finish();
}

/**
 * A wall as a closed solid from the ground to heightM: four strips of 2n vertices (face side,
 * outer side, top, bottom), each with its own normals so the edges stay sharp. Vertices on a
 * shared edge have bit-identical positions, so welding by position gives a closed manifold.
 */
function wallGeometry(face: readonly Point[], thicknessM: number, heightM: number, side: WallSide): Geometry {
  const n = face.length;
  const { outer, normals } = wallOutline(face, thicknessM, side);
  const b = new GeometryBuilder(8 * n, 24 * n);
  const strips = { face: 0, outer: 2 * n, top: 4 * n, bottom: 6 * n };
  // face side (normal into the road), then outer side (normal away from it): bottom, top
  for (let i = 0; i < n; i++) {
    b.vertex(face[i][0], 0, face[i][1], -normals[2 * i], 0, -normals[2 * i + 1]);
    b.vertex(face[i][0], heightM, face[i][1], -normals[2 * i], 0, -normals[2 * i + 1]);
  }
  for (let i = 0; i < n; i++) {
    b.vertex(outer[2 * i], 0, outer[2 * i + 1], normals[2 * i], 0, normals[2 * i + 1]);
    b.vertex(outer[2 * i], heightM, outer[2 * i + 1], normals[2 * i], 0, normals[2 * i + 1]);
  }
  // top and bottom: face vertex, then outer vertex
  for (const [y, ny] of [[heightM, 1], [0, -1]] as const) {
    for (let i = 0; i < n; i++) {
      b.vertex(face[i][0], y, face[i][1], 0, ny, 0);
      b.vertex(outer[2 * i], y, outer[2 * i + 1], 0, ny, 0);
    }
  }
  // a vertical strip (a = bottom, b = top) faces right of travel with 'a-b' winding; the left
  // wall's face side and the right wall's outer side face right
  b.strip(strips.face, n, side === 'left' ? 'a-b' : 'b-a');
  b.strip(strips.outer, n, side === 'left' ? 'b-a' : 'a-b');
  // a flat strip faces +Y with 'b-a' winding when b lies right of a (as on the road), so the
  // left wall (outer vertex b on the left) takes 'a-b' on top
  b.strip(strips.top, n, side === 'left' ? 'a-b' : 'b-a');
  b.strip(strips.bottom, n, side === 'left' ? 'b-a' : 'a-b');
  return b.finish();
}

/**
 * A gate: a node at the middle of the gate line on the ground, turned to face the direction of
 * travel, carrying a box depthM deep (local X), as long as the gate (local Z) and heightM tall.
 */
function gateNode(doc: Document, buffer: GltfBuffer, gate: Gate, depthM: number, heightM: number, material: Material): Node {
  const [fx, fy] = unit(gate.forward);
  const mx = (gate.left[0] + gate.right[0]) / 2;
  const my = (gate.left[1] + gate.right[1]) / 2;
  // local Z runs to the driver's right: minus the left normal (-fy, fx)
  const across = (p: Point): number => -((p[0] - mx) * -fy + (p[1] - my) * fx);
  const z0 = Math.min(across(gate.left), across(gate.right));
  const z1 = Math.max(across(gate.left), across(gate.right));
  const name = gateNodeName(gate);
  return meshNode(doc, buffer, name, boxGeometry([-depthM / 2, 0, z0], [depthM / 2, heightM, z1]), material)
    .setTranslation(toGltfPosition([mx, my]))
    .setRotation(headingQuaternion((Math.atan2(fy, fx) * 180) / Math.PI))
    .setExtras({ index: gate.index, s: gate.s });
}

function spawnNode(doc: Document, spawn: Spawn): Node {
  return doc
    .createNode(spawnNodeName(spawn))
    .setTranslation(toGltfPosition(spawn.position))
    .setRotation(headingQuaternion(spawn.headingDeg))
    .setExtras({ index: spawn.index, s: spawn.s, headingDeg: spawn.headingDeg, lateralM: spawn.lateralM });
}

// an axis-aligned box in the node's frame: 6 faces of 4 vertices with the face's normal
function boxGeometry(min: readonly [number, number, number], max: readonly [number, number, number]): Geometry {
  const b = new GeometryBuilder(24, 36);
  // per face: the axis it faces along, the sign, and two in-plane axes (u × v = outward normal)
  const faces: [number, 1 | -1, number, number][] = [
    [0, 1, 1, 2],
    [0, -1, 2, 1],
    [1, 1, 2, 0],
    [1, -1, 0, 2],
    [2, 1, 0, 1],
    [2, -1, 1, 0],
  ];
  for (const [axis, sign, u, v] of faces) {
    const base = b.vertexCount;
    for (const [cu, cv] of [[0, 0], [1, 0], [1, 1], [0, 1]] as const) {
      const p = [0, 0, 0];
      p[axis] = sign > 0 ? max[axis] : min[axis];
      p[u] = cu ? max[u] : min[u];
      p[v] = cv ? max[v] : min[v];
      const nrm = [0, 0, 0];
      nrm[axis] = sign;
      b.vertex(p[0], p[1], p[2], nrm[0], nrm[1], nrm[2], true);
    }
    b.triangle(base, base + 1, base + 2);
    b.triangle(base, base + 2, base + 3);
  }
  return b.finish();
}

function meshNode(doc: Document, buffer: GltfBuffer, name: string, g: Geometry, material: Material): Node {
  const accessor = (suffix: string, type: 'VEC3' | 'SCALAR', array: Float32Array | Uint16Array | Uint32Array) => doc.createAccessor(`${name}-${suffix}`).setType(type).setArray(array).setBuffer(buffer);
  const primitive = doc
    .createPrimitive()
    .setAttribute('POSITION', accessor('position', 'VEC3', g.positions))
    .setAttribute('NORMAL', accessor('normal', 'VEC3', g.normals))
    .setIndices(accessor('indices', 'SCALAR', g.indices))
    .setMaterial(material);
  return doc.createNode(name).setMesh(doc.createMesh(name).addPrimitive(primitive));
}

function createMaterials(doc: Document) {
  const opaque = (name: string, hex: string, roughness: number) =>
    doc
      .createMaterial(name)
      .setBaseColorFactor([...srgbHexToLinear(hex), 1])
      .setMetallicFactor(0)
      .setRoughnessFactor(roughness);
  // trigger volumes: see-through and visible from inside
  const volume = (name: string, hex: string) => opaque(name, hex, 1).setBaseColorFactor([...srgbHexToLinear(hex), 0.3]).setAlphaMode('BLEND').setDoubleSided(true);
  return {
    road: opaque('road', PALETTE.asphalt, 0.9),
    wallLeft: opaque('wall-left', PALETTE.wallLeft, 0.6),
    wallRight: opaque('wall-right', PALETTE.wallRight, 0.6),
    gateVolume: volume('gate-volume', PALETTE.gateVolume),
    startVolume: volume('start-volume', PALETTE.startVolume),
  };
}

function unit(v: Point): [number, number] {
  const len = Math.hypot(v[0], v[1]);
  if (!(len > 0)) throw new RangeError(`a gate's forward vector must not be zero, got [${v[0]}, ${v[1]}]`);
  return [v[0] / len, v[1] / len];
}

/**
 * Collects vertices (glTF axes) and triangles. `vertex` takes track-plane x, y as (x, height, y)
 * and stores glTF (x, height, -y), unless `gltfAxes` says the numbers already are glTF.
 */
class GeometryBuilder {
  private readonly positions: Float32Array;
  private readonly normals: Float32Array;
  private readonly indices: Uint16Array | Uint32Array;
  vertexCount = 0;
  private indexCount = 0;

  constructor(vertices: number, indices: number) {
    this.positions = new Float32Array(3 * vertices);
    this.normals = new Float32Array(3 * vertices);
    this.indices = vertices <= MAX_U16_VERTICES ? new Uint16Array(indices) : new Uint32Array(indices);
  }

  vertex(x: number, height: number, y: number, nx: number, nHeight: number, ny: number, gltfAxes = false): void {
    const k = 3 * this.vertexCount++;
    this.positions[k] = x;
    this.positions[k + 1] = height;
    // 0 - y, not -y: no negative zeros in the file
    this.positions[k + 2] = gltfAxes ? y : 0 - y;
    this.normals[k] = nx;
    this.normals[k + 1] = nHeight;
    this.normals[k + 2] = gltfAxes ? ny : 0 - ny;
  }

  triangle(a: number, b: number, c: number): void {
    this.indices[this.indexCount++] = a;
    this.indices[this.indexCount++] = b;
    this.indices[this.indexCount++] = c;
  }

  /**
   * Closes a strip of n vertex pairs (a_i = base + 2i, b_i = base + 2i + 1) into quads i → i+1.
   * 'a-b' winds (a_i, a_j, b_j), (a_i, b_j, b_i); 'b-a' the opposite way round.
   */
  strip(base: number, n: number, winding: 'a-b' | 'b-a'): void {
    for (let i = 0; i < n; i++) {
      const j = (i + 1) % n;
      const ai = base + 2 * i;
      const bi = ai + 1;
      const aj = base + 2 * j;
      const bj = aj + 1;
      if (winding === 'a-b') {
        this.triangle(ai, aj, bj);
        this.triangle(ai, bj, bi);
      } else {
        this.triangle(ai, bj, aj);
        this.triangle(ai, bi, bj);
      }
    }
  }

  finish(): Geometry {
    if (this.vertexCount * 3 !== this.positions.length || this.indexCount !== this.indices.length) throw new RangeError(`geometry filled ${this.vertexCount} vertices and ${this.indexCount} indices of ${this.positions.length / 3} and ${this.indices.length}`);
    return { positions: this.positions, normals: this.normals, indices: this.indices };
  }
}
