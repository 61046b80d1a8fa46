// The quick screen of table headers for a wavelength column (core/spectrum/fits/wave-column-screen.ts)
// must never pass over a table whose TTYPEn, as the full card parser reads it (FITS Standard 4.0
// §4.2.1: quoted strings, blanks not significant at the end; CONTINUE strings §4.2.1.2), names one.
import { describe, expect, it } from 'vitest';
import { FitsHeader } from '../../core/fits/header.js';
import { COLUMN_NAMES } from '../../core/spectrum/columns.js';
import { mayNameWavelength } from '../../core/spectrum/fits/wave-column-screen.js';

const headerOf = (...cards: string[]) => FitsHeader.fromBytes(new Uint8Array([...cards.map((c) => c.padEnd(80).slice(0, 80)).join('')].map((ch) => ch.charCodeAt(0))));

/** Whether the full parse finds a wavelength column name among TTYPE1..TTYPE3. */
function namesWavelength(h: FitsHeader): boolean {
  const names = [1, 2, 3].map((n) => h.string(`TTYPE${n}`)?.trim().toLowerCase());
  return names.some((n) => n !== undefined && [...COLUMN_NAMES.wave, ...COLUMN_NAMES.loglam].includes(n));
}

describe('wavelength-column screen of a table header', () => {
  const named: Array<[string, string[]]> = [
    ['quoted', ["TTYPE1  = 'LOGLAM  '"]],
    ['blanks inside the quotes first', ["TTYPE2  = '   wave'           / the wavelength"]],
    ['lower-case keyword', ["ttype1  = 'Lambda'"]],
    ['unquoted value', ['TTYPE1  = wavelength / not standard, still read']],
    ['unterminated string', ["TTYPE3  = 'wave_air"]],
    ['unprintable byte beside the name', ["TTYPE1  = '\u0001wave\u0002'"]],
    ['name built from CONTINUE cards', ["TTYPE1  = 'wa&'", "CONTINUE  've'"]],
    ['HIERARCH keyword', ["HIERARCH TTYPE1 = 'wave'"]],
  ];
  for (const [what, cards] of named) {
    it(`keeps a table whose name is a ${what}`, () => {
      const h = headerOf("XTENSION= 'BINTABLE'", 'TFIELDS =                    3', ...cards);
      expect(namesWavelength(h)).toBe(true);
      expect(mayNameWavelength(h)).toBe(true);
    });
  }
  it('passes over tables that only mention such words elsewhere', () => {
    const h = headerOf("TTYPE1  = 'WAVEMIN '           / wave in the comment", "TTYPE2  = 'LINEWAVE'", "TFORM1  = 'E'", "COMMENT   wave");
    expect(namesWavelength(h)).toBe(false);
    expect(mayNameWavelength(h)).toBe(false);
  });
});
