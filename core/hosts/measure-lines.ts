/**
 * Emission-line measurement at a given redshift: each group of LINE_GROUPS is fitted with a
 * local linear continuum and Gaussians sharing one velocity offset and width; Balmer lines also
 * get a stellar absorption component (see STELLAR_ABSORPTION_METHOD) and, where the data ask for
 * it, a broad component. Lines below S/N 3 are reported as 3σ upper limits.
 */
import { inUnitsOfNoise } from '../redshift/flux-scale.js';
import { median } from '../redshift/continuum.js';
import { REST_LINES } from '../redshift/line-list.js';
import type { Spectrum } from '../spectrum/spectrum.js';
import { fitGaussians, solveLinear, type FitBounds, type FitData, type FitResult } from './fit-gaussians.js';
import { SPEED_OF_LIGHT_KMS as C_KM_S } from '../astro/constants.js';
import { continuumAt, termFlux, termFluxGradient, termShape, type GaussianModel, type GaussianTerm, type Kinematics } from './gaussian-model.js';
import { LINE_GROUPS, parentOf, type GroupLine, type LineGroup } from './line-groups.js';

/** One measured line; keys are snake_case because they go straight into JSON output. */
export interface LineMeasurement {
  /** Line id from the rest-frame list; broad Balmer components end in '_broad'. */
  name: string;
  /** Rest-frame vacuum wavelength, Å. */
  rest_wave: number;
  /** Line flux in the spectrum's flux-density unit × Å; the 3σ upper limit when `limit`. */
  flux: number;
  flux_err: number;
  /** Rest-frame equivalent width, Å, positive for emission. */
  ew_rest: number;
  ew_rest_err: number;
  /** Fitted flux / its 1σ error (also for limits, where it is below 3). */
  sn: number;
  /** Intrinsic FWHM, km/s (instrumental width removed when known); null for limits. */
  fwhm_kms: number | null;
  fwhm_kms_err: number | null;
  /** Velocity of the line relative to the given z, km/s. */
  velocity_offset_kms: number;
  /** True when `flux` is a 3σ upper limit (fitted S/N below 3). */
  limit: boolean;
  component: 'narrow' | 'broad';
  group: string;
}

export interface StellarAbsorption {
  line: string;
  /** Rest-frame equivalent width of the fitted absorption, Å, positive for absorption. */
  ew_rest: number;
  ew_rest_err: number;
}

export interface GroupFitSummary {
  group: string;
  pixels: number;
  chi2_reduced: number;
  broad_component: boolean;
  /** True when the group was too weak for its own kinematics and was refitted with the strongest group's. */
  kinematics_fixed: boolean;
}

export interface LineMeasurementSet {
  lines: LineMeasurement[];
  stellar_absorption: StellarAbsorption[];
  groups: GroupFitSummary[];
  /** Lines of the groups whose window the spectrum does not cover (or only with bad pixels). */
  not_covered: string[];
  /** Instrumental FWHM used to correct the widths, Å (observed frame); null when not known. */
  instrumental_fwhm_angstrom: number | null;
  errors_from_scatter: boolean;
}

export interface MeasureOptions {
  /** Instrumental FWHM in observed Å; without it the FWHM values include the instrument. */
  instrumentalFwhmAngstrom?: number;
}

export const STELLAR_ABSORPTION_METHOD =
  'Under Hβ and Hα a Gaussian absorption component (same velocity as the emission, width free ' +
  'between 8 and 25 Å rest, equivalent width up to about 10 Å under Hβ and 5 Å under Hα against the window\'s median flux) is fitted together with the emission and the local ' +
  'continuum; emission fluxes are those of the emission component alone, so they are corrected ' +
  'for the underlying stellar absorption. Fitting the absorption rather than adding a fixed ' +
  'equivalent-width correction is common practice (no single source); no correction is applied ' +
  'where a broad component is fitted instead.';

export const DETECTION_SN = 3;

/**
 * The widest instrumental FWHM the line fit can work with at z, observed Å: a third of the
 * narrowest fit window (common practice, no source: a line needs continuum on both sides).
 */
export function maxInstrumentalFwhmAngstrom(z: number): { fwhmAngstrom: number; window: string } {
  const narrowest = [...LINE_GROUPS].sort((a, b) => (a.windowRestAngstrom[1] - a.windowRestAngstrom[0]) - (b.windowRestAngstrom[1] - b.windowRestAngstrom[0]))[0];
  const [lo, hi] = narrowest.windowRestAngstrom;
  return { fwhmAngstrom: ((hi - lo) * (1 + z)) / 3, window: `${narrowest.name}, ${hi - lo} Å rest` };
}
const SIGMA_PER_FWHM = 2 * Math.sqrt(2 * Math.log(2));
const OTHER_LINE_MASK_REST_ANGSTROM = 8;
const NARROW_SIGMA_KM_S: [number, number] = [10, 400];
const NARROW_DV_KM_S = 400;
const ABSORPTION_SIGMA_REST_ANGSTROM: [number, number] = [8, 25];
// Caps on the absorption depth (loose; common practice, no source): stellar Hα absorption is
// weaker than Hβ in all populations, a few Å at most.
const ABSORPTION_MAX_EW_REST_ANGSTROM: Record<string, number> = { Hbeta: 10, Halpha: 5 };
const BROAD_SIGMA_KM_S: [number, number] = [600, 6000];
const BROAD_DV_KM_S = 2000;
// A broad component must be clearly required (common practice, no source): Δχ² > 50 over the
// narrow+absorption fit, broad flux S/N > 5, a rest EW above 10 Å and FWHM ≥ 2000 km/s (wings
// of narrower lines, e.g. outflows in starbursts, are not broad-line regions).
const BROAD_MIN_DCHI2 = 50;
const BROAD_MIN_SN = 5;
const BROAD_MIN_EW_REST = 10;
const BROAD_MIN_FWHM_KM_S = 2000;

interface Window {
  data: FitData;
  lines: GroupLine[];
}

interface GroupFit {
  group: LineGroup;
  lines: GroupLine[];
  model: GaussianModel;
  fit: FitResult;
  broad: boolean;
  kinematicsFixed: boolean;
  data: FitData;
  /** Parameter index of each free flux, by line id (broad as id + '_broad', absorption as id + '_abs'). */
  fluxParam: Map<string, number>;
}

function instrumentalSigmaKmS(options: MeasureOptions, observedWave: number): number {
  const fwhm = options.instrumentalFwhmAngstrom;
  return fwhm && fwhm > 0 ? (C_KM_S * fwhm) / SIGMA_PER_FWHM / observedWave : 0;
}

function errorsAreKnown(spectrum: Spectrum): boolean {
  let known = 0;
  for (let i = 0; i < spectrum.error.length; i++) if (spectrum.error[i] > 0 && Number.isFinite(spectrum.error[i])) known++;
  return known > spectrum.error.length / 2;
}

function selectWindow(spectrum: Spectrum, z: number, group: LineGroup, errorsKnown: boolean): Window | null {
  const [lo, hi] = group.windowRestAngstrom.map((w) => w * (1 + z));
  const ids = new Set(group.lines.map((l) => l.id));
  const others = REST_LINES.filter(
    (l) => l.kind !== 'absorption' && !ids.has(l.id) && l.waveVacuumAngstrom > group.windowRestAngstrom[0] - OTHER_LINE_MASK_REST_ANGSTROM && l.waveVacuumAngstrom < group.windowRestAngstrom[1] + OTHER_LINE_MASK_REST_ANGSTROM,
  ).map((l) => l.waveVacuumAngstrom * (1 + z));
  const maskHalf = OTHER_LINE_MASK_REST_ANGSTROM * (1 + z);
  const data: FitData = { waveAngstrom: [], flux: [], sigma: [], errorsKnown };
  const w = spectrum.waveAngstrom;
  for (let i = 0; i < w.length; i++) {
    if (w[i] < lo || w[i] > hi || spectrum.mask[i] || !Number.isFinite(spectrum.flux[i])) continue;
    const e = spectrum.error[i];
    if (errorsKnown && !(e > 0 && Number.isFinite(e))) continue;
    if (others.some((o) => Math.abs(w[i] - o) < maskHalf)) continue;
    data.waveAngstrom.push(w[i]);
    data.flux.push(spectrum.flux[i]);
    data.sigma.push(errorsKnown ? e : 1);
  }
  // A line counts as covered when good pixels lie within ±3 Å rest on both sides of its centre.
  const covered = (rest: number) => {
    const c = rest * (1 + z);
    const d = 3 * (1 + z);
    return data.waveAngstrom.some((x) => x >= c - d && x < c) && data.waveAngstrom.some((x) => x >= c && x <= c + d);
  };
  let lines = group.lines.filter((l) => covered(l.restWaveAngstrom));
  lines = lines.filter((l) => !parentOf(l) || lines.some((p) => p.id === parentOf(l)));
  if (lines.length === 0 || data.waveAngstrom.length < 12) return null;
  return { data, lines };
}

interface ModelPlan {
  model: GaussianModel;
  bounds: FitBounds;
  start: number[];
  fluxParam: Map<string, number>;
  /** Starting-grid values to try for selected nonlinear parameters. */
  grid: Array<{ param: number; values: number[] }>;
}

interface PlanOptions {
  absorption: boolean;
  broad: 'none' | 'free' | { dvKmS: number; sigmaKmS: number };
  narrowFixed?: { dvKmS: number; sigmaKmS: number };
}

function planModel(group: LineGroup, lines: GroupLine[], data: FitData, z: number, options: MeasureOptions, plan: PlanOptions): ModelPlan {
  const wMin = data.waveAngstrom[0];
  const wMax = data.waveAngstrom[data.waveAngstrom.length - 1];
  const waveMid = (wMin + wMax) / 2;
  let yScale = 0;
  for (const v of data.flux) yScale = Math.max(yScale, Math.abs(v));
  yScale ||= 1;
  const fluxScale = yScale * ((waveMid * 150) / C_KM_S);
  const lower = [-Infinity, -Infinity];
  const upper = [Infinity, Infinity];
  const scale = [yScale, yScale];
  const start = [0, 0];
  const grid: ModelPlan['grid'] = [];
  const addParam = (lo: number, hi: number, s: number, v: number) => {
    lower.push(lo);
    upper.push(hi);
    scale.push(s);
    start.push(v);
    return lower.length - 1;
  };
  const sigmaInst = instrumentalSigmaKmS(options, waveMid);
  const kinematics: Kinematics[] = [];
  let narrowDv: Kinematics['dv'];
  if (plan.narrowFixed) {
    narrowDv = { fixedKmS: plan.narrowFixed.dvKmS };
    kinematics.push({ dv: narrowDv, sigma: { fixedKmS: plan.narrowFixed.sigmaKmS } });
  } else {
    const dv = addParam(-NARROW_DV_KM_S, NARROW_DV_KM_S, 100, 0);
    const sigma = addParam(Math.max(NARROW_SIGMA_KM_S[0], 0.5 * sigmaInst), NARROW_SIGMA_KM_S[1], 100, Math.hypot(100, sigmaInst));
    grid.push({ param: sigma, values: [60, 150, 300].map((s) => Math.hypot(s, sigmaInst)) });
    narrowDv = { param: dv };
    kinematics.push({ dv: narrowDv, sigma: { param: sigma } });
  }
  const terms: GaussianTerm[] = [];
  const fluxParam = new Map<string, number>();
  for (const l of lines) if (!parentOf(l)) fluxParam.set(l.id, addParam(-Infinity, Infinity, fluxScale, 0));
  for (const l of lines) {
    const p = fluxParam.get(parentOf(l) ?? l.id)!;
    const ratioParam = l.bounded ? addParam(l.bounded.min, l.bounded.max, 1, l.bounded.start) : undefined;
    terms.push({ restWaveAngstrom: l.restWaveAngstrom, fluxParam: p, ratio: l.tied ? l.tied.ratio : 1, kinematics: 0, ...(ratioParam !== undefined ? { ratioParam } : {}) });
  }
  const balmer = group.balmer ? lines.find((l) => l.id === group.balmer) : undefined;
  if (balmer && plan.absorption) {
    const rest = balmer.restWaveAngstrom;
    const sigmaRange = ABSORPTION_SIGMA_REST_ANGSTROM.map((a) => (C_KM_S * a) / rest);
    const sigma = addParam(sigmaRange[0], sigmaRange[1], 100, (C_KM_S * 10) / rest);
    // Depth bound: the EW cap against the continuum, taken as the window's median flux (the
    // brightest flux is the emission line's peak, which let a strong line's absorption run past the cap).
    const continuumLevel = Math.abs(median(data.flux)) || yScale;
    const flux = addParam(-ABSORPTION_MAX_EW_REST_ANGSTROM[balmer.id] * (1 + z) * continuumLevel, 0, fluxScale, 0);
    kinematics.push({ dv: narrowDv, sigma: { param: sigma } });
    terms.push({ restWaveAngstrom: rest, fluxParam: flux, ratio: 1, kinematics: kinematics.length - 1 });
    fluxParam.set(`${balmer.id}_abs`, flux);
  }
  if (balmer && plan.broad !== 'none') {
    let k: Kinematics;
    if (plan.broad === 'free') {
      const dv = addParam(-BROAD_DV_KM_S, BROAD_DV_KM_S, 100, 0);
      const sigma = addParam(BROAD_SIGMA_KM_S[0], BROAD_SIGMA_KM_S[1], 1000, 1500);
      grid.push({ param: sigma, values: [1000, 2000] });
      k = { dv: { param: dv }, sigma: { param: sigma } };
    } else {
      k = { dv: { fixedKmS: plan.broad.dvKmS }, sigma: { fixedKmS: plan.broad.sigmaKmS } };
    }
    kinematics.push(k);
    const flux = addParam(0, Infinity, fluxScale * 10, 0);
    terms.push({ restWaveAngstrom: balmer.restWaveAngstrom, fluxParam: flux, ratio: 1, kinematics: kinematics.length - 1 });
    fluxParam.set(`${balmer.id}_broad`, flux);
  }
  const model: GaussianModel = { z, waveMidAngstrom: waveMid, waveSpanAngstrom: wMax - wMin, kinematics, terms, nParams: lower.length };
  return { model, bounds: { lower, upper, scale }, start, fluxParam, grid };
}

/** Best start over the small grid (linear parameters solved at each point), then the full fit. */
function runPlan(plan: ModelPlan, data: FitData): FitResult | null {
  let points: number[][] = [plan.start];
  for (const { param, values } of plan.grid) {
    points = points.flatMap((p) => values.map((v) => {
      const q = p.slice();
      q[param] = v;
      return q;
    }));
  }
  let best: { params: number[]; chi2: number } | null = null;
  for (const p of points) {
    const solved = solveLinear(plan.model, p, data, plan.bounds);
    if (solved && (!best || solved.chi2 < best.chi2)) best = solved;
  }
  if (!best) return null;
  return fitGaussians(plan.model, data, best.params, plan.bounds);
}

function fitGroup(group: LineGroup, win: Window, z: number, options: MeasureOptions, plan: PlanOptions): GroupFit | null {
  const planned = planModel(group, win.lines, win.data, z, options, plan);
  const fit = runPlan(planned, win.data);
  if (!fit) return null;
  return { group, lines: win.lines, model: planned.model, fit, broad: plan.broad !== 'none', kinematicsFixed: !!plan.narrowFixed, data: win.data, fluxParam: planned.fluxParam };
}

function paramValue(g: GroupFit, key: string): { value: number; err: number } | null {
  const p = g.fluxParam.get(key);
  if (p === undefined) return null;
  const v = g.fit.covariance ? g.fit.covariance[p][p] : NaN;
  return { value: g.fit.params[p], err: v >= 0 ? Math.sqrt(v) : NaN };
}

function kinematicsOf(g: GroupFit, k: number): { dvKmS: number; dvErr: number; sigmaKmS: number; sigmaErr: number } {
  const kin = g.model.kinematics[k];
  const get = (ref: Kinematics['dv']) => {
    if ('fixedKmS' in ref) return { v: ref.fixedKmS, e: 0 };
    const c = g.fit.covariance ? g.fit.covariance[ref.param][ref.param] : NaN;
    return { v: g.fit.params[ref.param], e: c > 0 ? Math.sqrt(c) : NaN };
  };
  const dv = get(kin.dv);
  const s = get(kin.sigma);
  return { dvKmS: dv.v, dvErr: dv.e, sigmaKmS: s.v, sigmaErr: s.e };
}

function broadFlux(g: GroupFit): { sn: number; ewRest: number; fwhmKmS: number } {
  const balmer = g.group.balmer!;
  const f = paramValue(g, `${balmer}_broad`)!;
  const term = g.model.terms[g.model.terms.length - 1];
  const centre = termShape(g.model, term, g.fit.params).centre;
  const k = kinematicsOf(g, term.kinematics);
  return { sn: f.value / f.err, ewRest: f.value / continuumAt(g.model, g.fit.params, centre) / (1 + g.model.z), fwhmKmS: SIGMA_PER_FWHM * k.sigmaKmS };
}

/** Flux of term `index` and its error σ = √(gᵀ C g) from the fit covariance. */
function termValue(g: GroupFit, index: number): { value: number; err: number } {
  const term = g.model.terms[index];
  const grad = termFluxGradient(term, g.fit.params, g.model.nParams);
  const c = g.fit.covariance;
  let v = NaN;
  if (c) {
    v = 0;
    for (let a = 0; a < grad.length; a++) if (grad[a]) for (let b = 0; b < grad.length; b++) v += grad[a] * c[a][b] * grad[b];
  }
  return { value: termFlux(term, g.fit.params), err: v >= 0 ? Math.sqrt(v) : NaN };
}

function narrowWidthAtBound(g: GroupFit): boolean {
  const sigma = g.model.kinematics[0].sigma;
  return 'param' in sigma && g.fit.params[sigma.param] >= NARROW_SIGMA_KM_S[1] * (1 - 1e-6);
}

function bestNarrowSn(g: GroupFit): number {
  let best = -Infinity;
  g.lines.forEach((_, i) => {
    const f = termValue(g, i);
    if (f.err > 0) best = Math.max(best, f.value / f.err);
  });
  return best;
}

/**
 * A broad component can only pass the Δχ² test if the narrow fit leaves that much χ² above
 * what a correct model would plausibly reach (dof − 3√(2·dof)); otherwise it is not tried.
 */
function mayNeedBroad(fit: FitResult): boolean {
  return fit.chi2 > fit.dof - 3 * Math.sqrt(2 * fit.dof) + BROAD_MIN_DCHI2;
}

/** Fits every group; broad components are tried for the Balmer groups, Hα first. */
function fitAllGroups(spectrum: Spectrum, z: number, options: MeasureOptions, errorsKnown: boolean) {
  const windows = new Map<LineGroup, Window>();
  const notCovered: string[] = [];
  for (const group of LINE_GROUPS) {
    const win = selectWindow(spectrum, z, group, errorsKnown);
    const coveredIds = new Set(win?.lines.map((l) => l.id) ?? []);
    notCovered.push(...group.lines.filter((l) => !coveredIds.has(l.id)).map((l) => l.id));
    if (win) windows.set(group, win);
  }
  const fits = new Map<LineGroup, GroupFit>();
  let broadKinematics: { dvKmS: number; sigmaKmS: number } | null = null;
  const order = [...windows.keys()].sort((a, b) => (b.balmer === 'Halpha' ? 1 : 0) - (a.balmer === 'Halpha' ? 1 : 0));
  for (const group of order) {
    const win = windows.get(group)!;
    let chosen = fitGroup(group, win, z, options, { absorption: true, broad: 'none' });
    if (group.balmer && win.lines.some((l) => l.id === group.balmer) && (!chosen || mayNeedBroad(chosen.fit))) {
      const broadPlan: PlanOptions = { absorption: false, broad: broadKinematics ?? 'free' };
      const withBroad = fitGroup(group, win, z, options, broadPlan);
      if (withBroad && withBroad.fit.covariance) {
        const b = broadFlux(withBroad);
        const dchi2 = (chosen ? chosen.fit.chi2 : Infinity) - withBroad.fit.chi2;
        const required = broadKinematics !== null ? b.sn > BROAD_MIN_SN : dchi2 > BROAD_MIN_DCHI2 && b.sn > BROAD_MIN_SN && b.ewRest > BROAD_MIN_EW_REST && b.fwhmKmS >= BROAD_MIN_FWHM_KM_S;
        if (required) {
          chosen = withBroad;
          if (!broadKinematics) {
            const k = kinematicsOf(withBroad, withBroad.model.kinematics.length - 1);
            broadKinematics = { dvKmS: k.dvKmS, sigmaKmS: k.sigmaKmS };
          }
        }
      }
    }
    if (chosen) fits.set(group, chosen);
  }
  // Groups with no line at S/N ≥ 3 cannot set their own width and velocity, and a width on its
  // upper bound means the emission is trading flux with the absorption or the continuum: refit
  // those with the kinematics of the group holding the strongest line (or 100 km/s at the given z).
  const usable = (g: GroupFit) => !g.broad && bestNarrowSn(g) >= 5 && !narrowWidthAtBound(g);
  const strongest = [...fits.values()].filter(usable).sort((a, b) => bestNarrowSn(b) - bestNarrowSn(a))[0];
  const reference = strongest ? kinematicsOf(strongest, 0) : null;
  for (const [group, g] of fits) {
    if (bestNarrowSn(g) >= DETECTION_SN && !narrowWidthAtBound(g)) continue;
    const sigmaKmS = reference ? reference.sigmaKmS : Math.hypot(100, instrumentalSigmaKmS(options, g.model.waveMidAngstrom));
    const refit = fitGroup(group, windows.get(group)!, z, options, {
      absorption: !g.broad,
      broad: g.broad && broadKinematics ? broadKinematics : 'none',
      narrowFixed: { dvKmS: reference ? reference.dvKmS : 0, sigmaKmS },
    });
    if (refit) fits.set(group, refit);
  }
  return { fits: LINE_GROUPS.map((grp) => fits.get(grp)).filter((g): g is GroupFit => !!g), notCovered };
}

function measurementsOf(g: GroupFit, options: MeasureOptions): { lines: LineMeasurement[]; absorption: StellarAbsorption[] } {
  const z = g.model.z;
  const out: LineMeasurement[] = [];
  const absorption: StellarAbsorption[] = [];
  const p = g.fit.params;
  const describe = (name: string, rest: number, termIndex: number, flux: number, fluxErr: number, component: 'narrow' | 'broad') => {
    const term = g.model.terms[termIndex];
    const { centre } = termShape(g.model, term, p);
    const cont = continuumAt(g.model, p, centre);
    const k = kinematicsOf(g, term.kinematics);
    const sn = flux / fluxErr;
    const limit = !(sn >= DETECTION_SN);
    const sigmaInst = instrumentalSigmaKmS(options, centre);
    const sigmaInt = Math.sqrt(Math.max(0, k.sigmaKmS ** 2 - sigmaInst ** 2));
    const fwhm = limit ? null : SIGMA_PER_FWHM * sigmaInt;
    const fwhmErr = limit || sigmaInt === 0 ? null : (SIGMA_PER_FWHM * k.sigmaKmS * k.sigmaErr) / sigmaInt;
    const reported = limit ? DETECTION_SN * fluxErr : flux;
    const ewScale = 1 / (cont * (1 + z));
    out.push({
      name,
      rest_wave: rest,
      flux: reported,
      flux_err: fluxErr,
      ew_rest: reported * ewScale,
      ew_rest_err: Math.abs(fluxErr * ewScale),
      sn,
      fwhm_kms: fwhm,
      fwhm_kms_err: fwhmErr,
      velocity_offset_kms: k.dvKmS,
      limit,
      component,
      group: g.group.name,
    });
  };
  g.lines.forEach((l, i) => {
    const f = termValue(g, i);
    describe(l.id, l.restWaveAngstrom, i, f.value, f.err, 'narrow');
  });
  const balmer = g.lines.find((l) => l.id === g.group.balmer);
  if (balmer) {
    const abs = paramValue(g, `${balmer.id}_abs`);
    if (abs) {
      const term = g.model.terms.findIndex((t) => t.fluxParam === g.fluxParam.get(`${balmer.id}_abs`));
      const cont = continuumAt(g.model, p, termShape(g.model, g.model.terms[term], p).centre);
      absorption.push({ line: balmer.id, ew_rest: -abs.value / (cont * (1 + z)), ew_rest_err: abs.err / Math.abs(cont * (1 + z)) });
    }
    const broad = paramValue(g, `${balmer.id}_broad`);
    if (broad) {
      const term = g.model.terms.findIndex((t) => t.fluxParam === g.fluxParam.get(`${balmer.id}_broad`));
      describe(`${balmer.id}_broad`, balmer.restWaveAngstrom, term, broad.value, broad.err, 'broad');
    }
  }
  return { lines: out, absorption };
}

/** Measures the emission lines of LINE_GROUPS in `spectrum` at redshift `z`. */
export function measureLines(inFileUnits: Spectrum, z: number, options: MeasureOptions = {}): LineMeasurementSet {
  // Fitted in units of the noise (flux-scale.ts); fluxes are returned in the file's unit.
  const { spectrum, scale } = inUnitsOfNoise(inFileUnits);
  const errorsKnown = errorsAreKnown(spectrum);
  const { fits, notCovered } = fitAllGroups(spectrum, z, options, errorsKnown);
  const lines: LineMeasurement[] = [];
  const stellar: StellarAbsorption[] = [];
  const groups: GroupFitSummary[] = [];
  for (const g of fits) {
    const m = measurementsOf(g, options);
    lines.push(...m.lines.map((l) => ({ ...l, flux: l.flux * scale, flux_err: l.flux_err * scale })));
    stellar.push(...m.absorption);
    groups.push({ group: g.group.name, pixels: g.data.waveAngstrom.length, chi2_reduced: g.fit.chi2 / g.fit.dof, broad_component: g.broad, kinematics_fixed: g.kinematicsFixed });
  }
  return {
    lines,
    stellar_absorption: stellar,
    groups,
    not_covered: notCovered,
    instrumental_fwhm_angstrom: options.instrumentalFwhmAngstrom ?? null,
    errors_from_scatter: !errorsKnown,
  };
}
