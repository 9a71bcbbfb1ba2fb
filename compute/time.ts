/**
 * Instants, calendars and time scales.
 *
 * An {@link Instant} holds UT and TT as days since J2000.0 (JD 2451545.0), the same
 * convention as the ephemeris library. ΔT = TT − UT comes from the library's
 * polynomials (Espenak & Meeus 2006, extrapolated outside −500…2150).
 *
 * Calendars: the Julian calendar before 1582-10-15 and the Gregorian from then on
 * (the usual astronomical convention), or the proleptic Gregorian calendar throughout.
 * Years use astronomical numbering: year 0 is 1 BCE, −1 is 2 BCE.
 * Conversions follow Meeus, Astronomical Algorithms (2nd ed., 1998), chapter 7.
 */
import { AstroTime, DeltaT_EspenakMeeus } from 'astronomy-engine';

export const J2000_JD = 2451545.0;

export interface Instant {
  /** Universal Time, days since J2000.0. */
  readonly ut: number;
  /** Terrestrial Time, days since J2000.0. */
  readonly tt: number;
}

/** `mixed`: Julian before 1582-10-15, Gregorian after. `gregorian`: proleptic Gregorian. */
export type CalendarMode = 'mixed' | 'gregorian';
export type Calendar = 'julian' | 'gregorian';

export interface CalendarDate {
  readonly year: number;
  readonly month: number;
  readonly day: number;
  readonly hour: number;
  readonly minute: number;
  /** Seconds, may be fractional. */
  readonly second: number;
}

/** ΔT = TT − UT in seconds at a UT instant (days since J2000). */
export function deltaTSeconds(ut: number): number {
  return DeltaT_EspenakMeeus(ut);
}

export function instantFromUt(ut: number): Instant {
  if (!Number.isFinite(ut)) throw new RangeError('instant is not a finite number');
  return { ut, tt: ut + deltaTSeconds(ut) / 86400 };
}

/** From TT: ΔT depends on UT, so iterate (converges in two steps: ΔT changes slowly). */
export function instantFromTt(tt: number): Instant {
  if (!Number.isFinite(tt)) throw new RangeError('instant is not a finite number');
  let ut = tt;
  for (let i = 0; i < 3; i++) ut = tt - deltaTSeconds(ut) / 86400;
  return { ut, tt };
}

export const jdUt = (i: Instant): number => i.ut + J2000_JD;
export const jdTt = (i: Instant): number => i.tt + J2000_JD;

/** The ephemeris library's time object for an instant (positions are computed in TT). */
export function toAstroTime(i: Instant): AstroTime {
  return new AstroTime(i.ut);
}

/** Gregorian reform: JD of 1582-10-15 00:00 (Gregorian) = 2299160.5. */
export const GREGORIAN_START_JD = 2299160.5;

/** Which calendar a JD is shown in under a mode. */
export function calendarFor(jd: number, mode: CalendarMode): Calendar {
  return mode === 'gregorian' || jd >= GREGORIAN_START_JD ? 'gregorian' : 'julian';
}

/**
 * Calendar date (with fraction of day in h/m/s) to Julian Date. Meeus (1998) eq. 7.1;
 * valid for all years including negative ones.
 */
export function calendarToJd(d: CalendarDate, calendar: Calendar): number {
  let y = d.year;
  let m = d.month;
  if (m <= 2) { y -= 1; m += 12; }
  let b = 0;
  if (calendar === 'gregorian') {
    const a = Math.floor(y / 100);
    b = 2 - a + Math.floor(a / 4);
  }
  const dayFrac = d.day + (d.hour + (d.minute + d.second / 60) / 60) / 24;
  return Math.floor(365.25 * (y + 4716)) + Math.floor(30.6001 * (m + 1)) + dayFrac + b - 1524.5;
}

/**
 * Julian Date to calendar date. Meeus (1998) chapter 7, with the Gregorian correction
 * applied when `calendar` is gregorian (proleptic before 1582 when asked).
 * Valid for JD ≥ 0 in Meeus's form; extended to negative JD by shifting whole 400-year
 * Gregorian / 4-year Julian cycles.
 */
export function jdToCalendar(jd: number, calendar: Calendar): CalendarDate {
  // Shift into the positive range by whole cycles so the floor arithmetic holds.
  const cycleDays = calendar === 'gregorian' ? 146097 : 1461;
  const cycleYears = calendar === 'gregorian' ? 400 : 4;
  let shift = 0;
  if (jd < 0) shift = Math.ceil(-jd / cycleDays) + 1;
  const j = jd + shift * cycleDays + 0.5;
  let z = Math.floor(j);
  let f = j - z;
  // Round to the millisecond to avoid 59.9999 s displays.
  const msOfDay = Math.round(f * 86400000);
  if (msOfDay >= 86400000) { z += 1; f = 0; } else { f = msOfDay / 86400000; }
  let a = z;
  if (calendar === 'gregorian') {
    const alpha = Math.floor((z - 1867216.25) / 36524.25);
    a = z + 1 + alpha - Math.floor(alpha / 4);
  }
  const b = a + 1524;
  const c = Math.floor((b - 122.1) / 365.25);
  const dd = Math.floor(365.25 * c);
  const e = Math.floor((b - dd) / 30.6001);
  const day = b - dd - Math.floor(30.6001 * e);
  const month = e < 14 ? e - 1 : e - 13;
  const year = (month > 2 ? c - 4716 : c - 4715) - shift * cycleYears;
  const totalMs = Math.round(f * 86400000);
  const hour = Math.floor(totalMs / 3600000);
  const minute = Math.floor((totalMs % 3600000) / 60000);
  const second = (totalMs % 60000) / 1000;
  return { year, month, day, hour, minute, second };
}

/** Weekday name of a JD (UT): Meeus (1998) chapter 7, (JD + 1.5) mod 7, 0 = Sunday. */
export function weekday(jd: number): string {
  const names = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
  const k = ((Math.floor(jd + 1.5) % 7) + 7) % 7;
  return names[k]!;
}

function pad(n: number, w: number): string {
  const s = String(Math.abs(n)).padStart(w, '0');
  return n < 0 ? `-${s}` : s;
}

/** Astronomical year with at least four digits: `2031`, `0000`, `-0500`. */
export function formatYear(y: number): string {
  return pad(y, 4);
}

/**
 * Format a JD as `YYYY-MM-DD hh:mm:ss` in the given calendar (seconds rounded to
 * `secondDecimals`).
 */
export function formatJd(jd: number, calendar: Calendar, secondDecimals = 0): string {
  // Round first so that 59.6 s does not print as 60 s.
  const step = 86400 * 10 ** secondDecimals;
  const rounded = Math.round((jd + 0.5) * step) / step - 0.5;
  const d = jdToCalendar(rounded, calendar);
  const sec = secondDecimals > 0 ? d.second.toFixed(secondDecimals).padStart(3 + secondDecimals, '0') : pad(Math.floor(d.second + 1e-9), 2);
  return `${formatYear(d.year)}-${pad(d.month, 2)}-${pad(d.day, 2)} ${pad(d.hour, 2)}:${pad(d.minute, 2)}:${sec}`;
}

/** ISO 8601 UTC text of an instant, in the calendar the mode chooses: `2031-03-14T06:30:00Z`. */
export function isoUtc(i: Instant, mode: CalendarMode = 'mixed'): string {
  const jd = jdUt(i);
  return `${formatJd(jd, calendarFor(jd, mode)).replace(' ', 'T')}Z`;
}

/** Human form used in tables: `2031-03-14 06:30 UTC` (minutes), calendar chosen by mode. */
export function formatUtcMinutes(i: Instant, mode: CalendarMode = 'mixed'): string {
  const jd = Math.round(jdUt(i) * 1440) / 1440;
  const cal = calendarFor(jd, mode);
  return `${formatJd(jd, cal).slice(0, 16)} UTC${cal === 'julian' ? ' (Jul.)' : ''}`;
}

/** Instant from a calendar date in UTC (or TT when `scale` is TT). */
export function instantFromCalendar(d: CalendarDate, mode: CalendarMode, scale: 'UTC' | 'TT' = 'UTC'): Instant {
  const cal = mode === 'gregorian' ? 'gregorian' : (d.year > 1582 || (d.year === 1582 && (d.month > 10 || (d.month === 10 && d.day >= 15))) ? 'gregorian' : 'julian');
  const jd = calendarToJd(d, cal);
  return scale === 'TT' ? instantFromTt(jd - J2000_JD) : instantFromUt(jd - J2000_JD);
}

/** Is a calendar date real in its calendar (e.g. 1582-10-10 does not exist in the mixed mode)? */
export function validateCalendarDate(d: CalendarDate, mode: CalendarMode): string | undefined {
  if (d.month < 1 || d.month > 12) return `month ${d.month} is not between 1 and 12`;
  if (d.hour > 24 || d.minute > 59 || d.second >= 61) return 'time of day out of range';
  const cal: Calendar = mode === 'gregorian' ? 'gregorian' : (d.year > 1582 || (d.year === 1582 && (d.month > 10 || (d.month === 10 && d.day >= 15))) ? 'gregorian' : 'julian');
  const leap = cal === 'julian' ? d.year % 4 === 0 : (d.year % 4 === 0 && d.year % 100 !== 0) || d.year % 400 === 0;
  const lengths = [31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
  const max = lengths[d.month - 1]!;
  if (d.day < 1 || d.day > max) return `day ${d.day} does not exist in month ${d.month} of year ${d.year} (${cal} calendar)`;
  if (mode === 'mixed' && d.year === 1582 && d.month === 10 && d.day > 4 && d.day < 15) {
    return '1582-10-05 … 1582-10-14 do not exist: the Julian 1582-10-04 was followed by the Gregorian 1582-10-15 (write `set calendar gregorian` for a proleptic Gregorian date)';
  }
  return undefined;
}
