/**
 * Parameter identification: WMO GRIB2 code table 4.2 (discipline 0, categories 0, 1, 3; WMO CSVs
 * GRIB2_CodeFlag_4_2_0_{0,1,3}_CodeTable_en, master tables version 30), ECMWF local GRIB1 table
 * 128 (ecCodes 2.98.128.table), and unknown parameters listed by their numbers, not dropped.
 */
import { describe, expect, it } from 'vitest';
import { describeParameter, parameterKey } from '../../lib/formats/grib/index.js';

const g2 = (discipline: number, category: number, number: number, centre = 7) => ({ edition: 2 as const, discipline, category, number, centre });

describe('describeParameter, GRIB2 (WMO code table 4.2)', () => {
  it.each([
    { id: g2(0, 0, 0), name: 'Temperature', units: 'K', quantity: 'air_temperature', rh: undefined },
    { id: g2(0, 0, 6), name: 'Dewpoint temperature', units: 'K', quantity: 'dew_point_temperature', rh: undefined },
    { id: g2(0, 1, 0), name: 'Specific humidity', units: 'kg/kg', quantity: 'specific_humidity', rh: undefined },
    { id: g2(0, 1, 1), name: 'Relative humidity', units: '%', quantity: 'relative_humidity', rh: undefined },
    { id: g2(0, 1, 93), name: 'Relative humidity with respect to water', units: '%', quantity: 'relative_humidity', rh: 'water' },
    { id: g2(0, 1, 94), name: 'Relative humidity with respect to ice', units: '%', quantity: 'relative_humidity', rh: 'ice' },
    { id: g2(0, 3, 4), name: 'Geopotential', units: 'm2 s-2', quantity: 'geopotential', rh: undefined },
    { id: g2(0, 3, 5), name: 'Geopotential height', units: 'gpm', quantity: 'geopotential_height', rh: undefined },
  ])('$id.discipline/$id.category/$id.number is $name ($units)', ({ id, name, units, quantity, rh }) => {
    const d = describeParameter(id)!;
    expect(d.name).toBe(name);
    expect(d.units).toBe(units);
    expect(d.quantity).toBe(quantity);
    expect(d.rhConvention).toBe(rh);
  });

  it('relative humidity 0/1/1 from centre 98 is the mixed-phase one; from other centres it says nothing', () => {
    expect(describeParameter(g2(0, 1, 1, 98))!.rhConvention).toBe('ecmwf-mixed');
    expect(describeParameter(g2(0, 1, 1, 7))!.rhConvention).toBeUndefined();
    expect(describeParameter(g2(0, 1, 94, 98))!.rhConvention).toBe('ice');
  });

  it('an unknown parameter is undefined and named by its numbers', () => {
    expect(describeParameter(g2(0, 1, 250))).toBeUndefined();
    expect(parameterKey(g2(0, 1, 250))).toBe('p0.1.250');
  });
});

describe('describeParameter, GRIB1 (ECMWF local table 128)', () => {
  it.each([
    [130, 't', 'K'],
    [133, 'q', 'kg kg**-1'],
    [157, 'r', '%'],
    [129, 'z', 'm**2 s**-2'],
  ])('table 128 parameter %i is %s', (number, shortName, units) => {
    const d = describeParameter({ edition: 1, table: 128, number, centre: 98 })!;
    expect(d.shortName).toBe(shortName);
    expect(d.units).toBe(units);
  });
  it('ECMWF r (157) is mixed phase', () => {
    expect(describeParameter({ edition: 1, table: 128, number: 157, centre: 98 })!.rhConvention).toBe('ecmwf-mixed');
  });
});
