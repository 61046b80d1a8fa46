/**
 * A number as a person writes it in decimal: digits, an optional point, an optional exponent.
 * Number() alone also takes "0x10", "0b1", "Infinity" and "" (as 0).
 */
const DECIMAL_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** The value of a decimal number (surrounding blanks allowed), or null when the text is not one. */
export function parseDecimal(text: string): number | null {
  const t = text.trim();
  return DECIMAL_NUMBER.test(t) ? Number(t) : null;
}
