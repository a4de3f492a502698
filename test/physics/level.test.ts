import { describe, expect, it } from 'vitest';
import {
  CRITICAL_TABLE_NODES,
  DEFAULT_CRITERION,
  FUEL_PRESETS,
  SATURATION_FORMULATIONS,
  criticalTemperature,
  criticalTemperatureFromTable,
  evaluateLevel,
  fuelFromEmissionIndex,
  mixingLineSlope,
  prepareLevel,
  saturationPressureIce,
  saturationPressureWater,
  thresholdTemperature,
  vapourPressureFromRelativeHumidityArray,
  vapourPressureFromSpecificHumidity,
  type CriterionParameters,
  type LevelOutputs,
} from '../../lib/physics/index.js';
import { relErr } from './references.js';

function outputs(n: number, margin = true): LevelOutputs {
  return {
    rhiPercent: new Float32Array(n),
    iceSupersaturated: new Uint8Array(n),
    contrailForming: new Uint8Array(n),
    persistentContrail: new Uint8Array(n),
    ...(margin ? { formationMarginK: new Float32Array(n) } : {}),
  };
}

const KERO = fuelFromEmissionIndex({ eiH2O: 1.25, lhvMJPerKg: 43.2 });
const PARAMS: CriterionParameters = { ...DEFAULT_CRITERION, fuel: KERO };

describe('prepareLevel', () => {
  it.each([
    { input: 25000, expected: { G: 1.66806, tlm: 231.4056, ew: 15.74734, dry: 221.9651 }, tol: { G: 5e-6, K: 1e-4, ew: 5e-7 }, source: 'check-values §3.1 (C), 250 hPa, η = 0.3' },
    { input: 20000, expected: { G: 1.33445, tlm: 229.1009, ew: 12.30007, dry: 219.8836 }, tol: { G: 5e-6, K: 1e-4, ew: 5e-7 }, source: 'check-values §3.1 (C), 200 hPa, η = 0.3' },
  ])('p = $input Pa ($source)', ({ input, expected, tol }) => {
    const lev = prepareLevel(input, PARAMS);
    expect(relErr(lev.mixingLineSlopePaPerK, expected.G)).toBeLessThanOrEqual(tol.G);
    expect(Math.abs(lev.thresholdTemperatureK - expected.tlm)).toBeLessThanOrEqual(tol.K);
    expect(relErr(lev.waterSaturationAtThresholdPa, expected.ew)).toBeLessThanOrEqual(tol.ew);
    expect(Math.abs(lev.criticalTemperatureDryK - expected.dry)).toBeLessThanOrEqual(tol.K);
    expect(lev.criticalDepressionTableK.length).toBe(CRITICAL_TABLE_NODES);
  });

  it('the T_LC table matches the exact Newton T_LC within 2e-5 K (stated accuracy), 0.1 ≤ G ≤ 10, every formulation', () => {
    let worst = 0;
    for (const f of SATURATION_FORMULATIONS) {
      for (const G of [0.1, 0.5, 1.7, 4, 10]) {
        const p = (G * 0.622 * 43.2e6 * 0.7) / (1.25 * 1004);
        const lev = prepareLevel(p, { ...PARAMS, saturation: f });
        for (let k = 0; k <= 2000; k++) {
          const U = k / 2000;
          worst = Math.max(worst, Math.abs(criticalTemperatureFromTable(lev, U) - criticalTemperature(lev.mixingLineSlopePaPerK, U, f)));
        }
        expect(criticalTemperatureFromTable(lev, 1.3)).toBe(lev.thresholdTemperatureK);
      }
    }
    expect(worst).toBeLessThan(2e-5);
  });

  it('rejects bad parameters by name', () => {
    expect(() => prepareLevel(25000, { ...PARAMS, efficiency: 1.5 })).toThrow(/efficiency must be in \[0, 1\)/);
    expect(() => prepareLevel(-1, PARAMS)).toThrow(/pressure must be finite and > 0 Pa/);
  });
});

describe('evaluateLevel on a dense (T, U, p) sweep (issue property tests)', () => {
  const pressures = [15000, 20000, 25000, 30000, 35000];
  const nT = 241; // 200…260 K every 0.25 K
  const nU = 121; // U = 0…1.2
  for (const p of pressures) {
    it(`p = ${p} Pa: closed-form formation agrees with T ≤ T_LC(U) except within rounding; margin sign agrees; RHi = RH_w·e_w/e_i`, () => {
      const lev = prepareLevel(p, PARAMS);
      const n = nT * nU;
      const T = new Float32Array(n);
      const rh = new Float32Array(n);
      for (let a = 0; a < nT; a++) for (let b = 0; b < nU; b++) {
        T[a * nU + b] = 200 + a * 0.25;
        rh[a * nU + b] = b / 100;
      }
      const e = new Float32Array(n);
      vapourPressureFromRelativeHumidityArray(e, rh, T, 'water');
      const out = outputs(n);
      const counts = evaluateLevel(T, e, lev, PARAMS, out);
      expect(counts.valid).toBe(n);
      let disagreements = 0;
      let sumForm = 0;
      let sumIce = 0;
      let sumPers = 0;
      for (let i = 0; i < n; i++) {
        const t = T[i];
        const ew = saturationPressureWater(t);
        const U = e[i] / ew; // from the stored float32 e, in double
        const tlc = criticalTemperature(lev.mixingLineSlopePaPerK, U);
        const exact = t <= tlc ? 1 : 0;
        if (out.contrailForming[i] !== exact) {
          disagreements++;
          expect(Math.abs(t - tlc)).toBeLessThan(1e-6);
        }
        const m = out.formationMarginK?.[i] ?? NaN;
        expect(Math.abs(m - (tlc - t))).toBeLessThan(2e-5 + 1e-6 * Math.abs(tlc - t) + 4e-5);
        if (Math.abs(tlc - t) > 1e-4) expect(m > 0).toBe(out.contrailForming[i] === 1);
        // RHi = RH_w · e_w/e_i (float32 storage: 1e-6)
        const rhiExpected = (100 * U * ew) / saturationPressureIce(t);
        expect(Math.abs(out.rhiPercent[i] - rhiExpected)).toBeLessThanOrEqual(1e-6 * rhiExpected);
        sumForm += out.contrailForming[i];
        sumIce += out.iceSupersaturated[i];
        sumPers += out.persistentContrail[i];
      }
      expect(disagreements).toBeLessThanOrEqual(2);
      expect(counts.contrailForming).toBe(sumForm);
      expect(counts.iceSupersaturated).toBe(sumIce);
      expect(counts.persistentContrail).toBe(sumPers);
      expect(sumForm).toBeGreaterThan(0);
      expect(sumForm).toBeLessThan(n);
      // monotone in U (fixed T) and in T (fixed U): wetter or colder never switches formation off
      for (let a = 0; a < nT; a++) for (let b = 1; b < nU; b++) expect(out.contrailForming[a * nU + b]).toBeGreaterThanOrEqual(out.contrailForming[a * nU + b - 1]);
      for (let b = 0; b < nU; b++) for (let a = 1; a < nT; a++) expect(out.contrailForming[(a - 1) * nU + b]).toBeGreaterThanOrEqual(out.contrailForming[a * nU + b]);
    });
  }

  it('formation is monotone in T at fixed vapour pressure', () => {
    const lev = prepareLevel(25000, PARAMS);
    for (const e0 of [0.5, 2, 5, 10, 20]) {
      const T = Float32Array.from({ length: 400 }, (_, k) => 260 - k * 0.15);
      const e = new Float32Array(400).fill(e0);
      const out = outputs(400, false);
      evaluateLevel(T, e, lev, PARAMS, out);
      for (let k = 1; k < 400; k++) expect(out.contrailForming[k]).toBeGreaterThanOrEqual(out.contrailForming[k - 1]);
    }
  });
});

describe('evaluateLevel semantics', () => {
  const lev = prepareLevel(25000, PARAMS);
  it('RHi from q at 250 hPa, 220 K matches check-values §2 (ε = 0.622 column: 75.6919 %, 151.3792 %)', () => {
    const T = Float32Array.from([220, 220]);
    const e = Float32Array.from([vapourPressureFromSpecificHumidity(5e-5, 25000), vapourPressureFromSpecificHumidity(1e-4, 25000)]);
    const out = outputs(2);
    evaluateLevel(T, e, lev, PARAMS, out);
    expect(relErr(out.rhiPercent[0], 75.6919)).toBeLessThan(2e-6);
    expect(relErr(out.rhiPercent[1], 151.3792)).toBeLessThan(2e-6);
    expect([...out.iceSupersaturated]).toEqual([0, 1]);
    // 220 K is below T_LC(U) for both (dry-air T_LC ≈ 221.97 K): both form, the second persists
    expect([...out.contrailForming]).toEqual([1, 1]);
    expect([...out.persistentContrail]).toEqual([0, 1]);
  });
  it('invalid cells: masks 255, RHi and margin NaN, not counted valid; out-of-range counted', () => {
    const T = Float32Array.from([NaN, 220, 50, 220, 220, 400]);
    const e = Float32Array.from([1, NaN, 1, -1, Infinity, 1]);
    const out = outputs(6);
    const c = evaluateLevel(T, e, lev, PARAMS, out);
    expect(c).toEqual({ valid: 0, iceSupersaturated: 0, contrailForming: 0, persistentContrail: 0, outOfRange: 4, cappedCells: 0 });
    for (let i = 0; i < 6; i++) {
      expect(out.rhiPercent[i]).toBeNaN();
      expect(out.formationMarginK?.[i]).toBeNaN();
      expect(out.iceSupersaturated[i]).toBe(255);
      expect(out.contrailForming[i]).toBe(255);
      expect(out.persistentContrail[i]).toBe(255);
    }
  });
  it('ice supersaturation is 0 at and above 273.16 K (issue §1)', () => {
    const T = Float32Array.from([273.0, 273.16, 280]);
    const e = Float32Array.from([2000, 2000, 2000]);
    const out = outputs(3);
    evaluateLevel(T, e, lev, PARAMS, out);
    expect(out.rhiPercent[1]).toBeGreaterThan(100);
    expect([...out.iceSupersaturated]).toEqual([1, 0, 0]);
  });
  it('humidity scale: F = 1 leaves e unchanged (even above water saturation); F ≠ 1 scales and caps at e_w (issue §2)', () => {
    const T = Float32Array.from([230, 230, 230]);
    const ew = saturationPressureWater(230);
    const ei = saturationPressureIce(230);
    const e = Float32Array.from([0.5 * ei, 0.95 * ew, 1.1 * ew]);
    const out1 = outputs(3);
    const c1 = evaluateLevel(T, e, lev, PARAMS, out1);
    expect(c1.cappedCells).toBe(0);
    expect(relErr(out1.rhiPercent[2], (100 * e[2]) / ei)).toBeLessThan(1e-6);
    const p2 = { ...PARAMS, humidityScale: 1.2 };
    const out2 = outputs(3);
    const c2 = evaluateLevel(T, e, lev, p2, out2);
    expect(c2.cappedCells).toBe(2);
    expect(relErr(out2.rhiPercent[0], (120 * e[0]) / ei)).toBeLessThan(1e-6);
    expect(relErr(out2.rhiPercent[1], (100 * ew) / ei)).toBeLessThan(1e-6);
    expect(relErr(out2.rhiPercent[2], (100 * ew) / ei)).toBeLessThan(1e-6);
    expect(out2.formationMarginK?.[1]).toBeCloseTo(lev.thresholdTemperatureK - 230, 4);
  });
  it('persistence needs T below the freezing temperature: hydrogen at 350 hPa, η = 0.4 forms liquid plumes above 235 K (issue §3)', () => {
    const params = { ...DEFAULT_CRITERION, fuel: FUEL_PRESETS.hydrogen, efficiency: 0.4 };
    const lh = prepareLevel(35000, params);
    expect(lh.thresholdTemperatureK).toBeGreaterThan(240);
    const T = Float32Array.from([238, 233]);
    const e = Float32Array.from([1.05 * saturationPressureIce(238), 1.05 * saturationPressureIce(233)]);
    const out = outputs(2);
    const c = evaluateLevel(T, e, lh, params, out);
    expect([...out.contrailForming]).toEqual([1, 1]);
    expect([...out.iceSupersaturated]).toEqual([1, 1]);
    expect([...out.persistentContrail]).toEqual([0, 1]);
    expect(c.persistentContrail).toBe(1);
  });
  it('every formulation runs the kernel and agrees with the scalar functions', () => {
    for (const f of SATURATION_FORMULATIONS) {
      const params = { ...PARAMS, saturation: f };
      const l = prepareLevel(25000, params);
      expect(Math.abs(l.thresholdTemperatureK - thresholdTemperature(mixingLineSlope(25000, KERO, 0.3), f))).toBe(0);
      const T = Float32Array.from([210, 225, 240]);
      const e = Float32Array.from([1, 3, 20]);
      const out = outputs(3);
      evaluateLevel(T, e, l, params, out);
      // float32 storage: within 1e-7 relative
      for (let i = 0; i < 3; i++) expect(relErr(out.rhiPercent[i], (100 * e[i]) / saturationPressureIce(T[i], f))).toBeLessThan(1e-7);
      if (f !== 'murphy-koop') expect(() => evaluateLevel(T, e, lev, params, out)).toThrow(/level was prepared with saturation "murphy-koop" but params.saturation is/);
    }
  });
  it('the fast path (murphy-koop, F = 1, no margin) and the general path give identical RHi and masks', () => {
    const n = 20000;
    const T = Float32Array.from({ length: n }, (_, i) => 195 + (i % 400) * 0.2 + (i % 7 === 0 ? NaN : 0));
    const e = Float32Array.from({ length: n }, (_, i) => ((i * 7919) % 1300) / 1000 * saturationPressureIce(195 + (i % 400) * 0.2));
    const fast = outputs(n, false);
    const full = outputs(n, true);
    const cf = evaluateLevel(T, e, lev, PARAMS, fast);
    const cg = evaluateLevel(T, e, lev, PARAMS, full);
    expect(cf).toEqual(cg);
    expect(cf.valid).toBeGreaterThan(0);
    expect(cf.contrailForming).toBeGreaterThan(0);
    expect(cf.persistentContrail).toBeGreaterThan(0);
    expect(full.rhiPercent).toEqual(fast.rhiPercent);
    expect(full.iceSupersaturated).toEqual(fast.iceSupersaturated);
    expect(full.contrailForming).toEqual(fast.contrailForming);
    expect(full.persistentContrail).toEqual(fast.persistentContrail);
  });
  it('rejects arrays of different lengths', () => {
    expect(() => evaluateLevel(new Float32Array(3), new Float32Array(2), lev, PARAMS, outputs(3))).toThrow(/array lengths differ/);
  });
});
