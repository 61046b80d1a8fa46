// selectInPlace and medianInPlace against a full sort (the definition of the k-th smallest and
// of the median), on random arrays, arrays of few distinct values (the runs of equal values that
// send the selection to Hoare's partition) and sorted or reversed arrays.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { medianInPlace, selectInPlace } from '../../core/redshift/continuum.js';

const sorted = (values: number[]) => Float64Array.from(values).sort();

function checkSelection(values: number[], k: number): void {
  const a = Float64Array.from(values);
  const kth = selectInPlace(a, a.length, k);
  expect(kth).toBe(sorted(values)[k]);
  // The partial order promised: nothing larger on the left of k, nothing smaller on its right.
  for (let i = 0; i < k; i++) expect(a[i]).toBeLessThanOrEqual(kth);
  for (let i = k + 1; i < a.length; i++) expect(a[i]).toBeGreaterThanOrEqual(kth);
  // A permutation of the input.
  expect(sorted(Array.from(a))).toEqual(sorted(values));
}

const arrays = fc.oneof(
  fc.array(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), { minLength: 1, maxLength: 600 }),
  fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 1, maxLength: 600 }),
  fc.array(fc.double({ noNaN: true, min: 0, max: 1 }), { minLength: 1, maxLength: 600 }).map((v) => v.sort((x, y) => x - y)),
  fc.array(fc.double({ noNaN: true, min: 0, max: 1 }), { minLength: 1, maxLength: 600 }).map((v) => v.sort((x, y) => y - x)),
);

describe('selectInPlace', () => {
  it('returns the k-th smallest and splits the array around it', () => {
    fc.assert(
      fc.property(arrays, fc.double({ min: 0, max: 1, noNaN: true }), (values, f) => checkSelection(values, Math.min(values.length - 1, Math.floor(f * values.length)))),
      { numRuns: 400 },
    );
  });

  it('handles all-equal and two-valued arrays of survey length', () => {
    checkSelection(new Array(4000).fill(2.5), 2000);
    checkSelection(Array.from({ length: 4001 }, (_, i) => (i % 2 ? 1 : 0)), 2000);
    checkSelection(Array.from({ length: 4000 }, (_, i) => (i < 3990 ? 7 : i)), 3995);
  });
});

describe('medianInPlace', () => {
  it('is the middle value, or the mean of the two middle values', () => {
    fc.assert(
      fc.property(arrays, (values) => {
        const s = sorted(values), n = s.length;
        const expected = n % 2 ? s[n >> 1] : 0.5 * (s[(n >> 1) - 1] + s[n >> 1]);
        expect(medianInPlace(Float64Array.from(values), n)).toBe(expected);
      }),
      { numRuns: 400 },
    );
  });
});
