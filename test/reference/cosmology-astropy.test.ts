// ΛCDM distances against Debian's astropy (astropy.cosmology.LambdaCDM with Tcmb0 = 0, i.e. no
// radiation; one group with photons only: Tcmb0 = 2.7255 K, Neff = 0), flat and curved.
// Requirement: ≤ 1e-6 relative on every distance, the lookback time and the age. The largest
// differences (a few 1e-7, age at z = 1100) are astropy's: its quad runs with an absolute
// tolerance of 1.5e-8 Hubble times, and a tight scipy quad (epsrel 1e-13) agrees with zvet there.
import { afterAll, describe, expect, it } from 'vitest';
import { distances, type CosmologyModel, type Distances } from '../../core/astro/cosmology.js';
import { execFileSync } from 'node:child_process';
import { ZVET_BIN } from '../support/paths.js';
import { astropyJson } from '../support/tools.js';

interface Case { h0: number; om: number; ol: number; tcmb: number; z: number }
type AstropyRow = { ogamma: number; dc: number; dm: number; dl: number; da: number; mu: number; lookback: number; age: number; kpcArcsec: number };

// (H0 km/s/Mpc, Ωm, ΩΛ): flat, open and closed, from nearly empty to Einstein–de Sitter.
const MODELS: Array<[number, number, number, number]> = [
  [67.66, 0.3111, 0.6889, 0],
  [70, 0.3, 0.7, 0],
  [70, 0.3, 0, 0],
  [70, 1, 0, 0],
  [65, 0.2, 0.9, 0],
  [72, 0.25, 0.6, 0],
  [60, 0.5, 0.6, 0],
  [75, 0.05, 0, 0],
  [68, 0.3, 0.8, 0],
  [100, 0.27, 0.73, 0],
  [67.66, 0.3111, 0.6889, 2.7255],
  [70, 0.3, 0.6, 2.7255],
];
const REDSHIFTS = [0.0005, 0.05, 0.3, 1, 2.5, 7, 1100];
const CASES: Case[] = MODELS.flatMap(([h0, om, ol, tcmb]) => REDSHIFTS.map((z) => ({ h0, om, ol, tcmb, z })));

const SCRIPT = `
import json, sys
from astropy.cosmology import LambdaCDM
import astropy.units as u
out = []
for c in json.load(sys.stdin):
    m = LambdaCDM(H0=c['h0'], Om0=c['om'], Ode0=c['ol'], Tcmb0=c['tcmb'], Neff=0)
    z = c['z']
    out.append(dict(
        ogamma=float(m.Ogamma0),
        dc=m.comoving_distance(z).to_value(u.Mpc),
        dm=m.comoving_transverse_distance(z).to_value(u.Mpc),
        dl=m.luminosity_distance(z).to_value(u.Mpc),
        da=m.angular_diameter_distance(z).to_value(u.Mpc),
        mu=m.distmod(z).to_value(u.mag),
        lookback=m.lookback_time(z).to_value(u.Gyr),
        age=m.age(z).to_value(u.Gyr),
        kpcArcsec=m.kpc_proper_per_arcmin(z).to_value(u.kpc / u.arcmin) / 60,
    ))
print(json.dumps(out))
`;

const FIELDS: Array<[keyof Distances, keyof AstropyRow]> = [
  ['comovingMpc', 'dc'], ['transverseMpc', 'dm'], ['luminosityMpc', 'dl'], ['angularMpc', 'da'],
  ['lookbackGyr', 'lookback'], ['ageGyr', 'age'], ['kpcPerArcsec', 'kpcArcsec'],
];

const worst = { relative: 0, relativeWhere: '', relativeNoRadiation: 0, relativeNoRadiationWhere: '', muMag: 0, muWhere: '' };

describe('cosmology against astropy LambdaCDM', () => {
  const reference = astropyJson<AstropyRow[]>(SCRIPT, [], JSON.stringify(CASES));

  it('covers at least 30 combinations including curved models', () => {
    expect(CASES.length).toBeGreaterThanOrEqual(30);
    expect(CASES.filter((c) => Math.abs(1 - c.om - c.ol) > 0.01).length).toBeGreaterThanOrEqual(30);
  });

  it.each(CASES.map((c, i) => [`z=${c.z} H0=${c.h0} Ωm=${c.om} ΩΛ=${c.ol} Tcmb=${c.tcmb}`, c, i] as const))('%s', (label, c, i) => {
    const ref = reference[i];
    const model: CosmologyModel = { name: 'test', h0: c.h0, omegaM: c.om, omegaL: c.ol, omegaR: ref.ogamma, source: 'test' };
    const d = distances(c.z, model);
    for (const [ours, theirs] of FIELDS) {
      const rel = Math.abs(d[ours] / ref[theirs] - 1);
      if (rel > worst.relative) Object.assign(worst, { relative: rel, relativeWhere: `${label} ${ours}` });
      if (c.tcmb === 0 && rel > worst.relativeNoRadiation) Object.assign(worst, { relativeNoRadiation: rel, relativeNoRadiationWhere: `${label} ${ours}` });
      expect(rel, `${ours}: zvet ${d[ours]} astropy ${ref[theirs]}`).toBeLessThanOrEqual(1e-6);
    }
    // 1e-6 relative in D_L is 5/ln 10 · 1e-6 ≈ 2.2e-6 mag in the distance modulus.
    const dmu = Math.abs(d.distanceModulusMag - ref.mu);
    if (dmu > worst.muMag) Object.assign(worst, { muMag: dmu, muWhere: label });
    expect(dmu).toBeLessThanOrEqual(2.2e-6);
  });

  it("states in `zvet cosmo` what leaving radiation out of the presets costs, as astropy measures it (photons and neutrinos: Tcmb0 = 2.7255 K, Neff = 3.046)", () => {
    const effect = astropyJson<Array<{ z: number; age: number; dl: number }>>(`
import json
from astropy.cosmology import FlatLambdaCDM
with_r = FlatLambdaCDM(H0=67.66, Om0=0.3111, Tcmb0=2.7255, Neff=3.046)
without = FlatLambdaCDM(H0=67.66, Om0=0.3111, Tcmb0=0)
print(json.dumps([dict(z=z, age=float(without.age(z).value / with_r.age(z).value - 1), dl=float(without.luminosity_distance(z).value / with_r.luminosity_distance(z).value - 1)) for z in (2, 5, 10, 20, 1100)]))
`);
    const at = (z: number) => effect.find((e) => e.z === z)!;
    for (const z of [2, 5, 10]) {
      expect(at(z).dl).toBeLessThan(0.0005);
      expect(at(z).age).toBeLessThan(0.005);
    }
    const note = execFileSync(process.execPath, [ZVET_BIN, 'cosmo', '1100'], { encoding: 'utf8' }).trimEnd().split('\n').at(-1)!;
    expect(note).toContain(`at z = 20 the age comes out ${(100 * at(20).age).toFixed(1)} % and at z = 1100 ${(100 * at(1100).age).toFixed(0)} % higher`);
    expect(execFileSync(process.execPath, [ZVET_BIN, 'cosmo', '10'], { encoding: 'utf8' })).not.toContain('radiation');
  });

  afterAll(() => {
    console.info(`cosmology vs astropy: worst relative ${worst.relative.toExponential(2)} (${worst.relativeWhere}), ${worst.relativeNoRadiation.toExponential(2)} with Tcmb0 = 0 (${worst.relativeNoRadiationWhere}); worst |Δμ| ${worst.muMag.toExponential(2)} mag (${worst.muWhere})`);
  });
});
