/** Puts a Spectrum into the JSON-safe shapes of the host API (NaN and ±Infinity become null). */
import type { SpectrumArrays, SpectrumMetaView } from '../../api/host-api.js';
import type { Spectrum } from '../../spectrum/spectrum.js';
import { toJsonNumbers } from '../../util/json-numbers.js';

export { toJsonNumbers };

export function spectrumArrays(s: Spectrum): SpectrumArrays {
  return {
    waveAngstrom: toJsonNumbers(s.waveAngstrom),
    flux: toJsonNumbers(s.flux),
    error: toJsonNumbers(s.error),
    mask: Array.from(s.mask),
    sky: s.sky ? toJsonNumbers(s.sky) : null,
  };
}

export function spectrumMetaView(s: Spectrum): SpectrumMetaView {
  const m = s.meta;
  return {
    fileName: s.fileName,
    format: s.provenance.format,
    hdu: s.provenance.hdu,
    fluxUnit: s.fluxUnit,
    object: m.object ?? null,
    raDeg: m.raDeg ?? null,
    decDeg: m.decDeg ?? null,
    dateObsUtc: m.dateObsUtc ?? null,
    mjdObs: m.mjdObs ?? null,
    exposureS: m.exposureS ?? null,
    mediumInFile: s.provenance.medium,
    mediumReason: s.provenance.mediumReason,
    mediumSource: s.provenance.mediumSource,
    waveUnitDoubt: s.provenance.waveUnitDoubt,
    velocityFrame: m.velocityFrame,
    velocityFrameReason: m.velocityFrameReason,
    site: m.site ? { ...m.site } : null,
  };
}
