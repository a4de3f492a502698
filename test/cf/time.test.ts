/**
 * CF time decoding. Expected dates come from cftime (the calendar library of netCDF4-python),
 * committed in data-samples/fixtures/netcdf/time_reference.json by make_fixtures.py, and from
 * the published CF-conventions text.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DecodeError, UnsupportedError } from '../../lib/errors.js';
import { calendarDate, dateOfDayNumber, dayNumber, decodeTimes, resolveCalendar } from '../../lib/grid/calendar.js';
import type { Calendar, CalendarDate } from '../../lib/grid/types.js';
import { FIXTURES } from '../netcdf/reference.js';

const TIME_REF = JSON.parse(readFileSync(`${FIXTURES}time_reference.json`, 'utf8')) as {
  cases: { units: string; calendar: string; values: number[]; iso: string[] }[];
};

/** cftime's isoformat ("2000-02-30T00:00:00" or with ".500000") in our form, without the zone. */
function components(d: CalendarDate): string {
  const s = d.second;
  const whole = Math.floor(s);
  const micro = Math.round((s - whole) * 1e6);
  const p = (n: number, w = 2) => String(n).padStart(w, '0');
  return `${p(d.year, 4)}-${p(d.month)}-${p(d.day)}T${p(d.hour)}:${p(d.minute)}:${p(whole)}${micro ? '.' + p(micro, 6) : ''}`;
}

const hasZone = (units: string) => /\d\s+[+-]\d{1,2}(:?\d{2})?\s*$/.test(units);

describe('decodeTimes agrees with cftime num2date', () => {
  const cases = TIME_REF.cases.flatMap((c) => c.values.map((v, i) => ({ ...c, value: v, want: c.iso[i] })));
  it.each(cases.filter((c) => !hasZone(c.units)))('$value $units ($calendar) → $want', ({ units, calendar, value, want }) => {
    const [d] = decodeTimes([value], units, calendar);
    expect(components(d)).toBe(want);
  });
  // cftime 1.6.2 drops a reference time zone ("… -6:00") and returns local time; CF 1.11 §4.4
  // says the zone is part of the reference, so we convert to UTC: exactly 6 h later than cftime.
  it.each(cases.filter((c) => hasZone(c.units)))('$value $units: cftime $want plus the 6 h zone offset', ({ units, calendar, value, want }) => {
    const [d] = decodeTimes([value], units, calendar);
    expect(d.epochMs! - Date.parse(want + 'Z')).toBe(6 * 3600 * 1000);
  });
});

describe('published CF-conventions examples', () => {
  it('"seconds since 1992-10-8 15:15:42.5 -6:00" is 1992-10-08 21:15:42.5 UTC (CF 1.11 §4.4, quoting UDUNITS)', () => {
    const [d] = decodeTimes([0], 'seconds since 1992-10-8 15:15:42.5 -6:00', 'standard');
    expect(d.iso).toBe('1992-10-08T21:15:42.500Z');
    expect(d.epochMs).toBe(Date.UTC(1992, 9, 8, 21, 15, 42, 500));
  });
  it('in the standard calendar 1582-10-04 is followed by 1582-10-15 (CF 1.11 §4.4.1)', () => {
    const [a, b] = decodeTimes([3, 4], 'days since 1582-10-01', 'standard');
    expect([a.iso, b.iso]).toEqual(['1582-10-04T00:00:00Z', '1582-10-15T00:00:00Z']);
  });
  it('360_day has 30-day months: day 59 after 2000-01-01 is 2000-02-30, kept as written (CF 1.11 §4.4.1)', () => {
    const [d] = decodeTimes([59], 'days since 2000-01-01', '360_day');
    expect(d.iso).toBe('2000-02-30T00:00:00');
    expect(d.epochMs).toBeUndefined();
  });
  it('noleap has no 29 February: day 59 after 2000-01-01 is 2000-03-01 (CF 1.11 §4.4.1)', () => {
    const [d] = decodeTimes([59], 'days since 2000-01-01', 'noleap');
    expect(d.iso).toBe('2000-03-01T00:00:00');
  });
  it('"hours since 1900-01-01" values 0 and 876576 are 1900-01-01 and 2000-01-01 (876576 h = 36524 days, common practice, no source)', () => {
    const ds = decodeTimes([0, 876576], 'hours since 1900-01-01', 'gregorian');
    expect(ds.map((d) => d.iso)).toEqual(['1900-01-01T00:00:00Z', '2000-01-01T00:00:00Z']);
    expect(ds[1].epochMs).toBe(Date.UTC(2000, 0, 1));
  });
});

describe('calendar aliases (CF 1.11 §4.4.1)', () => {
  it.each([
    ['gregorian', 'standard'],
    ['standard', 'standard'],
    [undefined, 'standard'],
    ['proleptic_gregorian', 'proleptic_gregorian'],
    ['365_day', 'noleap'],
    ['noleap', 'noleap'],
    ['366_day', 'all_leap'],
    ['all_leap', 'all_leap'],
    ['360_day', '360_day'],
    ['julian', 'julian'],
  ])('%s → %s', (name, want) => {
    expect(resolveCalendar(name)).toBe(want);
  });
  it('an unknown calendar is an UnsupportedError naming it', () => {
    expect(() => resolveCalendar('martian')).toThrow(UnsupportedError);
    expect(() => resolveCalendar('martian')).toThrow(/calendar "martian" is not supported/);
  });
});

describe('day numbers invert (round trip over 1000 years in each calendar)', () => {
  it.each<Calendar>(['standard', 'proleptic_gregorian', 'julian', 'noleap', 'all_leap', '360_day'])('%s', (cal) => {
    const start = dayNumber(cal, 1500, 1, 1);
    const end = dayNumber(cal, 2500, 1, 1);
    let bad = 0;
    for (let n = start; n < end; n += 7) {
      const [y, m, d] = dateOfDayNumber(cal, n);
      if (dayNumber(cal, y, m, d) !== n) bad++;
    }
    expect(bad).toBe(0);
  });
  it('the Unix epoch is JDN 2440588 and epochMs 0 (Meeus, Astronomical Algorithms ch. 7; from memory)', () => {
    expect(dayNumber('proleptic_gregorian', 1970, 1, 1)).toBe(2440588);
    expect(calendarDate('standard', 1970, 1, 1, 0, 0, 0).epochMs).toBe(0);
  });
});

describe('bad time units', () => {
  it('units without "since" are a DecodeError', () => {
    expect(() => decodeTimes([0], 'hours', 'standard')).toThrow(DecodeError);
  });
  it('months in a real-world calendar are unsupported (CF 1.11 §4.4 advises against them)', () => {
    expect(() => decodeTimes([0], 'months since 2000-01-01', 'standard')).toThrow(/time unit "months" is not supported/);
  });
});
