/**
 * Sky positions: reading RA/Dec written as decimal degrees or sexagesimal text, and the unit
 * vector of a direction.
 */
import { RAD_PER_DEG } from './constants.js';

/** A plain decimal number of degrees, optionally with a unit: "188.7", "-5.1deg", "1.2e2°". */
const DECIMAL_DEG = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?\s*(d|deg|°)?$/i;
/** What sexagesimal text may contain: digits, points, spaces and the h/d/m/s, ° ′ ″, : separators. */
const SEXAGESIMAL_CHARS = /^[\d.\s:hdms°′″'"]+$/i;

/**
 * Sign, whether hours were marked with "h", and the one to three numbers of a sexagesimal
 * text ("12:34:56.7", "12 34 56.7", "12h34m56.7s", "-05°06′07″"); null when it is not one.
 */
function sexagesimalParts(text: string): { sign: number; hours: boolean; degrees: boolean; parts: number[] } | null {
  const sign = text.startsWith('-') ? -1 : 1;
  const body = text.replace(/^[+-]\s*/, '');
  if (!SEXAGESIMAL_CHARS.test(body)) return null;
  const tokens = body.replace(/[hdms°′″'":]/gi, ' ').trim().split(/\s+/);
  if (tokens.length < 1 || tokens.length > 3 || !tokens.every((t) => /^(\d+(\.\d*)?|\.\d+)$/.test(t))) return null;
  return { sign, hours: /h/i.test(body), degrees: /[d°]/i.test(body), parts: tokens.map(Number) };
}

/** a + b/60 + c/3600, refusing minutes or seconds of 60 and more. */
function sexagesimalValue(what: string, text: string, parts: number[]): number {
  const [a, b = 0, c = 0] = parts;
  if (b >= 60 || c >= 60) throw new RangeError(`${what} "${text}": minutes and seconds must be below 60`);
  return a + b / 60 + c / 3600;
}

type SexagesimalParts = NonNullable<ReturnType<typeof sexagesimalParts>>;

/** Degrees from decimal text, else from what `fromParts` makes of the sexagesimal parts (null: refused). */
function readDegrees(text: string, fromParts: (p: SexagesimalParts) => number | null, complaint: string): number {
  const t = text.trim();
  if (DECIMAL_DEG.test(t)) return Number.parseFloat(t);
  const p = sexagesimalParts(t);
  const deg = p ? fromParts(p) : null;
  if (deg === null) throw new RangeError(complaint);
  return deg;
}

/**
 * Right ascension in degrees from decimal degrees ("188.7", "188.7d"), sexagesimal degrees
 * marked with d or ° ("188d42m"), or hours: sexagesimal without a mark or marked with h
 * ("12:34:48", "12 34 48", "12h34m48s", "12.58h"). Throws a RangeError naming the text.
 */
export function parseRaDeg(text: string): number {
  const what = 'right ascension';
  const deg = readDegrees(text, (p) => {
    if ((p.hours && p.degrees) || (p.parts.length === 1 && !p.hours)) return null;
    if (p.sign < 0) throw new RangeError(`${what} "${text}" cannot be negative`);
    return (p.degrees ? 1 : 15) * sexagesimalValue(what, text, p.parts);
  }, `${what} "${text}" is neither degrees (188.7) nor hours:minutes:seconds (12:34:48.0)`);
  if (!(deg >= 0 && deg < 360)) throw new RangeError(`${what} "${text}" is outside 0–360° (0–24 h)`);
  return deg;
}

/**
 * Declination in degrees from decimal degrees ("-5.1") or sexagesimal degrees ("-05:06:07",
 * "-05d06m07s"); the sign of "-00:30:00" is kept. Throws a RangeError naming the text.
 */
export function parseDecDeg(text: string): number {
  const what = 'declination';
  const deg = readDegrees(text, (p) => (p.hours || p.parts.length === 1 ? null : p.sign * sexagesimalValue(what, text, p.parts)),
    `${what} "${text}" is neither degrees (-5.1) nor degrees:minutes:seconds (-05:06:07)`);
  if (!(deg >= -90 && deg <= 90)) throw new RangeError(`${what} "${text}" is outside −90…+90°`);
  return deg;
}

export type Vec3 = readonly [number, number, number];

/** Unit vector (x toward RA 0, z toward the pole) of a direction given in degrees. */
export function unitVector(lonDeg: number, latDeg: number): Vec3 {
  const lon = lonDeg * RAD_PER_DEG;
  const lat = latDeg * RAD_PER_DEG;
  return [Math.cos(lat) * Math.cos(lon), Math.cos(lat) * Math.sin(lon), Math.sin(lat)];
}

/** Longitude (0–360°) and latitude in degrees of a vector. */
export function lonLatDeg(v: Vec3): { lonDeg: number; latDeg: number } {
  const lon = Math.atan2(v[1], v[0]) / RAD_PER_DEG;
  return { lonDeg: lon < 0 ? lon + 360 : lon, latDeg: Math.atan2(v[2], Math.hypot(v[0], v[1])) / RAD_PER_DEG };
}

export function dot(a: Vec3, b: Vec3): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}
