// Builds raw FITS header blocks for tests: 80-character cards, END, padded to 2880 bytes.
// Deliberately permissive (any key, any value text) so tests can write broken headers.

export function card(key: string, value?: string | number | boolean): string {
  if (value === undefined) return key.padEnd(80).slice(0, 80);
  const text = typeof value === 'boolean' ? (value ? 'T' : 'F') : typeof value === 'number' ? String(value) : `'${value.replace(/'/g, "''")}'`;
  return `${key.padEnd(8).slice(0, 8)}= ${text.padStart(typeof value === 'string' ? 0 : 20)}`.padEnd(80).slice(0, 80);
}

/** Header text from cards (END appended unless told not to), padded to whole 2880-byte blocks. */
export function headerBytes(cards: string[], withEnd = true): Uint8Array {
  let text = cards.join('') + (withEnd ? 'END'.padEnd(80) : '');
  const pad = (2880 - (text.length % 2880)) % 2880;
  text += ' '.repeat(pad);
  return new TextEncoder().encode(text);
}

export function concatBytes(...parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}
