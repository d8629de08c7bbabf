/**
 * A binary min-heap of (id, priority) in parallel growable arrays. Dijkstra pushes duplicates and skips
 * stale pops ("lazy deletion"), which is simpler and on road graphs as fast as decrease-key.
 */
export class MinHeap {
  private ids: number[] = [];
  private keys: number[] = [];

  get size(): number {
    return this.ids.length;
  }

  clear(): void {
    this.ids.length = 0;
    this.keys.length = 0;
  }

  push(id: number, key: number): void {
    const ids = this.ids;
    const keys = this.keys;
    let i = ids.length;
    ids.push(id);
    keys.push(key);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      const pk = keys[parent]!;
      if (pk <= key) break;
      ids[i] = ids[parent]!;
      keys[i] = pk;
      i = parent;
    }
    ids[i] = id;
    keys[i] = key;
  }

  /** Key of the smallest entry; only valid when size > 0. */
  peekKey(): number {
    return this.keys[0]!;
  }

  /** Removes the smallest entry and returns its id; only valid when size > 0. */
  pop(): number {
    const ids = this.ids;
    const keys = this.keys;
    const top = ids[0]!;
    const lastId = ids.pop()!;
    const lastKey = keys.pop()!;
    const n = ids.length;
    if (n > 0) {
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= n) break;
        const r = l + 1;
        const c = r < n && keys[r]! < keys[l]! ? r : l;
        if (keys[c]! >= lastKey) break;
        ids[i] = ids[c]!;
        keys[i] = keys[c]!;
        i = c;
      }
      ids[i] = lastId;
      keys[i] = lastKey;
    }
    return top;
  }
}
