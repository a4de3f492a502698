/**
 * Units to SI. Expected factors are SI definitions: BIPM SI Brochure, 9th ed. (2019), §2.3.1
 * (t/°C = T/K − 273.15), Table 7 (prefixes hecto 10², kilo 10³, milli 10⁻³), and the bar
 * (10⁵ Pa; SI Brochure 8th ed. Table 8, from memory). Spellings are UDUNITS-2 grammar (products
 * by space, exponents as "2", "^2", "**2") as CF 1.11 §3.1 requires.
 */
import { describe, expect, it } from 'vitest';
import { UnitsError } from '../../lib/errors.js';
import { parseUnits, toSI, type SiTarget } from '../../lib/cf/units.js';

const cases: { units: string; target: SiTarget; si: string; scale: number; offset: number; source: string }[] = [
  { units: 'K', target: 'air_temperature', si: 'K', scale: 1, offset: 0, source: 'SI base unit' },
  { units: 'degC', target: 'air_temperature', si: 'K', scale: 1, offset: 273.15, source: 'SI Brochure §2.3.1' },
  { units: 'degrees_Celsius', target: 'air_temperature', si: 'K', scale: 1, offset: 273.15, source: 'SI Brochure §2.3.1, UDUNITS-2 spelling' },
  { units: 'Pa', target: 'air_pressure', si: 'Pa', scale: 1, offset: 0, source: 'SI derived unit' },
  { units: 'hPa', target: 'air_pressure', si: 'Pa', scale: 100, offset: 0, source: 'SI Brochure Table 7 (hecto)' },
  { units: 'mbar', target: 'air_pressure', si: 'Pa', scale: 100, offset: 0, source: 'bar = 1e5 Pa, milli = 1e-3' },
  { units: 'millibars', target: 'air_pressure', si: 'Pa', scale: 100, offset: 0, source: 'bar = 1e5 Pa, milli = 1e-3' },
  { units: 'kg kg**-1', target: 'specific_humidity', si: 'kg kg-1', scale: 1, offset: 0, source: 'kg/kg is dimensionless' },
  { units: 'kg kg-1', target: 'specific_humidity', si: 'kg kg-1', scale: 1, offset: 0, source: 'kg/kg is dimensionless' },
  { units: 'kg/kg', target: 'humidity_mixing_ratio', si: 'kg kg-1', scale: 1, offset: 0, source: 'kg/kg is dimensionless' },
  { units: 'g/kg', target: 'specific_humidity', si: 'kg kg-1', scale: 1e-3, offset: 0, source: 'gram = 1e-3 kg' },
  { units: 'g kg-1', target: 'humidity_mixing_ratio', si: 'kg kg-1', scale: 1e-3, offset: 0, source: 'gram = 1e-3 kg' },
  { units: '1', target: 'specific_humidity', si: 'kg kg-1', scale: 1, offset: 0, source: 'CF 1.11 §3.1: "1" is dimensionless' },
  { units: '%', target: 'relative_humidity', si: '1', scale: 0.01, offset: 0, source: 'percent = 1/100' },
  { units: 'percent', target: 'relative_humidity', si: '1', scale: 0.01, offset: 0, source: 'percent = 1/100' },
  { units: '(0 - 1)', target: 'relative_humidity', si: '1', scale: 1, offset: 0, source: 'common practice, no source (GRIB table spelling)' },
  { units: 'm**2 s**-2', target: 'geopotential', si: 'm2 s-2', scale: 1, offset: 0, source: 'UDUNITS-2 exponent grammar' },
  { units: 'm2 s-2', target: 'geopotential', si: 'm2 s-2', scale: 1, offset: 0, source: 'UDUNITS-2 exponent grammar' },
  { units: 'm^2/s^2', target: 'geopotential', si: 'm2 s-2', scale: 1, offset: 0, source: 'UDUNITS-2 exponent grammar' },
  { units: 'gpm', target: 'geopotential_height', si: 'm', scale: 1, offset: 0, source: 'common practice, no source (geopotential metre)' },
  { units: 'm', target: 'geopotential_height', si: 'm', scale: 1, offset: 0, source: 'SI base unit' },
  { units: 'dam', target: 'geopotential_height', si: 'm', scale: 10, offset: 0, source: 'SI Brochure Table 7 (deca)' },
];

describe('toSI', () => {
  it.each(cases)('$units as $target → $si ×$scale +$offset ($source)', ({ units, target, si, scale, offset }) => {
    const c = toSI(units, target);
    expect(c.units).toBe(si);
    expect(c.unitScale).toBeCloseTo(scale, 15);
    expect(c.unitOffset).toBe(offset);
  });

  it('degF converts by K = (°F + 459.67)·5/9: 32 °F is 273.15 K (definition of the Fahrenheit scale, from memory)', () => {
    const c = toSI('degF', 'air_temperature');
    expect(32 * c.unitScale + c.unitOffset).toBeCloseTo(273.15, 10);
  });
});

describe('units errors name the variable, what was needed and what was found', () => {
  it('units that cannot be understood', () => {
    let err: unknown;
    try {
      toSI('furlongs per fortnight', 'air_temperature', { file: 'x.nc', variable: 't' });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(UnitsError);
    const u = err as UnitsError;
    expect(u.message).toBe('x.nc: variable t: units "furlongs per fortnight" cannot be understood (needed a temperature, K)');
    expect([u.needed, u.found, u.variable, u.file]).toEqual(['K', 'furlongs per fortnight', 't', 'x.nc']);
  });
  it('geopotential in metres is a different quantity (a factor g0 apart)', () => {
    expect(() => toSI('m', 'geopotential', { variable: 'z' })).toThrow('variable z: units "m" are not a geopotential (m2 s-2) (needed m2 s-2, found "m")');
  });
  it('humidity in K is refused', () => {
    expect(() => toSI('K', 'specific_humidity')).toThrow(UnitsError);
  });
  it('an offset unit cannot be raised to a power or multiplied', () => {
    expect(parseUnits('degC m')).toBeUndefined();
    expect(parseUnits('degC2')).toBeUndefined();
  });
});
