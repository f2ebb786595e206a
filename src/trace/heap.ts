/**
 * A flat binary min-heap of (key: Float64, value: Int32) pairs, grown by doubling and
 * reused across searches: no allocation per push. Stale entries are left in place and
 * skipped by the caller (lazy deletion).
 */
export class FlatHeap {
  private keys: Float64Array;
  private values: Int32Array;
  length = 0;

  constructor(capacity = 1024) {
    this.keys = new Float64Array(capacity);
    this.values = new Int32Array(capacity);
  }

  clear(): void {
    this.length = 0;
  }

  push(value: number, key: number): void {
    if (this.length === this.keys.length) this.grow();
    let pos = this.length++;
    const keys = this.keys;
    const values = this.values;
    while (pos > 0) {
      const parent = (pos - 1) >> 1;
      const pk = keys[parent];
      if (key >= pk) break;
      keys[pos] = pk;
      values[pos] = values[parent];
      pos = parent;
    }
    keys[pos] = key;
    values[pos] = value;
  }

  /** Key of the smallest entry; Infinity when empty. */
  peekKey(): number {
    return this.length > 0 ? this.keys[0] : Infinity;
  }

  /** Removes and returns the value of the smallest entry; -1 when empty. */
  pop(): number {
    if (this.length === 0) return -1;
    const keys = this.keys;
    const values = this.values;
    const top = values[0];
    const n = --this.length;
    if (n > 0) {
      const key = keys[n];
      const value = values[n];
      let pos = 0;
      const half = n >> 1;
      while (pos < half) {
        let child = 2 * pos + 1;
        const right = child + 1;
        if (right < n && keys[right] < keys[child]) child = right;
        if (keys[child] >= key) break;
        keys[pos] = keys[child];
        values[pos] = values[child];
        pos = child;
      }
      keys[pos] = key;
      values[pos] = value;
    }
    return top;
  }

  private grow(): void {
    const keys = new Float64Array(this.keys.length * 2);
    keys.set(this.keys);
    const values = new Int32Array(this.values.length * 2);
    values.set(this.values);
    this.keys = keys;
    this.values = values;
  }
}
