/**
 * 1-D spectra stored as images: one image HDU (primary or extension) with a linear, log10
 * (DC-FLAG = 1 or SDSS COEFF0/COEFF1), `-LOG` or IRAF multispec wavelength axis, and optional
 * companion HDUs of the same length named for their content (EXTNAME 'ERROR', 'SIGMA', 'IVAR',
 * 'VARIANCE', 'SKY', 'MASK', …).
 * GALAH files (Kos et al. 2017): HDU 0 counts and HDU 1 'normalized' are spectra; the
 * 'relative_error' HDU is σ/flux, so σ = relative_error × |flux|; 'sky' is in counts and goes
 * with HDU 0 only.
 */
import { readImage } from '../../fits/image.js';
import type { FitsHdu } from '../../fits/parse.js';
import { ERROR_KIND, maskFrom, sigmaFrom, type ErrorRole } from '../columns.js';
import { bunit, firstPixels, headerParts, type HduContext, type LayoutDraft, type LayoutVerdict } from './layout.js';
import { GALAH_DEFAULTS, sdssDefaults } from './surveys.js';
import { axisProblem, coeffAxis, hasCoeffAxis, linearAxis, type WavelengthAxis } from './wavelength-axis.js';
import { isMultispec, multispecAxis } from './multispec-wcs.js';

type CompanionRole = ErrorRole | 'relative' | 'sky' | 'mask' | 'auxiliary';

/** EXTNAMEs of HDUs that accompany a spectrum rather than being one (common practice, no source). */
const COMPANIONS: Array<[RegExp, CompanionRole]> = [
  [/^relative_?err(or)?$/i, 'relative'],
  [/^(err|error|errors|sigma|noise|stddev|uncert|uncertainty|flux_?err(or)?|e_flux)$/i, 'sigma'],
  [/^(ivar|invvar|inverse_?variance|weight)$/i, 'ivar'],
  [/^(var|variance)$/i, 'variance'],
  [/^(sky|sky_?flux|background)$/i, 'sky'],
  [/^(mask|badpix|dq|quality|flags?)$/i, 'mask'],
  [/^(teluric|telluric|scattered|cross_?talk|resolution_?profile|resolution|lsf|wave|wavelength|continuum|model|fit)$/i, 'auxiliary'],
];

export function companionRole(hdu: FitsHdu): CompanionRole | undefined {
  const name = hdu.extname;
  if (!name) return undefined;
  return COMPANIONS.find(([re]) => re.test(name))?.[1];
}

/** Pixels along axis 1 when the image is 1-D in effect (other axes of length 1). */
export function spectralLength(hdu: FitsHdu): number | undefined {
  if (hdu.kind !== 'image' || hdu.axes.length === 0) return undefined;
  return hdu.axes.slice(1).every((n) => n === 1) ? hdu.axes[0] : undefined;
}

export function isGalah(ctx: HduContext): boolean {
  const names = new Set(ctx.file.hdus.map((h) => h.extname?.toLowerCase()));
  return names.has('normalized') && names.has('relative_error');
}

export function matchImage1d(ctx: HduContext): LayoutVerdict {
  const n = spectralLength(ctx.hdu);
  if (n === undefined) return undefined;
  const role = companionRole(ctx.hdu);
  if (role) return `'${ctx.hdu.extname}' image accompanies a spectrum`;
  if (isMultispec(ctx.keywords)) {
    const axis = multispecAxis(ctx.keywords, n);
    if ('problem' in axis) return `1-D image: ${axis.problem}`;
    return { format: 'fits-image-1d', read: () => readImage1d(ctx, n, axis) };
  }
  const problem = axisProblem(ctx.keywords);
  if (problem && !hasCoeffAxis(ctx.keywords)) return `1-D image with ${problem}`;
  return { format: 'fits-image-1d', read: () => readImage1d(ctx, n, problem ? coeffAxis(ctx.keywords, n) : linearAxis(ctx.keywords, n)) };
}

function readImage1d(ctx: HduContext, n: number, { wave, unit, dispersion }: WavelengthAxis): LayoutDraft {
  const flux = readImage(ctx.hdu).values;
  const mask = new Uint8Array(n);
  let error: Float64Array | undefined;
  let errorKind: LayoutDraft['errorKind'] = 'none';
  let sky: Float64Array | undefined;
  let hasMask = false;
  const galah = isGalah(ctx);
  for (const other of ctx.file.hdus) {
    if (other === ctx.hdu || spectralLength(other) !== n) continue;
    const role = companionRole(other);
    if (!role || role === 'auxiliary') continue;
    const values = readImage(other).values;
    if (role === 'relative' && !error) {
      error = values.map((r, i) => r * Math.abs(flux[i]));
      errorKind = 'sigma';
      for (let i = 0; i < n; i++) if (!(error[i] > 0)) mask[i] = 1;
    } else if ((role === 'sigma' || role === 'ivar' || role === 'variance') && !error) {
      error = sigmaFrom(role, values, mask, flux, values);
      errorKind = ERROR_KIND[role];
    } else if (role === 'sky' && !sky && !(galah && ctx.hdu.index !== 0)) {
      sky = values;
    } else if (role === 'mask' && !hasMask) {
      maskFrom(values, mask);
      hasMask = true;
    }
  }
  const parts = headerParts(ctx, galah ? GALAH_DEFAULTS : (sdssDefaults(ctx.keywords) ?? {}));
  return firstPixels({
    format: galah ? 'fits-image-1d (GALAH)' : 'fits-image-1d',
    wave,
    waveUnit: unit,
    dispersion,
    flux,
    error,
    errorKind,
    mask: hasMask || error ? mask : undefined,
    sky,
    fluxUnit: galah ? (ctx.hdu.index === 0 ? 'counts' : 'normalised (continuum = 1)') : (bunit(ctx.keywords) ?? 'unknown'),
    ...parts,
  }, wave.length);
}
