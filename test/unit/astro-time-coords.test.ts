// Time-scale arithmetic and RA/Dec parsing. Known MJDs: MJD 51544.5 is J2000.0 (2000-01-01
// 12h; IAU), MJD 0 is 1858-11-17 (Smithsonian definition).
import { describe, expect, it } from 'vitest';
import { parseDecDeg, parseRaDeg } from '../../core/astro/coords.js';
import { findSite, resolveSite, SITES } from '../../core/astro/sites.js';
import { isoUtcFromMjd, mjdFromCalendar, mjdFromIsoUtc, mjdTtFromUtc, taiMinusUtcS } from '../../core/astro/time.js';

describe('calendar and MJD', () => {
  it('has the defining epochs', () => {
    expect(mjdFromCalendar(1858, 11, 17)).toBe(0);
    expect(mjdFromIsoUtc('2000-01-01T12:00:00Z')).toBe(51544.5);
    expect(mjdFromCalendar(1970, 1, 1)).toBe(40587);
  });

  it('reads ISO text with fractions, a space or no seconds, and writes it back', () => {
    expect(mjdFromIsoUtc('2026-03-14 06:00')).toBe(mjdFromCalendar(2026, 3, 14) + 0.25);
    expect(isoUtcFromMjd(mjdFromIsoUtc('2024-02-29T23:59:59.250'))).toBe('2024-02-29T23:59:59.250Z');
  });

  it('refuses impossible or incomplete times with the text in the message', () => {
    expect(() => mjdFromIsoUtc('2026-02-29T01:00:00')).toThrow(/2026-02-29T01:00:00.*no such calendar date/);
    expect(() => mjdFromIsoUtc('2026-03-14')).toThrow(/not an ISO 8601 UTC date and time/);
    expect(() => mjdFromIsoUtc('2026-03-14T25:00:00')).toThrow(/out of range/);
    expect(() => mjdFromIsoUtc('2026-03-14T05:00:00+02:00')).toThrow(/time zones/);
  });

  it('takes second 60 only in the last minute of a day that ends with a leap second (IERS Bulletin C)', () => {
    // 2016 December 31 and 2015 June 30 ended with leap seconds; 2026 March 14 and 2017 December 31 did not.
    expect(mjdFromIsoUtc('2016-12-31T23:59:60.5')).toBeCloseTo(mjdFromCalendar(2016, 12, 31) + 86400.5 / 86400, 12);
    expect(() => mjdFromIsoUtc('2015-06-30T23:59:60')).not.toThrow();
    for (const text of ['2026-03-14T05:12:60', '2017-12-31T23:59:60', '2016-12-31T22:59:60']) expect(() => mjdFromIsoUtc(text), text).toThrow(/second 60/);
  });

  it('TT = UTC + 37 s + 32.184 s after 2017 (IERS Bulletin C)', () => {
    const mjd = mjdFromIsoUtc('2026-03-14T05:00:00');
    expect(taiMinusUtcS(mjd)).toBe(37);
    expect((mjdTtFromUtc(mjd) - mjd) * 86400).toBeCloseTo(69.184, 6);
    expect(() => taiMinusUtcS(mjdFromCalendar(1969, 6, 1))).toThrow(/before 1972/);
  });
});

describe('RA/Dec parsing', () => {
  it('reads degrees and sexagesimal hours for RA', () => {
    expect(parseRaDeg('188.7')).toBe(188.7);
    expect(parseRaDeg('12:34:48')).toBeCloseTo(188.7, 12);
    expect(parseRaDeg('12 34 48.0')).toBeCloseTo(188.7, 12);
    expect(parseRaDeg('12h34m48s')).toBeCloseTo(188.7, 12);
    expect(parseRaDeg('12.58h')).toBeCloseTo(188.7, 12);
    expect(parseRaDeg('188d42m')).toBeCloseTo(188.7, 12);
  });

  it('reads degrees and sexagesimal degrees for Dec, keeping the sign of −00', () => {
    expect(parseDecDeg('-5.1')).toBe(-5.1);
    expect(parseDecDeg('-05:06:00')).toBeCloseTo(-5.1, 12);
    expect(parseDecDeg('-00:30:00')).toBeCloseTo(-0.5, 12);
    expect(parseDecDeg('+41d16m08.4s')).toBeCloseTo(41.269, 12);
    expect(parseDecDeg('-05°06′00″')).toBeCloseTo(-5.1, 12);
  });

  it('gives clear errors', () => {
    expect(() => parseRaDeg('25:00:00')).toThrow(/right ascension "25:00:00" is outside/);
    expect(() => parseRaDeg('-01:00:00')).toThrow(/cannot be negative/);
    expect(() => parseRaDeg('12:61:00')).toThrow(/minutes and seconds must be below 60/);
    expect(() => parseRaDeg('abc')).toThrow(/right ascension "abc" is neither/);
    expect(() => parseDecDeg('95')).toThrow(/declination "95" is outside/);
    expect(() => parseDecDeg('12h30m')).toThrow(/declination "12h30m" is neither/);
  });
});

describe('sites', () => {
  it('has the invented demo site and finds sites by id or name', () => {
    const k = findSite('Kestrel Ridge');
    expect(k).toMatchObject({ latitudeDeg: 36.1843, longitudeDeg: -105.721, heightM: 2840 });
    expect(k?.source).toMatch(/invented/);
    expect(findSite('kestrel-ridge')).toBe(k);
    expect(findSite('nowhere')).toBeUndefined();
    expect(new Set(SITES.map((s) => s.id)).size).toBe(SITES.length);
  });

  it('completes a header site from its coordinates or its name', () => {
    expect(resolveSite({ latitudeDeg: 10, longitudeDeg: 20 })).toMatchObject({ site: { heightM: 0 }, note: /height unknown/ });
    expect(resolveSite({ name: 'KESTREL RIDGE' })?.site.latitudeDeg).toBe(36.1843);
    expect(resolveSite({ name: 'unknown hill' })).toBeNull();
    expect(resolveSite(undefined)).toBeNull();
  });
});
