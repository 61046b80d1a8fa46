/**
 * Start of the observation from the header: MJD-OBS / JD / DATE-OBS (+ TIME-OBS or UT) and
 * survey variants, returned both as an ISO 8601 UTC string and as MJD (UTC).
 * MJD = JD − 2400000.5; MJD 40587 = 1970-01-01T00:00:00 UTC (Unix epoch).
 */
import { firstNumber, firstString, type Keywords } from './keywords.js';

export interface ObservationTime {
  dateObsUtc: string;
  mjdObs: number;
}

const MJD_UNIX_EPOCH = 40587;
const MS_PER_DAY = 86_400_000;

export function observationTime(k: Keywords): ObservationTime | undefined {
  const mjd = firstNumber(k, ['MJD-OBS', 'MJD_OBS', 'MJDSTART', 'UTMJD_S']);
  if (mjd) return fromMjd(mjd.value);
  const jd = firstNumber(k, ['JD', 'JD-OBS', 'JD_OBS']);
  if (jd && jd.value > 2_400_000) return fromMjd(jd.value - 2_400_000.5);
  const dateText = firstString(k, ['DATE-OBS', 'DATE_OBS', 'UTDATE_S'])?.value;
  const date = dateText ? fromDateText(dateText, firstString(k, ['TIME-OBS', 'TIME_OBS', 'UT', 'UTC', 'UTSTART', 'UT-START'])?.value) : undefined;
  if (date?.hasTime) return date.time;
  const taiSeconds = firstNumber(k, ['TAI-BEG', 'TAI']);
  if (taiSeconds && taiSeconds.value > 3e9) return fromMjd(taiSecondsToMjdUtc(taiSeconds.value));
  const mjdDay = firstNumber(k, ['UTMJD', 'MJD']);
  if (mjdDay && !Number.isInteger(mjdDay.value)) return fromMjd(mjdDay.value);
  if (date) return date.time;
  if (mjdDay && mjdDay.value > 0 && mjdDay.value < 100_000) return fromMjd(mjdDay.value);
  return undefined;
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
  const ms = (mjd - MJD_UNIX_EPOCH) * MS_PER_DAY;
  const date = new Date(ms);
  if (!Number.isFinite(date.getTime())) return undefined;
  return { dateObsUtc: date.toISOString(), mjdObs: mjd };
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
  const seconds = Number(hh ?? 0) * 3600 + Number(mm ?? 0) * 60 + Number(ss ?? 0);
  const dayMs = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  if (!Number.isFinite(dayMs) || Number(m[2]) > 12 || Number(m[3]) > 31 || seconds >= 86_401) return undefined;
  const mjd = MJD_UNIX_EPOCH + (dayMs + seconds * 1000) / MS_PER_DAY;
  const time = fromMjd(mjd);
  return time ? { time, hasTime } : undefined;
}
