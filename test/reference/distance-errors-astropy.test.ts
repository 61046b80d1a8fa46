// Errors of the luminosity distance and distance modulus (core/astro/distance-errors.ts):
// the slope dD_L/dz against a central difference of Debian's astropy LambdaCDM luminosity
// distances (flat, open and closed, with and without photons), and the low-z limit against
// Hubble's law D = v/H0 (Hubble 1929, PNAS 15, 168), where a peculiar velocity σ_v is a
// distance error σ_v/H0.
import { describe, expect, it } from 'vitest';
import { SPEED_OF_LIGHT_KMS } from '../../core/astro/constants.js';
import { COSMOLOGY_PRESETS, distances, luminosityDistanceSlopeMpc, type CosmologyModel } from '../../core/astro/cosmology.js';
import { distanceErrors, PECULIAR_VELOCITY_KMS } from '../../core/astro/distance-errors.js';
import { astropyJson } from '../support/tools.js';

// (H0 km/s/Mpc, Ωm, ΩΛ, Tcmb0 K): flat, open, closed, matter only, with photons.
const MODELS: Array<[number, number, number, number]> = [
  [67.66, 0.3111, 0.6889, 0],
  [70, 0.3, 0, 0],
  [68, 0.3, 0.8, 0],
  [70, 1, 0, 0],
  [67.66, 0.3111, 0.6889, 2.7255],
];
const REDSHIFTS = [0.0005, 0.01, 0.05, 0.3, 1, 2.5, 7];
const CASES = MODELS.flatMap(([h0, om, ol, tcmb]) => REDSHIFTS.map((z) => ({ h0, om, ol, tcmb, z, h: Math.min(1e-3 * (1 + z), z / 2) })));

// The step h keeps the O(h²) truncation below 1e-6 of the slope, and astropy's quadrature noise
// (absolute 1.5e-8 Hubble distances) divided by 2h below 3e-5 of it.
const SCRIPT = `
import json, sys
from astropy.cosmology import LambdaCDM
import astropy.units as u
out = []
for c in json.load(sys.stdin):
    m = LambdaCDM(H0=c['h0'], Om0=c['om'], Ode0=c['ol'], Tcmb0=c['tcmb'], Neff=0)
    z, h = c['z'], c['h']
    dl = lambda x: m.luminosity_distance(x).to_value(u.Mpc)
    out.append(dict(ogamma=float(m.Ogamma0), slope=(dl(z + h) - dl(z - h)) / (2 * h)))
print(json.dumps(out))
`;

describe('luminosity-distance errors', () => {
  const reference = astropyJson<Array<{ ogamma: number; slope: number }>>(SCRIPT, [], JSON.stringify(CASES));

  it.each(CASES.map((c, i) => [`z=${c.z} H0=${c.h0} Ωm=${c.om} ΩΛ=${c.ol} Tcmb=${c.tcmb}`, c, i] as const))('dD_L/dz at %s equals astropy’s central difference within 1e-4', (_label, c, i) => {
    const model: CosmologyModel = { name: 'test', h0: c.h0, omegaM: c.om, omegaL: c.ol, omegaR: reference[i].ogamma, source: 'test' };
    const slope = luminosityDistanceSlopeMpc(distances(c.z, model), model);
    expect(Math.abs(slope / reference[i].slope - 1), `zvet ${slope} astropy ${reference[i].slope}`).toBeLessThan(1e-4);
  });

  it('propagates σz and the peculiar velocity in quadrature, and σμ = (5/ln 10)·σ_DL/D_L', () => {
    const model = COSMOLOGY_PRESETS.planck18;
    const d = distances(0.3, model);
    const e = distanceErrors(d, 4e-4, model);
    const zErr = Math.hypot(4e-4, (1.3 * PECULIAR_VELOCITY_KMS) / SPEED_OF_LIGHT_KMS);
    expect(e.zErr).toBeCloseTo(zErr, 15);
    expect(e.luminosityMpc / (luminosityDistanceSlopeMpc(d, model) * zErr) - 1).toBeCloseTo(0, 12);
    expect(e.distanceModulusMag).toBeCloseTo(((5 / Math.LN10) * e.luminosityMpc) / d.luminosityMpc, 12);
  });

  it('gives σ_v/H0 at low z, as Hubble’s law does (300 km/s at H0 = 67.66 is 4.43 Mpc)', () => {
    const model = COSMOLOGY_PRESETS.planck18;
    const e = distanceErrors(distances(0.001, model), null, model);
    // At z = 0.001 the slope and the (1+z) of the velocity term differ from 1 by about 0.2 %.
    expect(Math.abs(e.luminosityMpc / (PECULIAR_VELOCITY_KMS / model.h0) - 1)).toBeLessThan(5e-3);
    // A 300 km/s velocity at cz = 3000 km/s is a 10 % distance, 0.217 mag (5/ln 10 · 0.1).
    const near = distanceErrors(distances(0.01, model), null, model);
    expect(near.distanceModulusMag).toBeGreaterThan(0.2);
    expect(near.distanceModulusMag).toBeLessThan(0.23);
  });

  it('stays positive in a closed model where D_L turns over (Ωm = 0.3, ΩΛ = 1.6: it falls from between z = 1 and 2)', () => {
    const model: CosmologyModel = { name: 'closed', h0: 70, omegaM: 0.3, omegaL: 1.6, source: 'test' };
    const d = distances(2, model);
    expect(luminosityDistanceSlopeMpc(d, model)).toBeLessThan(0);
    const e = distanceErrors(d, 1e-3, model);
    expect(e.luminosityMpc).toBeGreaterThan(0);
    expect(e.distanceModulusMag).toBeGreaterThan(0);
  });
});
