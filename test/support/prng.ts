// Seeded random numbers for tests, so a failing case can be replayed: the same generator the
// demo worklist uses (sample-spectra/demo/random.ts: mulberry32 + Box–Muller).
import { seededRandom } from '../../sample-spectra/demo/random.js';

/** Uniform deviates in [0, 1). */
export function prng(seed: number): () => number {
  return seededRandom(seed).uniform;
}

/** Standard normal deviates (mean 0, σ 1). */
export function normalDeviates(seed: number): () => number {
  return seededRandom(seed).normal;
}
