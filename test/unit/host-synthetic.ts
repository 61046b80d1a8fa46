// Synthetic spectra with Gaussian emission lines injected at known fluxes, for the host tests.
import type { Spectrum } from '../../core/spectrum/spectrum.js';
import { normalDeviates } from '../support/prng.js';

/** Provenance of a spectrum made in a test: vacuum, log-linear, with σ. */
export const SYNTHETIC_PROVENANCE: Spectrum['provenance'] = {
  format: 'synthetic', hdu: null, spectrumHdus: [], medium: 'vacuum', mediumReason: 'synthetic', mediumSource: 'file', dispersion: 'log10',
  errorKind: 'sigma', waveUnitInFile: 'Å', waveUnitDoubt: null, hasMask: false, hasSky: false, flipped: false, header: [],
};

export { normalDeviates };

export interface InjectedLine {
  restWaveAngstrom: number;
  /** Flux in flux-density unit × Å; negative for absorption. */
  flux: number;
  sigmaKmS: number;
  dvKmS?: number;
}

export interface SyntheticOptions {
  z: number;
  lines: InjectedLine[];
  /** 1σ noise per pixel (flux-density units). */
  noise: number;
  seed: number;
  continuum?: (waveAngstrom: number) => number;
  /** log10 pixel step (SDSS-like 1e-4 by default). */
  dlog10?: number;
  fluxUnit?: string;
}

export function syntheticSpectrum(o: SyntheticOptions): Spectrum {
  const dlog = o.dlog10 ?? 1e-4;
  const n = Math.floor((Math.log10(9200) - Math.log10(3800)) / dlog);
  const wave = new Float64Array(n);
  const flux = new Float64Array(n);
  const error = new Float64Array(n).fill(o.noise);
  const rand = normalDeviates(o.seed);
  const continuum = o.continuum ?? ((w: number) => 10 + 2e-4 * (w - 6000));
  const c = 299792.458;
  for (let i = 0; i < n; i++) {
    const w = 10 ** (Math.log10(3800) + i * dlog);
    wave[i] = w;
    let f = continuum(w);
    for (const l of o.lines) {
      const mu = l.restWaveAngstrom * (1 + o.z) * (1 + (l.dvKmS ?? 0) / c);
      const s = (mu * l.sigmaKmS) / c;
      f += (l.flux / (Math.sqrt(2 * Math.PI) * s)) * Math.exp(-0.5 * ((w - mu) / s) ** 2);
    }
    flux[i] = f + o.noise * rand();
  }
  return {
    fileName: 'synthetic.fits',
    waveAngstrom: wave,
    flux,
    error,
    mask: new Uint8Array(n),
    fluxUnit: o.fluxUnit ?? '1e-17 erg/s/cm^2/Angstrom',
    meta: { velocityFrame: 'unknown', velocityFrameReason: 'synthetic' },
    provenance: SYNTHETIC_PROVENANCE,
  };
}
