/**
 * Wavelengths of an image axis from its header. Linear WCS (FITS WCS Paper I, Greisen &
 * Calabretta 2002, A&A 395, 1061): λ = CRVALi + CDi_i·(p − CRPIXi) (CDi_i, else CDELTi;
 * p the 1-based pixel). `-LOG` axes (WCS Paper III, Greisen et al. 2006, eq. 5):
 * λ = CRVAL·exp(CDELT·(p − CRPIX)/CRVAL). IRAF's DC-FLAG = 1: λ = 10^(CRVAL + CDELT·(p − CRPIX)).
 * The unit comes from CUNITi, else the IRAF WAT1_001 'units=' word, else the values.
 * SDSS images carry instead λ = 10^(COEFF0 + COEFF1·i), i from 0, in Å (SDSS data model).
 */
import type { Keywords } from '../keywords.js';
import type { Dispersion } from '../spectrum.js';
import { guessWaveUnit, parseWaveUnit, type WaveUnit } from '../units.js';

export interface WavelengthAxis {
  wave: Float64Array;
  unit: WaveUnit;
  dispersion: Dispersion;
}

/** CTYPE values that are not wavelengths (WCS Paper III spectral types and others). */
const NOT_WAVELENGTH = /^(FREQ|ENER|WAVN|VRAD|VOPT|ZOPT|VELO|BETA|PIXEL|RA--|DEC-|GLON|GLAT)/;

/** True when the header carries a linear wavelength solution for the axis. */
export function hasLinearAxis(k: Keywords, axis = 1): boolean {
  return k.number(`CRVAL${axis}`) !== undefined && step(k, axis) !== undefined;
}

/** Reason the axis is not a wavelength axis zvet reads, or undefined when it is. */
export function axisProblem(k: Keywords, axis = 1): string | undefined {
  if (!hasLinearAxis(k, axis)) return `no wavelength axis (CRVAL${axis} with CDELT${axis} or CD${axis}_${axis})`;
  const ctype = k.string(`CTYPE${axis}`)?.trim().toUpperCase() ?? '';
  if (NOT_WAVELENGTH.test(ctype)) return `axis ${axis} is '${ctype}', not a wavelength`;
  if (/-(TAB|F2W|V2W|GRI|GRA)$/.test(ctype)) return `axis ${axis} uses the '${ctype}' algorithm, which zvet does not read`;
  const cunit = k.string(`CUNIT${axis}`)?.trim();
  if (cunit && !parseWaveUnit(cunit)) return `CUNIT${axis} '${cunit}' is not a wavelength unit`;
  return undefined;
}

export function linearAxis(k: Keywords, length: number, axis = 1): WavelengthAxis {
  const crval = k.number(`CRVAL${axis}`)!;
  const delta = step(k, axis)!;
  const crpix = k.number(`CRPIX${axis}`) ?? 1;
  const ctype = k.string(`CTYPE${axis}`)?.trim().toUpperCase() ?? '';
  const wave = new Float64Array(length);
  let dispersion: Dispersion;
  if (ctype.endsWith('-LOG')) {
    dispersion = 'ln';
    for (let i = 0; i < length; i++) wave[i] = crval * Math.exp((delta * (i + 1 - crpix)) / crval);
  } else if (k.number('DC-FLAG') === 1) {
    dispersion = 'log10';
    for (let i = 0; i < length; i++) wave[i] = 10 ** (crval + delta * (i + 1 - crpix));
  } else {
    dispersion = 'linear';
    for (let i = 0; i < length; i++) wave[i] = crval + delta * (i + 1 - crpix);
  }
  return { wave, unit: axisUnit(k, axis, wave), dispersion };
}

/** True when the header carries the SDSS log10 solution COEFF0/COEFF1. */
export function hasCoeffAxis(k: Keywords): boolean {
  return k.number('COEFF0') !== undefined && k.number('COEFF1') !== undefined;
}

export function coeffAxis(k: Keywords, length: number): WavelengthAxis {
  const c0 = k.number('COEFF0')!;
  const c1 = k.number('COEFF1')!;
  return { wave: Float64Array.from({ length }, (_, i) => 10 ** (c0 + c1 * i)), unit: { name: 'Å', toAngstrom: 1, assumed: false }, dispersion: 'log10' };
}

function step(k: Keywords, axis: number): number | undefined {
  const cd = k.number(`CD${axis}_${axis}`);
  const cdelt = k.number(`CDELT${axis}`);
  const s = cd !== undefined && cd !== 0 ? cd : cdelt;
  return s !== undefined && s !== 0 ? s : undefined;
}

function axisUnit(k: Keywords, axis: number, wave: Float64Array): WaveUnit {
  const cunit = k.string(`CUNIT${axis}`)?.trim();
  if (cunit) {
    const u = parseWaveUnit(cunit);
    if (u) return u;
  }
  const wat = k.string(`WAT${axis}_001`);
  const m = wat ? /units=(\S+)/.exec(wat) : null;
  if (m) {
    const u = parseWaveUnit(m[1]);
    if (u) return u;
  }
  return guessWaveUnit(wave);
}
