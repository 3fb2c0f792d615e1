/** Binary max-heap of (index, key); equal keys come out lowest index first. Typed arrays, grown by doubling. */
export class MaxHeap {
  private indices: Float64Array;
  private keys: Float64Array;
  private count = 0;

  constructor(capacity = 64) {
    this.indices = new Float64Array(Math.max(1, capacity));
    this.keys = new Float64Array(Math.max(1, capacity));
  }

  get size(): number {
    return this.count;
  }

  push(index: number, key: number): void {
    if (this.count === this.indices.length) this.grow();
    let i = this.count++;
    // sift up with a hole instead of swaps
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!this.beats(key, index, parent)) break;
      this.indices[i] = this.indices[parent] ?? 0;
      this.keys[i] = this.keys[parent] ?? 0;
      i = parent;
    }
    this.indices[i] = index;
    this.keys[i] = key;
  }

  peek(): { index: number; key: number } | null {
    return this.count === 0 ? null : { index: this.indices[0] ?? 0, key: this.keys[0] ?? 0 };
  }

  pop(): { index: number; key: number } | null {
    const top = this.peek();
    if (!top) return null;
    const n = --this.count;
    if (n > 0) this.siftDown(this.indices[n] ?? 0, this.keys[n] ?? 0);
    return top;
  }

  /** True when (key, index) comes out before the entry at slot. */
  private beats(key: number, index: number, slot: number): boolean {
    const k = this.keys[slot] ?? 0;
    return key > k || (key === k && index < (this.indices[slot] ?? 0));
  }

  private siftDown(index: number, key: number): void {
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      if (l >= this.count) break;
      const r = l + 1;
      const child = r < this.count && this.beats(this.keys[r] ?? 0, this.indices[r] ?? 0, l) ? r : l;
      if (!this.childBeats(child, key, index)) break;
      this.indices[i] = this.indices[child] ?? 0;
      this.keys[i] = this.keys[child] ?? 0;
      i = child;
    }
    this.indices[i] = index;
    this.keys[i] = key;
  }

  private childBeats(slot: number, key: number, index: number): boolean {
    const k = this.keys[slot] ?? 0;
    return k > key || (k === key && (this.indices[slot] ?? 0) < index);
  }

  private grow(): void {
    const indices = new Float64Array(2 * this.indices.length);
    const keys = new Float64Array(2 * this.keys.length);
    indices.set(this.indices);
    keys.set(this.keys);
    this.indices = indices;
    this.keys = keys;
  }
}
