/**
 * A local linear continuum plus Gaussian lines, each line placed at λ_rest·(1+z)·(1+Δv/c)
 * with a width σ_λ = λ_centre·σ_v/c, and its analytic Jacobian.
 *
 * Parameter vector: [c0, c1, then the free velocity offsets (km/s), widths (km/s) and line
 * fluxes (flux-density unit × Å) as the terms and kinematic components name them].
 * The continuum is c0 + c1·t with t = (λ − λ_mid)/span, so c1 is the change across the window.
 */
import { SPEED_OF_LIGHT_KMS as C_KM_S } from '../astro/constants.js';

const SQRT_2PI = Math.sqrt(2 * Math.PI);

/** Shared kinematics of a set of lines: a parameter index or a fixed value for each. */
export interface Kinematics {
  dv: { param: number } | { fixedKmS: number };
  sigma: { param: number } | { fixedKmS: number };
}

/** One Gaussian: its flux is ratio × params[fluxParam] (× params[ratioParam] when set). */
export interface GaussianTerm {
  restWaveAngstrom: number;
  fluxParam: number;
  ratio: number;
  ratioParam?: number;
  kinematics: number;
}

export interface GaussianModel {
  z: number;
  waveMidAngstrom: number;
  waveSpanAngstrom: number;
  kinematics: Kinematics[];
  terms: GaussianTerm[];
  nParams: number;
}

function valueOf(ref: { param: number } | { fixedKmS: number }, p: ArrayLike<number>): number {
  return 'param' in ref ? p[ref.param] : ref.fixedKmS;
}

/** Observed centre (Å) and width σ_λ (Å) of a term. */
export function termShape(model: GaussianModel, term: GaussianTerm, p: ArrayLike<number>): { centre: number; sigma: number } {
  const k = model.kinematics[term.kinematics];
  const centre = term.restWaveAngstrom * (1 + model.z) * (1 + valueOf(k.dv, p) / C_KM_S);
  return { centre, sigma: (centre * valueOf(k.sigma, p)) / C_KM_S };
}

/** Flux of a term (flux-density unit × Å) and its gradient with respect to the parameters. */
export function termFlux(term: GaussianTerm, p: ArrayLike<number>): number {
  return term.ratio * p[term.fluxParam] * (term.ratioParam === undefined ? 1 : p[term.ratioParam]);
}

export function termFluxGradient(term: GaussianTerm, p: ArrayLike<number>, nParams: number): number[] {
  const d = new Array<number>(nParams).fill(0);
  const free = term.ratioParam === undefined ? 1 : p[term.ratioParam];
  d[term.fluxParam] = term.ratio * free;
  if (term.ratioParam !== undefined) d[term.ratioParam] = term.ratio * p[term.fluxParam];
  return d;
}

export function continuumAt(model: GaussianModel, p: ArrayLike<number>, waveAngstrom: number): number {
  return p[0] + p[1] * ((waveAngstrom - model.waveMidAngstrom) / model.waveSpanAngstrom);
}

/** Model value at one wavelength. */
export function evaluate(model: GaussianModel, p: ArrayLike<number>, waveAngstrom: number): number {
  let y = continuumAt(model, p, waveAngstrom);
  for (const term of model.terms) {
    const { centre, sigma } = termShape(model, term, p);
    const u = (waveAngstrom - centre) / sigma;
    if (Math.abs(u) < 12) y += (termFlux(term, p) * Math.exp(-0.5 * u * u)) / (SQRT_2PI * sigma);
  }
  return y;
}

/** ∂model/∂p at one wavelength. */
export function jacobian(model: GaussianModel, p: ArrayLike<number>, waveAngstrom: number): number[] {
  const d = new Array<number>(model.nParams).fill(0);
  d[0] = 1;
  d[1] = (waveAngstrom - model.waveMidAngstrom) / model.waveSpanAngstrom;
  for (const term of model.terms) {
    const k = model.kinematics[term.kinematics];
    const base = term.restWaveAngstrom * (1 + model.z);
    const dvKmS = valueOf(k.dv, p);
    const sigmaKmS = valueOf(k.sigma, p);
    const centre = base * (1 + dvKmS / C_KM_S);
    const sigma = (centre * sigmaKmS) / C_KM_S;
    const u = (waveAngstrom - centre) / sigma;
    if (Math.abs(u) >= 12) continue;
    const g = Math.exp(-0.5 * u * u) / (SQRT_2PI * sigma);
    const free = term.ratioParam === undefined ? 1 : p[term.ratioParam];
    const flux = term.ratio * free * p[term.fluxParam];
    d[term.fluxParam] += term.ratio * free * g;
    if (term.ratioParam !== undefined) d[term.ratioParam] += term.ratio * p[term.fluxParam] * g;
    // g depends on the centre μ (∂g/∂μ = g·u/σ_λ) and on σ_λ (∂g/∂σ_λ = g·(u²−1)/σ_λ);
    // μ and σ_λ both move with Δv, σ_λ with σ_v.
    const dgdMu = (g * u) / sigma;
    const dgdS = (g * (u * u - 1)) / sigma;
    if ('param' in k.dv) d[k.dv.param] += flux * (dgdMu * (base / C_KM_S) + dgdS * ((base / C_KM_S) * sigmaKmS) / C_KM_S);
    if ('param' in k.sigma) d[k.sigma.param] += flux * dgdS * (centre / C_KM_S);
  }
  return d;
}
