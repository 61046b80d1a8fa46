/** A map that keeps its `capacity` most recently used entries (Map keeps insertion order). */
export class LruCache<K, V> {
  private readonly map = new Map<K, V>();

  constructor(private readonly capacity: number) {}

  /** The entry for key, made by `make` when missing. */
  get(key: K, make: () => V): V {
    const hit = this.map.get(key);
    if (hit !== undefined) {
      this.map.delete(key);
      this.map.set(key, hit);
      return hit;
    }
    const made = make();
    this.map.set(key, made);
    if (this.map.size > this.capacity) this.map.delete(this.map.keys().next().value as K);
    return made;
  }
}
