/**
 * The per-level kernel: RHi, ice-supersaturation, contrail-formation and persistent-contrail
 * masks for one pressure level, in one pass, with no allocation per cell.
 *
 * @packageDocumentation
 */

import { TRIPLE_POINT_T } from './constants.js';
import { criticalTemperatureFrom, mixingLineSlope, thresholdTemperature, validateCriterionParameters, type CriterionParameters } from './criterion.js';
import { CODE_MURPHY_KOOP, lnIce, lnIceMurphyKoop, lnWater, lnWaterMurphyKoop } from './saturation-formulas.js';

const LN_100 = Math.log(100);
import { checkLengths, commonRange, extrapolationRange, formulationCode, type SaturationFormulation } from './saturation.js';

/**
 * Number of nodes of the per-level T_LC table. With nodes uniform in s = √(1 − U) and linear
 * interpolation the table reproduces the exact T_LC to better than 2e-5 K for 0.1 ≤ G ≤ 10 Pa/K
 * and every formulation (measured worst case 8.5e-6 K at G = 10 Pa/K, U ≈ 0.9995; tested in
 * test/physics/level.test.ts). Building a table costs about 1.5 ms per level.
 */
export const CRITICAL_TABLE_NODES = 513;

/** Everything the kernel needs for one pressure level, computed once by {@link prepareLevel}. */
export interface LevelCriterion {
  /** Pressure of the level, Pa. */
  readonly pressurePa: number;
  /** Mixing-line slope G, Pa K⁻¹. */
  readonly mixingLineSlopePaPerK: number;
  /** Threshold temperature T_LM, K (exact). */
  readonly thresholdTemperatureK: number;
  /** e_w(T_LM), Pa. */
  readonly waterSaturationAtThresholdPa: number;
  /** T_LC for dry air (U = 0), K: T_LM − e_w(T_LM)/G. */
  readonly criticalTemperatureDryK: number;
  /** Formulation the level was prepared with. */
  readonly saturation: SaturationFormulation;
  /**
   * T_LM − T_LC(U) in K at the nodes s_j = j/(n − 1), s = √(1 − U), j = 0…n − 1 (so node 0 is
   * U = 1, depression 0, and node n − 1 is dry air). Linear interpolation in s.
   */
  readonly criticalDepressionTableK: Float64Array;
}

/** Output arrays of {@link evaluateLevel}; all of the grid's cell count. */
export interface LevelOutputs {
  /** Relative humidity over ice, % (NaN for invalid cells). */
  rhiPercent: Float32Array;
  /** 1 where RHi ≥ threshold and T < 273.16 K, 0 elsewhere, 255 invalid. */
  iceSupersaturated: Uint8Array;
  /** 1 where the Schmidt–Appleman criterion is met, 0 elsewhere, 255 invalid. */
  contrailForming: Uint8Array;
  /** 1 where contrails form, RHi ≥ threshold and T < freezing temperature, 0 elsewhere, 255 invalid. */
  persistentContrail: Uint8Array;
  /** Optional: T_LC(U) − T, K; positive where contrails form (NaN invalid). */
  formationMarginK?: Float32Array;
}

/** Cell counts returned by {@link evaluateLevel}. */
export interface LevelCounts {
  /** Cells with valid input. */
  valid: number;
  iceSupersaturated: number;
  contrailForming: number;
  persistentContrail: number;
  /** Cells with non-NaN input that could not be evaluated: T outside the formulation's range, or e < 0 or infinite. */
  outOfRange: number;
  /** Cells whose scaled vapour pressure F·e exceeded e_w(T) and was capped (only when F ≠ 1). */
  cappedCells: number;
}

/**
 * Prepares the criterion for one pressure level: G, exact T_LM, e_w(T_LM) and the T_LC table.
 * @param pPa - pressure of the level, Pa
 * @param params - criterion parameters (validated here)
 * @remarks G from {@link mixingLineSlope}, T_LM from {@link thresholdTemperature}; the table holds
 * exact T_LC (criticalTemperature) at {@link CRITICAL_TABLE_NODES} nodes in s = √(1 − U): T_LC − T_LM
 * behaves like −c·√(1 − U) near saturation, so the table is smooth in s [Schumann1996].
 * @throws RangeError for invalid parameters or when T_LM is outside the water range.
 */
export function prepareLevel(pPa: number, params: CriterionParameters): LevelCriterion {
  validateCriterionParameters(params);
  const f = params.saturation;
  const code = formulationCode(f);
  const G = mixingLineSlope(pPa, params.fuel, params.efficiency);
  const tlm = thresholdTemperature(G, f);
  const ewTlm = Math.exp(lnWater(code, tlm));
  const lo = extrapolationRange(f, 'water')[0];
  const n = CRITICAL_TABLE_NODES;
  const table = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const s = j / (n - 1);
    const U = 1 - s * s;
    table[j] = tlm - criticalTemperatureFrom(G, j === n - 1 ? 0 : U, tlm, ewTlm, code, lo, f);
  }
  return Object.freeze({
    pressurePa: pPa,
    mixingLineSlopePaPerK: G,
    thresholdTemperatureK: tlm,
    waterSaturationAtThresholdPa: ewTlm,
    criticalTemperatureDryK: tlm - ewTlm / G,
    saturation: f,
    criticalDepressionTableK: table,
  });
}

/**
 * T_LC(U) from a level's table (linear interpolation in s = √(1 − U)); T_LM for U ≥ 1.
 * @param level - from {@link prepareLevel}
 * @param U - relative humidity over water, fraction ≥ 0
 * @returns T_LC, K (accuracy: see {@link CRITICAL_TABLE_NODES})
 */
export function criticalTemperatureFromTable(level: LevelCriterion, U: number): number {
  const table = level.criticalDepressionTableK;
  const last = table.length - 1;
  if (!(U < 1)) return U >= 1 ? level.thresholdTemperatureK : NaN;
  const pos = Math.sqrt(1 - (U > 0 ? U : 0)) * last;
  let j = Math.floor(pos);
  if (j >= last) j = last - 1;
  const w = pos - j;
  return level.thresholdTemperatureK - (table[j] + w * (table[j + 1] - table[j]));
}

/**
 * Evaluates the criterion on one level.
 *
 * @param temperatureK - T per cell, K
 * @param vapourPressurePa - e per cell, Pa
 * @param level - from {@link prepareLevel} with the same params
 * @param params - criterion parameters
 * @param out - output arrays, same length as the inputs
 * @returns cell counts
 * @remarks Per valid cell (T within the formulation's common ice/water range and 0 ≤ e < ∞):
 * - e′ = e when F = 1, else e′ = min(F·e, e_w(T)) (capped cells counted);
 * - RHi = 100 e′/e_i(T) %; ice-supersaturated = RHi ≥ threshold and T < 273.16 K;
 * - formation (closed form, no iteration) = T ≤ T_LM and e′ ≥ e_w(T_LM) − G (T_LM − T), i.e. the
 *   plume mixing line reaches water saturation [Schumann1996];
 * - persistent = formation and RHi ≥ threshold and T < freezingTemperatureK;
 * - margin = T_LC(U) − T with U = e′/e_w(T), from the level's table.
 * Invalid cells (NaN input, T outside range, e < 0): masks 255, RHi and margin NaN.
 * One e_i per cell, plus one e_w per cell only when F ≠ 1 or the margin is requested.
 * The masks are decided in double precision; RHi is then stored in single precision, so a cell
 * within ~1e-7 relative of the threshold may print as the threshold value on either side.
 * Speed: ≈ 25 M cells/s on one core for the default case (benchmarks/physics.ts).
 * @throws RangeError when array lengths differ or the level was prepared with another formulation.
 */
export function evaluateLevel(
  temperatureK: Float32Array,
  vapourPressurePa: Float32Array,
  level: LevelCriterion,
  params: CriterionParameters,
  out: LevelOutputs,
): LevelCounts {
  validateCriterionParameters(params);
  if (level.saturation !== params.saturation) {
    throw new RangeError(`level was prepared with saturation "${level.saturation}" but params.saturation is "${params.saturation}"`);
  }
  const n = temperatureK.length;
  const margin = out.formationMarginK;
  checkLengths(n, vapourPressurePa.length, out.rhiPercent.length, out.iceSupersaturated.length, out.contrailForming.length, out.persistentContrail.length, margin === undefined ? n : margin.length);
  const code = formulationCode(params.saturation);
  // the default formulation is called directly (inlined); the others through the switch
  const mk = code === CODE_MURPHY_KOOP;
  const [lo, hi] = commonRange(params.saturation);
  const G = level.mixingLineSlopePaPerK;
  const tlm = level.thresholdTemperatureK;
  const ewTlm = level.waterSaturationAtThresholdPa;
  const thr = params.iceThresholdPercent;
  const tFreeze = params.freezingTemperatureK;
  const F = params.humidityScale;
  const scaled = F !== 1;
  const T = temperatureK;
  const E = vapourPressurePa;
  const rhi = out.rhiPercent;
  const iss = out.iceSupersaturated;
  const form = out.contrailForming;
  const pers = out.persistentContrail;
  const counts = COUNTS;
  counts.fill(0);
  if (mk && !scaled && margin === undefined) {
    plainLoopMurphyKoop(T, E, rhi, iss, form, pers, lo, hi, G, tlm, ewTlm, thr, tFreeze, counts);
  } else {
    fullLoop(T, E, rhi, iss, form, pers, margin, level.criticalDepressionTableK, mk, code, lo, hi, G, tlm, ewTlm, thr, tFreeze, F, counts);
  }
  return {
    valid: counts[0],
    iceSupersaturated: counts[1],
    contrailForming: counts[2],
    persistentContrail: counts[3],
    outOfRange: counts[4],
    cappedCells: counts[5],
  };
}

/** Counters shared by the loops: valid, ice-supersaturated, forming, persistent, out of range, capped. */
const COUNTS = new Float64Array(6);

/*
 * The two loops below implement the semantics documented on evaluateLevel. plainLoopMurphyKoop is
 * the common case (default formulation, F = 1, no margin layer): no e_w per cell and the
 * Murphy–Koop ice formula called directly so that it is inlined. fullLoop serves every other case.
 * Tests check that both give identical RHi and masks.
 */
function plainLoopMurphyKoop(
  T: Float32Array, E: Float32Array, rhi: Float32Array, iss: Uint8Array, form: Uint8Array, pers: Uint8Array,
  lo: number, hi: number, G: number, tlm: number, ewTlm: number, thr: number, tFreeze: number,
  counts: Float64Array,
): void {
  const n = T.length;
  // locals, not module bindings, inside the loop (an imported binding is reloaded on every use)
  const ln100 = LN_100;
  const tTriple = TRIPLE_POINT_T;
  const lnIceMK = lnIceMurphyKoop;
  let valid = 0;
  let nIss = 0;
  let nForm = 0;
  let nPers = 0;
  let nOut = 0;
  for (let i = 0; i < n; i++) {
    const t = T[i];
    const e = E[i];
    if (!(t >= lo && t <= hi && e >= 0 && e < Infinity)) {
      rhi[i] = NaN;
      iss[i] = 255;
      form[i] = 255;
      pers[i] = 255;
      if (t === t && e === e) nOut++;
      continue;
    }
    valid++;
    // RHi = 100 e/e_i = e exp(ln 100 − ln e_i): one exp, no division
    const r = e * Math.exp(ln100 - lnIceMK(t));
    rhi[i] = r;
    const isIce = r >= thr && t < tTriple;
    const isForm = t <= tlm && e >= ewTlm - G * (tlm - t);
    const isPers = isForm && isIce && t < tFreeze;
    iss[i] = isIce ? 1 : 0;
    form[i] = isForm ? 1 : 0;
    pers[i] = isPers ? 1 : 0;
    if (isIce) nIss++;
    if (isForm) nForm++;
    if (isPers) nPers++;
  }
  counts[0] = valid;
  counts[1] = nIss;
  counts[2] = nForm;
  counts[3] = nPers;
  counts[4] = nOut;
}

function fullLoop(
  T: Float32Array, E: Float32Array, rhi: Float32Array, iss: Uint8Array, form: Uint8Array, pers: Uint8Array,
  margin: Float32Array | undefined, table: Float64Array,
  mk: boolean, code: number, lo: number, hi: number, G: number, tlm: number, ewTlm: number, thr: number, tFreeze: number,
  F: number, counts: Float64Array,
): void {
  const n = T.length;
  const ln100 = LN_100;
  const tTriple = TRIPLE_POINT_T;
  const lnIceMK = lnIceMurphyKoop;
  const lnWaterMK = lnWaterMurphyKoop;
  const lnIceAny = lnIce;
  const lnWaterAny = lnWater;
  const scaled = F !== 1;
  const needEw = scaled || margin !== undefined;
  const last = table.length - 1;
  let valid = 0;
  let nIss = 0;
  let nForm = 0;
  let nPers = 0;
  let nOut = 0;
  let nCap = 0;
  for (let i = 0; i < n; i++) {
    const t = T[i];
    let e = E[i];
    if (!(t >= lo && t <= hi && e >= 0 && e < Infinity)) {
      rhi[i] = NaN;
      iss[i] = 255;
      form[i] = 255;
      pers[i] = 255;
      if (margin !== undefined) margin[i] = NaN;
      if (t === t && e === e) nOut++;
      continue;
    }
    valid++;
    let ew = 0;
    if (needEw) ew = Math.exp(mk ? lnWaterMK(t) : lnWaterAny(code, t));
    if (scaled) {
      e *= F;
      if (e > ew) {
        e = ew;
        nCap++;
      }
    }
    const r = e * Math.exp(ln100 - (mk ? lnIceMK(t) : lnIceAny(code, t)));
    rhi[i] = r;
    const isIce = r >= thr && t < tTriple;
    const isForm = t <= tlm && e >= ewTlm - G * (tlm - t);
    const isPers = isForm && isIce && t < tFreeze;
    iss[i] = isIce ? 1 : 0;
    form[i] = isForm ? 1 : 0;
    pers[i] = isPers ? 1 : 0;
    if (isIce) nIss++;
    if (isForm) nForm++;
    if (isPers) nPers++;
    if (margin !== undefined) {
      const U = e / ew;
      let tlc = tlm;
      if (U < 1) {
        const pos = Math.sqrt(1 - U) * last;
        let j = pos | 0;
        if (j >= last) j = last - 1;
        tlc = tlm - (table[j] + (pos - j) * (table[j + 1] - table[j]));
      }
      margin[i] = tlc - t;
    }
  }
  counts[0] = valid;
  counts[1] = nIss;
  counts[2] = nForm;
  counts[3] = nPers;
  counts[4] = nOut;
  counts[5] = nCap;
}
