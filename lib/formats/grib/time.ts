/**
 * GRIB times: reference times are proleptic Gregorian UTC; forecast steps come in the units of
 * GRIB2 code table 4.4 (GRIB1 code table 4 uses the same codes for the units below).
 */
import type { CalendarDate } from '../../grid/types.js';

const pad = (n: number, w = 2) => String(n).padStart(w, '0');

/** A CalendarDate in the standard calendar from milliseconds since 1970-01-01T00:00Z. */
export function dateFromEpochMs(epochMs: number): CalendarDate {
  const d = new Date(epochMs);
  const year = d.getUTCFullYear();
  const iso = `${pad(year, 4)}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}T${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:${pad(d.getUTCSeconds())}Z`;
  return {
    calendar: 'standard',
    year,
    month: d.getUTCMonth() + 1,
    day: d.getUTCDate(),
    hour: d.getUTCHours(),
    minute: d.getUTCMinutes(),
    second: d.getUTCSeconds(),
    iso,
    epochMs,
  };
}

export function dateFromParts(year: number, month: number, day: number, hour: number, minute: number, second: number): CalendarDate {
  const ms = Date.UTC(year, month - 1, day, hour, minute, second);
  const t = new Date(ms);
  t.setUTCFullYear(year); // Date.UTC maps years 0..99 to 1900..1999
  return dateFromEpochMs(t.getTime());
}

/** Seconds per unit of code table 4.4 for the fixed-length units. */
const UNIT_SECONDS: Readonly<Record<number, number>> = {
  0: 60, // minute
  1: 3600, // hour
  2: 86400, // day
  10: 3 * 3600, // 3 hours
  11: 6 * 3600, // 6 hours
  12: 12 * 3600, // 12 hours
  13: 1, // second
  254: 1, // second (GRIB1 code table 4)
} as const;
/** Months per unit for the calendar units of code table 4.4. */
const UNIT_MONTHS: Readonly<Record<number, number>> = { 3: 1, 4: 12, 5: 120, 6: 360, 7: 1200 } as const;

/** True when code table 4.4 has this unit. */
export function isKnownTimeUnit(unit: number): boolean {
  return unit in UNIT_SECONDS || unit in UNIT_MONTHS;
}

/** Adds `value` units of code table 4.4 to a time; undefined for an unknown unit. */
export function addTimeUnits(epochMs: number, value: number, unit: number): number | undefined {
  const s = UNIT_SECONDS[unit];
  if (s !== undefined) return epochMs + value * s * 1000;
  const m = UNIT_MONTHS[unit];
  if (m === undefined) return undefined;
  const d = new Date(epochMs);
  d.setUTCMonth(d.getUTCMonth() + value * m);
  return d.getTime();
}
