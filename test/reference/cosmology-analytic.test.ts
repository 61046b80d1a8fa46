// Closed-form cases of Hogg (1999, astro-ph/9905116) and common practice.
import { describe, expect, it } from 'vitest';
import { distances, hubbleDistanceMpc, hubbleTimeGyr, type CosmologyModel } from '../../core/astro/cosmology.js';

const model = (h0: number, omegaM: number, omegaL: number): CosmologyModel => ({ name: 't', h0, omegaM, omegaL, source: 'test' });
const REDSHIFTS = [0.001, 0.1, 0.5, 1, 3, 10, 100];

describe('analytic cosmologies', () => {
  it('Einstein–de Sitter: D_C = 2 D_H (1 − 1/√(1+z)), t = (2/3) t_H (1+z)^(−3/2) (Hogg 1999 §5, §11)', () => {
    const m = model(70, 1, 0);
    for (const z of REDSHIFTS) {
      const d = distances(z, m);
      expect(d.comovingMpc / (2 * hubbleDistanceMpc(m) * (1 - 1 / Math.sqrt(1 + z))) - 1).toBeLessThan(1e-12);
      expect(d.ageGyr / ((2 / 3) * hubbleTimeGyr(m) * (1 + z) ** -1.5) - 1).toBeLessThan(1e-12);
    }
  });

  it('empty (Milne) universe: D_C = D_H ln(1+z), D_M = D_H z(1 + z/2)/(1+z), t = t_H/(1+z) (Hogg 1999 eq. 16 with Ωm → 0)', () => {
    const m = model(70, 0, 0);
    for (const z of REDSHIFTS) {
      const d = distances(z, m);
      const dh = hubbleDistanceMpc(m);
      expect(Math.abs(d.comovingMpc / (dh * Math.log1p(z)) - 1)).toBeLessThan(1e-12);
      expect(Math.abs(d.transverseMpc / ((dh * z * (1 + z / 2)) / (1 + z)) - 1)).toBeLessThan(1e-12);
      expect(Math.abs(d.ageGyr / (hubbleTimeGyr(m) / (1 + z)) - 1)).toBeLessThan(1e-12);
      expect(Math.abs(d.lookbackGyr / ((hubbleTimeGyr(m) * z) / (1 + z)) - 1)).toBeLessThan(1e-12);
    }
  });

  it('open ΩΛ = 0: Mattig’s D_M = D_H 2[2 − Ωm(1 − z) − (2 − Ωm)√(1 + Ωm z)] / (Ωm²(1+z)) (Hogg 1999 eq. 16 note, after Weinberg 1972)', () => {
    const om = 0.3;
    const m = model(65, om, 0);
    for (const z of REDSHIFTS) {
      const mattig = (hubbleDistanceMpc(m) * 2 * (2 - om * (1 - z) - (2 - om) * Math.sqrt(1 + om * z))) / (om * om * (1 + z));
      expect(Math.abs(distances(z, m).transverseMpc / mattig - 1)).toBeLessThan(1e-10);
    }
  });

  it('flat ΛCDM age t0 = (2/3) t_H asinh(√(ΩΛ/Ωm))/√ΩΛ; Ωm = 0.27, H0 = 71 gives about 13.7 Gyr (common practice, value from memory)', () => {
    const m = model(71, 0.27, 0.73);
    const t0 = distances(0, m).ageGyr;
    expect(Math.abs(t0 / (((2 / 3) * hubbleTimeGyr(m) * Math.asinh(Math.sqrt(0.73 / 0.27))) / Math.sqrt(0.73)) - 1)).toBeLessThan(1e-12);
    expect(t0).toBeGreaterThan(13.6);
    expect(t0).toBeLessThan(13.8);
  });

  it('z = 0 is the origin; de Sitter has no finite age; bad models and redshifts are refused', () => {
    const d0 = distances(0, model(70, 0.3, 0.7));
    expect([d0.comovingMpc, d0.luminosityMpc, d0.lookbackGyr, d0.kpcPerArcsec]).toEqual([0, 0, 0, 0]);
    expect(d0.distanceModulusMag).toBe(-Infinity);
    expect(distances(1, model(70, 0, 1)).ageGyr).toBe(Infinity);
    expect(() => distances(-0.1, model(70, 0.3, 0.7))).toThrow(/redshift must be a number ≥ 0/);
    expect(() => distances(1, model(-70, 0.3, 0.7))).toThrow(/H0 must be a positive/);
    // Ωm = 0.1, ΩΛ = 1.5: a bouncing model that never reached z = 3.
    expect(() => distances(3, model(70, 0.1, 1.5))).toThrow(/E\(z\)² ≤ 0/);
  });
});
