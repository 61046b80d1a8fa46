// A redshift does not depend on the unit the flux is stored in: the same spectrum in
// 1e-17 erg/s/cm²/Å (the demo night's unit) and in plain erg/s/cm²/Å (values ~1e-17), or at any
// other constant factor, must give the same measurement, and fluxes must scale with it.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readSpectrumFile } from '../../core/node/read-spectrum-file.js';
import { measureRedshift } from '../../core/redshift/measure.js';
import { templateModelFlux } from '../../core/redshift/template-model.js';
import { measureLines } from '../../core/hosts/measure-lines.js';
import type { Spectrum } from '../../core/spectrum/spectrum.js';
import { DEMO_WORKLIST, OPEN_SPECTRA } from '../support/paths.js';

const FACTORS = [1e-17, 1e17, 1e-200, 1e200];

function times(s: Spectrum, k: number): Spectrum {
  const by = (a: Float64Array) => a.map((v) => v * k);
  return { ...s, flux: by(s.flux), error: by(s.error), ...(s.sky ? { sky: by(s.sky) } : {}) };
}

function withoutErrors(s: Spectrum): Spectrum {
  return { ...s, error: new Float64Array(s.flux.length).fill(NaN) };
}

/** One demo spectrum of each kind (emission galaxy, passive, QSO, star) and an SDSS galaxy. */
const FILES = [
  join(DEMO_WORKLIST, 'KRT-26-0018.csv'),
  join(DEMO_WORKLIST, 'KRT-26-0012.fits'),
  join(DEMO_WORKLIST, 'KRT-26-0014.fits'),
  join(DEMO_WORKLIST, 'KRT-26-0016.fits'),
  join(OPEN_SPECTRA, 'sdss/spec-0266-51602-0001.fits'),
];

describe('measurements in any flux unit', () => {
  it.each(FILES)('%s: same z, σz, template and verdict at flux × 1e±17 and × 1e±200, with and without errors', async (file) => {
    const spectrum = await readSpectrumFile(file);
    for (const base of [spectrum, withoutErrors(spectrum)]) {
      const ref = measureRedshift(base);
      expect(ref.best).not.toBeNull();
      for (const k of FACTORS) {
        const m = measureRedshift(times(base, k));
        expect(m.best?.template, `× ${k}`).toBe(ref.best!.template);
        expect(m.confidence, `× ${k}`).toBe(ref.confidence);
        // Only rounding in the division by the scale differs.
        expect(Math.abs(m.best!.z - ref.best!.z), `× ${k}`).toBeLessThan(1e-9 * (1 + ref.best!.z));
        expect(m.best!.zErr / ref.best!.zErr, `× ${k}`).toBeCloseTo(1, 6);
        expect(m.candidates.map((c) => c.template)).toEqual(ref.candidates.map((c) => c.template));
      }
    }
  });

  it('draws the template model in the file unit: it scales with the flux', async () => {
    const spectrum = await readSpectrumFile(join(DEMO_WORKLIST, 'KRT-26-0018.csv'));
    const ref = templateModelFlux('star-forming', 0.41272, spectrum);
    const finite = ref.filter(Number.isFinite);
    expect(finite.length).toBeGreaterThan(100);
    for (const k of FACTORS) {
      const scaled = templateModelFlux('star-forming', 0.41272, times(spectrum, k));
      ref.forEach((v, i) => {
        if (Number.isFinite(v)) expect(scaled[i] / k / v).toBeCloseTo(1, 8);
        else expect(scaled[i]).toBeNaN();
      });
    }
  });

  it('measures host line fluxes that scale with the flux, and the same equivalent widths', async () => {
    const spectrum = await readSpectrumFile(join(DEMO_WORKLIST, 'KRT-26-0018.csv'));
    const ref = measureLines(spectrum, 0.41272);
    const detected = ref.lines.filter((l) => !l.limit);
    expect(detected.length).toBeGreaterThan(3);
    for (const k of FACTORS) {
      const m = measureLines(times(spectrum, k), 0.41272);
      expect(m.lines.map((l) => [l.name, l.limit])).toEqual(ref.lines.map((l) => [l.name, l.limit]));
      m.lines.forEach((l, i) => {
        const r = ref.lines[i];
        expect(l.flux / k / r.flux, `${l.name} × ${k}`).toBeCloseTo(1, 6);
        expect(l.flux_err / k / r.flux_err, `${l.name} × ${k}`).toBeCloseTo(1, 6);
        expect(l.ew_rest / r.ew_rest, `${l.name} × ${k}`).toBeCloseTo(1, 6);
      });
    }
  });
});
