/** Joins typed arrays of one kind into a new one (chunks of inflated data, table heap pieces). */
export function concatArrays<T extends Uint8Array | Float64Array>(make: (length: number) => T, parts: readonly T[]): T {
  const out = make(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}
