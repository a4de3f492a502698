/**
 * RHi uncertainty implied by the humidity's own quantisation.
 *
 * A packed humidity (int16 with scale_factor, GRIB simple packing, …) can only take values on a
 * lattice of step Δ (the field's `encoding.quantizationStep`, SI units). A stored value stands for
 * anything within ±Δ/2, so the vapour pressure, and with it RHi = 100·F·e/e_i(T), is uncertain by
 *
 *   specific humidity q:   δe/e = (Δ/2)·ε / (q·(ε + (1 − ε) q))      from e = q p/(ε + (1 − ε) q)
 *   mixing ratio r:        δe/e = (Δ/2)·ε / (r·(ε + r))               from e = r p/(ε + r)
 *   relative humidity RH:  δe   = (Δ/2)·e_c(T)                        from e = RH·e_c(T) (convention c)
 *   dew point T_d:         δe   = (Δ/2)·de_w/dT(T_d)                  from e = e_w(T_d)
 *
 * (first-order propagation, ε = 0.622 as in the physics core), and δRHi = 100·F·δe/e_i(T) =
 * RHi·δe/e. F is the humidity scale; where the kernel capped F·e at water saturation the level
 * summary's δRHi is relative to the capped RHi.
 *
 * Units: the level reports δRHi as **percentage points of RHi** (absolute: RHi = 100 % ± δRHi),
 * the quantity to compare with the distance of RHi from the threshold, and also relative to RHi
 * (δRHi/RHi, in %). Both as maximum and median over the level's valid cells. A cell "lies within
 * the uncertainty of the threshold" when |RHi − threshold| ≤ δRHi: its ice-supersaturation flag
 * is not resolved by the data.
 *
 * @packageDocumentation
 */
import { ParameterError } from '../errors.js';
import { EPSILON, saturationPressureForConvention, saturationPressureIce, saturationPressureWaterDerivative } from '../physics/index.js';
import type { SaturationFormulation } from '../physics/index.js';
import type { RhConvention } from '../grid/types.js';
import type { HumiditySourceKind } from './humidity.js';

/** Per-level RHi uncertainty from quantisation (JSON-ready keys). */
export interface RhiUncertainty {
  /** Humidity quantity whose step was propagated. */
  readonly quantity: HumiditySourceKind;
  /** Quantisation step of the humidity, SI (kg kg⁻¹, fraction, K); 0 = unpacked floating point. */
  readonly step: number;
  /** Largest δRHi over the level's valid cells, percentage points of RHi; null without valid cells. */
  readonly max_percentage_points: number | null;
  /** Median δRHi, percentage points. */
  readonly median_percentage_points: number | null;
  /** Largest δRHi/RHi, % of RHi. */
  readonly max_relative_percent: number | null;
  /** Median δRHi/RHi, % of RHi. */
  readonly median_relative_percent: number | null;
  /** Valid cells with |RHi − threshold| ≤ δRHi (inside the box when one is given). */
  readonly cells_within_threshold_uncertainty: number;
}

/** Inputs of {@link rhiUncertainty}; all arrays of the grid's point count. */
export interface UncertaintyInputs {
  readonly quantity: HumiditySourceKind;
  /** Quantisation step Δ of the humidity, SI. */
  readonly step: number;
  /** The humidity slice as read (SI: kg kg⁻¹, fraction, K). */
  readonly humidity: Float32Array;
  /** Temperature, K. */
  readonly temperatureK: Float32Array;
  /** Vapour pressure e from the humidity (before the humidity scale), Pa. */
  readonly vapourPressurePa: Float32Array;
  /** RHi from the level kernel, % (NaN for invalid cells). */
  readonly rhiPercent: Float32Array;
  /** RH convention (relative humidity only). */
  readonly convention?: RhConvention;
  readonly saturation: SaturationFormulation;
  readonly iceThresholdPercent: number;
  readonly humidityScale: number;
  /** Optional box inclusion mask (1 inside). */
  readonly inside?: Uint8Array;
  /** Optional scratch arrays of the grid's point count (avoid allocation per level). */
  readonly scratch?: { absolute: Float32Array; relative: Float32Array };
}

/**
 * δRHi (percentage points) of one cell from the quantisation step; NaN when the inputs are invalid.
 * @param quantity - humidity quantity
 * @param step - quantisation step Δ, SI
 * @param h - humidity value, SI
 * @param tK - temperature, K
 * @param ePa - vapour pressure from h, Pa
 * @param humidityScale - F
 */
export function rhiUncertaintyAt(
  quantity: HumiditySourceKind,
  step: number,
  h: number,
  tK: number,
  ePa: number,
  humidityScale: number,
  saturation: SaturationFormulation,
  convention?: RhConvention,
): number {
  if (!(step >= 0)) throw new ParameterError(`quantisation step must be ≥ 0, got ${step}`, 'quantizationStep');
  if (!(h === h) || !(tK === tK) || !(ePa === ePa)) return NaN;
  const half = step / 2;
  let de: number;
  switch (quantity) {
    case 'specific_humidity':
      de = h > 0 ? (ePa * half * EPSILON) / (h * (EPSILON + (1 - EPSILON) * h)) : NaN;
      break;
    case 'humidity_mixing_ratio':
      de = h > 0 ? (ePa * half * EPSILON) / (h * (EPSILON + h)) : NaN;
      break;
    case 'relative_humidity':
      if (convention === undefined) throw new ParameterError('relative humidity needs a phase convention', 'rh-convention');
      de = half * saturationPressureForConvention(tK, convention, saturation);
      break;
    case 'dew_point_temperature':
      de = half * saturationPressureWaterDerivative(h, saturation);
      break;
  }
  return (100 * humidityScale * de) / saturationPressureIce(tK, saturation);
}

/**
 * Relative vapour-pressure uncertainty δe/e of one cell (the factor by which RHi's own value is
 * multiplied to give δRHi); NaN when it cannot be formed (h ≤ 0 for q and r, RH ≤ 0).
 */
function relativeVapourUncertainty(quantity: HumiditySourceKind, half: number, h: number, ePa: number, saturation: SaturationFormulation): number {
  switch (quantity) {
    case 'specific_humidity':
      return h > 0 ? (half * EPSILON) / (h * (EPSILON + (1 - EPSILON) * h)) : NaN;
    case 'humidity_mixing_ratio':
      return h > 0 ? (half * EPSILON) / (h * (EPSILON + h)) : NaN;
    case 'relative_humidity':
      return h > 0 ? half / h : NaN;
    case 'dew_point_temperature':
      return ePa > 0 ? (half * saturationPressureWaterDerivative(h, saturation)) / ePa : NaN;
  }
}

/**
 * Level summary of the RHi uncertainty from quantisation: max and median δRHi (absolute and
 * relative) over the valid cells and the count of cells whose threshold test is unresolved.
 * Computed as δRHi = RHi·δe/e from the kernel's RHi, so no saturation pressure is evaluated per
 * cell (for a dew point, one derivative of e_w per cell). Where the kernel capped F·e at water
 * saturation, δRHi is relative to the capped RHi. Cells with invalid RHi are skipped.
 */
export function rhiUncertainty(inp: UncertaintyInputs): RhiUncertainty {
  if (!(inp.step >= 0)) throw new ParameterError(`quantisation step must be ≥ 0, got ${inp.step}`, 'quantizationStep');
  if (inp.quantity === 'relative_humidity' && inp.convention === undefined) {
    throw new ParameterError('relative humidity needs a phase convention', 'rh-convention');
  }
  const n = inp.rhiPercent.length;
  const abs = inp.scratch?.absolute ?? new Float32Array(n);
  const rel = inp.scratch?.relative ?? new Float32Array(n);
  const half = inp.step / 2;
  const thr = inp.iceThresholdPercent;
  const quantity = inp.quantity;
  const hum = inp.humidity;
  const e = inp.vapourPressurePa;
  const rhi = inp.rhiPercent;
  const inside = inp.inside;
  let m = 0;
  let near = 0;
  let maxA = -Infinity;
  let maxR = -Infinity;
  for (let i = 0; i < n; i++) {
    if (inside !== undefined && inside[i] !== 1) continue;
    const r = rhi[i];
    if (!(r === r)) continue;
    let f: number;
    if (quantity === 'specific_humidity') {
      const h = hum[i];
      f = h > 0 ? (half * EPSILON) / (h * (EPSILON + (1 - EPSILON) * h)) : NaN;
    } else {
      try {
        f = relativeVapourUncertainty(quantity, half, hum[i], e[i], inp.saturation);
      } catch (err) {
        if (err instanceof RangeError) continue;
        throw err;
      }
    }
    if (!(f === f)) continue;
    const d = r * f;
    const dr = 100 * f;
    abs[m] = d;
    rel[m] = dr;
    m++;
    if (d > maxA) maxA = d;
    if (dr > maxR) maxR = dr;
    if (Math.abs(r - thr) <= d) near++;
  }
  if (m === 0) {
    return {
      quantity: inp.quantity,
      step: inp.step,
      max_percentage_points: null,
      median_percentage_points: null,
      max_relative_percent: null,
      median_relative_percent: null,
      cells_within_threshold_uncertainty: 0,
    };
  }
  return {
    quantity: inp.quantity,
    step: inp.step,
    max_percentage_points: maxA,
    median_percentage_points: medianOfPrefix(abs, m),
    max_relative_percent: maxR,
    median_relative_percent: medianOfPrefix(rel, m),
    cells_within_threshold_uncertainty: near,
  };
}

/**
 * Median of the first m values of a (scratch) array, reordering them (Hoare quickselect); for
 * even m the mean of the two middle values.
 */
export function medianOfPrefix(a: Float32Array | Float64Array, m: number): number {
  if (m <= 0) return NaN;
  const hi = select(a, m, m >> 1);
  if (m % 2 === 1) return hi;
  // The lower middle is the largest value left of position m/2 after the selection.
  let lo = -Infinity;
  for (let i = 0; i < m >> 1; i++) if (a[i] > lo) lo = a[i];
  return 0.5 * (lo + hi);
}

function select(a: Float32Array | Float64Array, m: number, k: number): number {
  let left = 0;
  let right = m - 1;
  while (right > left) {
    const pivot = a[(left + right) >> 1];
    let i = left;
    let j = right;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else break;
  }
  return a[k];
}
