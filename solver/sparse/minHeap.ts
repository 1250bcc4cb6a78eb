// A binary min-heap of (key, value) number pairs, for the minimum-degree orderings of the sparse
// factorisations: key = degree, value = node. Equal keys go to the smaller value, so an ordering
// never depends on the order the entries were pushed in. Entries made stale by a later push are
// left in place; the caller skips them when they come out.
export class MinHeap {
  private readonly keys: number[] = [];
  private readonly values: number[] = [];
  /** The key of the entry that `pop` returned last. */
  lastKey = 0;

  get size(): number {
    return this.keys.length;
  }

  push(key: number, value: number): void {
    const { keys, values } = this;
    let i = keys.length;
    keys.push(key);
    values.push(value);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (keys[parent] < key || (keys[parent] === key && values[parent] <= value)) break;
      keys[i] = keys[parent];
      values[i] = values[parent];
      i = parent;
    }
    keys[i] = key;
    values[i] = value;
  }

  /** Removes the smallest entry and returns its value; its key is left in `lastKey`. */
  pop(): number {
    const { keys, values } = this;
    if (keys.length === 0) throw new Error("pop from an empty heap");
    const topValue = values[0];
    this.lastKey = keys[0];
    const tailKey = keys.pop()!;
    const tailValue = values.pop()!;
    const size = keys.length;
    if (size > 0) {
      let i = 0;
      for (;;) {
        const left = 2 * i + 1;
        if (left >= size) break;
        const right = left + 1;
        const child = right < size && (keys[right] < keys[left] || (keys[right] === keys[left] && values[right] < values[left])) ? right : left;
        if (keys[child] > tailKey || (keys[child] === tailKey && values[child] >= tailValue)) break;
        keys[i] = keys[child];
        values[i] = values[child];
        i = child;
      }
      keys[i] = tailKey;
      values[i] = tailValue;
    }
    return topValue;
  }
}
