/**
 * Reference time, forecast step and valid time of a GRIB edition 1 product (section 1 octets
 * 13–25). Dates are proleptic Gregorian in UTC.
 *
 * Year = (century − 1)·100 + year of century (octet 25 century, octet 13 year of century 1..100;
 * FM 92 GRIB edition 1, section 1, notes). The step follows the time range indicator (Code
 * table 5) in the unit of Code table 4 (tables/time-units.ts).
 */
import type { CalendarDate } from '../../../grid/types.js';
import { hoursPerUnit } from './tables/time-units.js';
import type { MessageContext } from './context.js';

const MS_PER_HOUR = 3_600_000;

function pad(n: number, width: number): string {
  return String(n).padStart(width, '0');
}

/** A proleptic Gregorian UTC date from milliseconds since 1970-01-01T00:00Z. */
export function calendarDateFromEpochMs(epochMs: number): CalendarDate {
  const d = new Date(epochMs);
  const year = d.getUTCFullYear();
  const month = d.getUTCMonth() + 1;
  const day = d.getUTCDate();
  const hour = d.getUTCHours();
  const minute = d.getUTCMinutes();
  const second = d.getUTCSeconds();
  const iso = `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}T${pad(hour, 2)}:${pad(minute, 2)}:${pad(second, 2)}Z`;
  return { calendar: 'proleptic_gregorian', year, month, day, hour, minute, second, iso, epochMs };
}

/** Milliseconds since 1970-01-01T00:00Z of a proleptic Gregorian UTC date (any year ≥ 0). */
export function epochMsOf(year: number, month: number, day: number, hour: number, minute: number): number {
  const d = new Date(0);
  d.setUTCFullYear(year, month - 1, day);
  d.setUTCHours(hour, minute, 0, 0);
  return d.getTime();
}

export interface Grib1Time {
  readonly referenceTime: CalendarDate;
  readonly stepHours: number;
  readonly validTime: CalendarDate;
}

/** Octets 13–25 of section 1; `pds` starts at the section, `sectionOffset` is its offset in the message. */
export function readTime(pds: Uint8Array, sectionOffset: number, ctx: MessageContext): Grib1Time {
  const at = (octet: number) => sectionOffset + octet - 1;
  const yearOfCentury = pds[12];
  const month = pds[13];
  const day = pds[14];
  const hour = pds[15];
  const minute = pds[16];
  const unit = pds[17];
  const p1 = pds[18];
  const p2 = pds[19];
  const tri = pds[20];
  const century = pds[24];
  if (century === 0 || yearOfCentury > 100) {
    throw ctx.decode(at(13), `reference year of century ${yearOfCentury} in century ${century} is not a date`);
  }
  const year = (century - 1) * 100 + yearOfCentury;
  const daysInMonth = month >= 1 && month <= 12 ? new Date(Date.UTC(2000, month, 0)).getUTCDate() : 0;
  const leapFeb = month === 2 && ((year % 4 === 0 && year % 100 !== 0) || year % 400 === 0);
  const maxDay = month === 2 ? (leapFeb ? 29 : 28) : daysInMonth;
  if (month < 1 || month > 12 || day < 1 || day > maxDay || hour > 23 || minute > 59) {
    throw ctx.decode(
      at(13),
      `reference time ${year}-${pad(month, 2)}-${pad(day, 2)} ${pad(hour, 2)}:${pad(minute, 2)} is not a date`,
    );
  }
  const hours = hoursPerUnit(unit);
  if (hours === undefined) {
    throw ctx.unsupported(at(18), 'GRIB1 time unit (Code table 4)', unit, 'only fixed-length units are');
  }
  let steps: number;
  switch (tri) {
    case 0: // valid at reference time + P1
      steps = p1;
      break;
    case 1: // initialised analysis, P1 = 0
      steps = 0;
      break;
    case 2: // valid between reference + P1 and reference + P2
    case 3: // average over reference + P1 .. reference + P2
    case 4: // accumulation over reference + P1 .. reference + P2, valid at reference + P2
    case 5: // difference (reference + P2) − (reference + P1), valid at reference + P2
      steps = p2;
      break;
    case 10: // P1 occupies octets 19 and 20
      steps = p1 * 256 + p2;
      break;
    default:
      throw ctx.unsupported(at(21), 'GRIB1 time range indicator (Code table 5)', tri);
  }
  const stepHours = steps * hours;
  const refMs = epochMsOf(year, month, day, hour, minute);
  return {
    referenceTime: calendarDateFromEpochMs(refMs),
    stepHours,
    validTime: calendarDateFromEpochMs(refMs + Math.round(stepHours * MS_PER_HOUR)),
  };
}
