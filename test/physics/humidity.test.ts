import { describe, expect, it } from 'vitest';
import {
  EPSILON,
  HUMIDITY_CONVENTIONS,
  SATURATION_FORMULATIONS,
  dewPointFromVapourPressure,
  dewPointFromVapourPressureArray,
  frostPointFromVapourPressure,
  frostPointFromVapourPressureArray,
  mixingRatioFromVapourPressure,
  mixingRatioFromVapourPressureArray,
  saturationPressureEcmwfIce,
  saturationPressureEcmwfMixed,
  saturationPressureEcmwfWater,
  saturationPressureForConvention,
  saturationPressureIce,
  saturationPressureWater,
  specificHumidityFromVapourPressure,
  specificHumidityFromVapourPressureArray,
  vapourPressureFromDewPoint,
  vapourPressureFromDewPointArray,
  vapourPressureFromFrostPoint,
  vapourPressureFromMixingRatio,
  vapourPressureFromMixingRatioArray,
  vapourPressureFromRelativeHumidityArray,
  vapourPressureFromSpecificHumidity,
  vapourPressureFromSpecificHumidityArray,
  type HumidityConvention,
} from '../../lib/physics/index.js';
import { loadPsychrolib, relErr } from './references.js';

describe('RHi from specific humidity (check-values §2, column "RHi MK, ε = 0.622")', () => {
  const rows = [
    [250, 220.0, 5.0e-5, 75.6919],
    [250, 220.0, 1.0e-4, 151.3792],
    [200, 215.0, 3.0e-5, 69.579],
    [300, 230.0, 1.5e-4, 80.8303],
    [250, 225.0, 1.2e-4, 97.618],
  ].map(([pHpa, tK, q, rhi]) => ({ input: { pPa: pHpa * 100, tK, q }, expected: rhi, tol: 2e-6, source: 'check-values §2 (C), e = q p/(ε + (1 − ε) q), MK ice; printed to 6 digits' }));
  it.each(rows)('p = $input.pPa Pa, T = $input.tK K, q = $input.q → $expected % ($source)', ({ input, expected, tol }) => {
    const e = vapourPressureFromSpecificHumidity(input.q, input.pPa);
    expect(relErr((100 * e) / saturationPressureIce(input.tK), expected)).toBeLessThanOrEqual(tol);
  });
  it('ε is 0.622, one constant (issue §2; check-values §2: 0.6219569 would change RHi by ~7e-5)', () => {
    expect(EPSILON).toBe(0.622);
  });
});

describe('q ↔ e ↔ r: definitions and round trips', () => {
  it.each([
    { input: { q: 0.01, p: 100000 }, expected: (0.01 * 100000) / (0.622 + 0.378 * 0.01), tol: 1e-15, source: 'WMO-No. 8 Annex 4.B definition q = ε e/(p − (1 − ε) e), solved for e' },
    { input: { q: 1e-5, p: 20000 }, expected: (1e-5 * 20000) / (0.622 + 0.378 * 1e-5), tol: 1e-15, source: 'WMO-No. 8 Annex 4.B' },
  ])('e(q = $input.q, p = $input.p) ($source)', ({ input, expected, tol }) => {
    expect(relErr(vapourPressureFromSpecificHumidity(input.q, input.p), expected)).toBeLessThanOrEqual(tol);
  });
  it('q → e → q and r → e → r round trips to 1e-12 over 1e-7…0.04 kg/kg and 100–1050 hPa (issue property test)', () => {
    for (let lq = -7; lq <= Math.log10(0.04); lq += 0.1) {
      const q = 10 ** lq;
      for (let p = 10000; p <= 105000; p += 5000) {
        expect(relErr(specificHumidityFromVapourPressure(vapourPressureFromSpecificHumidity(q, p), p), q)).toBeLessThan(1e-12);
        expect(relErr(mixingRatioFromVapourPressure(vapourPressureFromMixingRatio(q, p), p), q)).toBeLessThan(1e-12);
        // r = q/(1 − q) (definition)
        const e = vapourPressureFromSpecificHumidity(q, p);
        expect(relErr(mixingRatioFromVapourPressure(e, p), q / (1 - q))).toBeLessThan(1e-12);
      }
    }
  });
  it('array twins equal the scalars (single pressure and per-cell pressure)', () => {
    const q = Float32Array.from([1e-5, 1e-4, 5e-3]);
    const pCells = Float32Array.from([20000, 25000, 85000]);
    const e = new Float64Array(3);
    vapourPressureFromSpecificHumidityArray(e, q, 25000);
    for (let i = 0; i < 3; i++) expect(e[i]).toBe(vapourPressureFromSpecificHumidity(q[i], 25000));
    vapourPressureFromSpecificHumidityArray(e, q, pCells);
    for (let i = 0; i < 3; i++) expect(e[i]).toBe(vapourPressureFromSpecificHumidity(q[i], pCells[i]));
    const back = new Float64Array(3);
    specificHumidityFromVapourPressureArray(back, e, pCells);
    for (let i = 0; i < 3; i++) expect(relErr(back[i], q[i])).toBeLessThan(1e-12);
    const r = new Float64Array(3);
    mixingRatioFromVapourPressureArray(r, e, pCells);
    const e2 = new Float64Array(3);
    vapourPressureFromMixingRatioArray(e2, r, pCells);
    for (let i = 0; i < 3; i++) expect(relErr(e2[i], e[i])).toBeLessThan(1e-12);
  });
});

describe('dew point and frost point', () => {
  it('inverse of the saturation pressure to 1e-9 K for every formulation (definition)', () => {
    for (const f of SATURATION_FORMULATIONS) {
      for (let t = 180; t <= 320; t += 5) {
        expect(Math.abs(dewPointFromVapourPressure(vapourPressureFromDewPoint(t, f), f) - t)).toBeLessThan(1e-9);
        expect(Math.abs(frostPointFromVapourPressure(vapourPressureFromFrostPoint(t, f), f) - t)).toBeLessThan(1e-9);
      }
    }
  });
  const psy = loadPsychrolib();
  const dew = [0.5, 5, 10, 20, 30, 40].map((tC) => ({ input: tC, tol: 0.02, source: 'psychrolib GetTDewPointFromVapPres (ASHRAE 2017, tolerance 0.001 °C); formulas differ ≤ 2e-4 → ≤ 0.005 K' }));
  it.each(dew)('dew point at $input °C matches psychrolib within $tol K ($source)', ({ input, tol }) => {
    const e = psy.GetSatVapPres(input);
    expect(Math.abs(dewPointFromVapourPressure(e, 'iapws') - 273.15 - psy.GetTDewPointFromVapPres(50, e))).toBeLessThanOrEqual(tol);
  });
  const frost = [-90, -70, -50, -30, -10, -1].map((tC) => ({ input: tC, tol: 0.02, source: 'psychrolib GetTDewPointFromVapPres over ice (ASHRAE 2017 eq. 5)' }));
  it.each(frost)('frost point at $input °C matches psychrolib within $tol K ($source)', ({ input, tol }) => {
    const e = psy.GetSatVapPres(input);
    expect(Math.abs(frostPointFromVapourPressure(e, 'iapws') - 273.15 - psy.GetTDewPointFromVapPres(0, e))).toBeLessThanOrEqual(tol);
  });
  it('frost point lies above the dew point below 0 °C (e_w > e_i; MurphyKoop2005)', () => {
    for (const e of [0.1, 1, 10, 100]) expect(frostPointFromVapourPressure(e)).toBeGreaterThan(dewPointFromVapourPressure(e));
  });
  it('errors and array forms', () => {
    expect(() => dewPointFromVapourPressure(0)).toThrow(/dew point: vapour pressure must be finite and > 0 Pa/);
    expect(() => frostPointFromVapourPressure(1e-30)).toThrow(/outside the ice extrapolation range 100–330 K of saturation formulation "murphy-koop"/);
    const e = Float32Array.from([10, NaN, -1, 100]);
    const out = new Float64Array(4);
    expect(dewPointFromVapourPressureArray(out, e)).toBe(1);
    expect(out[0]).toBeCloseTo(dewPointFromVapourPressure(Math.fround(10)), 9);
    expect(out[1]).toBeNaN();
    expect(out[2]).toBeNaN();
    expect(frostPointFromVapourPressureArray(out, e)).toBe(1);
    expect(out[3]).toBeCloseTo(frostPointFromVapourPressure(100), 9);
    const td = Float32Array.from([250, 10]);
    expect(vapourPressureFromDewPointArray(out.subarray(0, 2), td)).toBe(1);
    expect(out[0]).toBe(saturationPressureWater(250));
  });
});

describe('ECMWF IFS mixed-phase saturation (check-values §2.1)', () => {
  const computed = [
    [273.16, 611.21], [270.0, 480.58671], [265.0, 316.0656], [260.0, 200.37241], [255.0, 123.9487], [250.16, 77.05816], [245.0, 45.91146], [230.0, 8.93344],
  ].map(([tK, e]) => ({ input: tK, expected: e, tol: 1e-7, source: 'check-values §2.1 table (C, matches earthkit-meteo tests/data/sat_vp.csv to 3e-15), printed to 7–8 digits' }));
  const ekm = [
    [233.16, 12.834073], [253.16, 103.505017], [263.16, 268.237242],
  ].map(([tK, e]) => ({ input: tK, expected: e, tol: 5e-8, source: 'earthkit-meteo tests/data/sat_vp.csv as quoted in check-values §2.1 (F), ECMWF IFS CY47R3 Part IV ch. 12' }));
  it.each([...computed, ...ekm])('e_sat,mixed($input K) = $expected Pa ($source)', ({ input, expected, tol }) => {
    expect(relErr(saturationPressureEcmwfMixed(input), expected)).toBeLessThanOrEqual(tol);
    expect(relErr(saturationPressureForConvention(input, 'ecmwf-mixed', 'sonntag'), expected)).toBeLessThanOrEqual(tol);
  });
  // columns e_sat,w IFS, e_sat,i IFS and e_mixed/e_sat,i of the §2.1 table (C; 7–8 printed digits)
  const columns = [
    [273.16, 611.21, 611.21, 1.0], [270.0, 484.38277, 469.54898, 1.023507], [265.0, 330.95909, 305.4432, 1.034777],
    [260.0, 222.38162, 195.44141, 1.02523], [255.0, 146.78225, 122.89071, 1.008609], [250.16, 96.4134, 77.05816, 1.0],
    [245.0, 60.30984, 45.91146, 1.0], [230.0, 13.4193, 8.93344, 1.0],
  ].map(([tK, ew, ei, ratio]) => ({ input: tK, expected: { ew, ei, ratio }, tol: 1e-6, source: 'check-values §2.1 table (C), IFS CY47R3 Part IV ch. 12 Tetens forms' }));
  it.each(columns)('IFS water, ice and mixed/ice ratio at $input K ($source)', ({ input, expected, tol }) => {
    expect(relErr(saturationPressureEcmwfWater(input), expected.ew)).toBeLessThanOrEqual(tol);
    expect(relErr(saturationPressureEcmwfIce(input), expected.ei)).toBeLessThanOrEqual(tol);
    expect(relErr(saturationPressureEcmwfMixed(input) / saturationPressureEcmwfIce(input), expected.ratio)).toBeLessThanOrEqual(tol);
  });
  it('earthkit-meteo water and ice columns at 233.16, 253.16, 263.16 K (check-values §2.1, F)', () => {
    for (const [t, ew, ei] of [[233.16, 18.763915, 12.834073], [253.16, 125.378123, 103.126444], [263.16, 286.483187, 259.671784]]) {
      expect(relErr(saturationPressureEcmwfWater(t), ew)).toBeLessThan(5e-8);
      expect(relErr(saturationPressureEcmwfIce(t), ei)).toBeLessThan(5e-8);
    }
    expect(() => saturationPressureEcmwfIce(20)).toThrow(/outside the range 123–373.15 K of the IFS ice form/);
  });
  it('is continuous at 250.16 K and 273.16 K (α = 0 and 1; IFS definition)', () => {
    for (const t of [250.16, 273.16]) {
      expect(relErr(saturationPressureEcmwfMixed(t - 1e-9), saturationPressureEcmwfMixed(t + 1e-9))).toBeLessThan(1e-8);
    }
  });
});

describe('conventions', () => {
  it('water, ice and cmip (hur: over water above 0 °C, over ice below; CMIP6 data request)', () => {
    for (const f of SATURATION_FORMULATIONS) {
      expect(saturationPressureForConvention(230, 'water', f)).toBe(saturationPressureWater(230, f));
      expect(saturationPressureForConvention(230, 'ice', f)).toBe(saturationPressureIce(230, f));
      expect(saturationPressureForConvention(280, 'cmip', f)).toBe(saturationPressureWater(280, f));
      expect(saturationPressureForConvention(260, 'cmip', f)).toBe(saturationPressureIce(260, f));
      expect(saturationPressureForConvention(273.15, 'cmip', f)).toBe(saturationPressureIce(273.15, f));
    }
    expect(() => saturationPressureForConvention(250, 'wmo' as HumidityConvention)).toThrow(/unknown humidity convention "wmo"; valid: water, ice, ecmwf-mixed, cmip/);
  });
  it('RH array → e equals RH × e_sat of the convention, NaN and counted outside range', () => {
    const t = Float32Array.from([220, 255, 265, 280, 50, NaN]);
    const rh = Float32Array.from([1.2, 0.5, 0.9, 0.7, 0.5, 0.5]);
    const out = new Float32Array(6);
    for (const c of HUMIDITY_CONVENTIONS) {
      expect(vapourPressureFromRelativeHumidityArray(out, rh, t, c)).toBe(1);
      for (let i = 0; i < 4; i++) expect(out[i]).toBe(Math.fround(rh[i] * saturationPressureForConvention(t[i], c)));
      expect(out[4]).toBeNaN();
      expect(out[5]).toBeNaN();
    }
  });
  it('converting ECMWF r to RHi below 250.16 K lowers it by 0.15–0.32 % with MK ice (check-values §2.1)', () => {
    for (let t = 193.15; t <= 250.16; t += 1) {
      const factor = saturationPressureEcmwfMixed(t) / saturationPressureIce(t);
      expect(1 - factor).toBeGreaterThanOrEqual(0.0015 - 5e-5);
      expect(1 - factor).toBeLessThanOrEqual(0.0032 + 5e-5);
    }
  });
});
