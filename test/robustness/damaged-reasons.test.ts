// Each way of damaging a spectrum (test/support/damaged-spectra.ts), applied to every 1-D FITS
// image of the demo night, is refused with a SpectrumReadError whose reason says what is wrong in
// one printable line: no control characters (a terminal or a CSV cell must show it as it is).
// This is the in-process half of the batch-resilience check; the other half runs `zvet measure`.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readSpectrum } from '../../core/spectrum/read';
import { SpectrumReadError } from '../../core/spectrum/spectrum';
import { CONTROL_CHARACTERS as CONTROL, FITS_DAMAGE, TEXT_DAMAGE } from '../support/damaged-spectra';
import { DEMO_WORKLIST } from '../support/paths';
import { prng } from '../support/prng';

/** The demo's 1-D FITS images (the table, text and truncated files are not images). */
const IMAGES = ['KRT-26-0011.fits', 'KRT-26-0012.fits', 'KRT-26-0013.fits', 'KRT-26-0014.fits', 'KRT-26-0015_1d.fits', 'KRT-26-0016.fits', 'KRT-26-0019.fits.gz', 'KRT-26-0020.fits', 'KRT-26-0021.fits', 'KRT-26-0022.fits'];
/** Random draws (cut points, junk bytes) per image and damage. */
const SEEDS = 8;

function reasonFor(bytes: Buffer, name: string): string {
  try {
    readSpectrum(new Uint8Array(bytes), name);
  } catch (err) {
    expect(err).toBeInstanceOf(SpectrumReadError);
    return (err as SpectrumReadError).reason;
  }
  throw new Error(`${name} was read although it is damaged`);
}

describe('damaged spectra: the reason', () => {
  for (const damage of FITS_DAMAGE) {
    it(`${damage.name}: ${damage.reason}`, () => {
      for (const image of damage.demoSource ? [damage.demoSource] : IMAGES) {
        const good = readFileSync(join(DEMO_WORKLIST, image));
        for (let seed = 1; seed <= SEEDS; seed++) {
          const reason = reasonFor(damage.make(good, prng(seed)), `damaged${damage.ending}`);
          expect(reason, `${image}, seed ${seed}: ${JSON.stringify(reason)}`).toMatch(damage.reason);
          expect(reason, `${image}, seed ${seed}: ${JSON.stringify(reason)}`).not.toMatch(CONTROL);
        }
      }
    });
  }
  for (const damage of TEXT_DAMAGE) {
    it(`${damage.name}: ${damage.reason}`, () => {
      const reason = reasonFor(damage.make(Buffer.alloc(0), prng(1)), `damaged${damage.ending}`);
      expect(reason).toMatch(damage.reason);
      expect(reason).not.toMatch(CONTROL);
    });
  }
});
