/**
 * Observing site from the header. Longitudes are returned east-positive. Each keyword family
 * has its own habit, and a comment naming the direction ('west', '[deg E]') overrides it:
 * - OBSGEO-B/L/H: latitude, longitude east-positive, height in m (Rots et al. 2015, A&A 574,
 *   A36, §4.1.1.3, the FITS time paper); else OBSGEO-X/Y/Z, geocentric metres (same paper),
 *   taken to WGS84 latitude, longitude and height (geocentric.ts).
 * - ESO TEL GEOLAT/GEOLON/GEOELEV (ESO HIERARCH): east-positive (the cards say '+=East'; from memory).
 * - LAT_OBS/LONG_OBS/ALT_OBS (e.g. AAO headers): east-positive (AAT has LONG_OBS = 149.07).
 * - LATITUDE/LONGITUD/ALTITUDE or HEIGHT: west-positive in ING and NOAO/IRAF practice
 *   (La Palma written as +17.88; fitsbits list, Nov 2000).
 * - SITELAT/SITELONG/SITEALT or SITEELEV: west-positive ("degrees west of zero", FLWO headers,
 *   fitsbits list, Nov 2000).
 * - OBS-LAT/OBS-LONG/OBS-ELEV: east-positive (from memory, unverified).
 * Sexagesimal strings ('-31:16:37') are accepted for latitude and longitude.
 */
import { firstString, type Keywords } from './keywords.js';
import { angleDeg } from './sexagesimal.js';
import { geodeticFromGeocentric } from './geocentric.js';
import type { Site } from './spectrum.js';

interface Family {
  lat: string;
  lon: string;
  heights: string[];
  eastPositive: boolean;
}

const FAMILIES: Family[] = [
  { lat: 'OBSGEO-B', lon: 'OBSGEO-L', heights: ['OBSGEO-H'], eastPositive: true },
  { lat: 'ESO TEL GEOLAT', lon: 'ESO TEL GEOLON', heights: ['ESO TEL GEOELEV'], eastPositive: true },
  { lat: 'LAT_OBS', lon: 'LONG_OBS', heights: ['ALT_OBS'], eastPositive: true },
  { lat: 'LATITUDE', lon: 'LONGITUD', heights: ['ALTITUDE', 'HEIGHT'], eastPositive: false },
  { lat: 'SITELAT', lon: 'SITELONG', heights: ['SITEALT', 'SITEELEV'], eastPositive: false },
  { lat: 'OBS-LAT', lon: 'OBS-LONG', heights: ['OBS-ELEV'], eastPositive: true },
];

export function siteOf(k: Keywords): Site | undefined {
  const name = firstString(k, ['OBSERVAT', 'SITENAME', 'TELESCOP'])?.value;
  const [x, y, z] = ['OBSGEO-X', 'OBSGEO-Y', 'OBSGEO-Z'].map((key) => k.number(key));
  const hasBlh = k.value('OBSGEO-B') !== undefined && k.value('OBSGEO-L') !== undefined;
  // A point within 100 km of the Earth's surface, else not a site.
  if (!hasBlh && x !== undefined && y !== undefined && z !== undefined && Math.abs(Math.hypot(x, y, z) - 6.371e6) < 1e5) {
    return { ...geodeticFromGeocentric(x, y, z), ...(name ? { name } : {}) };
  }
  for (const f of FAMILIES) {
    const latitudeDeg = angleDeg(k.value(f.lat), false);
    const lon = angleDeg(k.value(f.lon), false);
    if (latitudeDeg === undefined || lon === undefined || Math.abs(latitudeDeg) > 90 || Math.abs(lon) > 360) continue;
    const east = eastPositive(k.comment(f.lon), f.eastPositive);
    const longitudeDeg = wrap180(east ? lon : -lon);
    const heightKey = f.heights.find((h) => k.number(h) !== undefined);
    const site: Site = { latitudeDeg, longitudeDeg };
    if (heightKey) site.heightM = k.number(heightKey);
    if (name) site.name = name;
    return site;
  }
  return name ? { name } : undefined;
}

function eastPositive(comment: string | undefined, byDefault: boolean): boolean {
  if (!comment) return byDefault;
  if (/\bwest\b|\bW\b/i.test(comment) && !/\beast\b/i.test(comment)) return false;
  if (/\beast\b|\bE\b/.test(comment) || /\beast\b/i.test(comment)) return true;
  return byDefault;
}

/** Longitude in (−180°, 180°]; values already in range are returned unchanged. */
function wrap180(deg: number): number {
  if (deg > -180 && deg <= 180) return deg;
  const d = ((((deg + 180) % 360) + 360) % 360) - 180;
  return d === -180 ? 180 : d;
}
