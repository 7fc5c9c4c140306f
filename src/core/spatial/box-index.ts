import Flatbush from 'flatbush';

/**
 * A static index of axis-aligned boxes (a packed Hilbert R-tree: Agafonkin's flatbush), wrapped
 * here so the rest of the core does not depend on its API. Build once: add every box, finish,
 * then query.
 *
 * @example
 * const index = new BoxIndex(2);
 * index.add(0, 0, 1, 1); index.add(5, 5, 6, 6); index.finish();
 * index.search(0.5, 0.5, 2, 2); // [0]
 */
export class BoxIndex {
  private readonly tree: Flatbush;
  /** Nodes waiting to be opened by searchInto: (node | contained, level) pairs. */
  private stack: Int32Array = new Int32Array(0);

  /** @param count number of boxes that will be added (>= 1) */
  constructor(count: number) {
    this.tree = new Flatbush(Math.max(1, count));
  }

  /** Adds the next box (ids are 0, 1, 2, ... in the order added). */
  add(minX: number, minY: number, maxX: number, maxY: number): void {
    this.tree.add(minX, minY, maxX, maxY);
  }

  /** Builds the tree; call once after the last add. */
  finish(): void {
    this.tree.finish();
    // each opened node stacks at most nodeSize children, one level below it
    this.stack = new Int32Array(2 * this.tree.nodeSize * this.tree._levelBounds.length + 2);
  }

  /** Ids of the boxes that meet the query box (touching counts). */
  search(minX: number, minY: number, maxX: number, maxY: number): number[] {
    return this.tree.search(minX, minY, maxX, maxY);
  }

  /**
   * The ids `search` returns, in the same order, written to `out` (length >= the number of
   * boxes) without allocating: the same walk of the tree as flatbush's search (children tested in
   * order, nodes opened last-stacked first, a node inside the query box taken whole), so a caller
   * whose results depend on the order of the ids gets the same answer. Returns how many ids.
   */
  searchInto(minX: number, minY: number, maxX: number, maxY: number, out: Int32Array): number {
    const tree = this.tree;
    if (this.stack.length === 0) throw new Error('Data not yet indexed - call index.finish().');
    const { _boxes: boxes, _indices: indices, _levelBounds: levelBounds, nodeSize } = tree;
    const items4 = tree.numItems * 4;
    const stack = this.stack;
    let top = 0;
    let count = 0;
    let nodeIndex = boxes.length - 4;
    let level = levelBounds.length - 1;
    let contained = false;
    for (;;) {
      const end = Math.min(nodeIndex + nodeSize * 4, levelBounds[level]);
      if (contained) {
        // the subtree's leaves are one run of the leaf level
        let pos = nodeIndex;
        for (let l = level; l > 0; l--) pos = indices[pos >> 2];
        const leafEnd = Math.min(pos + (end - nodeIndex) * nodeSize ** level, items4);
        for (; pos < leafEnd; pos += 4) out[count++] = indices[pos >> 2] | 0;
      } else {
        const isNode = nodeIndex >= items4;
        for (let pos = nodeIndex; pos < end; pos += 4) {
          const x0 = boxes[pos];
          if (maxX < x0) continue;
          const y0 = boxes[pos + 1];
          if (maxY < y0) continue;
          const x1 = boxes[pos + 2];
          if (minX > x1) continue;
          const y1 = boxes[pos + 3];
          if (minY > y1) continue;
          const index = indices[pos >> 2] | 0;
          if (isNode) {
            stack[top++] = index | +(minX <= x0 && minY <= y0 && maxX >= x1 && maxY >= y1);
            stack[top++] = level - 1;
          } else out[count++] = index;
        }
      }
      if (top === 0) return count;
      level = stack[--top];
      nodeIndex = stack[--top];
      contained = (nodeIndex & 1) === 1;
      nodeIndex &= ~1;
    }
  }
}
