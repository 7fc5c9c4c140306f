/** A polyline as flat coordinates `[x0, y0, x1, y1, …]` in metres; `closed` adds the segment from last to first. */
export interface PolylineInput {
  readonly coords: Float64Array;
  readonly closed: boolean;
}

/** Called for each candidate segment id; return `true` to stop the search early. */
export type SegmentVisitor = (id: number) => boolean | void;

/** Called for each candidate pair of segment ids, i < j. */
export type PairVisitor = (i: number, j: number) => void;

// flags of a cell entry: the cell is in the first column / first row of its segment's cell range
const FIRST_COLUMN = 1;
const FIRST_ROW = 2;
const FIRST_CELL = FIRST_COLUMN | FIRST_ROW;

/**
 * Static spatial index over line segments for broad-phase queries by axis-aligned box: a uniform grid whose
 * cell lists are packed into one Int32Array by counting sort. Boxes are kept as exact Float64 values and the
 * point-to-cell map is monotone, so a query never misses a segment whose box meets the query box.
 *
 * Lifecycle: construct with the total count, {@link SegmentIndex.add} every segment, {@link SegmentIndex.finish},
 * then query with {@link SegmentIndex.search} or {@link SegmentIndex.searchInto}, or list every pair of
 * segments whose boxes meet with {@link SegmentIndex.forEachCandidatePair}. Ids are 0, 1, 2, … in the order
 * added; each id remembers the polyline and segment it came from. Axes x right, y up, metres.
 *
 * Each segment occupies the rectangle of cells its box touches (its cell range); every cell entry also
 * records whether its cell is in the first column and in the first row of that range, which is all the
 * pair listing needs to report a pair in one cell only.
 *
 * Cost: build O(n + cells touched), query O(cells in the box + candidates), pair listing O(cells +
 * {@link SegmentIndex.candidatePairCount}). The cell side is at least the mean segment extent and at least
 * √(area / n), so there are at most about 3n cells; a few segments spanning the whole extent can raise the
 * stored entries towards n√n.
 *
 * @example
 * const index = SegmentIndex.fromPolylines([{ coords: new Float64Array([0, 0, 1, 0, 1, 1]), closed: true }]);
 * const out = new Int32Array(index.numItems);
 * const n = index.searchInto(0.5, -0.1, 0.6, 0.1, out); // 1 candidate: id 0, the segment (0,0)-(1,0)
 */
export class SegmentIndex {
  /** Number of segments the index holds once finished. */
  readonly numItems: number;
  // [minX, minY, maxX, maxY] per segment
  private readonly boxes: Float64Array;
  private readonly polylineOf: Int32Array;
  private readonly segmentOf: Int32Array;
  // last query that met each segment, to report a segment once though it sits in several cells;
  // allocated by the first query
  private stamp = new Int32Array(0);
  private query = 0;
  private added = 0;
  private finished = false;
  private minX = Infinity;
  private minY = Infinity;
  private maxX = -Infinity;
  private maxY = -Infinity;
  private inv = 1;
  private cols = 0;
  private rows = 0;
  private cellStart = new Int32Array(1);
  private cellItems = new Int32Array(0);
  // FIRST_COLUMN | FIRST_ROW flags of each entry of cellItems
  private cellFlags = new Uint8Array(0);
  private pairSlots = 0;
  private crowd = 0;

  /**
   * @param numItems total number of segments that will be added (≥ 0).
   * @throws {RangeError} when numItems is not a non-negative integer.
   */
  constructor(numItems: number) {
    if (!Number.isInteger(numItems) || numItems < 0) {
      throw new RangeError(`numItems must be a non-negative integer, got ${numItems}.`);
    }
    this.numItems = numItems;
    this.boxes = new Float64Array(4 * numItems);
    this.polylineOf = new Int32Array(numItems);
    this.segmentOf = new Int32Array(numItems);
  }

  /**
   * Build and finish an index over every segment of the given polylines, in order: polyline 0's segments
   * first. An open polyline of n vertices has n − 1 segments, a closed one n (the last joins back to vertex 0).
   * @throws {RangeError} on a non-finite coordinate.
   * @example
   * const index = SegmentIndex.fromPolylines([{ coords: new Float64Array([0, 0, 1, 0, 1, 1]), closed: false }]);
   * index.numItems; // 2
   */
  static fromPolylines(polylines: readonly PolylineInput[]): SegmentIndex {
    let total = 0;
    for (const p of polylines) total += segmentCount(p);
    const index = new SegmentIndex(total);
    for (let k = 0; k < polylines.length; k++) {
      const { coords } = polylines[k];
      const n = segmentCount(polylines[k]);
      const vertices = coords.length >> 1;
      for (let i = 0; i < n; i++) {
        const j = i + 1 === vertices ? 0 : i + 1;
        index.add(coords[2 * i], coords[2 * i + 1], coords[2 * j], coords[2 * j + 1], k, i);
      }
    }
    index.finish();
    return index;
  }

  /**
   * Add the segment [a, b] (metres) and return its id (0, 1, 2, … in order).
   * @param polyline index of the polyline it belongs to, kept for {@link SegmentIndex.polyline} (default 0).
   * @param segment index of the segment within that polyline (default: the id).
   * @throws {RangeError} on a non-finite coordinate.
   * @throws {Error} when more than `numItems` segments are added or the index is already finished.
   */
  add(ax: number, ay: number, bx: number, by: number, polyline = 0, segment = this.added): number {
    if (this.finished) throw new Error('Index already finished - create a new index to add segments.');
    if (this.added >= this.numItems) throw new Error(`Added more than the expected ${this.numItems} segments.`);
    if (!Number.isFinite(ax + ay + bx + by)) {
      throw new RangeError(`Segment ${this.added} has a non-finite coordinate: (${ax}, ${ay})-(${bx}, ${by}).`);
    }
    const id = this.added++;
    const b = this.boxes;
    const x0 = Math.min(ax, bx);
    const y0 = Math.min(ay, by);
    const x1 = Math.max(ax, bx);
    const y1 = Math.max(ay, by);
    b[4 * id] = x0;
    b[4 * id + 1] = y0;
    b[4 * id + 2] = x1;
    b[4 * id + 3] = y1;
    if (x0 < this.minX) this.minX = x0;
    if (y0 < this.minY) this.minY = y0;
    if (x1 > this.maxX) this.maxX = x1;
    if (y1 > this.maxY) this.maxY = y1;
    this.polylineOf[id] = polyline;
    this.segmentOf[id] = segment;
    return id;
  }

  /**
   * Sort the segments into grid cells; call once after adding all segments.
   * @throws {Error} when the number added differs from `numItems`.
   * @throws {RangeError} when the coordinate span overflows a double.
   */
  finish(): void {
    if (this.added !== this.numItems) {
      throw new Error(`Added ${this.added} segments when expected ${this.numItems}.`);
    }
    if (this.finished) return;
    this.finished = true;
    const n = this.numItems;
    if (n === 0) return;
    const b = this.boxes;
    const w = this.maxX - this.minX;
    const h = this.maxY - this.minY;
    if (!Number.isFinite(w) || !Number.isFinite(h)) {
      throw new RangeError(`Coordinate span ${w} x ${h} overflows - translate or scale the input.`);
    }
    let extent = 0;
    for (let i = 0; i < n; i++) extent += Math.max(b[4 * i + 2] - b[4 * i], b[4 * i + 3] - b[4 * i + 1]);
    // cells about two typical segments wide, and at most ~4n of them: a track fills a thin band
    // of its bounding box, so cells sized to the box (w·h/n each) would hold dozens of segments
    const cell = Math.max((2 * extent) / n, Math.sqrt((w / n) * h / 4), Math.max(w, h) / n);
    // all segments at one point: any positive cell side gives a single cell
    const inv = cell > 0 ? 1 / cell : 1;
    // spans of subnormal size: 1 / cell overflows, or rounding breaks the bound of about 6n
    // cells; one cell then (every pair a candidate, still exact)
    const sane = Number.isFinite(inv) && (Math.floor(w * inv) + 1) * (Math.floor(h * inv) + 1) <= 8 * n + 16;
    this.inv = sane ? inv : 0;
    this.cols = Math.floor(w * this.inv) + 1;
    this.rows = Math.floor(h * this.inv) + 1;
    const cells = this.cols * this.rows;

    // counting sort: count entries per cell, sum into cell ends, then place the ids from the last down, each
    // at the end of its cell's free part, which leaves each cell's start and its ids in ascending order.
    // Each segment's cell range [cx0, cx1] x [cy0, cy1] is computed once and kept for the second pass.
    // An entry joining a cell that already holds k entries adds k to the pairs within cells.
    const cols = this.cols;
    const range = new Int32Array(4 * n);
    const start = new Int32Array(cells + 1);
    let pairSlots = 0;
    let crowd = 0;
    for (let i = 0; i < n; i++) {
      const cx0 = this.cellX(b[4 * i]);
      const cy0 = this.cellY(b[4 * i + 1]);
      const cx1 = this.cellX(b[4 * i + 2]);
      const cy1 = this.cellY(b[4 * i + 3]);
      range[4 * i] = cx0;
      range[4 * i + 1] = cy0;
      range[4 * i + 2] = cx1;
      range[4 * i + 3] = cy1;
      for (let cy = cy0; cy <= cy1; cy++) {
        for (let cx = cx0; cx <= cx1; cx++) {
          const before = start[cy * cols + cx]++;
          pairSlots += before;
          if (before >= crowd) crowd = before + 1;
        }
      }
    }
    for (let c = 1; c < cells; c++) start[c] += start[c - 1];
    const entries = start[cells - 1];
    start[cells] = entries;
    const items = new Int32Array(entries);
    const flags = new Uint8Array(entries);
    for (let i = n - 1; i >= 0; i--) {
      const cx0 = range[4 * i], cy0 = range[4 * i + 1], cx1 = range[4 * i + 2], cy1 = range[4 * i + 3];
      for (let cy = cy0; cy <= cy1; cy++) {
        const row = cy === cy0 ? FIRST_ROW : 0;
        for (let cx = cx0; cx <= cx1; cx++) {
          const k = --start[cy * cols + cx];
          items[k] = i;
          flags[k] = cx === cx0 ? row | FIRST_COLUMN : row;
        }
      }
    }
    this.cellStart = start;
    this.cellItems = items;
    this.cellFlags = flags;
    this.pairSlots = pairSlots;
    this.crowd = crowd;
  }

  /**
   * Σ k(k − 1)/2 over the cells, for k entries in a cell: the pairs {@link SegmentIndex.forEachCandidatePair}
   * examines, and an upper bound on the pairs it reports. Known once finished (0 before).
   */
  get candidatePairCount(): number {
    return this.pairSlots;
  }

  /** The most entries in one cell. Known once finished (0 before). */
  get maxCellItems(): number {
    return this.crowd;
  }

  /**
   * Visit every pair of segments whose bounding boxes intersect or touch (exact Float64 comparison) as
   * `visit(i, j)` with i < j, each pair once: in the lowest cell both occupy, the cell (max of the first
   * columns, max of the first rows) of their two cell ranges, which is the cell where one of the two entries
   * is in the first column of its range and one is in the first row. Boxes that meet share a cell because the
   * point-to-cell map is monotone, so no pair is missed. Order: by cell, then by position in the cell
   * (deterministic, not by id). Cost O(cells + candidatePairCount): quadratic in crowded cells.
   * @throws {Error} when the index is not finished.
   * @example
   * const index = SegmentIndex.fromPolylines([{ coords: new Float64Array([0, 0, 1, 0, 1, 1]), closed: true }]);
   * index.forEachCandidatePair((i, j) => console.log(i, j)); // 0 1, 0 2, 1 2: the sides share vertices
   */
  forEachCandidatePair(visit: PairVisitor): void {
    this.assertFinished();
    const { boxes: b, cellStart: start, cellItems: items, cellFlags: flags } = this;
    const cells = start.length - 1;
    for (let c = 0; c < cells; c++) {
      const end = start[c + 1];
      for (let u = start[c]; u < end - 1; u++) {
        const i = items[u];
        const f = flags[u];
        const x0 = b[4 * i], y0 = b[4 * i + 1], x1 = b[4 * i + 2], y1 = b[4 * i + 3];
        for (let v = u + 1; v < end; v++) {
          if ((f | flags[v]) !== FIRST_CELL) continue;
          const j = items[v];
          if (b[4 * j] > x1 || b[4 * j + 1] > y1 || b[4 * j + 2] < x0 || b[4 * j + 3] < y0) continue;
          visit(i, j);
        }
      }
    }
  }

  /**
   * Visit the id of every segment whose bounding box intersects or touches the query box (metres), each once.
   * Candidates are a superset of the segments that meet the box; the order is deterministic (by cell, then id).
   * @throws {Error} when the index is not finished.
   */
  search(minX: number, minY: number, maxX: number, maxY: number, visit: SegmentVisitor): void {
    this.assertFinished();
    if (this.numItems === 0) return;
    const q = this.nextQuery();
    const { boxes: b, stamp, cellStart: start, cellItems: items, cols } = this;
    const cx0 = Math.max(0, this.cellX(minX));
    const cx1 = Math.min(cols - 1, this.cellX(maxX));
    const cy1 = Math.min(this.rows - 1, this.cellY(maxY));
    for (let cy = Math.max(0, this.cellY(minY)); cy <= cy1; cy++) {
      for (let cx = cx0; cx <= cx1; cx++) {
        const c = cy * cols + cx;
        for (let k = start[c], end = start[c + 1]; k < end; k++) {
          const i = items[k];
          if (stamp[i] === q) continue;
          stamp[i] = q;
          if (b[4 * i] > maxX || b[4 * i + 1] > maxY || b[4 * i + 2] < minX || b[4 * i + 3] < minY) continue;
          if (visit(i) === true) return;
        }
      }
    }
  }

  /**
   * Write candidate ids for the query box into `out` and return how many there are. When the return value
   * exceeds `out.length` only the first `out.length` were written: grow the buffer and search again
   * (a buffer of `numItems` always suffices).
   * @throws {Error} when the index is not finished.
   */
  searchInto(minX: number, minY: number, maxX: number, maxY: number, out: Int32Array): number {
    this.assertFinished();
    if (this.numItems === 0) return 0;
    // the loop of search() without a visitor call per candidate: this is the hot query of the checkers
    const q = this.nextQuery();
    const { boxes: b, stamp, cellStart: start, cellItems: items, cols } = this;
    const cx0 = Math.max(0, this.cellX(minX));
    const cx1 = Math.min(cols - 1, this.cellX(maxX));
    const cy1 = Math.min(this.rows - 1, this.cellY(maxY));
    let count = 0;
    for (let cy = Math.max(0, this.cellY(minY)); cy <= cy1; cy++) {
      for (let cx = cx0; cx <= cx1; cx++) {
        const c = cy * cols + cx;
        for (let k = start[c], end = start[c + 1]; k < end; k++) {
          const i = items[k];
          if (stamp[i] === q) continue;
          stamp[i] = q;
          if (b[4 * i] > maxX || b[4 * i + 1] > maxY || b[4 * i + 2] < minX || b[4 * i + 3] < minY) continue;
          if (count < out.length) out[count] = i;
          count++;
        }
      }
    }
    return count;
  }

  /** Index of the polyline (or the value passed to `add`) that segment `id` belongs to. */
  polyline(id: number): number {
    return this.polylineOf[id];
  }

  /** Index of segment `id` within its polyline (or the value passed to `add`). */
  segment(id: number): number {
    return this.segmentOf[id];
  }

  // floor is monotone, so overlapping boxes always share a cell; callers clamp query ranges
  private cellX(x: number): number {
    return Math.floor((x - this.minX) * this.inv);
  }

  private cellY(y: number): number {
    return Math.floor((y - this.minY) * this.inv);
  }

  private nextQuery(): number {
    if (this.stamp.length !== this.numItems) this.stamp = new Int32Array(this.numItems);
    if (this.query === 0x7fffffff) {
      this.stamp.fill(0);
      this.query = 0;
    }
    return ++this.query;
  }

  private assertFinished(): void {
    if (!this.finished) throw new Error('Index not finished - call finish().');
  }
}

/**
 * Number of segments of a polyline: n − 1 for an open one of n vertices, n for a closed one (0 if empty).
 * @example
 * segmentCount({ coords: new Float64Array([0, 0, 1, 0, 1, 1]), closed: true }); // 3
 */
export function segmentCount(p: PolylineInput): number {
  const n = p.coords.length >> 1;
  return p.closed ? n : Math.max(n - 1, 0);
}
