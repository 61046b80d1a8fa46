// A site given as OBSGEO-X/Y/Z (geocentric ITRS metres; Rots et al. 2015, A&A 574, A36,
// §4.1.1.3) is read as WGS84 latitude, longitude and height, checked against Debian's astropy
// (EarthLocation.from_geocentric(...).to_geodetic('WGS84'), ERFA gc2gd) at observatories of both
// hemispheres, east and west, from sea level to 4200 m, and one near the pole.
import { describe, expect, it } from 'vitest';
import { readSpectrum } from '../../core/spectrum/read.js';
import { beBytes, card, fitsBytes, imageCards, linearWcs, testFlux } from '../unit/fits-fixtures.js';
import { astropyJson } from '../support/tools.js';

interface Case { xyz: [number, number, number]; lat: number; lon: number; height: number }

const SITES: Array<[number, number, number]> = [
  [-24.6272, -70.4039, 2635], [19.8255, -155.4719, 4205], [28.7606, -17.8816, 2326],
  [-31.2754, 149.0672, 1149], [51.4769, -0.0005, 46], [0.5, 179.9, 0], [-89.99, 45, 2835],
];

const cases = astropyJson<Case[]>(String.raw`
import sys, json
import astropy.units as u
from astropy.coordinates import EarthLocation
out = []
for lat, lon, h in json.loads(sys.argv[1]):
    g = EarthLocation.from_geodetic(lon * u.deg, lat * u.deg, h * u.m, ellipsoid='WGS84')
    xyz = [float(v.to_value(u.m)) for v in g.geocentric]
    back = EarthLocation.from_geocentric(*xyz, unit=u.m).to_geodetic('WGS84')
    out.append({'xyz': xyz, 'lat': float(back.lat.deg), 'lon': float(back.lon.deg), 'height': float(back.height.to_value(u.m))})
print(json.dumps(out))
`, [JSON.stringify(SITES)]);

describe('OBSGEO-X/Y/Z sites, against astropy', () => {
  it('astropy converted every site', () => expect(cases).toHaveLength(SITES.length));
  for (const c of cases) {
    it(`(${c.lat.toFixed(4)}°, ${c.lon.toFixed(4)}°, ${c.height.toFixed(0)} m): within 1e-9° and 1 mm`, () => {
      const cards = [...linearWcs(5000, 1), card('OBSGEO-X', c.xyz[0]), card('OBSGEO-Y', c.xyz[1]), card('OBSGEO-Z', c.xyz[2])];
      const site = readSpectrum(fitsBytes([{ cards: imageCards(-64, [20], cards), data: beBytes('f64', testFlux(20)) }]), 's.fits').meta.site!;
      expect(Math.abs(site.latitudeDeg! - c.lat)).toBeLessThan(1e-9);
      expect(Math.abs(site.longitudeDeg! - c.lon)).toBeLessThan(1e-9);
      expect(Math.abs(site.heightM! - c.height)).toBeLessThan(1e-3);
    });
  }
});
