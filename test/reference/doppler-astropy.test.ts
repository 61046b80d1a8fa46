// A star's redshift as a radial velocity (the window's Derived panel for class star) against
// Debian's astropy: astropy.units.doppler_relativistic, the special-relativistic Doppler
// equivalency, converting the observed wavelength λ0(1 + z) to a velocity. Requirement: 1e-9
// relative (1e-9 km/s near zero).
import { expect, it } from 'vitest';
import { radialVelocityKmS } from '../../core/astro/doppler.js';
import { astropyJson } from '../support/tools.js';

const REDSHIFTS = [-0.002, -0.0001, 0, 0.00012, 0.001, 0.01, 0.1, 1];

it('gives the radial velocity of a redshift as astropy.units.doppler_relativistic does', () => {
  const astropy = astropyJson<number[]>(`
import json, sys
import astropy.units as u
rest = 5000 * u.AA
out = [(rest * (1 + z)).to(u.km / u.s, equivalencies=u.doppler_relativistic(rest)).value for z in json.load(sys.stdin)]
print(json.dumps(out))
`, [], JSON.stringify(REDSHIFTS));
  REDSHIFTS.forEach((z, i) => expect(Math.abs(radialVelocityKmS(z) - astropy[i]), `z = ${z}`).toBeLessThan(1e-9 * Math.max(1, Math.abs(astropy[i]))));
  // Small z: v ≈ cz (the demo star at z = 0.00012 moves at about 36 km/s).
  expect(radialVelocityKmS(0.00012)).toBeCloseTo(35.97, 2);
});
