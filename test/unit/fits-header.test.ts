// FITS header cards as FITS Standard 4.0 §4 defines them (values, comments, CONTINUE §4.2.1.2,
// the ESO HIERARCH convention).
import { describe, expect, it } from 'vitest';
import { FitsHeader, joinContinued, parseCard, parseFitsNumber } from '../../core/fits/header.js';
import { card } from './fits-fixtures.js';

describe('parseCard', () => {
  it('reads strings with doubled quotes, dropping trailing blanks only through string()', () => {
    const c = parseCard(card('OBJECT', "O'Neil   ", 'target'));
    expect(c).toEqual({ key: 'OBJECT', value: "O'Neil   ", comment: 'target' });
    expect(new FitsHeader([c]).string('object')).toBe("O'Neil");
  });
  it('reads logicals, integers, floats with D exponents and comments', () => {
    expect(parseCard(card('SIMPLE', true)).value).toBe(true);
    expect(parseCard(card('NAXIS1', 3853)).value).toBe(3853);
    expect(parseCard('CRVAL1  =             1.25D+03 / start'.padEnd(80)).value).toBe(1250);
    expect(parseCard('CRVAL1  =             1.25D+03 / start'.padEnd(80)).comment).toBe('start');
    expect(parseFitsNumber('-.5E-2')).toBe(-0.005);
    expect(parseFitsNumber('12abc')).toBeNull();
  });
  it('keeps a slash inside a string as part of the value', () => {
    expect(parseCard(card('BUNIT', '1E-17 erg/cm^2/s/Ang')).value).toBe('1E-17 erg/cm^2/s/Ang');
  });
  it('treats COMMENT, HISTORY and cards without "= " as commentary', () => {
    expect(parseCard(card('COMMENT', undefined, 'hello')).value).toBeNull();
    expect(parseCard('HISTORY = not a value'.padEnd(80)).key).toBe('HISTORY');
  });
  it('reads HIERARCH keywords', () => {
    const c = parseCard('HIERARCH ESO TEL GEOLAT = -24.6270 / [deg] Tel geo latitude'.padEnd(80));
    expect(c.key).toBe('ESO TEL GEOLAT');
    expect(c.value).toBeCloseTo(-24.627, 10);
  });
  it('a blank value field is null (undefined value, FITS 4.0 §4.2)', () => {
    expect(parseCard('BLANKVAL=                      / nothing'.padEnd(80)).value).toBeNull();
  });
});

describe('parseFitsNumber', () => {
  // The reference is ECMAScript Number(), which rounds a decimal string correctly (ECMA-262
  // §7.1.4.1.1); parseFitsNumber works short numbers out itself (Clinger's fast path) and
  // must give the very same double, sign of zero included.
  const same = (text: string) => expect(Object.is(parseFitsNumber(text), Number(text.replace(/[Dd]/, 'E')))).toBe(true);
  it('equals Number() inside the fast path and at its edges', () => {
    for (const t of ['0', '-0', '+0', '-0.0', '.5', '5.', '0.1', '0.3', '-12.5e+01', '4.35', '3.14159265358979', '123456789012345', '1e22', '1e-22', '7.5D-3', '56.3742820000000']) same(t);
  });
  it('equals Number() past the fast path (16+ digits, exponents beyond ±22)', () => {
    for (const t of ['1234567890123456', '9007199254740993', '1e23', '1e-23', '0.1e-22', '2.2250738585072014e-308', '00000000000000000001']) same(t);
  });
  it('equals Number() on random decimals', () => {
    let seed = 7;
    const random = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 2 ** 32;
    const digits = (n: number) => Array.from({ length: n }, () => Math.floor(random() * 10)).join('');
    for (let k = 0; k < 20000; k++) {
      const exponent = random() < 0.5 ? `E${random() < 0.5 ? '-' : ''}${Math.floor(random() * 30)}` : '';
      same(`${random() < 0.3 ? '-' : ''}${digits(1 + Math.floor(random() * 9))}.${digits(Math.floor(random() * 10))}${exponent}`);
    }
  });
  it('refuses what is not a number, and infinities', () => {
    for (const t of ['', '.', '-', '1e', '1e+', 'E5', '1.2.3', ' 1', '0x10', 'NaN', 'Infinity', '1e400']) expect(parseFitsNumber(t)).toBeNull();
  });
});

describe('CONTINUE long strings', () => {
  it('joins the pieces, dropping each trailing &', () => {
    const cards = [
      "OBJECT  = 'a very long object name that does not fit on one card of eighty c&'",
      "CONTINUE  'haracters, so it continues&'",
      "CONTINUE  ' here' / the end",
      "NEXT    = 1",
    ].map((s) => parseCard(s.padEnd(80)));
    const joined = joinContinued(cards);
    expect(joined).toHaveLength(2);
    expect(joined[0].value).toBe('a very long object name that does not fit on one card of eighty characters, so it continues here');
    expect(joined[0].comment).toBe('the end');
  });
  it('leaves a CONTINUE card alone when the string before it has no &', () => {
    const cards = ["OBJECT  = 'short'", "CONTINUE  'orphan'"].map((s) => parseCard(s.padEnd(80)));
    expect(joinContinued(cards)).toHaveLength(2);
  });
});

describe('FitsHeader getters', () => {
  const h = new FitsHeader(
    [card('EXPTIME', 1200.5), card('EBV', '0.611'), card('VACUUM', true), card('OBJECT', 'KRT-26-0017'), card('EXPTIME', 1)].map(parseCard),
  );
  it('look keys up without regard to case; the first occurrence wins', () => {
    expect(h.number('exptime')).toBe(1200.5);
    expect(h.integer('EXPTIME')).toBeUndefined();
  });
  it('accept numbers written as strings, but not strings as booleans', () => {
    expect(h.number('EBV')).toBeCloseTo(0.611, 12);
    expect(h.bool('OBJECT')).toBeUndefined();
    expect(h.bool('VACUUM')).toBe(true);
    expect(h.number('OBJECT')).toBeUndefined();
  });
});
