import { describe, expect, it } from 'vitest';
import { featureCentre } from '../../renderer/science/feature-centre.js';
import { normalDeviates } from '../support/prng.js';

/** A 2 Å-per-pixel spectrum with one Gaussian line (σ in Å) on a flat continuum of 10. */
function spectrum(centreA: number, amplitude: number, sigmaA: number, noise: number, seed: number) {
  const gauss = normalDeviates(seed);
  const wave = Array.from({ length: 400 }, (_, i) => 5000 + 2 * i);
  const flux = wave.map((w) => 10 + amplitude * Math.exp(-0.5 * ((w - centreA) / sigmaA) ** 2) + noise * gauss());
  return { wave, flux };
}

describe('feature centre from a click', () => {
  it('snaps a click 5 Å off to the centre of an emission line, to a fraction of a pixel', () => {
    const { wave, flux } = spectrum(5447.3, 50, 2.2, 0, 1);
    const c = featureCentre(wave, flux, 5452.4)!;
    expect(c.kind).toBe('emission');
    // A parabola through three samples of a Gaussian of σ ≈ 1 pixel is good to ≈ 0.1 pixel.
    expect(Math.abs(c.waveAngstrom - 5447.3)).toBeLessThan(0.25);
  });

  it('finds an absorption trough and says so', () => {
    const { wave, flux } = spectrum(5601.1, -6, 3, 0.05, 2);
    const c = featureCentre(wave, flux, 5598);
    expect(c?.kind).toBe('absorption');
    expect(Math.abs(c!.waveAngstrom - 5601.1)).toBeLessThan(0.6);
  });

  it('beats the raw click on noisy lines (S/N of the peak ≈ 20), over 50 realisations', () => {
    let snapped = 0;
    for (let seed = 1; seed <= 50; seed++) {
      const { wave, flux } = spectrum(5500.7, 20, 2.5, 1, seed);
      const c = featureCentre(wave, flux, 5505)!;
      snapped += Math.abs(c.waveAngstrom - 5500.7);
    }
    expect(snapped / 50).toBeLessThan(1);
  });

  it('gives null where there is no data to centre on', () => {
    const wave = Array.from({ length: 100 }, (_, i) => 4000 + i);
    const flux = wave.map(() => null);
    expect(featureCentre(wave, flux, 4050)).toBeNull();
  });
});
