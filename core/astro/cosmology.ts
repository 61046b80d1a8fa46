/**
 * ΛCDM distances and times, flat or curved, after Hogg (1999, "Distance measures in cosmology",
 * astro-ph/9905116): comoving (line-of-sight and transverse), angular-diameter and luminosity
 * distances, distance modulus, lookback time, age at z and the proper scale in kpc per arcsec.
 */
import { KM_PER_MPC, RAD_PER_ARCSEC, SECONDS_PER_GYR, SPEED_OF_LIGHT_KMS } from './constants.js';
import { integrate } from './quadrature.js';

export interface CosmologyModel {
  name: string;
  /** Hubble constant, km/s/Mpc. */
  h0: number;
  /** Matter density today, in units of the critical density. */
  omegaM: number;
  /** Cosmological-constant density today. */
  omegaL: number;
  /** Radiation density today (neglected when absent). */
  omegaR?: number;
  /** Where the numbers come from. */
  source: string;
}

export interface Distances {
  z: number;
  /** Line-of-sight comoving distance D_C, Mpc (Hogg eq. 15). */
  comovingMpc: number;
  /** Transverse comoving distance D_M, Mpc (Hogg eq. 16). */
  transverseMpc: number;
  /** Luminosity distance D_L = (1+z) D_M, Mpc (Hogg eq. 21). */
  luminosityMpc: number;
  /** Angular-diameter distance D_A = D_M/(1+z), Mpc (Hogg eq. 18). */
  angularMpc: number;
  /** Distance modulus 5 log10(D_L / 10 pc), mag (Hogg eq. 24); −Infinity at z = 0. */
  distanceModulusMag: number;
  /** Lookback time, Gyr (Hogg eq. 30). */
  lookbackGyr: number;
  /** Age of the universe at z, Gyr (Hogg eq. 30 integrated from z to ∞); Infinity without a big bang singularity of matter or radiation. */
  ageGyr: number;
  /** Proper transverse size of one arcsecond at z, kpc. */
  kpcPerArcsec: number;
}

const PLANCK18_OMEGA_M = 0.3111;

export const COSMOLOGY_PRESETS: Record<string, CosmologyModel> = {
  planck18: {
    name: 'planck18',
    h0: 67.66,
    omegaM: PLANCK18_OMEGA_M,
    omegaL: 1 - PLANCK18_OMEGA_M,
    source: 'Planck 2018 results VI (A&A 641, A6, 2020), Table 2, TT,TE,EE+lowE+lensing+BAO; flat',
  },
  round70: {
    name: 'round70',
    h0: 70,
    omegaM: 0.3,
    omegaL: 0.7,
    source: 'round values H0 = 70, Ωm = 0.3, ΩΛ = 0.7 (common practice, no source)',
  },
};

/** A parameter as it was defined, for display: ΩΛ = 1 − 0.3111 is 0.6889, not its binary rounding 0.6889000000000001. */
export function asDefined(x: number): number {
  return Number(x.toPrecision(12));
}

/** Curvature density Ω_k = 1 − Ωm − ΩΛ − Ωr (Hogg eq. 7). */
export function omegaK(model: CosmologyModel): number {
  return 1 - model.omegaM - model.omegaL - (model.omegaR ?? 0);
}

/** Hubble distance c/H0, Mpc (Hogg eq. 4). */
export function hubbleDistanceMpc(model: CosmologyModel): number {
  return SPEED_OF_LIGHT_KMS / model.h0;
}

/** Hubble time 1/H0, Gyr (Hogg eq. 3). */
export function hubbleTimeGyr(model: CosmologyModel): number {
  return KM_PER_MPC / model.h0 / SECONDS_PER_GYR;
}

/** Throws a RangeError naming the first unusable parameter. */
export function checkModel(model: CosmologyModel): void {
  const { h0, omegaM, omegaL } = model;
  const omegaR = model.omegaR ?? 0;
  if (!(Number.isFinite(h0) && h0 > 0)) throw new RangeError(`H0 must be a positive number of km/s/Mpc, got ${h0}`);
  if (!(Number.isFinite(omegaM) && omegaM >= 0)) throw new RangeError(`Ωm must be a number ≥ 0, got ${omegaM}`);
  if (!Number.isFinite(omegaL)) throw new RangeError(`ΩΛ must be a number, got ${omegaL}`);
  if (!(Number.isFinite(omegaR) && omegaR >= 0)) throw new RangeError(`Ωr must be a number ≥ 0, got ${omegaR}`);
}

/**
 * The integrands in s = √a = (1+z)^(−1/2), which keeps them smooth down to a = 0 (the age
 * integral runs to z = ∞). With R(s) = a³E(a)² = Ωr/s² + Ωm + Ωk s² + ΩΛ s⁶ (Hogg eq. 14,
 * E(z)² = Ωr(1+z)⁴ + Ωm(1+z)³ + Ωk(1+z)² + ΩΛ):
 *   dz/E(z)         = 2/√R ds      (comoving distance, Hogg eq. 15)
 *   dz/((1+z)E(z))  = 2s²/√R ds    (lookback time and age, Hogg eq. 30)
 */
function integrands(model: CosmologyModel) {
  const { omegaM, omegaL } = model;
  const omegaR = model.omegaR ?? 0;
  const ok = omegaK(model);
  const r = (s: number): number => {
    const s2 = s * s;
    const value = (omegaR > 0 ? omegaR / s2 : 0) + omegaM + ok * s2 + omegaL * s2 * s2 * s2;
    if (!(value > 0)) {
      throw new RangeError(`the model (Ωm = ${omegaM}, ΩΛ = ${omegaL}) has E(z)² ≤ 0 at z = ${(1 / s2 - 1).toPrecision(4)}: that redshift is never reached`);
    }
    return value;
  };
  return {
    comoving: (s: number) => 2 / Math.sqrt(r(s)),
    time: (s: number) => (2 * s * s) / Math.sqrt(r(s)),
  };
}

/** D_M from D_C for the model's curvature (Hogg eq. 16). */
function transverseFromComoving(comovingMpc: number, model: CosmologyModel): number {
  const ok = omegaK(model);
  const dh = hubbleDistanceMpc(model);
  if (ok > 0) return (dh / Math.sqrt(ok)) * Math.sinh((Math.sqrt(ok) * comovingMpc) / dh);
  if (ok < 0) return (dh / Math.sqrt(-ok)) * Math.sin((Math.sqrt(-ok) * comovingMpc) / dh);
  return comovingMpc;
}

/** Whether the age integral diverges: no matter or radiation, so no big-bang singularity. */
function ageIsInfinite(model: CosmologyModel): boolean {
  return model.omegaM === 0 && (model.omegaR ?? 0) === 0 && model.omegaL > 0;
}

/** All distance measures at redshift z ≥ 0 for the model. Throws a RangeError for bad input. */
export function distances(z: number, model: CosmologyModel): Distances {
  if (!(Number.isFinite(z) && z >= 0)) throw new RangeError(`redshift must be a number ≥ 0 for distances, got ${z}`);
  checkModel(model);
  const f = integrands(model);
  const sz = 1 / Math.sqrt(1 + z);
  const comovingMpc = hubbleDistanceMpc(model) * integrate(f.comoving, sz, 1);
  const transverseMpc = transverseFromComoving(comovingMpc, model);
  const th = hubbleTimeGyr(model);
  const lookbackGyr = th * integrate(f.time, sz, 1);
  const ageGyr = ageIsInfinite(model) ? Infinity : th * integrate(f.time, 0, sz);
  const luminosityMpc = (1 + z) * transverseMpc;
  const angularMpc = transverseMpc / (1 + z);
  return {
    z,
    comovingMpc,
    transverseMpc,
    luminosityMpc,
    angularMpc,
    distanceModulusMag: 5 * Math.log10(luminosityMpc) + 25,
    lookbackGyr,
    ageGyr,
    kpcPerArcsec: angularMpc * 1000 * RAD_PER_ARCSEC,
  };
}

/** E(z) = H(z)/H0 = √(Ωr(1+z)⁴ + Ωm(1+z)³ + Ωk(1+z)² + ΩΛ) (Hogg eq. 14). */
export function hubbleE(z: number, model: CosmologyModel): number {
  const x = 1 + z;
  return Math.sqrt((((model.omegaR ?? 0) * x + model.omegaM) * x + omegaK(model)) * x * x + model.omegaL);
}

/**
 * dD_L/dz, Mpc per unit z, at the distances d of the same model: with dD_C/dz = D_H/E(z) (Hogg
 * eq. 15), dD_M/dz = dD_C/dz · {cosh, 1, cos}(√|Ωk| D_C/D_H) (eq. 16) and D_L = (1+z) D_M (eq. 21),
 * dD_L/dz = D_M + (1+z) dD_M/dz.
 */
export function luminosityDistanceSlopeMpc(d: Distances, model: CosmologyModel): number {
  const ok = omegaK(model), dh = hubbleDistanceMpc(model), x = (Math.sqrt(Math.abs(ok)) * d.comovingMpc) / dh;
  const curvature = ok > 0 ? Math.cosh(x) : ok < 0 ? Math.cos(x) : 1;
  return d.transverseMpc + ((1 + d.z) * dh * curvature) / hubbleE(d.z, model);
}
