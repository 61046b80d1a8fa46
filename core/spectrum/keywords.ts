/**
 * Header keywords looked up through several headers in turn (an extension's own header first,
 * then the primary header it inherits from), so that metadata can sit in either.
 */
import { FitsHeader, type CardValue } from '../fits/header.js';

export interface Keywords {
  has(key: string): boolean;
  value(key: string): CardValue | undefined;
  string(key: string): string | undefined;
  number(key: string): number | undefined;
  bool(key: string): boolean | undefined;
  comment(key: string): string | undefined;
}

export function stackKeywords(...headers: FitsHeader[]): Keywords {
  const owner = (key: string) => headers.find((h) => h.has(key));
  return {
    has: (key) => owner(key) !== undefined,
    value: (key) => owner(key)?.value(key),
    string: (key) => owner(key)?.string(key),
    number: (key) => owner(key)?.number(key),
    bool: (key) => owner(key)?.bool(key),
    comment: (key) => owner(key)?.comment(key),
  };
}

/** The first of the keys present, with its number value. */
export function firstNumber(k: Keywords, keys: string[]): { key: string; value: number } | undefined {
  for (const key of keys) {
    const value = k.number(key);
    if (value !== undefined) return { key, value };
  }
  return undefined;
}

/** The first of the keys present with a non-blank string value. */
export function firstString(k: Keywords, keys: string[]): { key: string; value: string } | undefined {
  for (const key of keys) {
    const value = k.string(key)?.trim();
    if (value) return { key, value };
  }
  return undefined;
}
