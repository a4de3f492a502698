import { describe, expect, it } from 'vitest';
import {
  FOOT,
  ISA_PRESSURE_MAX_PA,
  ISA_PRESSURE_MIN_PA,
  flightLevelFromPressure,
  flightLevelFromPressureArray,
  geometricAltitudeFromGeopotentialHeight,
  geopotentialFromGeopotentialHeight,
  geopotentialHeightFromGeometricAltitude,
  geopotentialHeightFromGeopotential,
  geopotentialHeightFromGeopotentialArray,
  isaAltitudeFromPressure,
  isaAltitudeFromPressureArray,
  isaPressureFromAltitude,
  isaTemperatureAtAltitude,
  pressureFromFlightLevel,
} from '../../lib/physics/index.js';
import { relErr } from './references.js';

describe('ISA: values named in the issue (ICAO Doc 7488 constants; published ISA tables)', () => {
  it.each([
    { input: 'FL300', actual: () => pressureFromFlightLevel(300) / 100, expected: 300.9, tol: 0.005, source: 'issue §checks: FL300 → 300.90 hPa (ISA tables)' },
    { input: 'FL340', actual: () => pressureFromFlightLevel(340) / 100, expected: 249.99, tol: 0.005, source: 'issue §checks: FL340 → 249.99 hPa' },
    { input: '11 km p', actual: () => isaPressureFromAltitude(11000) / 100, expected: 226.32, tol: 0.005, source: 'ICAO Doc 7488: tropopause 226.32 hPa' },
    { input: '11 km T', actual: () => isaTemperatureAtAltitude(11000), expected: 216.65, tol: 1e-9, source: 'ICAO Doc 7488: 216.65 K' },
    { input: '250 hPa m', actual: () => isaAltitudeFromPressure(25000), expected: 10363, tol: 1, source: 'ISA table (meteowvl.be, ICAO 1964; check-values §4.2): 10 363 m' },
    { input: '250 hPa ft', actual: () => isaAltitudeFromPressure(25000) / FOOT, expected: 33999, tol: 2, source: 'ISA table: 33 999 ft' },
    { input: '200 hPa', actual: () => isaAltitudeFromPressure(20000), expected: 11784, tol: 1, source: 'ISA table: 11 784 m' },
    { input: '500 hPa', actual: () => isaAltitudeFromPressure(50000), expected: 5574, tol: 1, source: 'ISA table: 5 574 m' },
  ])('$input → $expected ± $tol ($source)', ({ actual, expected, tol }) => {
    expect(Math.abs(actual() - expected)).toBeLessThanOrEqual(tol);
  });
});

describe('ISA pressure at flight levels against python3-fluids ATMOSPHERE_1976 (check-values §4.1, L3)', () => {
  const rows = [
    [0, 101325.0], [200, 46563.26], [250, 37600.92], [300, 30089.59], [340, 24999.02], [360, 22729.3], [390, 19677.32], [410, 17873.87], [450, 14747.68],
  ].map(([fl, p]) => ({ input: fl, expected: p, tol: 2e-6, source: 'check-values §4.1, fluids 1.0.22 ATMOSPHERE_1976 (rtol 2e-6 for p11 rounding, §7)' }));
  it.each(rows)('FL$input → $expected Pa ($source)', ({ input, expected, tol }) => {
    expect(relErr(pressureFromFlightLevel(input), expected)).toBeLessThanOrEqual(tol);
  });
});

describe('ISA pressure → altitude against a published ISA table (check-values §4.2, meteowvl.be ICAO 1964)', () => {
  const rows = [
    [850, 1457, 4781], [700, 3012, 9882], [400, 7185, 23574], [300, 9164, 30065], [250, 10363, 33999], [200, 11784, 38662], [150, 13608, 44647], [100, 16180, 53083], [50, 20576, 67507],
  ].map(([hpa, m, ft]) => ({ input: hpa, expected: { m, ft }, tol: { m: 1, ft: 2 }, source: 'check-values §4.2 (F2: meteowvl.be ISA table, ICAO 1964), ±1 m / ±2 ft' }));
  it.each(rows)('$input hPa ($source)', ({ input, expected, tol }) => {
    const h = isaAltitudeFromPressure(input * 100);
    expect(Math.abs(h - expected.m)).toBeLessThanOrEqual(tol.m);
    expect(Math.abs(h / FOOT - expected.ft)).toBeLessThanOrEqual(tol.ft);
  });
  it('500 hPa is FL 182.9 (AMS Glossary "flight level": ICAO standard height 18 289 ft)', () => {
    expect(Math.abs(flightLevelFromPressure(50000) * 100 - 18289)).toBeLessThanOrEqual(2);
  });
});

describe('ISA layer bases (derived, not retyped)', () => {
  it.each([
    { input: 11000, expected: { p: 22632.1, t: 216.65 }, tol: 1e-5, source: 'US Standard Atmosphere 1976 layer table (F2, check-values §4): 22 632.10 Pa' },
    { input: 20000, expected: { p: 5474.89, t: 216.65 }, tol: 1e-5, source: 'US Standard Atmosphere 1976 layer table (F2, check-values §4): 5 474.89 Pa' },
    { input: 32000, expected: { p: 868.02, t: 228.65 }, tol: 1e-5, source: 'COESA 1976 layer table, from memory' },
    { input: 47000, expected: { p: 110.91, t: 270.65 }, tol: 1e-4, source: 'COESA 1976 layer table, from memory' },
    { input: 51000, expected: { p: 66.939, t: 270.65 }, tol: 1e-4, source: 'COESA 1976 layer table, from memory' },
    { input: 71000, expected: { p: 3.9564, t: 214.65 }, tol: 1e-4, source: 'COESA 1976 layer table, from memory' },
  ])('H = $input m ($source)', ({ input, expected, tol }) => {
    expect(relErr(isaPressureFromAltitude(input), expected.p)).toBeLessThanOrEqual(tol);
    expect(Math.abs(isaTemperatureAtAltitude(input) - expected.t)).toBeLessThan(1e-9);
  });
  it('T at 84.852 km′ is 186.946 K (COESA 1976, from memory)', () => {
    expect(Math.abs(isaTemperatureAtAltitude(84852) - 186.946)).toBeLessThan(1e-3);
  });
});

describe('ISA round trips', () => {
  it('p → H → p to 1e-9 relative from the top of the range to −5 km (issue §checks)', () => {
    let worst = 0;
    for (let lg = Math.log(ISA_PRESSURE_MIN_PA); lg <= Math.log(ISA_PRESSURE_MAX_PA); lg += 0.01) {
      const p = Math.exp(lg);
      worst = Math.max(worst, relErr(isaPressureFromAltitude(isaAltitudeFromPressure(p)), p));
    }
    expect(worst).toBeLessThan(1e-9);
  });
  it('H → p → H to 1e-6 m (check-values §7)', () => {
    for (let h = -5000; h <= 84852; h += 37) expect(Math.abs(isaAltitudeFromPressure(isaPressureFromAltitude(h)) - h)).toBeLessThan(1e-6);
  });
  it('FL → p → FL', () => {
    for (let fl = 0; fl <= 600; fl += 10) expect(Math.abs(flightLevelFromPressure(pressureFromFlightLevel(fl)) - fl)).toBeLessThan(1e-9);
  });
  it('array forms equal the scalar ones and flag out-of-range pressures', () => {
    const p = Float64Array.from([25000, 20000, NaN, 0.01, 2e5]);
    const h = new Float64Array(5);
    expect(isaAltitudeFromPressureArray(h, p)).toBe(2);
    expect(h[0]).toBe(isaAltitudeFromPressure(25000));
    expect(h[2]).toBeNaN();
    expect(h[3]).toBeNaN();
    const fl = new Float32Array(5);
    expect(flightLevelFromPressureArray(fl, p)).toBe(2);
    expect(fl[1]).toBe(Math.fround(flightLevelFromPressure(20000)));
  });
  it('errors name the range', () => {
    expect(() => isaPressureFromAltitude(90000)).toThrow(/ISA altitude 90000 m is outside -5000…84852 m/);
    expect(() => isaAltitudeFromPressure(0)).toThrow(/outside the ISA range/);
  });
});

describe('geopotential and geometric altitude', () => {
  it.each([
    { input: 84852, expected: 86000, tol: 1, source: 'COESA 1976: 84.852 km geopotential = 86 km geometric (from memory)' },
    { input: 71000, expected: 71802, tol: 1, source: 'COESA 1976 layer table: 71.802 km geometric (from memory)' },
    { input: 47000, expected: 47350, tol: 1, source: 'COESA 1976 layer table: 47.350 km geometric (from memory)' },
    { input: 11000, expected: 11019, tol: 1, source: 'COESA 1976 layer table: 11.019 km geometric (from memory)' },
  ])('H = $input m → Z = $expected m ($source)', ({ input, expected, tol }) => {
    const z = geometricAltitudeFromGeopotentialHeight(input);
    expect(Math.abs(z - expected)).toBeLessThanOrEqual(tol);
    expect(Math.abs(geopotentialHeightFromGeometricAltitude(z) - input)).toBeLessThan(1e-8);
  });
  it('Φ = g0 H with g0 = 9.80665 m s⁻² (ICAO Doc 7488; check-values §6)', () => {
    expect(geopotentialHeightFromGeopotential(98066.5)).toBeCloseTo(10000, 9);
    expect(geopotentialFromGeopotentialHeight(10000)).toBeCloseTo(98066.5, 8);
    const out = new Float32Array(2);
    geopotentialHeightFromGeopotentialArray(out, Float32Array.from([98066.5, 0]));
    expect(out[0]).toBeCloseTo(10000, 2);
    expect(out[1]).toBe(0);
  });
});
