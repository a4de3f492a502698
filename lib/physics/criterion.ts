/**
 * The Schmidt–Appleman criterion: mixing-line slope, threshold temperature T_LM and critical
 * temperature T_LC [Schumann1996], and the criterion's parameters.
 *
 * @packageDocumentation
 */

import { CELSIUS_ZERO, CP_DRY_AIR, EPSILON, TRIPLE_POINT_T } from './constants.js';
import type { Fuel } from './fuels.js';
import { FUEL_PRESETS } from './fuels.js';
import { dLnWater, lnWater } from './saturation-formulas.js';
import { DEFAULT_SATURATION, extrapolationRange, formulationCode, type SaturationFormulation } from './saturation.js';

/**
 * Slope of the plume mixing line in the (T, e) diagram.
 * @param pPa - ambient pressure, Pa (> 0)
 * @param fuel - fuel (EI_H2O in kg/kg, Q in J/kg)
 * @param efficiency - overall propulsion efficiency η, in [0, 1)
 * @returns G, Pa K⁻¹
 * @remarks G = EI_H2O c_p p / (ε Q (1 − η)), c_p = 1004 J kg⁻¹ K⁻¹, ε = 0.622 [Schumann1996].
 * @throws RangeError for p ≤ 0, η outside [0, 1) or a fuel with non-positive EI_H2O or Q.
 */
export function mixingLineSlope(pPa: number, fuel: Fuel, efficiency: number): number {
  if (!(pPa > 0 && pPa < Infinity)) throw new RangeError(`pressure must be finite and > 0 Pa, got ${pPa}`);
  return (contrailFactor(fuel, efficiency) * pPa) / EPSILON;
}

/**
 * Contrail factor: kg of water vapour per kg of air per kelvin of plume cooling.
 * @param fuel - fuel
 * @param efficiency - η in [0, 1)
 * @returns EI_H2O c_p / (Q (1 − η)), kg kg⁻¹ K⁻¹ (multiply by 1000 for g kg⁻¹ K⁻¹) [Schumann1996];
 * published values for kerosene lie between 0.0295 and 0.049 g kg⁻¹ K⁻¹ [JAM2000].
 */
export function contrailFactor(fuel: Fuel, efficiency: number): number {
  checkEfficiency(efficiency);
  checkFuel(fuel);
  return (fuel.eiH2O * CP_DRY_AIR) / (fuel.lhvJPerKg * (1 - efficiency));
}

function checkEfficiency(efficiency: number): void {
  if (!(efficiency >= 0 && efficiency < 1)) throw new RangeError(`efficiency must be in [0, 1), got ${efficiency}`);
}

function checkFuel(fuel: Fuel): void {
  if (fuel === null || typeof fuel !== 'object') throw new RangeError('fuel must be a Fuel object');
  if (!(fuel.eiH2O > 0 && fuel.eiH2O < Infinity)) throw new RangeError(`fuel.eiH2O must be finite and > 0 kg/kg, got ${fuel.eiH2O}`);
  if (!(fuel.lhvJPerKg > 0 && fuel.lhvJPerKg < Infinity)) throw new RangeError(`fuel.lhvJPerKg must be finite and > 0 J/kg, got ${fuel.lhvJPerKg}`);
}

/** ln(de_w/dT) and its derivative with respect to T, for the safeguarded Newton solve of T_LM. */
function lnSlope(code: number, t: number): number {
  return lnWater(code, t) + Math.log(dLnWater(code, t));
}

/**
 * Threshold temperature T_LM: the temperature at which the mixing line of slope G is tangent to
 * the saturation curve over liquid water, de_w/dT (T_LM) = G.
 * @param G - mixing-line slope, Pa K⁻¹ (> 0)
 * @param f - liquid saturation formulation (default murphy-koop)
 * @returns T_LM, K
 * @remarks Exact: safeguarded Newton iteration (bisection fallback) on ln(de_w/dT) − ln G, with
 * the analytic de_w/dT of the chosen formulation and a central-difference second derivative;
 * converged to < 1e-10 K [Schumann1996].
 * @throws RangeError when G is not positive or T_LM lies outside the water extrapolation range.
 */
export function thresholdTemperature(G: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  if (!(G > 0 && G < Infinity)) throw new RangeError(`mixing-line slope G must be finite and > 0 Pa/K, got ${G}`);
  const [lo, hi] = extrapolationRange(f, 'water');
  const target = Math.log(G);
  let a = lo;
  let b = Math.min(hi, 400);
  const fa = lnSlope(code, a) - target;
  const fb = lnSlope(code, b) - target;
  if (!(fa <= 0 && fb >= 0)) {
    throw new RangeError(
      `mixing-line slope G = ${G} Pa/K has no threshold temperature within the water range ${lo}–${b} K of saturation formulation "${f}"`,
    );
  }
  let t = G > 0.06 ? thresholdTemperatureApproxUnchecked(G) : 0.5 * (a + b);
  if (!(t > a && t < b)) t = 0.5 * (a + b);
  for (let k = 0; k < 200; k++) {
    const ft = lnSlope(code, t) - target;
    if (ft === 0) return t;
    if (ft < 0) a = t;
    else b = t;
    const h = 1e-3;
    const d = (lnSlope(code, t + h) - lnSlope(code, t - h)) / (2 * h);
    let next = t - ft / d;
    if (!(next > a && next < b)) next = 0.5 * (a + b);
    if (Math.abs(next - t) < 1e-11 || b - a < 1e-11) return next;
    t = next;
  }
  return t;
}

function thresholdTemperatureApproxUnchecked(G: number): number {
  const x = Math.log(G - 0.053);
  return CELSIUS_ZERO - 46.46 + 9.43 * x + 0.72 * x * x;
}

/**
 * Schumann's approximation of the threshold temperature.
 * @param G - mixing-line slope, Pa K⁻¹ (> 0.053)
 * @returns T_LM, K
 * @remarks T_LM[°C] = −46.46 + 9.43 ln(G − 0.053) + 0.72 ln²(G − 0.053), G in Pa K⁻¹
 * [Schumann1996]. Within 0.05 K of the exact solution with Murphy–Koop for
 * 0.5 ≤ G ≤ 10 Pa/K; it degrades below G ≈ 0.3 Pa/K (−1.45 K at G = 0.1).
 * @throws RangeError when G ≤ 0.053 Pa/K.
 */
export function thresholdTemperatureApprox(G: number): number {
  if (!(G > 0.053 && G < Infinity)) throw new RangeError(`Schumann's approximation needs G > 0.053 Pa/K, got ${G}`);
  return thresholdTemperatureApproxUnchecked(G);
}

/**
 * Internal: T_LC for given T_LM and e_w(T_LM), formulation code and lower range bound.
 * Safeguarded Newton on F(T) = e_w(T_LM) − G (T_LM − T) − U e_w(T), bracketed by the dry-air root
 * T_LM − e_w(T_LM)/G and T_LM; F is increasing and concave there, tolerance 1e-10 K.
 */
export function criticalTemperatureFrom(
  G: number,
  U: number,
  tlm: number,
  ewTlm: number,
  code: number,
  lo: number,
  f: SaturationFormulation,
): number {
  if (!(U >= 0)) throw new RangeError(`relative humidity over water U must be ≥ 0, got ${U}`);
  if (U >= 1) return tlm;
  const dry = tlm - ewTlm / G;
  if (U === 0) return dry;
  let a = Math.max(dry, lo);
  let b = tlm;
  const fa = ewTlm - G * (tlm - a) - U * Math.exp(lnWater(code, a));
  if (fa > 0) {
    throw new RangeError(`critical temperature for U = ${U} lies below the water range (${lo} K) of saturation formulation "${f}"`);
  }
  let t = a;
  for (let k = 0; k < 300; k++) {
    const ew = Math.exp(lnWater(code, t));
    const F = ewTlm - G * (tlm - t) - U * ew;
    if (F === 0) return t;
    if (F < 0) a = t;
    else b = t;
    const dF = G - U * ew * dLnWater(code, t);
    let next = dF > 0 ? t - F / dF : 0.5 * (a + b);
    if (!(next >= a && next <= b)) next = 0.5 * (a + b);
    if (Math.abs(next - t) < 1e-11 || b - a < 1e-11) return next;
    t = next;
  }
  return t;
}

/**
 * Critical temperature T_LC: the highest ambient temperature at which contrails form for ambient
 * relative humidity over liquid water U.
 * @param G - mixing-line slope, Pa K⁻¹
 * @param U - ambient relative humidity over liquid water, fraction (≥ 0)
 * @param f - liquid saturation formulation (default murphy-koop)
 * @returns T_LC, K (T_LC = T_LM for U ≥ 1; T_LM − e_w(T_LM)/G for U = 0)
 * @remarks Exact solution of e_w(T_LM) − G (T_LM − T_LC) = U e_w(T_LC) [Schumann1996],
 * safeguarded Newton, < 1e-10 K.
 * @throws RangeError for U < 0 or NaN, or when T_LM or T_LC leave the water range.
 */
export function criticalTemperature(G: number, U: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  const tlm = thresholdTemperature(G, f);
  const ewTlm = Math.exp(lnWater(code, tlm));
  return criticalTemperatureFrom(G, U, tlm, ewTlm, code, extrapolationRange(f, 'water')[0], f);
}

/** Parameters of the contrail criterion. */
export interface CriterionParameters {
  /** Fuel burnt. */
  fuel: Fuel;
  /** Overall propulsion efficiency η, in [0, 1). */
  efficiency: number;
  /** Saturation formulation for e_i and e_w. */
  saturation: SaturationFormulation;
  /** RHi threshold for ice supersaturation and persistence, %, in (0, 200]. */
  iceThresholdPercent: number;
  /** Homogeneous freezing temperature of the plume droplets, K, in [150, 273.16]; persistence needs T below it. */
  freezingTemperatureK: number;
  /** Humidity correction factor F applied to the vapour pressure, in (0, 10]; 1 = off. */
  humidityScale: number;
}

/**
 * Default parameters: kerosene, η = 0.3, Murphy–Koop, RHi threshold 100 %, freezing at 235 K
 * (≈ −38 °C, homogeneous freezing of plume droplets; common practice, no source), F = 1.
 */
export const DEFAULT_CRITERION: Readonly<CriterionParameters> = Object.freeze({
  fuel: FUEL_PRESETS.kerosene,
  efficiency: 0.3,
  saturation: 'murphy-koop',
  iceThresholdPercent: 100,
  freezingTemperatureK: 235,
  humidityScale: 1,
});

/**
 * Checks every parameter.
 * @throws RangeError naming the first invalid parameter and its allowed range.
 */
export function validateCriterionParameters(p: CriterionParameters): void {
  if (p === null || typeof p !== 'object') throw new RangeError('criterion parameters must be an object');
  checkFuel(p.fuel);
  checkEfficiency(p.efficiency);
  formulationCode(p.saturation);
  if (!(p.iceThresholdPercent > 0 && p.iceThresholdPercent <= 200)) {
    throw new RangeError(`iceThresholdPercent must be in (0, 200] %, got ${p.iceThresholdPercent}`);
  }
  if (!(p.freezingTemperatureK >= 150 && p.freezingTemperatureK <= TRIPLE_POINT_T)) {
    throw new RangeError(`freezingTemperatureK must be in [150, ${TRIPLE_POINT_T}] K, got ${p.freezingTemperatureK}`);
  }
  if (!(p.humidityScale > 0 && p.humidityScale <= 10)) {
    throw new RangeError(`humidityScale must be in (0, 10], got ${p.humidityScale}`);
  }
}
