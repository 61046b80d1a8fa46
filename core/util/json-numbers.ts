/** Numbers for JSON, which has no NaN or ±Infinity: those become null. */
export function toJsonNumbers(values: ArrayLike<number>): (number | null)[] {
  const out = new Array<number | null>(values.length);
  for (let i = 0; i < values.length; i++) out[i] = Number.isFinite(values[i]) ? values[i] : null;
  return out;
}
