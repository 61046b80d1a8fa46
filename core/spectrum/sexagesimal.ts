/**
 * Angles as headers write them: numbers in degrees, or sexagesimal strings
 * ('09:43:44.6', '-01 02 28.7', '+07d59m53.5s'). Right ascension strings are in hours
 * (FITS practice, e.g. the NOAO keyword dictionary), declinations in degrees.
 */

import { parseDecimal } from '../util/decimal.js';

/** Degrees from a header value; `hours` when a sexagesimal string counts hours (RA). */
export function angleDeg(value: string | number | boolean | null | undefined, hours: boolean): number | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? value : undefined;
  if (typeof value !== 'string') return undefined;
  const s = value.trim();
  const decimal = parseDecimal(s);
  if (decimal !== null) return decimal;
  const m = /^([+-]?)\s*(\d{1,3})[\s:hd°]+(\d{1,2})[\s:m']+(\d{1,2}(?:\.\d*)?)\s*(s|")?$/i.exec(s);
  if (!m) return undefined;
  const [, sign, a, b, c] = m;
  if (Number(b) >= 60 || Number(c) >= 60) return undefined;
  const magnitude = Number(a) + Number(b) / 60 + Number(c) / 3600;
  const signed = sign === '-' ? -magnitude : magnitude;
  return hours ? signed * 15 : signed;
}
