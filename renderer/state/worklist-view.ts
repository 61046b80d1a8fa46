/** Pure views of the worklist: filters, progress, and moving between spectra. */
import type { SpectrumListItem } from '../../core/api/host-api.js';
import type { Confidence } from '../../core/catalogue/verdict.js';

export const FILTERS = ['pending', 'all', 'secure', 'likely', 'tentative'] as const;
export type WorklistFilter = (typeof FILTERS)[number];

export function isVetted(item: SpectrumListItem): boolean {
  return item.verdict !== null && item.verdict.status !== 'pending';
}

export function passesFilter(item: SpectrumListItem, filter: WorklistFilter): boolean {
  if (filter === 'all') return true;
  if (filter === 'pending') return !isVetted(item);
  return isVetted(item) && item.verdict?.confidence === (filter as Confidence);
}

export function progress(items: readonly SpectrumListItem[]): { vetted: number; total: number } {
  return { vetted: items.filter(isVetted).length, total: items.length };
}

export function nextFilter(filter: WorklistFilter): WorklistFilter {
  return FILTERS[(FILTERS.indexOf(filter) + 1) % FILTERS.length];
}

/**
 * The spectrum after (dir = 1) or before (dir = −1) the current one among those the filter shows,
 * in worklist order. The current one may itself be hidden (just vetted under "pending"); the
 * move then starts from its place in the full list. Null at either end.
 */
export function neighbour(items: readonly SpectrumListItem[], filter: WorklistFilter, currentId: string | null, dir: 1 | -1): string | null {
  const at = items.findIndex((it) => it.id === currentId);
  for (let i = at + dir; i >= 0 && i < items.length; i += dir) if (passesFilter(items[i], filter)) return items[i].id;
  if (at < 0 && dir === 1) return items.find((it) => passesFilter(it, filter))?.id ?? null;
  return null;
}

/** The first pending spectrum after the current one, wrapping round; null when all are vetted. */
export function nextPending(items: readonly SpectrumListItem[], currentId: string | null): string | null {
  const at = items.findIndex((it) => it.id === currentId);
  for (let k = 1; k <= items.length; k++) {
    const it = items[(at + k + items.length) % items.length];
    if (!isVetted(it) && it.id !== currentId) return it.id;
  }
  return null;
}
