/**
 * Points bucketed in square cells, for "is anything within this distance" queries over a few
 * thousand colony-sized objects without trying every pair.
 */
export class PointGrid<T extends { x: number; y: number }> {
  private readonly cells = new Map<number, T[]>();
  private readonly cell: number;

  constructor(cellPx: number) {
    this.cell = Math.max(1, cellPx);
  }

  add(p: T): void {
    const key = this.key(Math.floor(p.x / this.cell), Math.floor(p.y / this.cell));
    const list = this.cells.get(key);
    if (list) list.push(p);
    else this.cells.set(key, [p]);
  }

  /** Whether some point within `reach` of (x, y) satisfies `test`. */
  some(x: number, y: number, reach: number, test: (p: T) => boolean): boolean {
    const c = this.cell;
    for (let cy = Math.floor((y - reach) / c); cy <= Math.floor((y + reach) / c); cy++)
      for (let cx = Math.floor((x - reach) / c); cx <= Math.floor((x + reach) / c); cx++) {
        const list = this.cells.get(this.key(cx, cy));
        if (list?.some((p) => (p.x - x) ** 2 + (p.y - y) ** 2 <= reach * reach && test(p)))
          return true;
      }
    return false;
  }

  private key(cx: number, cy: number): number {
    // Cells are far fewer than 2^20 a side for any working image.
    return (cy + 0x80000) * 0x100000 + (cx + 0x80000);
  }
}
