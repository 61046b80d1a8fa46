/**
 * Refinement of an emission-line redshift: a joint fit of Gaussian lines at one common z with
 * the error spectrum (Levenberg–Marquardt on the analytic Jacobian, lm-fit.ts). Parameters: velocity
 * offset v (km/s), one σ for narrow and one for broad lines (km/s), and one amplitude per line
 * or tied doublet. The covariance is (Jᵀ W J)⁻¹ at the solution (e.g. Press et al., Numerical
 * Recipes, §15.5), scaled by √χ²_red when that exceeds 1; the spread of the lines' own
 * velocities is a floor (centroidScatterKmS).
 */
import { unitGaussian } from './gaussian.js';
import { lineGroups } from './line-groups.js';
import { choleskySolve, inverseDiagonal, lmFit, type LmProblem, type LmResult } from './lm-fit.js';
import { lineRun, pixelArrays, pixelsNearLines, usable, type NativeResidual } from './native-residual.js';
import { lineIon } from './line-list.js';
import { lowerBound, type ProfileLine, type Template } from './templates.js';
import { SPEED_OF_LIGHT_KMS } from '../astro/constants.js';
import { pauleMandelTau2, weightedMeanError } from '../math/random-effects.js';

const SQRT_2PI = Math.sqrt(2 * Math.PI);
/** Lines wider than this (km/s) share the broad σ (common practice, no source). */
const BROAD_KMS = 600;
/** A fit that wanders further than this from the correlation z is rejected, km/s. */
const MAX_SHIFT_KMS = 1500;
/** A line enters the fit only with at least this many good pixels within 4σ (common practice, no source). */
const MIN_LINE_PIXELS = 3;
/** A line's profile is evaluated out to this many σ, as the templates are (templates.ts addLineProfile; e^(−12.5) of the peak beyond). */
const PROFILE_REACH = 5;

export interface LineFit {
  z: number;
  zErr: number;
  chi2Red: number;
  nLinesFitted: number;
}

interface Component {
  line: ProfileLine;
  group: number;
  ratio: number;
  broad: boolean;
}

export function fitEmissionLines(nr: NativeResidual, template: Template, z0: number): LineFit | null {
  const lo = nr.waveAngstrom[0], hi = nr.waveAngstrom[nr.waveAngstrom.length - 1];
  // A line with no good pixels (inside a masked telluric band, say) has no amplitude to fit and
  // would make the normal matrix singular: it is left out.
  const inRange = template.lines.filter(
    (l) => l.strength > 0 && l.waveRestAngstrom * (1 + z0) > lo && l.waveRestAngstrom * (1 + z0) < hi && usablePixels(nr, l, z0) >= MIN_LINE_PIXELS,
  );
  const { members, nGroups } = lineGroups(inRange);
  const comps = inRange.map((line, k) => component(line, members[k].group, members[k].ratio));
  if (nGroups === 0) return null;
  const sub = { ...template, lines: inRange };
  const idx = pixelsNearLines(nr, sub, z0, 4);
  if (idx.length < nGroups + 4) return null;
  const narrow0 = Math.min(...inRange.map((l) => l.sigmaKmS));
  const broadLines = inRange.filter((l) => l.sigmaKmS > BROAD_KMS);
  const broad0 = broadLines.length ? Math.min(...broadLines.map((l) => l.sigmaKmS)) : 1000;
  const inst = nr.pixelKmS;

  const nP = 3 + nGroups;
  const { wave: xs, y: ys, w: ws } = pixelArrays(nr, idx);
  const start = new Float64Array(nP);
  start[1] = narrow0;
  start[2] = broad0;
  const fixedBroad = broadLines.length === 0;
  const fixedNarrow = inRange.every((l) => l.sigmaKmS > BROAD_KMS);
  const lower = new Float64Array(nP).fill(-Infinity), upper = new Float64Array(nP).fill(Infinity);
  lower.set([-MAX_SHIFT_KMS * 2, fixedNarrow ? narrow0 : 5, fixedBroad ? broad0 : 300]);
  upper.set([MAX_SHIFT_KMS * 2, fixedNarrow ? narrow0 : BROAD_KMS, fixedBroad ? broad0 : 6000]);
  const profiles = new LineProfiles(comps, z0, inst, xs);
  setInitialAmplitudes(profiles, nGroups, ys, ws, start);
  const work = lineWork(xs.length);
  const fit = lmFit(new LineProblem(profiles, nGroups, ys, ws, lower, upper, work), start);
  const p = fit.p;
  if (!p.every(Number.isFinite) || Math.abs(p[0]) > MAX_SHIFT_KMS) return null;
  const nF = fit.free.length;
  const variance = inverseDiagonal(fit.normal, nF);
  if (!variance || fit.free[0] !== 0 || !(variance[0] > 0)) return null;
  const dof = Math.max(1, xs.length - nF);
  const chi2Red = fit.chi2 / dof;
  const covarianceKmS = Math.sqrt(variance[0]) * Math.sqrt(Math.max(1, chi2Red));
  const ampErr = (g: number) => {
    const f = fit.free.indexOf(3 + g);
    return f >= 0 && variance[f] > 0 ? Math.sqrt(variance[f] * Math.max(1, chi2Red)) : Infinity;
  };
  const scatterKmS = centroidScatterKmS({ profiles, nGroups, ys, ws, lower, upper, work }, p, ampErr);
  const sigmaV = Math.max(covarianceKmS, scatterKmS);
  const z = (1 + z0) * (1 + p[0] / SPEED_OF_LIGHT_KMS) - 1;
  return { z, zErr: ((1 + z0) * sigmaV) / SPEED_OF_LIGHT_KMS, chi2Red, nLinesFitted: inRange.length };
}

/** Every component is made here, so that all have one shape and the fits' loops see one kind of object. */
function component(line: ProfileLine, group: number, ratio: number): Component {
  return { line, group, ratio, broad: line.sigmaKmS > BROAD_KMS };
}

function usablePixels(nr: NativeResidual, line: ProfileLine, z: number): number {
  const [from, to] = lineRun(nr, line, z, 4);
  let k = 0;
  for (let i = from; i < to; i++) if (usable(nr, i)) k++;
  return k;
}

/** The model at every point and its derivatives in v and in the narrow and broad σ. */
interface ModelSums {
  model: Float64Array;
  dv: Float64Array;
  dNarrow: Float64Array;
  dBroad: Float64Array;
}

/**
 * Each line's unit-amplitude profile (its ratio in its group included) at the pixels xs, over the
 * points within PROFILE_REACH of its centre (found by bisection in the sorted wavelengths).
 * Parameters as in the fit: [v, σ_narrow, σ_broad, A_0 …].
 */
class LineProfiles {
  readonly comps: Component[];
  /** Per line, for the loops: its rest wavelength (Å), group, ratio in the group, and 1 when broad. */
  readonly rest: Float64Array;
  readonly group: Int32Array;
  readonly ratio: Float64Array;
  readonly broad: Uint8Array;
  readonly xs: Float64Array;
  /** Per line: its points [from, to) and where they start in the packed arrays. */
  readonly from: Int32Array;
  readonly to: Int32Array;
  readonly at: Int32Array;
  phi = new Float64Array(0);
  readonly z0: number;
  readonly inst: number;
  private readonly centre: Float64Array;
  private readonly width: Float64Array;
  /** v, σ_narrow, σ_broad the profiles in phi are for (NaN before the first compute). */
  private readonly at3 = new Float64Array(3).fill(NaN);

  constructor(comps: Component[], z0: number, inst: number, xs: Float64Array) {
    this.comps = comps;
    this.rest = Float64Array.from(comps, (c) => c.line.waveRestAngstrom);
    this.group = Int32Array.from(comps, (c) => c.group);
    this.ratio = Float64Array.from(comps, (c) => c.ratio);
    this.broad = Uint8Array.from(comps, (c) => (c.broad ? 1 : 0));
    this.z0 = z0;
    this.inst = inst;
    this.xs = xs;
    const n = comps.length;
    this.from = new Int32Array(n);
    this.to = new Int32Array(n);
    this.at = new Int32Array(n + 1);
    this.centre = new Float64Array(n);
    this.width = new Float64Array(n);
  }

  /** The profiles at p; with `sums` (zeroed), also adds the model and its derivatives there. */
  compute(p: Float64Array, sums?: ModelSums): void {
    const { rest, group, ratio, broad, xs, z0 } = this;
    const nC = rest.length;
    // The amplitudes alone changed (the first step after the start): the profiles stand.
    const known = p[0] === this.at3[0] && p[1] === this.at3[1] && p[2] === this.at3[2];
    this.at3[0] = p[0];
    this.at3[1] = p[1];
    this.at3[2] = p[2];
    const zf = (1 + z0) * (1 + p[0] / SPEED_OF_LIGHT_KMS);
    // Line σ and the pixel width in quadrature, km/s, for the narrow and the broad lines.
    const totalNarrow = Math.hypot(p[1], this.inst), totalBroad = Math.hypot(p[2], this.inst);
    for (let c = 0; c < nC; c++) {
      const centre = rest[c] * zf;
      const sA = (centre * (broad[c] ? totalBroad : totalNarrow)) / SPEED_OF_LIGHT_KMS;
      const end = centre + PROFILE_REACH * sA;
      const from = lowerBound(xs, centre - PROFILE_REACH * sA);
      let to = lowerBound(xs, end);
      while (to < xs.length && xs[to] <= end) to++;
      this.centre[c] = centre;
      this.width[c] = sA;
      this.from[c] = from;
      this.to[c] = to;
      this.at[c + 1] = this.at[c] + to - from;
    }
    const total = this.at[nC];
    if (this.phi.length < total) this.phi = new Float64Array(2 * total);
    const { phi } = this;
    for (let c = 0; c < nC; c++) {
      const centre = this.centre[c], sA = this.width[c];
      const sv = broad[c] ? p[2] : p[1];
      const stot = broad[c] ? totalBroad : totalNarrow;
      const norm = ratio[c] / (sA * SQRT_2PI);
      // ∂φ/∂c = φ·u/s, ∂c/∂v = λ_rest(1+z0)/C; ∂φ/∂s = φ(u² − 1)/s, ∂s/∂σv = c·σv/(C·stot)
      const dcdv = (rest[c] * (1 + z0)) / SPEED_OF_LIGHT_KMS / sA;
      const dsdsv = (centre * sv) / (SPEED_OF_LIGHT_KMS * stot) / sA;
      const from = this.from[c], to = this.to[c], invS = 1 / sA;
      let q = this.at[c];
      if (!sums) {
        if (known) continue;
        for (let k = from; k < to; k++, q++) {
          const u = (xs[k] - centre) * invS;
          phi[q] = norm * unitGaussian(u);
        }
        continue;
      }
      const amp = p[3 + group[c]], { model, dv } = sums, ds = broad[c] ? sums.dBroad : sums.dNarrow;
      if (known) {
        for (let k = from; k < to; k++, q++) {
          const u = (xs[k] - centre) * invS;
          const ag = amp * phi[q];
          model[k] += ag;
          dv[k] += ag * u * dcdv;
          ds[k] += ag * (u * u - 1) * dsdsv;
        }
        continue;
      }
      for (let k = from; k < to; k++, q++) {
        const u = (xs[k] - centre) * invS;
        const g = (phi[q] = norm * unitGaussian(u));
        const ag = amp * g;
        model[k] += ag;
        dv[k] += ag * u * dcdv;
        ds[k] += ag * (u * u - 1) * dsdsv;
      }
    }
  }

  /** Adds Σ A_g·profile to out, with the amplitudes of p (after compute). */
  addModel(p: Float64Array, out: Float64Array): void {
    for (let c = 0; c < this.group.length; c++) {
      const amp = p[3 + this.group[c]];
      for (let k = this.from[c], q = this.at[c]; k < this.to[c]; k++, q++) out[k] += amp * this.phi[q];
    }
  }
}

/**
 * Σ w·φ_c·φ_d over the points two lines share, summed into their groups' entry of `out`
 * (row-major, nGroups²): the amplitude block of JᵀWJ, as the model is linear in the amplitudes.
 * Each line's own Σ w·φ_c² comes in `self`, from the caller's pass over its points.
 */
function amplitudeGram(profiles: LineProfiles, ws: Float64Array, nGroups: number, self: Float64Array, out: Float64Array): void {
  const { group, phi, from, to, at } = profiles;
  out.fill(0);
  for (let c = 0; c < group.length; c++) {
    const gc = group[c];
    out[gc * nGroups + gc] += self[c];
    for (let d = c + 1; d < group.length; d++) {
      const lo = Math.max(from[c], from[d]), hi = Math.min(to[c], to[d]);
      if (lo >= hi) continue;
      let s = 0;
      for (let k = lo, qc = at[c] + lo - from[c], qd = at[d] + lo - from[d]; k < hi; k++, qc++, qd++) s += ws[k] * phi[qc] * phi[qd];
      const gd = group[d];
      out[gc * nGroups + gd] += s;
      out[gd * nGroups + gc] += s;
    }
  }
}

/**
 * Sets p[3…] to the weighted linear least-squares amplitudes at p's velocity and widths (the
 * model is linear in them); zero when the normal equations cannot be solved.
 */
function setInitialAmplitudes(profiles: LineProfiles, nGroups: number, ys: Float64Array, ws: Float64Array, p: Float64Array): void {
  profiles.compute(p);
  const { group, phi, from, to, at } = profiles;
  const a = new Float64Array(nGroups * nGroups), b = new Float64Array(nGroups), amp = new Float64Array(nGroups);
  const self = new Float64Array(group.length);
  for (let c = 0; c < group.length; c++) {
    let s = 0, ss = 0;
    for (let k = from[c], q = at[c]; k < to[c]; k++, q++) {
      const wg = ws[k] * phi[q];
      s += wg * ys[k];
      ss += wg * phi[q];
    }
    b[group[c]] += s;
    self[c] = ss;
  }
  amplitudeGram(profiles, ws, nGroups, self, a);
  for (let i = 0; i < nGroups; i++) a[i * nGroups + i] += 1e-12 * (a[i * nGroups + i] || 1);
  if (choleskySolve(a, b, amp, nGroups)) p.set(amp, 3);
}

/** A line problem's work arrays (its model, residuals and their derivatives), at least as long as its points; one fit's serve the refits after it. */
interface LineWork {
  model: Float64Array;
  resid: Float64Array;
  dv: Float64Array;
  dn: Float64Array;
  db: Float64Array;
}

function lineWork(n: number): LineWork {
  return { model: new Float64Array(n), resid: new Float64Array(n), dv: new Float64Array(n), dn: new Float64Array(n), db: new Float64Array(n) };
}

/**
 * The weighted least-squares problem of fitting `profiles` to ys (weights ws), for lmFit. JᵀWJ
 * is built from the lines' own points: the v and width columns are dense, an amplitude's column
 * is its lines' profiles. A class rather than an object of closures, so that its methods are the
 * same functions from fit to fit and their optimised code lasts.
 */
class LineProblem implements LmProblem {
  private readonly model: Float64Array;
  private readonly resid: Float64Array;
  private readonly dv: Float64Array;
  private readonly dn: Float64Array;
  private readonly db: Float64Array;
  private readonly sumsAt: ModelSums;
  private readonly gram: Float64Array;
  private readonly at: Int32Array;
  private readonly sums = new Float64Array(9);
  private readonly self: Float64Array;

  constructor(
    private readonly profiles: LineProfiles,
    private readonly nGroups: number,
    private readonly ys: Float64Array,
    private readonly ws: Float64Array,
    readonly lower: Float64Array,
    readonly upper: Float64Array,
    work: LineWork,
  ) {
    const nY = ys.length;
    this.model = work.model.subarray(0, nY);
    this.resid = work.resid.subarray(0, nY);
    this.dv = work.dv.subarray(0, nY);
    this.dn = work.dn.subarray(0, nY);
    this.db = work.db.subarray(0, nY);
    this.sumsAt = { model: this.model, dv: this.dv, dNarrow: this.dn, dBroad: this.db };
    this.gram = new Float64Array(nGroups * nGroups);
    this.at = new Int32Array(3 + nGroups);
    this.self = new Float64Array(profiles.group.length);
  }

  chi2(p: Float64Array): number {
    const { model, resid, ys, ws } = this, nY = ys.length;
    model.fill(0);
    this.dv.fill(0);
    this.dn.fill(0);
    this.db.fill(0);
    this.profiles.compute(p, this.sumsAt);
    let chi2 = 0;
    for (let k = 0; k < nY; k++) {
      const r = ys[k] - model[k];
      resid[k] = r;
      chi2 += ws[k] * r * r;
    }
    return chi2;
  }

  linearise(free: readonly number[], normal: Float64Array, gradient: Float64Array): void {
    const { profiles, nGroups, ws, resid, dv, dn, db, at, sums, self, gram } = this, nY = this.ys.length;
    const { phi, from, to, group } = profiles;
    const start = profiles.at;
    const nF = free.length;
    normal.fill(0);
    gradient.fill(0);
    at.fill(-1);
    for (let i = 0; i < nF; i++) at[free[i]] = i;
    // The v and width rows of JᵀWJ and JᵀW(y − model), in one pass. Most fits have one width
    // free (narrow lines alone, or a quasar's broad ones): its column alone is summed then.
    const both = at[1] >= 0 && at[2] >= 0, wi = at[2] >= 0 && !both ? 2 : 1, dw = wi === 2 ? db : dn;
    sums.fill(0);
    if (both) {
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, s5 = 0, s6 = 0, s7 = 0, s8 = 0;
      for (let k = 0; k < nY; k++) {
        const r = resid[k], w = ws[k], dvk = dv[k], dnk = dn[k], dbk = db[k];
        const a = w * dvk, b = w * dnk, c = w * dbk;
        s0 += a * dvk;
        s1 += a * dnk;
        s2 += a * dbk;
        s3 += b * dnk;
        s4 += b * dbk;
        s5 += c * dbk;
        s6 += a * r;
        s7 += b * r;
        s8 += c * r;
      }
      sums[0] = s0; sums[1] = s1; sums[2] = s2; sums[3] = s3; sums[4] = s4; sums[5] = s5; sums[6] = s6; sums[7] = s7; sums[8] = s8;
    } else {
      let svv = 0, svw = 0, sww = 0, svr = 0, swr = 0;
      for (let k = 0; k < nY; k++) {
        const r = resid[k], w = ws[k], dvk = dv[k], dwk = dw[k];
        const a = w * dvk, b = w * dwk;
        svv += a * dvk;
        svw += a * dwk;
        sww += b * dwk;
        svr += a * r;
        swr += b * r;
      }
      sums[0] = svv;
      sums[wi] = svw;
      sums[wi === 1 ? 3 : 5] = sww;
      sums[6] = svr;
      sums[6 + wi] = swr;
    }
    for (let i = 0, t = 0; i < 3; i++) {
      for (let j = i; j < 3; j++, t++) {
        if (at[i] >= 0 && at[j] >= 0) normal[at[i] * nF + at[j]] = normal[at[j] * nF + at[i]] = sums[t];
      }
      if (at[i] >= 0) gradient[at[i]] = sums[6 + i];
    }
    for (let c = 0; c < group.length; c++) {
      const fa = at[3 + group[c]];
      self[c] = 0;
      if (fa < 0) continue;
      let sr = 0, sv = 0, sn = 0, sb = 0, ss = 0;
      for (let k = from[c], q = start[c]; k < to[c]; k++, q++) {
        const wg = ws[k] * phi[q];
        ss += wg * phi[q];
        sr += wg * resid[k];
        sv += wg * dv[k];
        sn += wg * dn[k];
        sb += wg * db[k];
      }
      self[c] = ss;
      gradient[fa] += sr;
      if (at[0] >= 0) normal[at[0] * nF + fa] = normal[fa * nF + at[0]] += sv;
      if (at[1] >= 0) normal[at[1] * nF + fa] = normal[fa * nF + at[1]] += sn;
      if (at[2] >= 0) normal[at[2] * nF + fa] = normal[fa * nF + at[2]] += sb;
    }
    amplitudeGram(profiles, ws, nGroups, self, gram);
    for (let g = 0; g < nGroups; g++) {
      const fg = at[3 + g];
      if (fg < 0) continue;
      for (let h = 0; h < nGroups; h++) if (at[3 + h] >= 0) normal[fg * nF + at[3 + h]] = gram[g * nGroups + h];
    }
  }
}

/** Lines (or tied doublets) count for the scatter from this amplitude S/N up. */
const SCATTER_MIN_SNR = 5;
/**
 * Two lines give a scatter of one degree of freedom: a rough error, but two broad QSO lines of
 * different ions can disagree by far more than their fits say (an open-spectra QSO: 729 km/s
 * off with σz 162 km/s from its two lines' covariance alone).
 */
const SCATTER_MIN_LINES = 2;

interface JointFit {
  profiles: LineProfiles;
  nGroups: number;
  ys: Float64Array;
  ws: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  work: LineWork;
}

/**
 * Error of the common velocity from the spread of the lines' own velocities: each strong line
 * (or doublet) refitted alone for its offset and its error, widths and the other lines held at
 * the joint fit. Lines may disagree by more than their errors (outflows, blends, asymmetric
 * wings, gas in other places) by an intrinsic scatter τ² (pauleMandelTau2, on the errors scaled by
 * each refit's √χ²_red). The joint fit weights each line by its unscaled 1/σ², so its velocity is
 * that weighted mean of theirs (to about 1 km/s in simulations), with the error
 * weightedMeanError gives. The scatter is taken between lines and between ions (lines of one
 * ion share their gas's velocity, so Balmer lines that agree say nothing of how far [O III] is
 * off), and the larger error is kept. 0 when fewer than SCATTER_MIN_LINES lines are strong enough.
 */
function centroidScatterKmS(j: JointFit, p: Float64Array, ampErr: (g: number) => number): number {
  const { comps, z0, inst, xs: allXs } = j.profiles;
  const nAll = allXs.length;
  const full = new Float64Array(nAll);
  // The joint fit's own profiles: recomputed only when its last evaluation was not at p.
  j.profiles.compute(p);
  j.profiles.addModel(p, full);
  // The refits' points, values and weights, and their lines' model: views of these.
  const idx = new Int32Array(nAll), subXs = new Float64Array(nAll), subYs = new Float64Array(nAll), subWs = new Float64Array(nAll), subModel = new Float64Array(nAll);
  const velocities: number[] = [], variances: number[] = [], weights: number[] = [], ions: string[] = [];
  for (let g = 0; g < j.nGroups; g++) {
    if (!(Math.abs(p[3 + g]) >= SCATTER_MIN_SNR * ampErr(g))) continue;
    // The group's lines alone, their amplitude the only one of the refit: [v, σ_narrow, σ_broad, A].
    const own = comps.filter((c) => c.group === g).map((c) => component(c.line, 0, c.ratio));
    const start = Float64Array.of(p[0], p[1], p[2], p[3 + g]);
    // The points within 3σ of the group's lines: one run per line, their union in order.
    const runs = own.map((c) => {
      const centre = c.line.waveRestAngstrom * (1 + z0) * (1 + p[0] / SPEED_OF_LIGHT_KMS);
      const half = (3 * centre * Math.hypot(c.broad ? p[2] : p[1], inst)) / SPEED_OF_LIGHT_KMS;
      const from = lowerBound(allXs, centre - half);
      let to = from;
      while (to < nAll && allXs[to] <= centre + half) to++;
      return [from, to];
    });
    runs.sort((a, b) => a[0] - b[0]);
    let n = 0, next = 0;
    for (const [from, to] of runs) {
      for (let k = Math.max(from, next); k < to; k++) idx[n++] = k;
      next = Math.max(next, to);
    }
    if (n < 4) continue;
    const xs = subXs.subarray(0, n), ys = subYs.subarray(0, n), ws = subWs.subarray(0, n), mine = subModel.fill(0, 0, n).subarray(0, n);
    for (let i = 0; i < n; i++) {
      xs[i] = allXs[idx[i]];
      ws[i] = j.ws[idx[i]];
    }
    const profiles = new LineProfiles(own, z0, inst, xs);
    profiles.compute(start);
    profiles.addModel(start, mine);
    // The other lines' share of the joint model stays subtracted.
    for (let i = 0; i < n; i++) ys[i] = j.ys[idx[i]] - (full[idx[i]] - mine[i]);
    // v and the amplitude free, the widths held.
    const lower = Float64Array.of(j.lower[0], p[1], p[2], -Infinity), upper = Float64Array.of(j.upper[0], p[1], p[2], Infinity);
    const fit = lmFit(new LineProblem(profiles, 1, ys, ws, lower, upper, j.work), start);
    const variance = velocityVariance(fit);
    if (!(Math.abs(fit.p[0]) <= MAX_SHIFT_KMS) || variance === null) continue;
    velocities.push(fit.p[0]);
    ions.push(lineIon(own[0].line.id));
    weights.push(1 / variance);
    // Scaled by the refit's own χ²_red, as the joint fit's covariance is.
    variances.push(variance * Math.max(1, fit.chi2 / Math.max(1, n - fit.free.length)));
  }
  if (velocities.length < SCATTER_MIN_LINES) return 0;
  const betweenLines = weightedMeanError(weights, variances, pauleMandelTau2(velocities, variances));
  const byIon = combinedByIon(velocities, variances, weights, ions);
  if (byIon.velocities.length < 2) return betweenLines;
  return Math.max(betweenLines, weightedMeanError(byIon.weights, byIon.variances, pauleMandelTau2(byIon.velocities, byIon.variances)));
}

/** The variance of v (parameter 0) from a fit's JᵀWJ, or null when v was held or the matrix is singular. */
function velocityVariance(fit: LmResult): number | null {
  if (fit.free[0] !== 0) return null;
  const variance = inverseDiagonal(fit.normal, fit.free.length)?.[0];
  return variance !== undefined && variance > 0 && variance < Infinity ? variance : null;
}

/** Per ion, its lines' velocities combined as the joint fit combines them (weights u), with that mean's variance and weight. */
function combinedByIon(velocities: number[], variances: number[], weights: number[], ions: string[]): { velocities: number[]; variances: number[]; weights: number[] } {
  const out = { velocities: [] as number[], variances: [] as number[], weights: [] as number[] };
  for (const ion of new Set(ions)) {
    let su = 0, suv = 0, su2s = 0;
    ions.forEach((other, i) => {
      if (other !== ion) return;
      su += weights[i];
      suv += weights[i] * velocities[i];
      su2s += weights[i] ** 2 * variances[i];
    });
    out.velocities.push(suv / su);
    out.variances.push(su2s / su ** 2);
    out.weights.push(su);
  }
  return out;
}
