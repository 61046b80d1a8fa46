/**
 * A value derived from a prepared spectrum, made on first use and kept as long as the spectrum
 * (several stages ask for the same running sums or positions).
 */
import type { PreparedSpectrum } from './preprocess.js';

export function perSpectrum<T>(make: (p: PreparedSpectrum) => T): (p: PreparedSpectrum) => T {
  const made = new WeakMap<PreparedSpectrum, T>();
  return (p) => {
    let value = made.get(p);
    if (value === undefined) made.set(p, (value = make(p)));
    return value;
  };
}
