/** Binary max-heap of (index, key); equal keys come out lowest index first. */
export class MaxHeap {
  private readonly indices: number[] = [];
  private readonly keys: number[] = [];

  get size(): number {
    return this.indices.length;
  }

  push(index: number, key: number): void {
    this.indices.push(index);
    this.keys.push(key);
    this.up(this.indices.length - 1);
  }

  peek(): { index: number; key: number } | null {
    const index = this.indices[0];
    return index === undefined ? null : { index, key: this.keys[0] ?? 0 };
  }

  pop(): { index: number; key: number } | null {
    const top = this.peek();
    if (!top) return null;
    const lastIndex = this.indices.pop() ?? 0;
    const lastKey = this.keys.pop() ?? 0;
    if (this.indices.length > 0) {
      this.indices[0] = lastIndex;
      this.keys[0] = lastKey;
      this.down(0);
    }
    return top;
  }

  private before(a: number, b: number): boolean {
    const ka = this.keys[a] ?? 0;
    const kb = this.keys[b] ?? 0;
    return ka > kb || (ka === kb && (this.indices[a] ?? 0) < (this.indices[b] ?? 0));
  }

  private swap(a: number, b: number): void {
    [this.indices[a], this.indices[b]] = [this.indices[b] ?? 0, this.indices[a] ?? 0];
    [this.keys[a], this.keys[b]] = [this.keys[b] ?? 0, this.keys[a] ?? 0];
  }

  private up(i: number): void {
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!this.before(i, parent)) return;
      this.swap(i, parent);
      i = parent;
    }
  }

  private down(i: number): void {
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let best = i;
      if (l < this.indices.length && this.before(l, best)) best = l;
      if (r < this.indices.length && this.before(r, best)) best = r;
      if (best === i) return;
      this.swap(i, best);
      i = best;
    }
  }
}
