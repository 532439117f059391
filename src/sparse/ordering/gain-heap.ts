/**
 * Indexed binary max-heap of vertices keyed by gain: insert, remove, change a key and take the
 * top in O(log size); `contains` in O(1). Used by the separator refinement as its gain queue
 * (weighted gains are not small integers, so a heap replaces the classic bucket array).
 */
export class GainHeap {
  private readonly heap: Int32Array;
  private readonly key: Float64Array;
  private readonly at: Int32Array; // heap position of each vertex, −1 when absent
  size = 0;

  constructor(capacity: number) {
    this.heap = new Int32Array(capacity);
    this.key = new Float64Array(capacity);
    this.at = new Int32Array(capacity).fill(-1);
  }

  contains(v: number): boolean {
    return this.at[v] >= 0;
  }

  top(): number {
    return this.size > 0 ? this.heap[0] : -1;
  }

  gainOf(v: number): number {
    return this.key[v];
  }

  /**
   * Inserts v, or updates its key when present. A vertex is in the heap at most once (`at`
   * says where), so the heap never holds more than `capacity` entries; an id outside
   * 0..capacity−1 is a caller bug and throws rather than being silently ignored.
   */
  set(v: number, gain: number): void {
    if (!(v >= 0 && v < this.at.length)) throw new Error(`gain heap: vertex ${v} outside 0..${this.at.length - 1}`);
    if (this.at[v] < 0) {
      this.heap[this.size] = v;
      this.at[v] = this.size++;
      this.key[v] = gain;
      this.up(this.at[v]);
      return;
    }
    const old = this.key[v];
    this.key[v] = gain;
    if (gain > old) this.up(this.at[v]);
    else this.down(this.at[v]);
  }

  remove(v: number): void {
    const i = this.at[v];
    if (i < 0) return;
    const last = this.heap[--this.size];
    this.at[v] = -1;
    if (i === this.size) return;
    this.heap[i] = last;
    this.at[last] = i;
    this.up(i);
    this.down(this.at[last]);
  }

  clear(): void {
    for (let i = 0; i < this.size; i++) this.at[this.heap[i]] = -1;
    this.size = 0;
  }

  private up(i: number): void {
    const { heap, key, at } = this;
    const v = heap[i];
    // move v up while its parent has a smaller key
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (key[heap[parent]] >= key[v]) break;
      heap[i] = heap[parent];
      at[heap[i]] = i;
      i = parent;
    }
    heap[i] = v;
    at[v] = i;
  }

  private down(i: number): void {
    const { heap, key, at } = this;
    const v = heap[i];
    // move v down while a child has a larger key
    for (;;) {
      let child = 2 * i + 1;
      if (child >= this.size) break;
      if (child + 1 < this.size && key[heap[child + 1]] > key[heap[child]]) child++;
      if (key[heap[child]] <= key[v]) break;
      heap[i] = heap[child];
      at[heap[i]] = i;
      i = child;
    }
    heap[i] = v;
    at[v] = i;
  }
}
