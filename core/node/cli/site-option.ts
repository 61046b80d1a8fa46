/** `--site NAME`: a known observing site (core/astro/sites.ts), used when a header names none. */
import { findSite, SITES } from '../../astro/sites.js';
import type { Site } from '../../spectrum/spectrum.js';
import { UsageError } from './usage-error.js';

export const SITE_OPTION_HELP = `observing site for files whose header gives none: ${SITES.map((s) => s.id).join(', ')}`;

export function siteOption(text: string | undefined): Site | undefined {
  if (text === undefined) return undefined;
  const known = findSite(text);
  if (!known) throw new UsageError(`--site: no site "${text}" (known: ${SITES.map((s) => s.id).join(', ')})`);
  return { name: known.name, latitudeDeg: known.latitudeDeg, longitudeDeg: known.longitudeDeg, heightM: known.heightM };
}
