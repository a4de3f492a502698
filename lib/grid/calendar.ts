/**
 * CF time: calendars and "<unit> since <reference>" decoding (CF 1.11 §4.4, §4.4.1).
 *
 * Calendars and their aliases (CF §4.4.1): standard (= gregorian: Julian before 1582-10-15,
 * Gregorian from then on), proleptic_gregorian, julian, noleap (= 365_day), all_leap (= 366_day),
 * 360_day. Real-world calendars map to Julian Day Numbers (the algorithms of Meeus, Astronomical
 * Algorithms ch. 7); model calendars count fixed-length years.
 */
import { DecodeError, UnsupportedError } from '../errors.js';
import type { Calendar, CalendarDate } from './types.js';

const ALIASES: Readonly<Record<string, Calendar>> = {
  standard: 'standard',
  gregorian: 'standard',
  proleptic_gregorian: 'proleptic_gregorian',
  julian: 'julian',
  noleap: 'noleap',
  '365_day': 'noleap',
  all_leap: 'all_leap',
  '366_day': 'all_leap',
  '360_day': '360_day',
};

/** Resolves a CF calendar attribute (absent means standard, CF §4.4.1). */
export function resolveCalendar(name: string | undefined, where = ''): Calendar {
  if (name === undefined || name.trim() === '') return 'standard';
  const c = ALIASES[name.trim().toLowerCase()];
  if (c === undefined) throw new UnsupportedError(`${where}calendar "${name}" is not supported`, 'calendar', name);
  return c;
}

/** Julian Day Number of 1970-01-01 (Gregorian). */
const JDN_UNIX_EPOCH = 2440588;
/** JDN of 1582-10-15 (Gregorian), where the standard calendar switches from Julian. */
const JDN_GREGORIAN_START = 2299161;
const MS_PER_DAY = 86_400_000;

const CUM_NOLEAP = [0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334, 365];
const CUM_LEAP = [0, 31, 60, 91, 121, 152, 182, 213, 244, 274, 305, 335, 366];

function jdnFromJulian(y: number, m: number, d: number): number {
  if (m <= 2) {
    y -= 1;
    m += 12;
  }
  return Math.floor(365.25 * (y + 4716)) + Math.floor(30.6001 * (m + 1)) + d - 1524;
}

function jdnFromGregorian(y: number, m: number, d: number): number {
  const yy = m <= 2 ? y - 1 : y;
  const a = Math.floor(yy / 100);
  return jdnFromJulian(y, m, d) + 2 - a + Math.floor(a / 4);
}

function dateFromJdn(jdn: number, gregorian: boolean): [number, number, number] {
  let a = jdn;
  if (gregorian) {
    const alpha = Math.floor((jdn - 1867216.25) / 36524.25);
    a = jdn + 1 + alpha - Math.floor(alpha / 4);
  }
  const b = a + 1524;
  const c = Math.floor((b - 122.1) / 365.25);
  const d = Math.floor(365.25 * c);
  const e = Math.floor((b - d) / 30.6001);
  const day = b - d - Math.floor(30.6001 * e);
  const month = e < 14 ? e - 1 : e - 13;
  const year = month > 2 ? c - 4716 : c - 4715;
  return [year, month, day];
}

/** Day count of a date in its calendar (JDN for real-world calendars, own count otherwise). */
export function dayNumber(cal: Calendar, y: number, m: number, d: number): number {
  switch (cal) {
    case 'proleptic_gregorian':
      return jdnFromGregorian(y, m, d);
    case 'julian':
      return jdnFromJulian(y, m, d);
    case 'standard':
      return y < 1582 || (y === 1582 && (m < 10 || (m === 10 && d < 15))) ? jdnFromJulian(y, m, d) : jdnFromGregorian(y, m, d);
    case 'noleap':
      return 365 * y + CUM_NOLEAP[m - 1] + d - 1;
    case 'all_leap':
      return 366 * y + CUM_LEAP[m - 1] + d - 1;
    case '360_day':
      return 360 * y + 30 * (m - 1) + d - 1;
  }
}

/** Inverse of dayNumber. */
export function dateOfDayNumber(cal: Calendar, n: number): [number, number, number] {
  switch (cal) {
    case 'proleptic_gregorian':
      return dateFromJdn(n, true);
    case 'julian':
      return dateFromJdn(n, false);
    case 'standard':
      return dateFromJdn(n, n >= JDN_GREGORIAN_START);
    case 'noleap':
    case 'all_leap': {
      const len = cal === 'noleap' ? 365 : 366;
      const cum = cal === 'noleap' ? CUM_NOLEAP : CUM_LEAP;
      const y = Math.floor(n / len);
      const doy = n - y * len;
      let m = 1;
      while (doy >= cum[m]) m++;
      return [y, m, doy - cum[m - 1] + 1];
    }
    case '360_day': {
      const y = Math.floor(n / 360);
      const doy = n - y * 360;
      return [y, Math.floor(doy / 30) + 1, (doy % 30) + 1];
    }
  }
}

function pad(n: number, w: number): string {
  const s = String(Math.abs(n)).padStart(w, '0');
  return n < 0 ? `-${s}` : s;
}

/** Builds a CalendarDate (second may carry a fraction). */
export function calendarDate(cal: Calendar, y: number, mo: number, d: number, h: number, mi: number, s: number): CalendarDate {
  const real = cal === 'standard' || cal === 'proleptic_gregorian' || cal === 'julian';
  const whole = Math.floor(s);
  const ms = Math.round((s - whole) * 1000);
  const frac = ms === 0 ? '' : `.${pad(ms, 3)}`;
  const iso = `${pad(y, 4)}-${pad(mo, 2)}-${pad(d, 2)}T${pad(h, 2)}:${pad(mi, 2)}:${pad(whole, 2)}${frac}${real ? 'Z' : ''}`;
  const epochMs = real ? (dayNumber(cal, y, mo, d) - JDN_UNIX_EPOCH) * MS_PER_DAY + ((h * 60 + mi) * 60 + whole) * 1000 + ms : undefined;
  return { calendar: cal, year: y, month: mo, day: d, hour: h, minute: mi, second: s, iso, epochMs };
}

/** Seconds per time unit name (UDUNITS names); months and years only in 360_day (CF §4.4). */
const UNIT_SECONDS: Readonly<Record<string, number>> = {
  s: 1, sec: 1, secs: 1, second: 1, seconds: 1,
  ms: 1e-3, msec: 1e-3, millisecond: 1e-3, milliseconds: 1e-3,
  min: 60, mins: 60, minute: 60, minutes: 60,
  h: 3600, hr: 3600, hrs: 3600, hour: 3600, hours: 3600,
  d: 86400, day: 86400, days: 86400,
  week: 604800, weeks: 604800,
};

export interface TimeUnits {
  readonly unitSeconds: number;
  readonly calendar: Calendar;
  /** Reference instant as milliseconds from the calendar's day 0 (UTC, zone applied). */
  readonly referenceMs: number;
  readonly text: string;
}

const REFERENCE =
  /^\s*([A-Za-z]+)\s+(?:since|after|from)\s+([+-]?\d{1,4})-(\d{1,2})-(\d{1,2})(?:(?:\s+|T)(\d{1,2}):(\d{1,2})(?::(\d{1,2}(?:\.\d*)?))?)?\s*(Z|UTC|GMT|[+-]\d{1,2}(?::?\d{2})?)?\s*$/i;

/** Parses "<unit> since <date>[ <time>][ <zone>]" for a calendar. */
export function parseTimeUnits(units: string, calendar: Calendar, where = ''): TimeUnits {
  const m = REFERENCE.exec(units);
  if (!m) throw new DecodeError(`${where}time units "${units}" are not "<unit> since <date>"`, { attribute: 'units' });
  const unit = m[1].toLowerCase();
  let unitSeconds = UNIT_SECONDS[unit];
  if (unitSeconds === undefined && calendar === '360_day') {
    if (unit === 'month' || unit === 'months') unitSeconds = 30 * 86400;
    if (unit === 'year' || unit === 'years') unitSeconds = 360 * 86400;
  }
  if (unitSeconds === undefined) {
    throw new UnsupportedError(`${where}time unit "${m[1]}" is not supported in the ${calendar} calendar`, 'time unit', m[1]);
  }
  const y = Number(m[2]);
  const mo = Number(m[3]);
  const d = Number(m[4]);
  if (mo < 1 || mo > 12 || d < 1 || d > 31) throw new DecodeError(`${where}time units "${units}" have an invalid reference date`, { attribute: 'units' });
  const h = m[5] === undefined ? 0 : Number(m[5]);
  const mi = m[6] === undefined ? 0 : Number(m[6]);
  const s = m[7] === undefined ? 0 : Number(m[7]);
  let zoneMinutes = 0;
  const z = m[8];
  if (z !== undefined && /^[+-]/.test(z)) {
    const zm = /^([+-])(\d{1,2})(?::?(\d{2}))?$/.exec(z)!;
    zoneMinutes = (zm[1] === '-' ? -1 : 1) * (Number(zm[2]) * 60 + (zm[3] === undefined ? 0 : Number(zm[3])));
  }
  const referenceMs = dayNumber(calendar, y, mo, d) * MS_PER_DAY + Math.round(((h * 60 + mi - zoneMinutes) * 60 + s) * 1000);
  return { unitSeconds, calendar, referenceMs, text: units };
}

/** Decodes one time value (in the units' unit) to a calendar date, to the millisecond. */
export function decodeTimeValue(value: number, tu: TimeUnits): CalendarDate {
  const total = tu.referenceMs + Math.round(value * tu.unitSeconds * 1000);
  const day = Math.floor(total / MS_PER_DAY);
  let rest = total - day * MS_PER_DAY;
  const [y, mo, d] = dateOfDayNumber(tu.calendar, day);
  const h = Math.floor(rest / 3_600_000);
  rest -= h * 3_600_000;
  const mi = Math.floor(rest / 60_000);
  rest -= mi * 60_000;
  return calendarDate(tu.calendar, y, mo, d, h, mi, rest / 1000);
}

/** Decodes CF time values given their units and calendar attributes. */
export function decodeTimes(values: ArrayLike<number>, units: string, calendar: string | undefined, where = ''): CalendarDate[] {
  const tu = parseTimeUnits(units, resolveCalendar(calendar, where), where);
  const out: CalendarDate[] = [];
  for (let i = 0; i < values.length; i++) out.push(decodeTimeValue(values[i], tu));
  return out;
}
