import { describe, expect, it } from 'vitest';
import {
  CO2_PER_CARBON,
  FUEL_PRESETS,
  WATER_PER_HYDROGEN,
  emissionIndexCO2,
  emissionIndexH2O,
  fuelFromComposition,
  fuelFromEmissionIndex,
  oxygenPerFuelMass,
  resolveFuel,
} from '../../lib/physics/index.js';
import { relErr } from './references.js';

describe('stoichiometry of complete combustion (check-values §5, IUPAC atomic weights)', () => {
  it.each([
    { input: 'M(H2O)/(2 M(H))', actual: WATER_PER_HYDROGEN, expected: 8.936, tol: 1e-4, source: 'check-values §5 (C): 8.936 with H 1.008, O 15.999' },
    { input: 'M(CO2)/M(C)', actual: CO2_PER_CARBON, expected: 3.664, tol: 1e-4, source: 'check-values §5 (C): 3.664' },
  ])('$input ≈ $expected ($source)', ({ actual, expected, tol }) => {
    expect(relErr(actual, expected)).toBeLessThanOrEqual(tol);
  });
  it.each([
    { input: { name: 'Jet A, NJFCP A2, C11.4H21.7', xH: 0.13774 }, expected: { h2o: 1.2309, co2: 3.1594 }, tol: 1e-4, source: 'Xu et al. 2015 Table 1 formula (F), EIs derived in check-values §5 (C)' },
    { input: { name: 'JP-8, NJFCP A1, C10.8H21.6', xH: 0.14372 }, expected: { h2o: 1.2843, co2: 3.1374 }, tol: 1e-4, source: 'Xu et al. 2015 Table 1 (F), check-values §5 (C)' },
    { input: { name: 'ATJ-SPK, NJFCP C1, C12.5H27.1', xH: 0.15394 }, expected: { h2o: 1.3756, co2: 3.1 }, tol: 1e-4, source: 'Xu et al. 2015 Table 1 (F), check-values §5 (C)' },
  ])('$input.name ($source)', ({ input, expected, tol }) => {
    expect(relErr(emissionIndexH2O(input.xH), expected.h2o)).toBeLessThanOrEqual(tol);
    expect(relErr(emissionIndexCO2(1 - input.xH), expected.co2)).toBeLessThanOrEqual(tol);
    const f = fuelFromComposition({ hydrogenMassFraction: input.xH, lhvMJPerKg: 43.1 });
    expect(f.eiH2O).toBe(emissionIndexH2O(input.xH));
    expect(f.eiCO2).toBe(emissionIndexCO2(1 - input.xH));
    expect(f.lhvJPerKg).toBe(43.1e6);
  });
  it.each([
    { input: 0.138, expected: { h2o: 1.23, co2: 3.16 }, tol: { h2o: 0.02, co2: 0.005 }, source: 'EI_CO2 3.16 (CORSIA; IPCC 1999) and EI_H2O ≈ 1.23 (Commun. Earth Environ., doi:10.1038/s43247-021-00174-y), check-values §7 tolerances' },
  ])('x_H = $input gives the published kerosene emission indices ($source)', ({ input, expected, tol }) => {
    expect(Math.abs(emissionIndexH2O(input) - expected.h2o)).toBeLessThanOrEqual(tol.h2o);
    expect(Math.abs(emissionIndexCO2(1 - input) - expected.co2)).toBeLessThanOrEqual(tol.co2);
  });
});

describe('airliner at cruise (fact of the trade; Jet A-1 density 0.8 kg/L: common practice, no source)', () => {
  // roughly 1.5 L of kerosene per second, a little over 4 kg of O2, about 3.7 kg CO2 and 1.5 kg (1.5 L) water per second
  const fuelKgPerS = 1.5 * 0.8;
  const xH = 0.138;
  const xC = 1 - xH;
  it.each([
    { input: 'CO2 kg/s', actual: () => fuelKgPerS * emissionIndexCO2(xC), expected: 3.7, tol: 0.05, source: 'common practice, no source: ≈ 3.7 kg CO2 per second, "within a few percent"' },
    { input: 'H2O kg/s', actual: () => fuelKgPerS * emissionIndexH2O(xH), expected: 1.5, tol: 0.05, source: 'common practice, no source: ≈ 1.5 kg water per second' },
    { input: 'H2O L/s as liquid (1 kg/L)', actual: () => fuelKgPerS * emissionIndexH2O(xH) / 1.0, expected: 1.5, tol: 0.05, source: 'common practice, no source: ≈ 1.5 L liquid water' },
  ])('$input ≈ $expected ($source)', ({ actual, expected, tol }) => {
    expect(relErr(actual(), expected)).toBeLessThanOrEqual(tol);
  });
  it('O2 consumed is "a little over 4 kg" per second: in [4.0, 4.3] kg (common practice, no source)', () => {
    const o2 = fuelKgPerS * oxygenPerFuelMass(xH, xC);
    expect(o2).toBeGreaterThan(4.0);
    expect(o2).toBeLessThan(4.3);
  });
  it('mass is conserved: fuel + O2 = CO2 + H2O (law of conservation of mass)', () => {
    expect(relErr(1 + oxygenPerFuelMass(xH, xC), emissionIndexCO2(xC) + emissionIndexH2O(xH))).toBeLessThan(1e-12);
  });
});

describe('presets and user fuels', () => {
  it.each([
    { input: 'kerosene', expected: { ei: 1.25, q: 43.2e6, co2: 3.16 }, tol: 1e-12, source: 'Schumann 1996 (EI 1.25, Q 43.2 MJ/kg, issue §4); EI_CO2 3.16 CORSIA' },
    { input: 'synthetic-kerosene', expected: { ei: 1.367, q: 44e6, co2: 3.104 }, tol: 5e-4, source: 'x_H 0.153 (from memory, check-values §5 HEFA row) → EI 1.367, EI_CO2 3.104 (C); Q 44 MJ/kg (issue §4)' },
    { input: 'hydrogen', expected: { ei: 8.936, q: 120e6, co2: 0 }, tol: 1e-4, source: 'x_H = 1 → 8.936 (check-values §5, C); LHV 120 MJ/kg (issue §4; NRC 2004 Table H-2: 120.1)' },
  ])('$input ($source)', ({ input, expected, tol }) => {
    const f = resolveFuel(input);
    expect(f).toBe(FUEL_PRESETS[input as keyof typeof FUEL_PRESETS]);
    expect(f.name).toBe(input);
    expect(relErr(f.eiH2O, expected.ei)).toBeLessThanOrEqual(tol);
    expect(relErr(f.lhvJPerKg, expected.q)).toBeLessThanOrEqual(1e-12);
    expect(Math.abs((f.eiCO2 ?? NaN) - expected.co2)).toBeLessThanOrEqual(expected.co2 * tol);
  });
  it('hydrogen LHV agrees with the DOE and NRC tables within 0.2 % (check-values §5: 119.96, 120.04, 120.1 MJ/kg)', () => {
    for (const ref of [119.96e6, 120.04e6, 120.1e6]) expect(relErr(FUEL_PRESETS.hydrogen.lhvJPerKg, ref)).toBeLessThan(2e-3);
  });
  it('kerosene preset x_H ≈ 0.14 (issue §4: "x_H ≈ 0.14"; check-values §5: 0.1399)', () => {
    expect(Math.abs((FUEL_PRESETS.kerosene.hydrogenMassFraction ?? NaN) - 0.1399)).toBeLessThan(1e-4);
  });
  it('unknown names list the valid ones', () => {
    expect(() => resolveFuel('diesel')).toThrow(RangeError);
    expect(() => resolveFuel('diesel')).toThrow(/unknown fuel "diesel"; valid: kerosene, synthetic-kerosene, hydrogen/);
  });
  it('validates user fuels', () => {
    expect(() => fuelFromComposition({ hydrogenMassFraction: 1.2, lhvMJPerKg: 43 })).toThrow(/hydrogenMassFraction must be in \[0, 1\], got 1.2/);
    expect(() => fuelFromComposition({ hydrogenMassFraction: 0.5, carbonMassFraction: 0.6, lhvMJPerKg: 43 })).toThrow(/must be ≤ 1/);
    expect(() => fuelFromEmissionIndex({ eiH2O: 1.2, lhvMJPerKg: 0 })).toThrow(/lhvMJPerKg must be in \(0, 1000\) MJ\/kg/);
    expect(() => fuelFromEmissionIndex({ eiH2O: -1, lhvMJPerKg: 43 })).toThrow(/eiH2O must be in \(0, 10\]/);
    const f = fuelFromEmissionIndex({ name: 'test blend', eiH2O: 1.3, lhvMJPerKg: 43.5 });
    expect(f).toMatchObject({ name: 'test blend', eiH2O: 1.3, lhvJPerKg: 43.5e6 });
    expect(relErr(f.hydrogenMassFraction ?? NaN, 1.3 / 8.936)).toBeLessThan(1e-4);
  });
});
