/**
 * Remembers measurements per spectrum and option set, so moving back and forth through a worklist
 * measures each file once. Full results (with the spectrum's arrays) are kept for the most recent
 * few; the one-line suggestion for the list is kept for every spectrum.
 */
import type { RemeasureOptions, SpectrumListItem } from '../../api/host-api.js';
import type { MeasuredFile } from './services.js';

const KEEP_FULL = 48;

export function optionsKey(id: string, options: RemeasureOptions): string {
  const sorted = Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined).sort(([a], [b]) => (a < b ? -1 : 1)));
  return `${id}\u0000${JSON.stringify(sorted)}`;
}

export class MeasurementCache {
  private readonly full = new Map<string, Promise<MeasuredFile>>();
  readonly suggestions = new Map<string, SpectrumListItem['suggestion']>();
  readonly errors = new Map<string, string>();

  /** The cached (or newly started) measurement; a failed promise is not kept. */
  get(key: string, measure: () => Promise<MeasuredFile>): Promise<MeasuredFile> {
    let hit = this.full.get(key);
    if (hit) {
      this.full.delete(key);
      this.full.set(key, hit);
      return hit;
    }
    hit = measure();
    this.full.set(key, hit);
    hit.catch(() => this.full.delete(key));
    while (this.full.size > KEEP_FULL) this.full.delete(this.full.keys().next().value as string);
    return hit;
  }

  /** Records what the list shows for a spectrum after a measurement. */
  note(id: string, result: MeasuredFile): void {
    const best = result.measurement?.best;
    if (result.error) this.errors.set(id, result.error);
    else this.errors.delete(id);
    this.suggestions.set(
      id,
      best && result.measurement ? { z: best.z, zErr: best.zErr, confidence: result.measurement.confidence, template: best.template } : null,
    );
  }
}
