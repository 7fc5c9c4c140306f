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
  }

  /** Ids of the boxes that meet the query box (touching counts). */
  search(minX: number, minY: number, maxX: number, maxY: number): number[] {
    return this.tree.search(minX, minY, maxX, maxY);
  }
}
