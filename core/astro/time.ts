/**
 * Time scales for the barycentric correction: UTC (civil, with leap seconds) → TAI → TT → TDB,
 * as Modified Julian Dates. UT1 is taken equal to UTC (IERS keeps |UT1 − UTC| < 0.9 s, which
 * moves a barycentric correction by < 0.05 m/s through the Earth's rotation).
 */

/**
 * TAI − UTC in seconds from each date on (year, month, day 1, 0h UTC), from IERS Bulletin C
 * (the leap-second history it restates in every issue; the last step is 2017 January 1).
 * IERS Bulletin C 70 (July 2025; from memory) announced no leap second at the end of
 * December 2025, so the table is known to hold until 2026 June 30; later dates use 37 s.
 */
const LEAP_SECONDS: ReadonlyArray<readonly [year: number, month: number, taiMinusUtcS: number]> = [
  [1972, 1, 10], [1972, 7, 11], [1973, 1, 12], [1974, 1, 13], [1975, 1, 14], [1976, 1, 15],
  [1977, 1, 16], [1978, 1, 17], [1979, 1, 18], [1980, 1, 19], [1981, 7, 20], [1982, 7, 21],
  [1983, 7, 22], [1985, 7, 23], [1988, 1, 24], [1990, 1, 25], [1991, 1, 26], [1992, 7, 27],
  [1993, 7, 28], [1994, 7, 29], [1996, 1, 30], [1997, 7, 31], [1999, 1, 32], [2006, 1, 33],
  [2009, 1, 34], [2012, 7, 35], [2015, 7, 36], [2017, 1, 37],
];

/** Last date (MJD, UTC) the leap-second table is known to be complete for. */
export const LEAP_SECONDS_KNOWN_UNTIL_MJD = mjdFromCalendar(2026, 7, 1);

/** TT − TAI, s (IAU 1991 Resolution A4, exact). */
const TT_MINUS_TAI_S = 32.184;

/** MJD of J2000.0 (2000 January 1, 12h TT). */
export const MJD_J2000 = 51544.5;

/** MJD at 0h of a Gregorian calendar date (days-from-civil algorithm; MJD 0 = 1858-11-17). */
export function mjdFromCalendar(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const mp = (month + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  const daysSince1970 = era * 146097 + doe - 719468;
  return daysSince1970 + 40587;
}

const LEAP_STEPS_MJD = LEAP_SECONDS.map(([y, m, s]) => [mjdFromCalendar(y, m, 1), s] as const);

/** TAI − UTC in seconds at a UTC MJD; UTC before 1972 (no whole-second offsets) is refused. */
export function taiMinusUtcS(mjdUtc: number): number {
  if (!(mjdUtc >= LEAP_STEPS_MJD[0][0])) {
    throw new RangeError(`UTC before 1972-01-01 is not supported (MJD ${mjdUtc}): it had no whole-second offset from TAI`);
  }
  let offset = LEAP_STEPS_MJD[0][1];
  for (const [mjd, s] of LEAP_STEPS_MJD) if (mjdUtc >= mjd) offset = s;
  return offset;
}

/** TT as MJD from UTC as MJD: TT = UTC + (TAI − UTC) + 32.184 s. */
export function mjdTtFromUtc(mjdUtc: number): number {
  return mjdUtc + (taiMinusUtcS(mjdUtc) + TT_MINUS_TAI_S) / 86400;
}

/**
 * TDB − TT in seconds at a TT MJD: the series of Fairhead & Bretagnon (1990) truncated as in
 * Kaplan (2005, USNO Circular 179, eq. 2.6), good to about 10 µs over 1600–2200.
 */
export function tdbMinusTtS(mjdTt: number): number {
  const t = (mjdTt - MJD_J2000) / 36525;
  return (
    0.001657 * Math.sin(628.3076 * t + 6.2401) +
    0.000022 * Math.sin(575.3385 * t + 4.297) +
    0.000014 * Math.sin(1256.6152 * t + 6.1969) +
    0.000005 * Math.sin(606.9777 * t + 4.0212) +
    0.000005 * Math.sin(52.9691 * t + 0.4444) +
    0.000002 * Math.sin(21.3299 * t + 5.5431) +
    0.00001 * t * Math.sin(628.3076 * t + 4.249)
  );
}

/** TDB as MJD from UTC as MJD. */
export function mjdTdbFromUtc(mjdUtc: number): number {
  const tt = mjdTtFromUtc(mjdUtc);
  return tt + tdbMinusTtS(tt) / 86400;
}

const ISO_UTC = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?Z?$/;

/**
 * UTC MJD from an ISO 8601 date and time ("2026-03-14T05:12:33.5", optional trailing Z, a
 * space instead of T allowed). A date without a time of day is refused: a barycentric
 * correction needs the time to a few minutes. Throws a RangeError saying what is wrong.
 */
export function mjdFromIsoUtc(text: string): number {
  const m = ISO_UTC.exec(text.trim());
  if (!m) {
    throw new RangeError(`"${text}" is not an ISO 8601 UTC date and time like 2026-03-14T05:12:33 (time zones other than Z are not accepted)`);
  }
  const [year, month, day, hour, minute] = m.slice(1, 6).map(Number);
  const second = m[6] === undefined ? 0 : Number(m[6]);
  const daysInMonth = mjdFromCalendar(month === 12 ? year + 1 : year, (month % 12) + 1, 1) - mjdFromCalendar(year, month, 1);
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth) throw new RangeError(`"${text}": no such calendar date`);
  if (hour > 23 || minute > 59 || second >= 61) throw new RangeError(`"${text}": time of day out of range`);
  const mjd0 = mjdFromCalendar(year, month, day);
  // Second 60 exists only in the last minute of a day that ends with a leap second.
  if (second >= 60 && !(hour === 23 && minute === 59 && LEAP_STEPS_MJD.some(([mjd]) => mjd === mjd0 + 1))) {
    throw new RangeError(`"${text}": second 60 exists only at 23:59 on a day that ends with a leap second (IERS Bulletin C), and this one does not`);
  }
  return mjd0 + (hour * 3600 + minute * 60 + second) / 86400;
}

/** ISO 8601 UTC text (millisecond precision, trailing Z) from a UTC MJD. */
export function isoUtcFromMjd(mjdUtc: number): string {
  return new Date(Math.round((mjdUtc - 40587) * 86400000)).toISOString();
}
