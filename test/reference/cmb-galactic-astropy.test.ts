// The ICRS → Galactic rotation and the CMB-frame velocity against Debian's astropy (its
// Galactic frame and SkyCoord separations), and the rotation matrix as published for the
// Hipparcos catalogue (ESA 1997, vol. 1, §1.5.3; entries from memory).
import { afterAll, describe, expect, it } from 'vitest';
import { CMB_DIPOLE, cmbVelocityTowardKmS, zCmbFromHelio } from '../../core/astro/cmb.js';
import { SPEED_OF_LIGHT_KMS } from '../../core/astro/constants.js';
import { galacticFromIcrs, ICRS_TO_GALACTIC } from '../../core/astro/galactic.js';
import { astropyJson } from '../support/tools.js';

// Targets over the whole sky, including the poles, the apex and the antapex neighbourhoods.
const TARGETS: Array<[number, number]> = [
  [0, 0], [45, 30], [90, -60], [135, 89.5], [180, -89.5], [192.85948, 27.12825], [266.405, -28.936],
  [168.0, -7.0], [348.0, 7.0], [210.9, 54.3], [10.684, 41.269], [83.633, -5.39], [299.9, -45.2], [359.99, -0.01],
];

const worst = { arcsec: 0, kmS: 0 };

describe('Galactic coordinates against astropy', () => {
  const ref = astropyJson<Array<{ l: number; b: number; vcmb: number }>>(`
import json, sys
import numpy as np
from astropy.coordinates import SkyCoord
import astropy.units as u
apex = SkyCoord(l=${CMB_DIPOLE.lDeg} * u.deg, b=${CMB_DIPOLE.bDeg} * u.deg, frame='galactic')
out = []
for ra, dec in json.load(sys.stdin):
    c = SkyCoord(ra * u.deg, dec * u.deg, frame='icrs')
    g = c.galactic
    out.append(dict(l=g.l.deg, b=g.b.deg, vcmb=${CMB_DIPOLE.speedKmS} * float(np.cos(c.separation(apex).rad))))
print(json.dumps(out))
`, [], JSON.stringify(TARGETS));

  it.each(TARGETS.map((t, i) => [`RA ${t[0]} Dec ${t[1]}`, t, i] as const))('%s: l, b within 0.1″ and the CMB velocity within 1 m/s', (_label, [ra, dec], i) => {
    const { lDeg, bDeg } = galacticFromIcrs(ra, dec);
    const dl = ((((lDeg - ref[i].l) % 360) + 540) % 360) - 180;
    const sepArcsec = Math.hypot(dl * Math.cos((bDeg * Math.PI) / 180), bDeg - ref[i].b) * 3600;
    worst.arcsec = Math.max(worst.arcsec, sepArcsec);
    expect(sepArcsec).toBeLessThan(0.1);
    const dv = Math.abs(cmbVelocityTowardKmS(ra, dec) - ref[i].vcmb);
    worst.kmS = Math.max(worst.kmS, dv);
    expect(dv * 1000).toBeLessThan(1);
  });

  afterAll(() => {
    console.info(`Galactic vs astropy: worst ${worst.arcsec.toFixed(4)}″; CMB velocity worst ${(worst.kmS * 1000).toFixed(4)} m/s`);
  });
});

describe('ICRS → Galactic matrix (Hipparcos vol. 1 §1.5.3)', () => {
  it('matches the published entries to 1e-9', () => {
    const published = [
      [-0.0548755604, -0.873437090, -0.4838350155],
      [0.4941094279, -0.44482963, 0.7469822445],
      [-0.867666149, -0.1980763734, 0.4559837762],
    ];
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) expect(Math.abs(ICRS_TO_GALACTIC[r][c] - published[r][c])).toBeLessThan(1e-9);
  });
});

describe('CMB-frame redshift', () => {
  it('toward the apex the CMB z is higher by about v/c, away from it lower', () => {
    // The apex in ICRS, from astropy: Galactic (264.021°, 48.253°).
    const apex = astropyJson<[number, number]>(`
import json
from astropy.coordinates import SkyCoord
import astropy.units as u
c = SkyCoord(l=${CMB_DIPOLE.lDeg} * u.deg, b=${CMB_DIPOLE.bDeg} * u.deg, frame='galactic').icrs
print(json.dumps([c.ra.deg, c.dec.deg]))
`);
    const zHelio = 0.02;
    const up = zCmbFromHelio(zHelio, apex[0], apex[1]);
    const down = zCmbFromHelio(zHelio, (apex[0] + 180) % 360, -apex[1]);
    // (1 + z_cmb) = (1 + z_helio)/(1 − v/c) toward the apex.
    expect(up).toBeCloseTo((1 + zHelio) / (1 - CMB_DIPOLE.speedKmS / SPEED_OF_LIGHT_KMS) - 1, 12);
    expect(down).toBeCloseTo((1 + zHelio) / (1 + CMB_DIPOLE.speedKmS / SPEED_OF_LIGHT_KMS) - 1, 12);
    expect((up - zHelio) * SPEED_OF_LIGHT_KMS).toBeGreaterThan(369);
  });
});
