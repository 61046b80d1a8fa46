/**
 * Spectra already fetched or on their way, so that "next" draws from memory: the controller
 * prefetches the neighbours of the spectrum in view. Holds a few, dropping the oldest.
 */
import type { SpectrumView } from '../../core/api/host-api.js';

export class SpectrumCache {
  private readonly entries = new Map<string, Promise<SpectrumView>>();
  private readonly arrived = new WeakSet<Promise<SpectrumView>>();

  constructor(
    private readonly load: (id: string) => Promise<SpectrumView>,
    private readonly capacity = 8,
  ) {}

  get(id: string): Promise<SpectrumView> {
    const hit = this.entries.get(id);
    if (hit) {
      this.entries.delete(id);
      this.entries.set(id, hit);
      return hit;
    }
    const p = this.load(id);
    p.then(() => this.arrived.add(p), () => undefined);
    // A failed fetch is not kept: the next look tries again.
    p.catch(() => this.entries.get(id) === p && this.entries.delete(id));
    this.entries.set(id, p);
    while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value as string);
    return p;
  }

  /** True when the spectrum is here already (showing it needs no "loading" state). */
  ready(id: string): boolean {
    const p = this.entries.get(id);
    return p !== undefined && this.arrived.has(p);
  }

  prefetch(id: string | null): void {
    if (id !== null && !this.entries.has(id)) this.get(id).catch(() => undefined);
  }

  /** Forget a spectrum (its verdict changed, or it was re-measured). */
  drop(id: string): void {
    this.entries.delete(id);
  }
}
