/**
 * WMO FM 92 GRIB edition 1, Code table 4: unit of time (section 1 octet 18), as hours.
 * Source: ecCodes 2.28 definitions grib1/4.table. Codes 0–2, 10–12 and 254 are those of the WMO
 * FM 92 GRIB edition 1 Code table 4; 13 (15 minutes) and 14 (30 minutes) are in ecCodes' table,
 * reserved in WMO's. Month, year, decade, normal (30 years) and century (codes 3–7) have no fixed
 * length and are left out.
 */
export const GRIB1_TIME_UNIT_HOURS = [
  { code: 0, abbreviation: 'm', name: 'Minute', hours: 1 / 60 },
  { code: 1, abbreviation: 'h', name: 'Hour', hours: 1 },
  { code: 2, abbreviation: 'D', name: 'Day', hours: 24 },
  { code: 10, abbreviation: '3h', name: '3 hours', hours: 3 },
  { code: 11, abbreviation: '6h', name: '6 hours', hours: 6 },
  { code: 12, abbreviation: '12h', name: '12 hours', hours: 12 },
  { code: 13, abbreviation: '15m', name: '15 minutes', hours: 0.25 },
  { code: 14, abbreviation: '30m', name: '30 minutes', hours: 0.5 },
  { code: 254, abbreviation: 's', name: 'Second', hours: 1 / 3600 },
] as const;

const BY_CODE = new Map<number, number>(GRIB1_TIME_UNIT_HOURS.map((u) => [u.code, u.hours]));

/** Hours in one unit of Code table 4, or undefined for a unit without a fixed length. */
export function hoursPerUnit(code: number): number | undefined {
  return BY_CODE.get(code);
}
