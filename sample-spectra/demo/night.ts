/**
 * The invented night: the Kestrel Ridge site, the clock of each exposure and where each target
 * stood in the sky. Times are UTC on 2026-03-14; targets are placed near the meridian.
 */

export const SITE = {
  name: 'Kestrel Ridge',
  latitudeDeg: 36.1843,
  /** East-positive. */
  longitudeDeg: -105.721,
  heightM: 2840,
} as const;

const MS_PER_DAY = 86_400_000;
/** MJD of the Unix epoch 1970-01-01T00:00 UTC. */
const MJD_UNIX_EPOCH = 40_587;

export function mjdFromUnixMs(ms: number): number {
  return ms / MS_PER_DAY + MJD_UNIX_EPOCH;
}

/**
 * Local sidereal time (degrees) from the GMST series of Meeus (1998, Astronomical Algorithms,
 * eq. 12.4), UT1 ≈ UTC (good to a second of time, plenty for placing demo targets).
 */
export function localSiderealDeg(mjd: number, longitudeEastDeg: number): number {
  const d = mjd - 51_544.5; // days since J2000.0
  const t = d / 36_525;
  const gmst = 280.46061837 + 360.98564736629 * d + 0.000387933 * t * t - (t * t * t) / 38_710_000;
  return (((gmst + longitudeEastDeg) % 360) + 360) % 360;
}

/** Plane-parallel airmass sec(zenith distance) (common practice, no source). */
export function airmass(hourAngleDeg: number, decDeg: number, latitudeDeg: number): number {
  const rad = Math.PI / 180;
  const cosZ = Math.sin(latitudeDeg * rad) * Math.sin(decDeg * rad) + Math.cos(latitudeDeg * rad) * Math.cos(decDeg * rad) * Math.cos(hourAngleDeg * rad);
  return 1 / cosZ;
}

/** ISO 8601 UTC with milliseconds and no zone letter, as DATE-OBS is usually written. */
export function isoUtc(ms: number): string {
  return new Date(ms).toISOString().slice(0, 23);
}

function sexagesimal(value: number, decimals: number): string {
  const scale = 10 ** decimals;
  const total = Math.round(Math.abs(value) * 3600 * scale);
  const units = Math.floor(total / (3600 * scale));
  const minutes = Math.floor((total % (3600 * scale)) / (60 * scale));
  const seconds = (total % (60 * scale)) / scale;
  const sec = seconds.toFixed(decimals).padStart(decimals ? 3 + decimals : 2, '0');
  return `${String(units).padStart(2, '0')}:${String(minutes).padStart(2, '0')}:${sec}`;
}

/** RA in hours as 'HH:MM:SS.SS'. */
export function raSexagesimal(raDeg: number): string {
  return sexagesimal(raDeg / 15, 2);
}

/** Dec as '+DD:MM:SS.S'. */
export function decSexagesimal(decDeg: number): string {
  return `${decDeg < 0 ? '-' : '+'}${sexagesimal(decDeg, 1)}`;
}
