import { parseDecimal } from '../../util/decimal.js';
import { UsageError } from './usage-error.js';

/** A command-line number, or a usage error naming the flag (or argument) and the text. */
export function numberOption(flag: string, text: string, min?: number): number {
  const v = parseDecimal(text);
  if (v === null) throw new UsageError(`${flag}: "${text}" is not a number`);
  if (min !== undefined && v < min) throw new UsageError(`${flag}: ${text} is below ${min}`);
  return v;
}
