import { describe, expect, it } from 'vitest';
import {
  CP_DRY_AIR,
  DEFAULT_CRITERION,
  EPSILON,
  FUEL_PRESETS,
  contrailFactor,
  criticalTemperature,
  fuelFromComposition,
  fuelFromEmissionIndex,
  mixingLineSlope,
  saturationPressureWater,
  saturationPressureWaterDerivative,
  thresholdTemperature,
  thresholdTemperatureApprox,
  validateCriterionParameters,
  type CriterionParameters,
} from '../../lib/physics/index.js';
import { REFERENCE, relErr } from './references.js';

// The fuel of check-values §3 (Schumann 1996 constants): EI_H2O = 1.25, Q = 43.2 MJ/kg; cp = 1004, ε = 0.622.
const KERO = fuelFromEmissionIndex({ name: 'check-values §3 kerosene', eiH2O: 1.25, lhvMJPerKg: 43.2 });
const CV31 = 'check-values.md §3.1 (C: Newton, cross-checked with scipy brentq; MK eq. 10)';

describe('constants used by the criterion', () => {
  it.each([
    { input: 'cp', actual: CP_DRY_AIR, expected: 1004, tol: 0, source: 'Schumann 1996 (issue §3)' },
    { input: 'ε', actual: EPSILON, expected: 0.622, tol: 0, source: 'Schumann 1996 (issue §3)' },
  ])('$input = $expected ($source)', ({ actual, expected, tol }) => {
    expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol);
  });
});

// §3.1: p, η, G, T_LM exact MK, approx, T_LM Sonntag, T_LC(0), T_LC(0.5), T_LC(1), e_w(T_LM)
const TABLE31: [number, number, number, number, number, number, number, number, number, number][] = [
  [200, 0.3, 1.33445, 229.1009, 229.0728, 229.1057, 219.8836, 221.9394, 229.1009, 12.30007],
  [250, 0.3, 1.66806, 231.4056, 231.3759, 231.4148, 221.9651, 224.0699, 231.4056, 15.74734],
  [300, 0.3, 2.00167, 233.3314, 233.3017, 233.3422, 223.7034, 225.8493, 233.3314, 19.27227],
  [200, 0.4, 1.55686, 230.687, 230.6576, 230.6951, 221.3162, 223.4057, 230.687, 14.58891],
  [250, 0.4, 1.94607, 233.0313, 233.0015, 233.0419, 223.4325, 225.5721, 233.0313, 18.67994],
  [300, 0.4, 2.33528, 234.9903, 234.9617, 235.0012, 225.2, 227.3817, 234.9903, 22.86309],
];

describe('exact T_LM and T_LC: check-values §3.1 (primary check of the criterion)', () => {
  const rows = TABLE31.map(([pHpa, eta, G, tlm, approx, tlmSo, tlc0, tlc05, tlc1, ew]) => ({
    input: { pPa: pHpa * 100, eta },
    expected: { G, tlm, approx, tlmSo, tlc0, tlc05, tlc1, ew },
    // printed to 4 decimals (K) / 6 significant digits: tolerances = half a unit of the last digit, plus solver noise
    tol: { K: 1e-4, G: 5e-6, ew: 5e-7 },
    source: CV31,
  }));
  it.each(rows)('p = $input.pPa Pa, η = $input.eta ($source)', ({ input, expected, tol }) => {
    const G = mixingLineSlope(input.pPa, KERO, input.eta);
    expect(relErr(G, expected.G)).toBeLessThanOrEqual(tol.G);
    const tlm = thresholdTemperature(G);
    expect(Math.abs(tlm - expected.tlm)).toBeLessThanOrEqual(tol.K);
    expect(Math.abs(thresholdTemperatureApprox(G) - expected.approx)).toBeLessThanOrEqual(tol.K);
    expect(Math.abs(thresholdTemperature(G, 'sonntag') - expected.tlmSo)).toBeLessThanOrEqual(tol.K);
    expect(Math.abs(criticalTemperature(G, 0) - expected.tlc0)).toBeLessThanOrEqual(tol.K);
    expect(Math.abs(criticalTemperature(G, 0.5) - expected.tlc05)).toBeLessThanOrEqual(tol.K);
    expect(Math.abs(criticalTemperature(G, 1) - expected.tlc1)).toBeLessThanOrEqual(tol.K);
    expect(relErr(saturationPressureWater(tlm), expected.ew)).toBeLessThanOrEqual(tol.ew);
  });

  it('headline example: 250 hPa, η = 0.3, EI 1.25, Q 43.2 MJ/kg → G ≈ 1.668 Pa/K, T_LM ≈ 231.4 K (−41.7 °C) (issue §3; check-values §3.1)', () => {
    const G = mixingLineSlope(25000, KERO, 0.3);
    expect(Math.abs(G - 1.668)).toBeLessThan(5e-4);
    expect(Math.abs(thresholdTemperature(G) - 273.15 - -41.744)).toBeLessThan(5e-4);
    expect(Math.abs(thresholdTemperatureApprox(G) - 273.15 - -41.774)).toBeLessThan(5e-4);
  });

  const others = [
    // SPK/HEFA: the note's G and T_LM were computed with the unrounded EI = 0.153 × 8.9367 (§5), not the printed 1.3672
    { input: { name: 'Jet A-1', ei: 1.23, q: 43.15 }, expected: { G: 1.9172, tlm: 232.872, approx: 232.842, tlc0: 223.289 } },
    { input: { name: 'SPK/HEFA', ei: 0.153 * 8.9367, q: 44.1 }, expected: { G: 2.0853, tlm: 233.769, approx: 233.74, tlc0: 224.098 } },
    { input: { name: 'liquid hydrogen', ei: 8.94, q: 120.0 }, expected: { G: 5.0106, tlm: 243.638, approx: 243.632, tlc0: 232.994 } },
  ].map((r) => ({ ...r, tol: { K: 1e-3, G: 5e-5 }, source: 'check-values.md §3.1 "other fuels at 250 hPa, η = 0.4" (C)' }));
  it.each(others)('$input.name at 250 hPa, η = 0.4 ($source)', ({ input, expected, tol }) => {
    const G = mixingLineSlope(25000, fuelFromEmissionIndex({ eiH2O: input.ei, lhvMJPerKg: input.q }), 0.4);
    expect(relErr(G, expected.G)).toBeLessThanOrEqual(tol.G);
    expect(Math.abs(thresholdTemperature(G) - expected.tlm)).toBeLessThanOrEqual(tol.K);
    expect(Math.abs(thresholdTemperatureApprox(G) - expected.approx)).toBeLessThanOrEqual(tol.K);
    expect(Math.abs(criticalTemperature(G, 0) - expected.tlc0)).toBeLessThanOrEqual(tol.K);
  });
});

describe('exact T_LM and T_LC against scipy brentq (data-samples/physics/reference.json)', () => {
  const rows = REFERENCE.criterion.flatMap((r) => [
    { input: { ...r, U: NaN }, expected: r.tlmK, tol: 1e-6, source: `scipy ${REFERENCE.versions.scipy} brentq on the published ${r.saturation} liquid formula (check-values §7: atol 1e-6 K)` },
    ...Object.entries(r.tlcK).map(([u, t]) => ({ input: { ...r, U: Number(u) }, expected: t, tol: 1e-6, source: `scipy ${REFERENCE.versions.scipy} brentq, T_LC(U = ${u})` })),
  ]);
  it.each(rows)('$input.fuel $input.saturation p = $input.pPa η = $input.efficiency U = $input.U ($source)', ({ input, expected, tol }) => {
    const fuel = fuelFromEmissionIndex({ eiH2O: input.eiH2O, lhvMJPerKg: input.lhvJPerKg / 1e6 });
    const G = mixingLineSlope(input.pPa, fuel, input.efficiency);
    expect(relErr(G, input.G)).toBeLessThanOrEqual(1e-12);
    const t = Number.isNaN(input.U) ? thresholdTemperature(G, input.saturation) : criticalTemperature(G, input.U, input.saturation);
    expect(Math.abs(t - expected)).toBeLessThanOrEqual(tol);
  });
});

describe("Schumann's approximation", () => {
  // check-values §3.1 "approximation error over G" row of exact T_LM (C)
  const exact = [
    [0.5, 219.6118], [1.0, 226.2042], [1.5, 230.3017], [2.0, 233.3225], [3.0, 237.7469], [5.0, 243.613], [10.0, 252.1409],
  ].map(([G, t]) => ({ input: G, expected: t, tol: 1e-4, source: 'check-values.md §3.1 approximation-error table, exact T_LM with MK (C)' }));
  it.each(exact)('exact T_LM(G = $input) = $expected K ($source)', ({ input, expected, tol }) => {
    expect(Math.abs(thresholdTemperature(input) - expected)).toBeLessThanOrEqual(tol);
  });
  const sweep = Array.from({ length: 96 }, (_, k) => 0.5 + k * 0.1).map((G) => ({ input: G, tol: 0.05, source: 'check-values §7: approx within 0.05 K of exact for 0.5 ≤ G ≤ 10 Pa/K' }));
  it.each(sweep)('G = $input Pa/K: |approx − exact| ≤ $tol K ($source)', ({ input, tol }) => {
    expect(Math.abs(thresholdTemperatureApprox(input) - thresholdTemperature(input))).toBeLessThanOrEqual(tol);
  });
  it('degrades below G ≈ 0.3 Pa/K (check-values §3.1: −0.363 K at G = 0.2, −1.454 K at G = 0.1)', () => {
    expect(thresholdTemperatureApprox(0.2) - thresholdTemperature(0.2)).toBeCloseTo(-0.363, 3);
    expect(thresholdTemperatureApprox(0.1) - thresholdTemperature(0.1)).toBeCloseTo(-1.454, 3);
  });
  it('needs G > 0.053 Pa/K', () => {
    expect(() => thresholdTemperatureApprox(0.05)).toThrow(/G > 0.053 Pa\/K/);
  });
});

describe('contrail factor', () => {
  const rows = [0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4].map((eta) => ({
    input: eta,
    expected: [0.0295, 0.049],
    tol: 0,
    source: 'J. Appl. Meteorol. 39(1) (2000), review of Schmidt–Appleman theory: published kerosene contrail factors 0.0295–0.049 g kg⁻¹ K⁻¹',
  }));
  it.each(rows)('kerosene, η = $input, lies in $expected g/kg/K ($source)', ({ input, expected }) => {
    const gPerKgK = contrailFactor(FUEL_PRESETS.kerosene, input) * 1000;
    expect(gPerKgK).toBeGreaterThanOrEqual(expected[0]);
    expect(gPerKgK).toBeLessThanOrEqual(expected[1]);
  });
  it.each([
    { input: 0.3, expected: 0.0415, tol: 1e-4, source: 'check-values §3.2 (C): 0.04150 g/kg/K' },
    { input: 0.4, expected: 0.04842, tol: 1e-4, source: 'check-values §3.2 (C): 0.04842 g/kg/K' },
  ])('η = $input → $expected g/kg/K ($source)', ({ input, expected, tol }) => {
    expect(relErr(contrailFactor(KERO, input) * 1000, expected)).toBeLessThanOrEqual(tol);
  });
  it('is G ε / p (definition, Schumann 1996)', () => {
    expect(relErr(contrailFactor(KERO, 0.3), (mixingLineSlope(25000, KERO, 0.3) * EPSILON) / 25000)).toBeLessThan(1e-14);
  });
});

describe('facts of the trade (common practice, no source)', () => {
  it('kerosene, η = 0.3, 200–300 hPa: every T_LC(U) lies roughly between −55 °C (dry) and −40 °C (saturated), ±1 K (common practice, no source)', () => {
    let lo = Infinity;
    let hi = -Infinity;
    for (let p = 20000; p <= 30000; p += 1000) {
      const G = mixingLineSlope(p, FUEL_PRESETS.kerosene, 0.3);
      for (let k = 0; k <= 10; k++) {
        const tC = criticalTemperature(G, k / 10) - 273.15;
        lo = Math.min(lo, tC);
        hi = Math.max(hi, tC);
      }
    }
    expect(lo).toBeGreaterThanOrEqual(-56);
    expect(hi).toBeLessThanOrEqual(-39);
    expect(hi - lo).toBeGreaterThan(10); // the span between dry and saturated air is real, not a constant
  });
  it.each([15000, 20000, 25000, 30000, 35000].map((p) => ({ input: p, source: 'common practice, no source: hydrogen raises G and the threshold temperature' })))(
    'hydrogen at $input Pa ($source)',
    ({ input }) => {
      const gk = mixingLineSlope(input, FUEL_PRESETS.kerosene, 0.3);
      const gh = mixingLineSlope(input, FUEL_PRESETS.hydrogen, 0.3);
      expect(gh).toBeGreaterThan(gk);
      expect(thresholdTemperature(gh)).toBeGreaterThan(thresholdTemperature(gk));
      expect(criticalTemperature(gh, 0.5)).toBeGreaterThan(criticalTemperature(gk, 0.5));
    },
  );
});

describe('properties of T_LM and T_LC', () => {
  it('de_w/dT(T_LM) = G for every formulation (definition, Schumann 1996)', () => {
    for (const f of ['murphy-koop', 'sonntag', 'goff-gratch', 'iapws', 'magnus'] as const) {
      for (const G of [0.1, 0.3, 1, 2, 5, 10]) {
        expect(relErr(saturationPressureWaterDerivative(thresholdTemperature(G, f), f), G)).toBeLessThan(1e-10);
      }
    }
  });
  it('T_LC solves e_w(T_LM) − G (T_LM − T_LC) = U e_w(T_LC), is ≤ T_LM and increases with U', () => {
    for (const G of [0.2, 1, 1.7, 3, 8]) {
      const tlm = thresholdTemperature(G);
      const ewm = saturationPressureWater(tlm);
      let prev = -Infinity;
      for (let k = 0; k <= 100; k++) {
        const U = k / 100;
        const tlc = criticalTemperature(G, U);
        expect(tlc).toBeLessThanOrEqual(tlm);
        expect(tlc).toBeGreaterThan(prev);
        prev = tlc;
        if (U < 1) expect(Math.abs(ewm - G * (tlm - tlc) - U * saturationPressureWater(tlc))).toBeLessThan(1e-9 * ewm);
      }
      expect(criticalTemperature(G, 1.2)).toBe(tlm);
    }
  });
  it('MK and Sonntag T_LM agree within 0.02 K at 200–300 hPa (check-values §7, §3.1 G values)', () => {
    for (const G of [1.33445, 1.66806, 2.00167, 2.33528]) expect(Math.abs(thresholdTemperature(G, 'sonntag') - thresholdTemperature(G))).toBeLessThan(0.02);
  });
});

describe('parameter validation', () => {
  const bad: { input: Partial<CriterionParameters>; expected: RegExp; source: string }[] = [
    { input: { efficiency: 1 }, expected: /efficiency must be in \[0, 1\), got 1/, source: 'issue §3: η must be in [0, 1)' },
    { input: { efficiency: -0.1 }, expected: /efficiency must be in \[0, 1\)/, source: 'issue §3' },
    { input: { humidityScale: 0 }, expected: /humidityScale must be in \(0, 10\]/, source: 'issue §2: F > 0' },
    { input: { iceThresholdPercent: NaN }, expected: /iceThresholdPercent must be in \(0, 200\] %/, source: 'project range' },
    { input: { freezingTemperatureK: 300 }, expected: /freezingTemperatureK must be in \[150, 273.16\] K/, source: 'project range' },
    { input: { saturation: 'tetens' as never }, expected: /unknown saturation formulation "tetens"; valid: murphy-koop/, source: 'issue §1 names' },
    { input: { fuel: { name: 'x', eiH2O: 0, lhvJPerKg: 1 } }, expected: /fuel.eiH2O must be finite and > 0/, source: 'project range' },
  ];
  it.each(bad)('rejects $input with $expected ($source)', ({ input, expected }) => {
    expect(() => validateCriterionParameters({ ...DEFAULT_CRITERION, ...input })).toThrow(RangeError);
    expect(() => validateCriterionParameters({ ...DEFAULT_CRITERION, ...input })).toThrow(expected);
  });
  it('accepts the defaults (kerosene, 0.3, murphy-koop, 100 %, 235 K, F = 1; issue §3)', () => {
    expect(() => validateCriterionParameters(DEFAULT_CRITERION)).not.toThrow();
    expect(DEFAULT_CRITERION).toMatchObject({ efficiency: 0.3, saturation: 'murphy-koop', iceThresholdPercent: 100, freezingTemperatureK: 235, humidityScale: 1 });
    expect(DEFAULT_CRITERION.fuel.name).toBe('kerosene');
  });
  it('rejects non-positive pressure and G', () => {
    expect(() => mixingLineSlope(0, KERO, 0.3)).toThrow(/pressure must be finite and > 0 Pa/);
    expect(() => thresholdTemperature(-1)).toThrow(/G must be finite and > 0 Pa\/K/);
    expect(() => criticalTemperature(1, -0.1)).toThrow(/U must be ≥ 0/);
    expect(() => thresholdTemperature(1e4)).toThrow(/no threshold temperature within the water range/);
  });
  it('a composition-built fuel gives the same G as its emission index', () => {
    const a = fuelFromComposition({ hydrogenMassFraction: 0.14, lhvMJPerKg: 43 });
    const b = fuelFromEmissionIndex({ eiH2O: a.eiH2O, lhvMJPerKg: 43 });
    expect(mixingLineSlope(25000, a, 0.3)).toBe(mixingLineSlope(25000, b, 0.3));
  });
});
