/**
 * `zvet bary --ra RA --dec DEC --utc ISO [--lat D --lon D --height M | --site NAME] [--json]`:
 * the barycentric and heliocentric radial-velocity corrections (km/s, to add to a measured
 * velocity) for a target, a time and a site, and the Sun's CMB-dipole velocity toward it.
 */
import type { Command } from 'commander';
import { barycentricCorrection } from '../../astro/barycentric.js';
import { cmbVelocityTowardKmS } from '../../astro/cmb.js';
import { parseDecDeg, parseRaDeg } from '../../astro/coords.js';
import { findSite, SITES, type ResolvedSite } from '../../astro/sites.js';
import { isoUtcFromMjd, mjdFromIsoUtc } from '../../astro/time.js';
import { numberOption } from './number-option.js';
import { runAction } from './run-action.js';
import { UsageError } from './usage-error.js';

interface BaryOptions {
  ra: string;
  dec: string;
  utc: string;
  lat?: string;
  lon?: string;
  height?: string;
  site?: string;
  json?: boolean;
}

export function registerBary(program: Command): void {
  program
    .command('bary')
    .description('barycentric and heliocentric velocity corrections (km/s, add to the measured velocity: (1+z_bary) = (1+z_obs)(1+v_corr/c))')
    .requiredOption('--ra <ra>', 'target right ascension (ICRS): degrees, or hours as 12:34:56.7 / 12h34m56.7s')
    .requiredOption('--dec <dec>', 'target declination (ICRS): degrees, or -05:06:07 / -05d06m07s')
    .requiredOption('--utc <iso>', 'time of the observation (mid-exposure), UTC, ISO 8601: 2026-03-14T05:12:33')
    .option('--lat <deg>', 'site geodetic latitude, degrees north')
    .option('--lon <deg>', 'site longitude, degrees east (west negative)')
    .option('--height <m>', 'site height above the WGS 84 ellipsoid, m (default 0)')
    .option('--site <name>', `a known site instead of --lat/--lon/--height: ${SITES.map((s) => s.id).join(', ')}`)
    .option('--json', 'print one JSON object (units in the key names)')
    .action(runAction((opts: BaryOptions) => {
      const raDeg = withFlag('--ra', () => parseRaDeg(opts.ra));
      const decDeg = withFlag('--dec', () => parseDecDeg(opts.dec));
      const mjdUtc = withFlag('--utc', () => mjdFromIsoUtc(opts.utc));
      const site = siteFromOptions(opts);
      const c = barycentricCorrection({ raDeg, decDeg, mjdUtc, site });
      const out = {
        v_corr_kms: c.vCorrKmS,
        v_helio_kms: c.vHelioKmS,
        v_relativistic_kms: c.relativisticKmS,
        v_cmb_dipole_kms: cmbVelocityTowardKmS(raDeg, decDeg),
        utc: isoUtcFromMjd(mjdUtc),
        mjd_utc: mjdUtc,
        mjd_tdb: c.mjdTdb,
        tai_minus_utc_s: c.taiMinusUtcS,
        ra_deg: raDeg,
        dec_deg: decDeg,
        site: { name: site.name, latitude_deg: site.latitudeDeg, longitude_deg: site.longitudeDeg, height_m: site.heightM },
        convention: 'add v_corr_kms to a measured velocity; exactly (1+z_bary) = (1+z_obs)(1+v_corr_kms/c)',
      };
      process.stdout.write(opts.json ? `${JSON.stringify(out)}\n` : formatBary(out));
    }));
}

/** Runs a parser and turns its RangeError into a usage error naming the flag. */
function withFlag<T>(flag: string, parse: () => T): T {
  try {
    return parse();
  } catch (err) {
    throw new UsageError(`${flag}: ${(err as Error).message}`);
  }
}

function siteFromOptions(opts: BaryOptions): ResolvedSite {
  const coords = opts.lat !== undefined || opts.lon !== undefined || opts.height !== undefined;
  if (opts.site !== undefined) {
    if (coords) throw new UsageError('give either --site or --lat/--lon/--height, not both');
    const known = findSite(opts.site);
    if (!known) throw new UsageError(`--site: no site "${opts.site}" (known: ${SITES.map((s) => s.id).join(', ')})`);
    return { name: known.name, latitudeDeg: known.latitudeDeg, longitudeDeg: known.longitudeDeg, heightM: known.heightM };
  }
  if (opts.lat === undefined || opts.lon === undefined) throw new UsageError('the site is missing: give --site NAME, or --lat and --lon (and --height)');
  const site = {
    name: 'as given by --lat/--lon/--height',
    latitudeDeg: numberOption('--lat', opts.lat),
    longitudeDeg: numberOption('--lon', opts.lon),
    heightM: opts.height === undefined ? 0 : numberOption('--height', opts.height),
  };
  if (site.latitudeDeg < -90 || site.latitudeDeg > 90) throw new UsageError(`--lat: ${opts.lat} is outside −90…+90°`);
  if (site.longitudeDeg < -360 || site.longitudeDeg > 360) throw new UsageError(`--lon: ${opts.lon} is outside −360…+360°`);
  return site;
}

function formatBary(o: {
  v_corr_kms: number; v_helio_kms: number; v_relativistic_kms: number; v_cmb_dipole_kms: number; utc: string; mjd_utc: number; mjd_tdb: number;
  ra_deg: number; dec_deg: number; site: { name: string; latitude_deg: number; longitude_deg: number; height_m: number };
}): string {
  const rows: Array<[string, string]> = [
    ['barycentric correction', `${o.v_corr_kms.toFixed(4)} km/s (add to the measured velocity; includes ${(o.v_relativistic_kms * 1000).toFixed(2)} m/s gravitational and time-dilation terms)`],
    ['heliocentric correction', `${o.v_helio_kms.toFixed(4)} km/s`],
    ['CMB dipole toward target', `${o.v_cmb_dipole_kms.toFixed(2)} km/s (add to a heliocentric cz to first order)`],
    ['time', `${o.utc} UTC (MJD ${o.mjd_utc.toFixed(6)} UTC, ${o.mjd_tdb.toFixed(6)} TDB)`],
    ['target', `RA ${o.ra_deg.toFixed(6)}°, Dec ${o.dec_deg.toFixed(6)}° (ICRS)`],
    ['site', `${o.site.name}: lat ${o.site.latitude_deg}°, lon ${o.site.longitude_deg}° E, height ${o.site.height_m} m`],
  ];
  const w = Math.max(...rows.map((r) => r[0].length));
  return `${rows.map(([k, v]) => `${k.padEnd(w)}  ${v}`).join('\n')}\n`;
}
