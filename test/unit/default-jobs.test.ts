// The default number of measuring workers: one per SPECTRA_PER_DEFAULT_WORKER spectra, never
// more than the cores, never fewer than one (the spacing is our measurement, see measure-pool.ts).
import { availableParallelism } from 'node:os';
import { describe, expect, it } from 'vitest';
import { defaultJobs, SPECTRA_PER_DEFAULT_WORKER } from '../../core/node/measure-pool.js';

describe('defaultJobs', () => {
  const cores = availableParallelism();

  it('gives short batches one worker', () => {
    expect(defaultJobs(1)).toBe(1);
    expect(defaultJobs(SPECTRA_PER_DEFAULT_WORKER)).toBe(1);
  });

  it('adds a worker per SPECTRA_PER_DEFAULT_WORKER spectra, up to the cores', () => {
    expect(defaultJobs(SPECTRA_PER_DEFAULT_WORKER + 1)).toBe(Math.min(cores, 2));
    expect(defaultJobs(3 * SPECTRA_PER_DEFAULT_WORKER)).toBe(Math.min(cores, 3));
    expect(defaultJobs(1_000_000)).toBe(cores);
  });

  it('gives an empty list one worker rather than none', () => {
    expect(defaultJobs(0)).toBe(1);
  });
});
