/**
 * Humidity at pressure p: specific humidity, mixing ratio and vapour pressure; dew and frost
 * point; saturation under the relative-humidity conventions found in model output.
 *
 * All functions use the single constant ε = {@link EPSILON} = 0.622 (see constants.ts).
 *
 * @packageDocumentation
 */

import { CELSIUS_ZERO, EPSILON, TRIPLE_POINT_T } from './constants.js';
import { dLnIce, dLnWater, lnIce, lnWater } from './saturation-formulas.js';
import {
  DEFAULT_SATURATION,
  checkLengths,
  extrapolationRange,
  formulationCode,
  saturationPressureIce,
  saturationPressureWater,
  type FloatArray,
  type SaturationFormulation,
} from './saturation.js';

/**
 * Saturation convention of a relative humidity:
 * - `water`: over liquid water at every temperature (WMO convention);
 * - `ice`: over ice at every temperature;
 * - `ecmwf-mixed`: ECMWF IFS mixed phase (see {@link saturationPressureEcmwfMixed});
 * - `cmip`: CMIP `hur`, over water above 273.15 K and over ice at or below it.
 */
export type HumidityConvention = 'water' | 'ice' | 'ecmwf-mixed' | 'cmip';

/** The conventions, for validation and listings. */
export const HUMIDITY_CONVENTIONS: readonly HumidityConvention[] = Object.freeze(['water', 'ice', 'ecmwf-mixed', 'cmip'] as const);

const ONE_MINUS_EPS = 1 - EPSILON;

/**
 * Vapour pressure from specific humidity.
 * @param q - specific humidity, kg kg⁻¹ (0 ≤ q < 1)
 * @param pPa - air pressure, Pa
 * @returns e, Pa
 * @remarks e = q p / (ε + (1 − ε) q), exact inverse of q = ε e/(p − (1 − ε) e) [WMO8 Annex 4.B],
 * ε = 0.622.
 */
export function vapourPressureFromSpecificHumidity(q: number, pPa: number): number {
  return (q * pPa) / (EPSILON + ONE_MINUS_EPS * q);
}

/**
 * Specific humidity from vapour pressure.
 * @param ePa - vapour pressure, Pa (0 ≤ e < p)
 * @param pPa - air pressure, Pa
 * @returns q, kg kg⁻¹
 * @remarks q = ε e / (p − (1 − ε) e) [WMO8 Annex 4.B], ε = 0.622.
 */
export function specificHumidityFromVapourPressure(ePa: number, pPa: number): number {
  return (EPSILON * ePa) / (pPa - ONE_MINUS_EPS * ePa);
}

/**
 * Vapour pressure from mixing ratio.
 * @param r - mixing ratio, kg kg⁻¹ of dry air
 * @param pPa - air pressure, Pa
 * @returns e, Pa
 * @remarks e = r p / (ε + r) [WMO8 Annex 4.B], ε = 0.622.
 */
export function vapourPressureFromMixingRatio(r: number, pPa: number): number {
  return (r * pPa) / (EPSILON + r);
}

/**
 * Mixing ratio from vapour pressure.
 * @param ePa - vapour pressure, Pa (0 ≤ e < p)
 * @param pPa - air pressure, Pa
 * @returns r, kg kg⁻¹ of dry air
 * @remarks r = ε e / (p − e) [WMO8 Annex 4.B], ε = 0.622.
 */
export function mixingRatioFromVapourPressure(ePa: number, pPa: number): number {
  return (EPSILON * ePa) / (pPa - ePa);
}

/**
 * Vapour pressure from dew point: e = e_w(T_d).
 * @param tdK - dew point, K
 * @param f - saturation formulation (default murphy-koop)
 * @returns e, Pa
 * @remarks Definition of the dew point [WMO8 Annex 4.B]; ranges as {@link saturationPressureWater}.
 */
export function vapourPressureFromDewPoint(tdK: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  return saturationPressureWater(tdK, f);
}

/**
 * Vapour pressure from frost point: e = e_i(T_f).
 * @param tfK - frost point, K
 * @param f - saturation formulation (default murphy-koop)
 * @returns e, Pa
 * @remarks Definition of the frost point [WMO8 Annex 4.B]; ranges as {@link saturationPressureIce}.
 */
export function vapourPressureFromFrostPoint(tfK: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  return saturationPressureIce(tfK, f);
}

/*
 * Inverse of ln e_sat(T) by Newton's method with the analytic derivative, started from the
 * inverse Magnus form (Alduchov & Eskridge 1996) and clamped to the extrapolation range.
 * Returns NaN when the solution lies outside [lo, hi]. Converges to < 1e-9 K in ≤ 6 steps.
 */
function invertSaturation(ice: boolean, code: number, ePa: number, lo: number, hi: number): number {
  if (!(ePa > 0) || ePa === Infinity) return NaN;
  const lnE = Math.log(ePa);
  const x = ice ? lnE - Math.log(611.21) : lnE - Math.log(610.94);
  const a = ice ? 22.587 : 17.625;
  const b = ice ? 273.86 : 243.04;
  let t = x < a ? (b * x) / (a - x) + CELSIUS_ZERO : hi;
  if (!(t >= lo)) t = lo;
  if (t > hi) t = hi;
  for (let k = 0; k < 50; k++) {
    const r = (ice ? lnIce(code, t) : lnWater(code, t)) - lnE;
    const d = ice ? dLnIce(code, t) : dLnWater(code, t);
    let next = t - r / d;
    if (next < lo) next = 0.5 * (t + lo);
    if (next > hi) next = 0.5 * (t + hi);
    if (Math.abs(next - t) < 1e-10) {
      t = next;
      break;
    }
    t = next;
  }
  const r = (ice ? lnIce(code, t) : lnWater(code, t)) - lnE;
  if (Math.abs(r) > 1e-9) return NaN;
  return t;
}

function pointFromVapourPressure(ice: boolean, ePa: number, f: SaturationFormulation): number {
  const code = formulationCode(f);
  if (Number.isNaN(ePa)) return NaN;
  const what = ice ? 'frost point' : 'dew point';
  if (!(ePa > 0) || ePa === Infinity) throw new RangeError(`${what}: vapour pressure must be finite and > 0 Pa, got ${ePa}`);
  const [lo, hi] = extrapolationRange(f, ice ? 'ice' : 'water');
  const t = invertSaturation(ice, code, ePa, lo, hi);
  if (Number.isNaN(t)) {
    throw new RangeError(
      `${what}: vapour pressure ${ePa} Pa corresponds to a temperature outside the ${ice ? 'ice' : 'water'} extrapolation range ${lo}–${hi} K of saturation formulation "${f}"`,
    );
  }
  return t;
}

/**
 * Dew point: the temperature at which e_w(T_d) = e.
 * @param ePa - vapour pressure, Pa (> 0)
 * @param f - saturation formulation (default murphy-koop)
 * @returns T_d, K (over supercooled water below 273.15 K)
 * @remarks Newton iteration on ln e_w(T) − ln e with the analytic derivative, tolerance 1e-10 K.
 * @throws RangeError when e ≤ 0 or T_d is outside the formulation's water extrapolation range.
 */
export function dewPointFromVapourPressure(ePa: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  return pointFromVapourPressure(false, ePa, f);
}

/**
 * Frost point: the temperature at which e_i(T_f) = e.
 * @param ePa - vapour pressure, Pa (> 0)
 * @param f - saturation formulation (default murphy-koop)
 * @returns T_f, K
 * @remarks Newton iteration on ln e_i(T) − ln e, tolerance 1e-10 K.
 * @throws RangeError when e ≤ 0 or T_f is outside the formulation's ice extrapolation range.
 */
export function frostPointFromVapourPressure(ePa: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  return pointFromVapourPressure(true, ePa, f);
}

// --- ECMWF IFS mixed phase [IFS-CY47R3 Part IV ch. 12, eqs. 12.13 ff.] ----------------------------
/** IFS Tetens constant e_s(T0), Pa [IFS-CY47R3]. */
export const IFS_ES0 = 611.21;
/** IFS Tetens a3, a4 over water [IFS-CY47R3]. */
export const IFS_A3_WATER = 17.502;
export const IFS_A4_WATER = 32.19;
/** IFS Tetens a3, a4 over ice [IFS-CY47R3]. */
export const IFS_A3_ICE = 22.587;
export const IFS_A4_ICE = -0.7;
/** IFS lower end of the mixed-phase interval, K [IFS-CY47R3]. */
export const IFS_T_ICE = 250.16;
/** Temperature range over which frostgrid evaluates the IFS forms, K (project choice). */
export const IFS_RANGE_K: readonly [number, number] = [123, 373.15];

function checkIfsRange(tK: number, what: string): void {
  if (!(tK >= IFS_RANGE_K[0] && tK <= IFS_RANGE_K[1])) {
    throw new RangeError(`temperature ${tK} K is outside the range ${IFS_RANGE_K[0]}–${IFS_RANGE_K[1]} K of the ${what}`);
  }
}

/**
 * ECMWF IFS Tetens saturation vapour pressure over liquid water.
 * @param tK - temperature, K (123–373.15 K)
 * @returns e = 611.21 Pa exp(17.502 (T − 273.16)/(T − 32.19 K)), Pa [IFS-CY47R3 Part IV ch. 12]
 */
export function saturationPressureEcmwfWater(tK: number): number {
  if (Number.isNaN(tK)) return NaN;
  checkIfsRange(tK, 'IFS water form');
  return IFS_ES0 * Math.exp((IFS_A3_WATER * (tK - TRIPLE_POINT_T)) / (tK - IFS_A4_WATER));
}

/**
 * ECMWF IFS Tetens saturation vapour pressure over ice.
 * @param tK - temperature, K (123–373.15 K)
 * @returns e = 611.21 Pa exp(22.587 (T − 273.16)/(T + 0.7 K)), Pa [IFS-CY47R3 Part IV ch. 12]
 */
export function saturationPressureEcmwfIce(tK: number): number {
  if (Number.isNaN(tK)) return NaN;
  checkIfsRange(tK, 'IFS ice form');
  return IFS_ES0 * Math.exp((IFS_A3_ICE * (tK - TRIPLE_POINT_T)) / (tK - IFS_A4_ICE));
}

function ifsMixed(t: number): number {
  if (t >= TRIPLE_POINT_T) return IFS_ES0 * Math.exp((IFS_A3_WATER * (t - TRIPLE_POINT_T)) / (t - IFS_A4_WATER));
  const ei = IFS_ES0 * Math.exp((IFS_A3_ICE * (t - TRIPLE_POINT_T)) / (t - IFS_A4_ICE));
  if (t <= IFS_T_ICE) return ei;
  const s = (t - IFS_T_ICE) / (TRIPLE_POINT_T - IFS_T_ICE);
  const alpha = s * s;
  const ew = IFS_ES0 * Math.exp((IFS_A3_WATER * (t - TRIPLE_POINT_T)) / (t - IFS_A4_WATER));
  return alpha * ew + (1 - alpha) * ei;
}

/**
 * Saturation vapour pressure of the ECMWF IFS mixed-phase convention (the definition behind
 * ECMWF relative humidity, parameter 157).
 * @param tK - temperature, K (123–373.15 K)
 * @returns e_sat, Pa
 * @remarks e = 611.21 Pa exp(a3 (T − 273.16)/(T − a4)); water a3 = 17.502, a4 = 32.19 K; ice
 * a3 = 22.587, a4 = −0.7 K. e_sat = e_w for T ≥ 273.16 K, e_i for T ≤ 250.16 K, and
 * α e_w + (1 − α) e_i with α = ((T − 250.16)/23)² in between [IFS-CY47R3 Part IV ch. 12].
 * Independent of the chosen saturation formulation.
 * @throws RangeError outside 123–373.15 K.
 */
export function saturationPressureEcmwfMixed(tK: number): number {
  if (Number.isNaN(tK)) return NaN;
  checkIfsRange(tK, 'ecmwf-mixed convention');
  return ifsMixed(tK);
}

function conventionCode(convention: HumidityConvention): number {
  const i = HUMIDITY_CONVENTIONS.indexOf(convention);
  if (i < 0) throw new RangeError(`unknown humidity convention "${String(convention)}"; valid: ${HUMIDITY_CONVENTIONS.join(', ')}`);
  return i;
}

/**
 * Saturation vapour pressure under a relative-humidity convention.
 * @param tK - temperature, K
 * @param convention - `water` | `ice` | `ecmwf-mixed` | `cmip` ({@link HumidityConvention})
 * @param f - saturation formulation for water, ice and cmip (ignored by ecmwf-mixed, which uses IFS Tetens forms)
 * @returns e_sat, Pa
 * @remarks cmip: e_w for T > 273.15 K, e_i for T ≤ 273.15 K (CMIP6 data request, variable `hur`:
 * "with respect to liquid water for T > 0 °C, and with respect to ice for T < 0 °C" [CMIP6-DR];
 * the point T = 0 °C itself is assigned to ice here, a choice of this project).
 */
export function saturationPressureForConvention(
  tK: number,
  convention: HumidityConvention,
  f: SaturationFormulation = DEFAULT_SATURATION,
): number {
  const c = conventionCode(convention);
  switch (c) {
    case 0:
      return saturationPressureWater(tK, f);
    case 1:
      return saturationPressureIce(tK, f);
    case 2:
      return saturationPressureEcmwfMixed(tK);
    default:
      return tK > CELSIUS_ZERO ? saturationPressureWater(tK, f) : saturationPressureIce(tK, f);
  }
}

/**
 * Array form: e = RH · e_sat(T) under a convention.
 * @param out - vapour pressure, Pa (written)
 * @param rhFraction - relative humidity as a fraction (1 = saturation; values above 1 allowed), not %
 * @param tK - temperature, K
 * @param convention - see {@link saturationPressureForConvention}
 * @param f - saturation formulation (default murphy-koop)
 * @returns number of cells whose temperature is outside the convention's range (NaN written);
 * NaN inputs give NaN and are not counted.
 */
export function vapourPressureFromRelativeHumidityArray(
  out: FloatArray,
  rhFraction: FloatArray,
  tK: FloatArray,
  convention: HumidityConvention,
  f: SaturationFormulation = DEFAULT_SATURATION,
): number {
  const c = conventionCode(convention);
  const code = formulationCode(f);
  checkLengths(out.length, rhFraction.length, tK.length);
  const wr = extrapolationRange(f, 'water');
  const ir = extrapolationRange(f, 'ice');
  let bad = 0;
  for (let i = 0; i < out.length; i++) {
    const t = tK[i];
    const rh = rhFraction[i];
    let es: number;
    let lo: number;
    let hi: number;
    if (c === 2) {
      lo = IFS_RANGE_K[0];
      hi = IFS_RANGE_K[1];
    } else if (c === 0 || (c === 3 && t > CELSIUS_ZERO)) {
      lo = wr[0];
      hi = wr[1];
    } else {
      lo = ir[0];
      hi = ir[1];
    }
    if (!(t >= lo && t <= hi)) {
      out[i] = NaN;
      if (t === t) bad++;
      continue;
    }
    if (c === 2) es = ifsMixed(t);
    else if (c === 0 || (c === 3 && t > CELSIUS_ZERO)) es = Math.exp(lnWater(code, t));
    else es = Math.exp(lnIce(code, t));
    out[i] = rh * es;
  }
  return bad;
}

function pressureAt(p: number | FloatArray, i: number): number {
  return typeof p === 'number' ? p : p[i];
}

/**
 * Array form of {@link vapourPressureFromSpecificHumidity}.
 * @param out - e, Pa (written)
 * @param q - specific humidity, kg kg⁻¹
 * @param pPa - pressure, Pa: one value for a pressure level, or one per cell
 */
export function vapourPressureFromSpecificHumidityArray(out: FloatArray, q: FloatArray, pPa: number | FloatArray): void {
  checkLengths(out.length, q.length, typeof pPa === 'number' ? q.length : pPa.length);
  if (typeof pPa === 'number') {
    for (let i = 0; i < q.length; i++) out[i] = (q[i] * pPa) / (EPSILON + ONE_MINUS_EPS * q[i]);
  } else {
    for (let i = 0; i < q.length; i++) out[i] = (q[i] * pPa[i]) / (EPSILON + ONE_MINUS_EPS * q[i]);
  }
}

/** Array form of {@link specificHumidityFromVapourPressure}; pPa is one value or one per cell. */
export function specificHumidityFromVapourPressureArray(out: FloatArray, ePa: FloatArray, pPa: number | FloatArray): void {
  checkLengths(out.length, ePa.length, typeof pPa === 'number' ? ePa.length : pPa.length);
  for (let i = 0; i < ePa.length; i++) out[i] = (EPSILON * ePa[i]) / (pressureAt(pPa, i) - ONE_MINUS_EPS * ePa[i]);
}

/** Array form of {@link vapourPressureFromMixingRatio}; pPa is one value or one per cell. */
export function vapourPressureFromMixingRatioArray(out: FloatArray, r: FloatArray, pPa: number | FloatArray): void {
  checkLengths(out.length, r.length, typeof pPa === 'number' ? r.length : pPa.length);
  for (let i = 0; i < r.length; i++) out[i] = (r[i] * pressureAt(pPa, i)) / (EPSILON + r[i]);
}

/** Array form of {@link mixingRatioFromVapourPressure}; pPa is one value or one per cell. */
export function mixingRatioFromVapourPressureArray(out: FloatArray, ePa: FloatArray, pPa: number | FloatArray): void {
  checkLengths(out.length, ePa.length, typeof pPa === 'number' ? ePa.length : pPa.length);
  for (let i = 0; i < ePa.length; i++) out[i] = (EPSILON * ePa[i]) / (pressureAt(pPa, i) - ePa[i]);
}

/**
 * Array form of {@link vapourPressureFromDewPoint}: e = e_w(T_d).
 * @returns number of cells outside the water extrapolation range (NaN written).
 */
export function vapourPressureFromDewPointArray(out: FloatArray, tdK: FloatArray, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  checkLengths(out.length, tdK.length);
  const [lo, hi] = extrapolationRange(f, 'water');
  let bad = 0;
  for (let i = 0; i < tdK.length; i++) {
    const t = tdK[i];
    if (t >= lo && t <= hi) out[i] = Math.exp(lnWater(code, t));
    else {
      out[i] = NaN;
      if (t === t) bad++;
    }
  }
  return bad;
}

/**
 * Array form of {@link dewPointFromVapourPressure}.
 * @returns number of cells with e ≤ 0 or a dew point outside the extrapolation range (NaN written).
 */
export function dewPointFromVapourPressureArray(out: FloatArray, ePa: FloatArray, f: SaturationFormulation = DEFAULT_SATURATION): number {
  return pointArray(false, out, ePa, f);
}

/** Array form of {@link frostPointFromVapourPressure}; returns the number of cells without a solution (NaN written). */
export function frostPointFromVapourPressureArray(out: FloatArray, ePa: FloatArray, f: SaturationFormulation = DEFAULT_SATURATION): number {
  return pointArray(true, out, ePa, f);
}

function pointArray(ice: boolean, out: FloatArray, ePa: FloatArray, f: SaturationFormulation): number {
  const code = formulationCode(f);
  checkLengths(out.length, ePa.length);
  const [lo, hi] = extrapolationRange(f, ice ? 'ice' : 'water');
  let bad = 0;
  for (let i = 0; i < ePa.length; i++) {
    const e = ePa[i];
    const t = invertSaturation(ice, code, e, lo, hi);
    out[i] = t;
    if (t !== t && e === e) bad++;
  }
  return bad;
}
