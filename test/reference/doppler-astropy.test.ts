// A star's redshift as a radial velocity (the window's Derived panel for class star) against
// Debian's astropy: astropy.units.doppler_relativistic, the special-relativistic Doppler
// equivalency, converting the observed wavelength λ0(1 + z) to a velocity. Requirement: 1e-9
// relative (1e-9 km/s near zero). Its 1σ, from σz by the derivative, is checked against a finite
// difference of the same formula (an internal check, no outside source).
import { expect, it } from 'vitest';
import { radialVelocityErrKmS, radialVelocityKmS } from '../../core/astro/doppler.js';
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

it('propagates σz to σv by the derivative of the Doppler formula (checked against a finite difference)', () => {
  for (const z of [0, 0.00012, 0.3, 2]) {
    const h = 1e-7;
    const slope = (radialVelocityKmS(z + h) - radialVelocityKmS(z - h)) / (2 * h);
    expect(radialVelocityErrKmS(z, 3e-5) / (slope * 3e-5)).toBeCloseTo(1, 6);
  }
  // At z ≈ 0, σv = c·σz: σz = 3.0e-5 is 8.99 km/s.
  expect(radialVelocityErrKmS(0, 3e-5)).toBeCloseTo(8.994, 3);
});
