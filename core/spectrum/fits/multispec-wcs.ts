/**
 * IRAF's "multispec" world coordinates (Valdes, "The IRAF/NOAO spectral world coordinate
 * systems"; the format's reference driver, IRAF sys/mwcs/wfmspec.x): CTYPE1 = 'MULTISPE', and
 * per image line a string specN = "ap beam dtype w1 dw nw z aplow aphigh [function blocks]" in
 * the WAT2_nnn cards. With p the physical pixel (p = (l − LTV1)/LTM1_1 for logical pixel l),
 * held within [0.5, nw + 0.5]:
 *   dtype 0: λ = (w1 + dw·(p − 1)) / (1 + z);   dtype 1: λ = 10^(w1 + dw·(p − 1)) / (1 + z);
 *   dtype 2: λ = Σ wᵢ·(z0ᵢ + Wᵢ(p)) / Σ wᵢ / (1 + z) over blocks "w z0 ftype order pmin pmax c…":
 *     ftype 1, 2: Chebyshev or Legendre series of `order` terms in n = (2p − (pmax + pmin))/(pmax − pmin);
 *     ftype 3, 4: cubic or linear spline of `order` pieces in x = (p − pmin)·order/(pmax − pmin),
 *       piece i = ⌊x⌋, b = x − i, a = 1 − b: cubic a³cᵢ + (1 + 3a(1 + ab))cᵢ₊₁ + (1 + 3b(1 + ab))cᵢ₊₂ + b³cᵢ₊₃,
 *       linear a·cᵢ + b·cᵢ₊₁.
 * The table dispersions (ftype 5, 6) are refused by name rather than guessed.
 */
import type { Keywords } from '../keywords.js';
import type { WavelengthAxis } from './wavelength-axis.js';
import { guessWaveUnit, parseWaveUnit } from '../units.js';

/** IRAF splits the WAT strings over cards of 68 characters, blanks included (the FITS reader trims them). */
const WAT_CARD_CHARACTERS = 68;

export function isMultispec(k: Keywords): boolean {
  return k.string('CTYPE1')?.trim().toUpperCase() === 'MULTISPE' || /system\s*=\s*multispec/i.test(k.string('WAT0_001') ?? '');
}

/** The WATn_001, WATn_002, … cards of one axis joined into one string. */
function watString(k: Keywords, axis: number): string {
  const parts: string[] = [];
  for (let i = 1; ; i++) {
    const v = k.string(`WAT${axis}_${String(i).padStart(3, '0')}`);
    if (v === undefined) break;
    parts.push(v);
  }
  return parts.map((p, i) => (i < parts.length - 1 ? p.padEnd(WAT_CARD_CHARACTERS) : p)).join('');
}

/** Wavelengths of the first aperture (image line 1) of a multispec image, its first nw pixels, or why there are none. */
export function multispecAxis(k: Keywords, length: number): WavelengthAxis | { problem: string } {
  const m = /spec1\s*=\s*"([^"]*)"/.exec(watString(k, 2));
  if (!m) return { problem: "IRAF multispec image without a 'spec1' dispersion in its WAT2 cards" };
  const f = m[1].trim().split(/\s+/).map(Number);
  if (f.length < 9 || f.some((v) => !Number.isFinite(v))) return { problem: `IRAF multispec 'spec1' is not a list of numbers: "${m[1].trim().slice(0, 60)}"` };
  const [, , dtype, w1, dw, nw, z] = f;
  const ltv = k.number('LTV1') ?? 0, ltm = k.number('LTM1_1') ?? 1;
  const physical = (i: number) => Math.max(0.5, Math.min(nw + 0.5, (i + 1 - ltv) / ltm));
  let world: (p: number) => number;
  if (dtype === 0) world = (p) => w1 + dw * (p - 1);
  else if (dtype === 1) world = (p) => 10 ** (w1 + dw * (p - 1));
  else if (dtype === 2) {
    const fn = nonLinear(f.slice(9));
    if ('problem' in fn) return fn;
    world = fn.at;
  } else {
    return { problem: `IRAF multispec 'spec1' has dispersion type ${dtype}, not a wavelength solution (0 linear, 1 log-linear, 2 non-linear)` };
  }
  // Pixels past nw (IRAF pads shorter apertures) have no wavelength: the readers leave them out.
  const wave = new Float64Array(Math.min(length, Math.max(1, Math.floor(nw))));
  for (let i = 0; i < wave.length; i++) wave[i] = world(physical(i)) / (1 + z);
  const units = /units=(\S+)/.exec(k.string('WAT1_001') ?? '')?.[1];
  return { wave, unit: (units && parseWaveUnit(units)) || guessWaveUnit(wave), dispersion: dtype === 1 ? 'log10' : dtype === 0 ? 'linear' : 'tabulated' };
}

interface Block {
  weight: number;
  zeropoint: number;
  at: (p: number) => number;
}

/** The weighted mean of the function blocks that follow the nine leading fields, as a function of p. */
function nonLinear(values: number[]): { at: (p: number) => number } | { problem: string } {
  const blocks: Block[] = [];
  const incomplete = { problem: "IRAF multispec 'spec1' function is incomplete (weight, order, pmin, pmax or coefficients)" };
  for (let at = 0; at < values.length; ) {
    if (at + 6 > values.length) return incomplete;
    const [weight, zeropoint, ftype, order, pmin, pmax] = values.slice(at, at + 6);
    const nCoeff = ftype === 1 || ftype === 2 ? order : ftype === 3 ? order + 3 : ftype === 4 ? order + 1 : NaN;
    if (Number.isNaN(nCoeff)) return { problem: `IRAF multispec dispersion function type ${ftype} (${ftype === 5 || ftype === 6 ? 'a pixel or sampled table' : 'unknown'}) is not read: only Chebyshev (1), Legendre (2) and spline (3, 4) functions` };
    const c = values.slice(at + 6, at + 6 + nCoeff);
    if (!(order >= 1) || !Number.isInteger(order) || c.length < nCoeff || !(pmax > pmin)) return incomplete;
    blocks.push({ weight, zeropoint, at: ftype <= 2 ? (p) => series(ftype, c, (2 * p - (pmax + pmin)) / (pmax - pmin)) : (p) => spline(ftype, c, order, ((p - pmin) * order) / (pmax - pmin)) });
    at += 6 + nCoeff;
  }
  if (blocks.length === 0) return { problem: "IRAF multispec 'spec1' of dispersion type 2 gives no function" };
  const totalWeight = blocks.reduce((s, b) => s + b.weight, 0);
  if (totalWeight === 0) return incomplete;
  return { at: (p) => blocks.reduce((s, b) => s + b.weight * (b.zeropoint + b.at(p)), 0) / totalWeight };
}

/** Σ c_j·T_j(n) (Chebyshev) or Σ c_j·P_j(n) (Legendre) by their three-term recurrences. */
function series(ftype: number, c: number[], n: number): number {
  let prev = 1, cur = n, sum = c[0] + (c.length > 1 ? c[1] * n : 0);
  for (let j = 2; j < c.length; j++) {
    const next = ftype === 1 ? 2 * n * cur - prev : ((2 * j - 1) * n * cur - (j - 1) * prev) / j;
    sum += c[j] * next;
    prev = cur;
    cur = next;
  }
  return sum;
}

/** The cubic (ftype 3) or linear (ftype 4) spline of `pieces` pieces at x ∈ [0, pieces]. */
function spline(ftype: number, c: number[], pieces: number, x: number): number {
  const i = Math.max(0, Math.min(Math.floor(x), pieces - 1));
  const b = x - i, a = 1 - b;
  if (ftype === 4) return a * c[i] + b * c[i + 1];
  return a * a * a * c[i] + (1 + 3 * a * (1 + a * b)) * c[i + 1] + (1 + 3 * b * (1 + a * b)) * c[i + 2] + b * b * b * c[i + 3];
}
