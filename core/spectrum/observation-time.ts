/**
 * Start of the observation from the header: MJD-OBS / JD / DATE-OBS (+ TIME-OBS or UT) and
 * survey variants, returned both as an ISO 8601 UTC string and as MJD (UTC).
 * MJD = JD − 2400000.5; MJD 40587 = 1970-01-01T00:00:00 UTC (Unix epoch).
 */
import { isoUtcFromMjd, mjdFromIsoUtc } from '../astro/time.js';
import { firstNumber, firstString, type Keywords } from './keywords.js';

export interface ObservationTime {
  dateObsUtc: string;
  mjdObs: number;
}

/** The observation time with the keyword(s) it came from, and a warning when DATE-OBS disagrees. */
export interface HeaderObservationTime extends ObservationTime {
  obsTimeFrom: string;
  obsTimeWarning?: string;
}

/** A DATE-OBS with a time of day and a numeric time may differ by this much before it is flagged. */
const DATE_AGREEMENT_DAYS = 1;

export function observationTime(k: Keywords): HeaderObservationTime | { obsTimeWarning: string } | undefined {
  const dateKey = firstString(k, ['DATE-OBS', 'DATE_OBS', 'DATE-BEG', 'UTDATE_S']);
  const timeKey = firstString(k, ['TIME-OBS', 'TIME_OBS', 'UT', 'UTC', 'UTSTART', 'UT-START']);
  const date = dateKey ? fromDateText(dateKey.value, timeKey?.value) : undefined;
  const dateFrom = dateKey ? (date?.hasTime && !/[T ]\d/.test(dateKey.value) && timeKey ? `${dateKey.key} + ${timeKey.key}` : dateKey.key) : '';
  const unreadableDate = dateKey ? `${dateKey.key} '${dateKey.value}'${timeKey ? ` with ${timeKey.key} '${timeKey.value}'` : ''} is not a date and time that exist` : '';
  /** A numeric time, checked against the DATE-OBS text when there is one. */
  const numeric = (mjd: number, from: string): HeaderObservationTime | undefined => {
    const t = fromMjd(mjd);
    if (!t) return undefined;
    const off = date ? mjd - date.time.mjdObs : 0;
    // A date alone may be the night's (local) date: the time may fall on it, the day after or the day before.
    const agrees = !date || (date.hasTime ? Math.abs(off) <= DATE_AGREEMENT_DAYS : off > -1 && off < 2);
    const warning = dateKey && !date ? `${unreadableDate}; ${from} used` : !agrees ? `${dateKey!.key} '${dateKey!.value}' is ${Math.abs(off).toFixed(1)} days from ${from} ${mjd}; ${from} used` : undefined;
    return { ...t, obsTimeFrom: from, ...(warning ? { obsTimeWarning: warning } : {}) };
  };
  const mjd = firstNumber(k, ['MJD-OBS', 'MJD_OBS', 'MJD-BEG', 'MJDSTART', 'UTMJD_S']);
  if (mjd) return numeric(mjd.value, mjd.key);
  const jd = firstNumber(k, ['JD', 'JD-OBS', 'JD_OBS']);
  if (jd && jd.value > 2_400_000) return numeric(jd.value - 2_400_000.5, `${jd.key} − 2400000.5`);
  if (date?.hasTime) return { ...date.time, obsTimeFrom: dateFrom };
  const taiSeconds = firstNumber(k, ['TAI-BEG', 'TAI']);
  if (taiSeconds && taiSeconds.value > 3e9) return numeric(taiSecondsToMjdUtc(taiSeconds.value), `${taiSeconds.key} (TAI − leap seconds)`);
  const mjdDay = firstNumber(k, ['UTMJD', 'MJD']);
  if (mjdDay && !Number.isInteger(mjdDay.value)) return numeric(mjdDay.value, mjdDay.key);
  if (date) return { ...date.time, obsTimeFrom: `${dateFrom} (a date without time: 00:00 UTC)` };
  if (mjdDay && mjdDay.value > 0 && mjdDay.value < 100_000) return numeric(mjdDay.value, `${mjdDay.key} (a whole day)`);
  return dateKey ? { obsTimeWarning: unreadableDate } : undefined;
}

/**
 * The header's own mid-time of the observation, MJD-AVG or DATE-AVG (Rots et al. 2015, A&A 574,
 * A36, §4.1.2: the average time, e.g. of exposures combined), as MJD (UTC; other time scales
 * are not converted, a difference of at most about a minute).
 */
export function averageTime(k: Keywords): { mjdAvg: number; avgTimeFrom: string } | undefined {
  const mjd = firstNumber(k, ['MJD-AVG']);
  if (mjd && fromMjd(mjd.value)) return { mjdAvg: mjd.value, avgTimeFrom: mjd.key };
  const date = firstString(k, ['DATE-AVG']);
  const t = date ? fromDateText(date.value) : undefined;
  return t?.hasTime ? { mjdAvg: t.time.mjdObs, avgTimeFrom: date!.key } : undefined;
}

/**
 * SDSS headers give TAI as seconds since MJD 0 (SDSS data model, spPlate/spec TAI keyword);
 * UTC = TAI − (TAI−UTC), the leap-second offsets from IERS Bulletin C.
 */
function taiSecondsToMjdUtc(seconds: number): number {
  const mjdTai = seconds / 86_400;
  let offset = 10;
  for (const [startMjd, value] of TAI_MINUS_UTC) if (mjdTai >= startMjd) offset = value;
  return mjdTai - offset / 86_400;
}

/** [MJD from which it applies, TAI−UTC in s] (IERS Bulletin C; 1972-01-01 to 2017-01-01). */
const TAI_MINUS_UTC: Array<[number, number]> = [
  [41317, 10], [41499, 11], [41683, 12], [42048, 13], [42413, 14], [42778, 15], [43144, 16],
  [43509, 17], [43874, 18], [44239, 19], [44786, 20], [45151, 21], [45516, 22], [46247, 23],
  [47161, 24], [47892, 25], [48257, 26], [48804, 27], [49169, 28], [49534, 29], [50083, 30],
  [50630, 31], [51179, 32], [53736, 33], [54832, 34], [56109, 35], [57204, 36], [57754, 37],
];

export function fromMjd(mjd: number): ObservationTime | undefined {
  // To the millisecond, so that 04:28:00 read into an MJD prints as 04:28:00.000, not 04:27:59.999.
  try {
    return { dateObsUtc: isoUtcFromMjd(mjd), mjdObs: mjd };
  } catch {
    return undefined;
  }
}

/**
 * 'YYYY-MM-DD', 'YYYY-MM-DDThh:mm:ss[.s]', 'YYYY-MM-DD hh:mm:ss' and the pre-2000 FITS form
 * 'DD/MM/YY' (FITS 4.0 §9.1.1: 19YY); a separate time 'hh:mm:ss[.s]' fills in the time of day.
 */
function fromDateText(text: string, timeText?: string): { time: ObservationTime; hasTime: boolean } | undefined {
  let iso = text.trim();
  const old = /^(\d\d)\/(\d\d)\/(\d\d)$/.exec(iso);
  if (old) iso = `19${old[3]}-${old[2]}-${old[1]}`;
  const m = /^(\d{4})-(\d\d)-(\d\d)(?:[T ](\d\d):(\d\d)(?::(\d\d(?:\.\d*)?))?)?$/.exec(iso);
  if (!m) return undefined;
  let [hh, mm, ss] = [m[4], m[5], m[6]];
  let hasTime = hh !== undefined;
  if (!hasTime && timeText) {
    const t = /^(\d{1,2}):(\d\d)(?::(\d\d(?:\.\d*)?))?$/.exec(timeText.trim());
    if (t) [hh, mm, ss, hasTime] = [t[1], t[2], t[3], true];
  }
  // A date or time that does not exist (February 30, 05:99) is refused, not rolled over.
  let mjd: number;
  try {
    mjd = mjdFromIsoUtc(`${m[1]}-${m[2]}-${m[3]}T${(hh ?? '0').padStart(2, '0')}:${mm ?? '00'}:${ss?.replace(/\.$/, '') ?? '00'}`);
  } catch {
    return undefined;
  }
  const time = fromMjd(mjd);
  return time ? { time, hasTime } : undefined;
}
