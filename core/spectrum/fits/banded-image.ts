/**
 * 2-D and 3-D images whose rows (or planes) are the bands of one spectrum:
 * - IRAF multispec/equispec (Valdes, "The IRAF/NOAO spectral world coordinate systems"):
 *   axis 1 is wavelength (equispec: a linear WCS; multispec: multispec-wcs.ts), axis 2 the
 *   apertures (zvet reads aperture 1), axis 3 the bands,
 *   labelled by BANDIDn ('spectrum - background fit, …', 'sigma - …', 'background - …').
 * - The SDSS-I/II spSpec image: rows labelled ARRAYn ('SPECTRUM', 'CONTINUUM-SUBTRACTED
 *   SPECTRUM', 'ERROR' (σ), 'MASK'), λ = 10^(COEFF0 + COEFF1·i), i from 0, vacuum (SDSS data model).
 */
import { readImage } from '../../fits/image.js';
import { ERROR_KIND, maskFrom, sdssMaskFrom, sigmaFrom } from '../columns.js';
import { bunit, firstPixels, headerParts, type HduContext, type LayoutDraft, type LayoutVerdict } from './layout.js';
import { sdssDefaults } from './surveys.js';
import { axisProblem, coeffAxis, hasCoeffAxis, linearAxis, type WavelengthAxis } from './wavelength-axis.js';
import { isMultispec, multispecAxis } from './multispec-wcs.js';

type BandRole = 'flux' | 'sigma' | 'ivar' | 'variance' | 'sky' | 'mask' | 'other';

/** Band label → role, by the label's first word (IRAF writes 'spectrum - …'; common practice). */
export function bandRole(label: string): BandRole {
  const word = label.trim().toLowerCase().split(/\s+-\s+|\s*,\s*/)[0];
  if (/^(spectrum|flux|optimal|object|science)\b/.test(word)) return 'flux';
  if (/^(sigma|error|err|uncertainty|noise|stddev)\b/.test(word)) return 'sigma';
  if (/^(ivar|inverse variance|invvar)\b/.test(word)) return 'ivar';
  if (/^(variance|var)\b/.test(word)) return 'variance';
  if (/^(background|sky)\b/.test(word)) return 'sky';
  if (/^(mask|bad pixel|badpix|flags?)\b/.test(word)) return 'mask';
  return 'other';
}

interface Bands {
  /** Offset of band b (0-based) in the image values, for aperture 1. */
  offset(band: number): number;
  labels: string[];
  wave: () => WavelengthAxis;
  format: string;
}

export function matchBandedImage(ctx: HduContext): LayoutVerdict {
  const { hdu, keywords: k } = ctx;
  if (hdu.kind !== 'image' || hdu.axes.length < 2 || hdu.axes.slice(1).every((a) => a === 1)) return undefined;
  const [n, n2, n3 = 1] = hdu.axes;
  if (hdu.axes.length > 3 && hdu.axes.slice(3).some((a) => a !== 1)) return `${hdu.axes.length}-D image is not a spectrum layout zvet reads`;
  let bands: Bands;
  if (hasCoeffAxis(k) && hdu.axes.length === 2) {
    bands = {
      offset: (b) => b * n,
      labels: Array.from({ length: n2 }, (_, b) => k.string(`ARRAY${b + 1}`) ?? ''),
      wave: () => coeffAxis(k, n),
      format: 'fits-survey-image',
    };
  } else {
    const multispec = isMultispec(k) ? multispecAxis(k, n) : null;
    if (multispec && 'problem' in multispec) return `${hdu.axes.length}-D image: ${multispec.problem}`;
    const problem = multispec ? undefined : axisProblem(k);
    if (problem) return `${hdu.axes.length}-D image with ${problem}`;
    // Bands lie along axis 3 (IRAF: axis 2 = apertures) or, for 2-D images, along axis 2.
    const bandAxisLength = hdu.axes.length === 3 ? n3 : n2;
    const stride = hdu.axes.length === 3 ? n * n2 : n;
    const labels = Array.from({ length: bandAxisLength }, (_, b) => k.string(`BANDID${b + 1}`) ?? '');
    const labelled = labels.some((l) => l);
    // A 2-D multispec image's lines are apertures (line 1 is read); another unlabelled 2-D image with many rows is not a spectrum.
    if (hdu.axes.length === 2 && !multispec && !labelled && n2 > 8) return `2-D image of ${n}×${n2} pixels without band labels (not a 1-D spectrum)`;
    const apertures = hdu.axes.length === 3 || (multispec && !labelled) ? n2 : 1;
    bands = { offset: (b) => b * stride, labels, wave: () => multispec ?? linearAxis(k, n), format: apertures > 1 ? `fits-multispec (aperture 1 of ${apertures})` : 'fits-multispec' };
  }
  return { format: bands.format, read: () => readBanded(ctx, bands, n) };
}

function readBanded(ctx: HduContext, bands: Bands, n: number): LayoutDraft {
  const values = readImage(ctx.hdu).values;
  const band = (b: number) => values.subarray(bands.offset(b), bands.offset(b) + n);
  const roles = bands.labels.map(bandRole);
  const find = (role: BandRole) => roles.indexOf(role);
  const fluxBand = find('flux') >= 0 ? find('flux') : 0;
  const flux = band(fluxBand).slice();
  const mask = new Uint8Array(n);
  let error: Float64Array | undefined;
  let errorKind: LayoutDraft['errorKind'] = 'none';
  for (const role of ['sigma', 'ivar', 'variance'] as const) {
    const b = find(role);
    if (b >= 0) {
      error = sigmaFrom(role, band(b), mask, flux);
      errorKind = ERROR_KIND[role];
      break;
    }
  }
  const maskBand = find('mask');
  if (maskBand >= 0) (bands.format === 'fits-survey-image' ? sdssMaskFrom : maskFrom)(band(maskBand), mask);
  const skyBand = find('sky');
  const { wave, unit, dispersion } = bands.wave();
  const defaults = sdssDefaults(ctx.keywords) ?? {};
  return firstPixels({
    format: bands.format,
    wave,
    waveUnit: unit,
    dispersion,
    flux,
    error,
    errorKind,
    mask: error || maskBand >= 0 ? mask : undefined,
    sky: skyBand >= 0 ? band(skyBand).slice() : undefined,
    fluxUnit: bunit(ctx.keywords) ?? 'unknown',
    ...headerParts(ctx, defaults),
  }, wave.length);
}
