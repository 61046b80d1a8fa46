// Barycentric and heliocentric radial-velocity corrections against Debian's astropy
// (SkyCoord.radial_velocity_correction, builtin ephemeris, offline: dates after the bundled
// IERS-B table take astropy's own fallback of UT1 = UTC and zero polar motion, as zvet does).
// Requirement: ≤ 2 m/s on both. Time scales against astropy.time and ERFA's leap seconds.
import { afterAll, describe, expect, it } from 'vitest';
import { barycentricCorrection } from '../../core/astro/barycentric.js';
import { findSite } from '../../core/astro/sites.js';
import { mjdFromIsoUtc, mjdTdbFromUtc, mjdTtFromUtc, taiMinusUtcS } from '../../core/astro/time.js';
import { astropyJson } from '../support/tools.js';

interface Case { utc: string; raDeg: number; decDeg: number; site: { name: string; latitudeDeg: number; longitudeDeg: number; heightM: number } }

function known(id: string) {
  const s = findSite(id);
  if (!s) throw new Error(`no site ${id}`);
  return s;
}

// Spread over 2000–2026, both hemispheres, high latitude, near the pole and near a leap second.
const CASES: Case[] = [
  { utc: '2000-01-01T06:00:00', raDeg: 0, decDeg: 0, site: known('kestrel-ridge') },
  { utc: '2002-07-15T03:21:10', raDeg: 83.633, decDeg: -5.39, site: known('paranal') },
  { utc: '2005-11-30T23:59:59', raDeg: 201.365, decDeg: -43.019, site: known('mauna-kea') },
  { utc: '2008-02-29T12:00:00', raDeg: 10.684, decDeg: 41.269, site: known('siding-spring') },
  { utc: '2011-09-10T04:45:00', raDeg: 279.234, decDeg: 38.784, site: known('greenwich') },
  { utc: '2012-06-30T23:59:30', raDeg: 150, decDeg: -60, site: known('la-silla') },
  { utc: '2015-03-20T09:46:00', raDeg: 350, decDeg: 89, site: known('kitt-peak') },
  { utc: '2017-01-01T00:00:30', raDeg: 266.4, decDeg: -28.9, site: known('roque') },
  { utc: '2019-12-21T18:00:00', raDeg: 120, decDeg: 65, site: { name: 'high arctic', latitudeDeg: 78.2, longitudeDeg: 15.6, heightM: 500 } },
  { utc: '2022-12-01T02:00:00', raDeg: 187.7, decDeg: 12.39, site: known('kestrel-ridge') },
  { utc: '2024-05-05T07:07:07.5', raDeg: 30, decDeg: -80, site: { name: 'southern sea level', latitudeDeg: -45, longitudeDeg: 170, heightM: 0 } },
  { utc: '2026-03-14T05:12:33', raDeg: 210.9, decDeg: 54.3, site: known('kestrel-ridge') },
];

const SCRIPT = `
import json, sys
from astropy.coordinates import SkyCoord, EarthLocation
from astropy.time import Time
import astropy.units as u
out = []
for c in json.load(sys.stdin):
    t = Time(c['utc'], scale='utc', format='isot')
    loc = EarthLocation.from_geodetic(c['site']['longitudeDeg'] * u.deg, c['site']['latitudeDeg'] * u.deg, c['site']['heightM'] * u.m)
    sc = SkyCoord(c['raDeg'] * u.deg, c['decDeg'] * u.deg, frame='icrs')
    out.append(dict(
        mjdUtc=t.mjd, mjdTt=t.tt.mjd, mjdTdb=t.tdb.mjd,
        bary=sc.radial_velocity_correction('barycentric', obstime=t, location=loc).to_value(u.km / u.s),
        helio=sc.radial_velocity_correction('heliocentric', obstime=t, location=loc).to_value(u.km / u.s),
    ))
print(json.dumps(out))
`;

const worst = { baryMS: 0, baryWhere: '', helioMS: 0, helioWhere: '', tdbUs: 0 };

describe('barycentric correction against astropy', () => {
  const reference = astropyJson<Array<{ mjdUtc: number; mjdTt: number; mjdTdb: number; bary: number; helio: number }>>(SCRIPT, [], JSON.stringify(CASES));

  it('has at least 10 cases over 2000–2026', () => {
    expect(CASES.length).toBeGreaterThanOrEqual(10);
    expect(new Set(CASES.map((c) => c.utc.slice(0, 4))).size).toBeGreaterThanOrEqual(10);
  });

  it.each(CASES.map((c, i) => [`${c.utc} ${c.site.name} RA ${c.raDeg} Dec ${c.decDeg}`, c, i] as const))('%s', (label, c, i) => {
    const ref = reference[i];
    const mjdUtc = mjdFromIsoUtc(c.utc);
    // On a day that ends with a leap second ERFA's UTC MJD runs on 86401-s days; ours on
    // 86400-s days: same instant, other number. TT is what must agree.
    if (!c.utc.startsWith('2012-06-30')) expect(Math.abs(mjdUtc - ref.mjdUtc) * 86400).toBeLessThan(1e-4);
    // UTC → TT is exact given the leap seconds; TDB − TT series good to ~10 µs (Kaplan 2005).
    expect(Math.abs(mjdTtFromUtc(mjdUtc) - ref.mjdTt) * 86400).toBeLessThan(1e-4);
    const tdbUs = Math.abs(mjdTdbFromUtc(mjdUtc) - ref.mjdTdb) * 86400e6;
    worst.tdbUs = Math.max(worst.tdbUs, tdbUs);
    expect(tdbUs).toBeLessThan(20);

    const ours = barycentricCorrection({ raDeg: c.raDeg, decDeg: c.decDeg, mjdUtc, site: c.site });
    const baryMS = Math.abs(ours.vCorrKmS - ref.bary) * 1000;
    const helioMS = Math.abs(ours.vHelioKmS - ref.helio) * 1000;
    if (baryMS > worst.baryMS) Object.assign(worst, { baryMS, baryWhere: label });
    if (helioMS > worst.helioMS) Object.assign(worst, { helioMS, helioWhere: label });
    expect(baryMS, `barycentric: zvet ${ours.vCorrKmS} astropy ${ref.bary} km/s`).toBeLessThanOrEqual(2);
    expect(helioMS, `heliocentric: zvet ${ours.vHelioKmS} astropy ${ref.helio} km/s`).toBeLessThanOrEqual(2);
  });

  afterAll(() => {
    console.info(`barycentric vs astropy: worst ${worst.baryMS.toFixed(3)} m/s (${worst.baryWhere}); heliocentric worst ${worst.helioMS.toFixed(3)} m/s (${worst.helioWhere}); TDB worst ${worst.tdbUs.toFixed(2)} µs`);
  });
});

describe('leap seconds against ERFA (eraDat)', () => {
  // Each step of the table, the day before it and a date well after the last one.
  const dates: Array<[number, number, number]> = [];
  for (let y = 1972; y <= 2017; y++) for (const m of [1, 7]) dates.push([y, m, 1], [m === 1 ? y - 1 : y, m === 1 ? 12 : 6, 30]);
  dates.push([2025, 6, 15]);
  const erfa = astropyJson<number[]>(`
import json, sys, erfa
print(json.dumps([float(erfa.dat(y, m, d, 0.5)) for y, m, d in json.load(sys.stdin)]))
`, [], JSON.stringify(dates.filter(([y]) => y >= 1972)));

  it('TAI − UTC matches on every date around each step from 1972 to 2017', () => {
    const ours = dates.filter(([y]) => y >= 1972).map(([y, m, d]) => taiMinusUtcS(mjdFromIsoUtc(`${y}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}T12:00:00`)));
    expect(ours).toEqual(erfa);
  });
});
