/**
 * International Standard Atmosphere: pressure ↔ geopotential pressure altitude ↔ flight level,
 * and geopotential ↔ geopotential height ↔ geometric altitude.
 *
 * Layers (geopotential altitude H, lapse rate L): from −5 km, −6.5 K/km to 11 km; 0 to 20 km;
 * +1.0 K/km to 32 km; +2.8 K/km to 47 km; 0 to 51 km; −2.8 K/km to 71 km; −2.0 K/km to
 * 84.852 km [ICAO7488] [ISO2533] [COESA1976] (ICAO and ISO define the atmosphere to 80 km, where
 * they coincide with [COESA1976]; the last 4.852 km follow [COESA1976]). Base temperatures and
 * pressures are derived from T0, p0, g0, R and the lapse rates, never retyped.
 *
 * @packageDocumentation
 */

import { EARTH_RADIUS_ISA, FOOT, G0, ISA_P0, ISA_T0, R_DRY_AIR } from './constants.js';
import { checkLengths, type FloatArray } from './saturation.js';

/** Layer bases, geopotential m. */
const BASE_H = [0, 11000, 20000, 32000, 47000, 51000, 71000] as const;
/** Lapse rates dT/dH, K m⁻¹, per layer. */
const LAPSE = [-0.0065, 0, 0.001, 0.0028, 0, -0.0028, -0.002] as const;
/** Lowest and highest geopotential altitude served, m. */
export const ISA_ALTITUDE_RANGE_M: readonly [number, number] = [-5000, 84852];

const BASE_T: number[] = [ISA_T0];
const BASE_P: number[] = [ISA_P0];
for (let k = 1; k < BASE_H.length; k++) {
  const dh = BASE_H[k] - BASE_H[k - 1];
  BASE_T.push(BASE_T[k - 1] + LAPSE[k - 1] * dh);
  BASE_P.push(layerPressure(k - 1, BASE_H[k]));
}

function layerPressure(k: number, h: number): number {
  const L = LAPSE[k];
  const tb = BASE_T[k];
  const dh = h - BASE_H[k];
  if (L === 0) return BASE_P[k] * Math.exp((-G0 * dh) / (R_DRY_AIR * tb));
  return BASE_P[k] * Math.pow(tb / (tb + L * dh), G0 / (R_DRY_AIR * L));
}

function layerOf(h: number): number {
  let k = 0;
  while (k < BASE_H.length - 1 && h >= BASE_H[k + 1]) k++;
  return k;
}

/** Pressure at the top of the served range (84.852 km), Pa. */
export const ISA_PRESSURE_MIN_PA = layerPressure(BASE_H.length - 1, ISA_ALTITUDE_RANGE_M[1]);
/** Pressure at the bottom of the served range (−5 km), Pa. */
export const ISA_PRESSURE_MAX_PA = layerPressure(0, ISA_ALTITUDE_RANGE_M[0]);

function checkAltitude(hM: number): void {
  if (!(hM >= ISA_ALTITUDE_RANGE_M[0] && hM <= ISA_ALTITUDE_RANGE_M[1])) {
    throw new RangeError(`ISA altitude ${hM} m is outside ${ISA_ALTITUDE_RANGE_M[0]}…${ISA_ALTITUDE_RANGE_M[1]} m (geopotential)`);
  }
}

/**
 * ISA pressure at a geopotential (pressure) altitude.
 * @param hM - geopotential altitude H, m (−5000…84852)
 * @returns p, Pa
 * @remarks p = p_b (T_b/(T_b + L (H − H_b)))^(g0/(R L)), or p_b exp(−g0 (H − H_b)/(R T_b)) where
 * L = 0 [ICAO7488] [ISO2533].
 * @throws RangeError outside the served range.
 */
export function isaPressureFromAltitude(hM: number): number {
  if (Number.isNaN(hM)) return NaN;
  checkAltitude(hM);
  return layerPressure(layerOf(hM), hM);
}

/**
 * ISA temperature at a geopotential altitude.
 * @param hM - geopotential altitude H, m (−5000…84852)
 * @returns T = T_b + L (H − H_b), K [ICAO7488]
 */
export function isaTemperatureAtAltitude(hM: number): number {
  if (Number.isNaN(hM)) return NaN;
  checkAltitude(hM);
  const k = layerOf(hM);
  return BASE_T[k] + LAPSE[k] * (hM - BASE_H[k]);
}

function altitudeUnchecked(p: number): number {
  let k = 0;
  while (k < BASE_P.length - 1 && p <= BASE_P[k + 1]) k++;
  const L = LAPSE[k];
  const tb = BASE_T[k];
  if (L === 0) return BASE_H[k] - ((R_DRY_AIR * tb) / G0) * Math.log(p / BASE_P[k]);
  return BASE_H[k] + (tb / L) * (Math.pow(p / BASE_P[k], (-R_DRY_AIR * L) / G0) - 1);
}

/**
 * Geopotential pressure altitude of a pressure in the ISA (inverse of {@link isaPressureFromAltitude}).
 * @param pPa - pressure, Pa (ISA_PRESSURE_MIN_PA…ISA_PRESSURE_MAX_PA, ≈ 0.373…177 687 Pa)
 * @returns H, m
 * @remarks H = H_b + (T_b/L)((p/p_b)^(−R L/g0) − 1), or H_b − (R T_b/g0) ln(p/p_b) where L = 0 [ICAO7488].
 * @throws RangeError outside the served range.
 */
export function isaAltitudeFromPressure(pPa: number): number {
  if (Number.isNaN(pPa)) return NaN;
  if (!(pPa >= ISA_PRESSURE_MIN_PA && pPa <= ISA_PRESSURE_MAX_PA)) {
    throw new RangeError(`pressure ${pPa} Pa is outside the ISA range ${ISA_PRESSURE_MIN_PA}…${ISA_PRESSURE_MAX_PA} Pa`);
  }
  return altitudeUnchecked(pPa);
}

/**
 * Array form of {@link isaAltitudeFromPressure}.
 * @returns the number of cells outside the ISA range (NaN written); NaN input is not counted.
 */
export function isaAltitudeFromPressureArray(out: FloatArray, pPa: FloatArray): number {
  checkLengths(out.length, pPa.length);
  let bad = 0;
  for (let i = 0; i < pPa.length; i++) {
    const p = pPa[i];
    if (p >= ISA_PRESSURE_MIN_PA && p <= ISA_PRESSURE_MAX_PA) out[i] = altitudeUnchecked(p);
    else {
      out[i] = NaN;
      if (p === p) bad++;
    }
  }
  return bad;
}

/**
 * Flight level of a pressure: ISA pressure altitude in hundreds of feet, unrounded.
 * @param pPa - pressure, Pa
 * @returns FL = H / (100 × 0.3048 m) [ICAO7488] [ICAO-Annex2: flight levels are surfaces of constant
 * pressure related to 1013.25 hPa]
 */
export function flightLevelFromPressure(pPa: number): number {
  return isaAltitudeFromPressure(pPa) / (100 * FOOT);
}

/** Array form of {@link flightLevelFromPressure}; returns the number of out-of-range cells (NaN written). */
export function flightLevelFromPressureArray(out: FloatArray, pPa: FloatArray): number {
  checkLengths(out.length, pPa.length);
  let bad = 0;
  for (let i = 0; i < pPa.length; i++) {
    const p = pPa[i];
    if (p >= ISA_PRESSURE_MIN_PA && p <= ISA_PRESSURE_MAX_PA) out[i] = altitudeUnchecked(p) / (100 * FOOT);
    else {
      out[i] = NaN;
      if (p === p) bad++;
    }
  }
  return bad;
}

/**
 * Pressure at a flight level.
 * @param fl - flight level, hundreds of feet of ISA pressure altitude
 * @returns p, Pa (inverse of {@link flightLevelFromPressure})
 */
export function pressureFromFlightLevel(fl: number): number {
  return isaPressureFromAltitude(fl * 100 * FOOT);
}

/**
 * Geopotential height from geopotential.
 * @param zM2S2 - geopotential Φ, m² s⁻²
 * @returns H = Φ/g0, geopotential m (g0 = 9.80665 m s⁻²) [ICAO7488] [WMO-306]
 */
export function geopotentialHeightFromGeopotential(zM2S2: number): number {
  return zM2S2 / G0;
}

/** Array form of {@link geopotentialHeightFromGeopotential}. */
export function geopotentialHeightFromGeopotentialArray(out: FloatArray, zM2S2: FloatArray): void {
  checkLengths(out.length, zM2S2.length);
  for (let i = 0; i < zM2S2.length; i++) out[i] = zM2S2[i] / G0;
}

/**
 * Geopotential from geopotential height.
 * @param hM - geopotential height, m
 * @returns Φ = g0 H, m² s⁻² [ICAO7488]
 */
export function geopotentialFromGeopotentialHeight(hM: number): number {
  return hM * G0;
}

/**
 * Geometric altitude from geopotential height.
 * @param hM - geopotential height H, m (< r)
 * @param earthRadiusM - nominal Earth radius r, m (default 6 356 766 m [ICAO7488])
 * @returns Z = r H / (r − H), m [ICAO7488] [COESA1976]
 */
export function geometricAltitudeFromGeopotentialHeight(hM: number, earthRadiusM: number = EARTH_RADIUS_ISA): number {
  if (!(hM < earthRadiusM)) throw new RangeError(`geopotential height ${hM} m must be below the Earth radius ${earthRadiusM} m`);
  return (earthRadiusM * hM) / (earthRadiusM - hM);
}

/**
 * Geopotential height from geometric altitude (inverse of {@link geometricAltitudeFromGeopotentialHeight}).
 * @param zM - geometric altitude Z, m (> −r)
 * @param earthRadiusM - nominal Earth radius r, m (default 6 356 766 m)
 * @returns H = r Z / (r + Z), m [ICAO7488]
 */
export function geopotentialHeightFromGeometricAltitude(zM: number, earthRadiusM: number = EARTH_RADIUS_ISA): number {
  if (!(zM > -earthRadiusM)) throw new RangeError(`geometric altitude ${zM} m must be above −${earthRadiusM} m`);
  return (earthRadiusM * zM) / (earthRadiusM + zM);
}
