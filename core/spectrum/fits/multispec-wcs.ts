/**
 * IRAF's "multispec" world coordinates (Valdes, "The IRAF/NOAO spectral world coordinate
 * systems", IRAF specwcs document): CTYPE1 = 'MULTISPE', and per aperture a string
 * specN = "ap beam dtype w1 dw nw z aplow aphigh [weight zeropoint ftype order pmin pmax c1 … cn …]"
 * in the WAT2_nnn cards. With p the physical pixel (p = (l − LTV1)/LTM1_1 for logical pixel l):
 *   dtype 0: λ = (w1 + dw·(p − 1)) / (1 + z);
 *   dtype 1: λ = 10^(w1 + dw·(p − 1)) / (1 + z);
 *   dtype 2: λ = Σ weight·(zeropoint + W(p)) / (1 + z), W a Chebyshev (ftype 1) or Legendre
 *            (ftype 2) series of `order` terms in n = (2p − (pmax + pmin)) / (pmax − pmin).
 * The spline and table dispersions (ftype 3–6) are refused by name rather than guessed.
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

/** Wavelengths of the first aperture (image line 1) of a multispec image, or why there are none. */
export function multispecAxis(k: Keywords, length: number): WavelengthAxis | { problem: string } {
  const m = /spec1\s*=\s*"([^"]*)"/.exec(watString(k, 2));
  if (!m) return { problem: "IRAF multispec image without a 'spec1' dispersion in its WAT2 cards" };
  const f = m[1].trim().split(/\s+/).map(Number);
  if (f.length < 9 || f.some((v) => !Number.isFinite(v))) return { problem: `IRAF multispec 'spec1' is not a list of numbers: "${m[1].trim().slice(0, 60)}"` };
  const [, , dtype, w1, dw, , z] = f;
  const ltv = k.number('LTV1') ?? 0, ltm = k.number('LTM1_1') ?? 1;
  const physical = (i: number) => (i + 1 - ltv) / ltm;
  const wave = new Float64Array(length);
  if (dtype === 0 || dtype === 1) {
    for (let i = 0; i < length; i++) {
      const x = w1 + dw * (physical(i) - 1);
      wave[i] = (dtype === 0 ? x : 10 ** x) / (1 + z);
    }
  } else if (dtype === 2) {
    const sum = nonLinear(f.slice(9), length, physical);
    if ('problem' in sum) return sum;
    for (let i = 0; i < length; i++) wave[i] = sum.values[i] / (1 + z);
  } else {
    return { problem: `IRAF multispec 'spec1' has dispersion type ${dtype}, not a wavelength solution (0 linear, 1 log-linear, 2 non-linear)` };
  }
  const units = /units=(\S+)/.exec(k.string('WAT1_001') ?? '')?.[1];
  return { wave, unit: (units && parseWaveUnit(units)) || guessWaveUnit(wave), dispersion: dtype === 1 ? 'log10' : dtype === 0 ? 'linear' : 'tabulated' };
}

/** Σ weight·(zeropoint + W(p)) over the function blocks that follow the nine leading fields. */
function nonLinear(blocks: number[], length: number, physical: (i: number) => number): { values: Float64Array } | { problem: string } {
  const values = new Float64Array(length);
  let at = 0;
  if (blocks.length === 0) return { problem: "IRAF multispec 'spec1' of dispersion type 2 gives no function" };
  while (at < blocks.length) {
    const [weight, zeropoint, ftype, order, pmin, pmax] = blocks.slice(at, at + 6);
    if (ftype !== 1 && ftype !== 2) return { problem: `IRAF multispec dispersion function type ${ftype} (${ftype >= 3 && ftype <= 6 ? 'spline or table' : 'unknown'}) is not read: only Chebyshev (1) and Legendre (2) series` };
    const c = blocks.slice(at + 6, at + 6 + order);
    if (!(order >= 1) || c.length < order || !(pmax > pmin)) return { problem: "IRAF multispec 'spec1' function is incomplete (order, pmin, pmax or coefficients)" };
    for (let i = 0; i < length; i++) {
      const n = (2 * physical(i) - (pmax + pmin)) / (pmax - pmin);
      values[i] += weight * (zeropoint + series(ftype, c, n));
    }
    at += 6 + order;
  }
  return { values };
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
