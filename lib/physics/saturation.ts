/**
 * Saturation vapour pressure over ice and over (supercooled) liquid water, selectable formulation,
 * scalar and array forms, with declared validity and extrapolation ranges.
 *
 * @packageDocumentation
 */

import { dLnIce, dLnWater, lnIce, lnWater } from './saturation-formulas.js';

/** The saturation formulations; these names are the command line's `--saturation` contract. */
export type SaturationFormulation = 'murphy-koop' | 'sonntag' | 'goff-gratch' | 'iapws' | 'magnus';

/** All formulations, in the order of their internal codes. The first is the default. */
export const SATURATION_FORMULATIONS: readonly SaturationFormulation[] = Object.freeze([
  'murphy-koop',
  'sonntag',
  'goff-gratch',
  'iapws',
  'magnus',
] as const);

/** Default formulation: Murphy & Koop (2005). */
export const DEFAULT_SATURATION: SaturationFormulation = 'murphy-koop';

/** Ranges and source of one phase of one formulation. */
export interface SaturationPhaseInfo {
  /** Range the source states (or the range of the data it was fitted to), K. */
  readonly validK: readonly [number, number];
  /** Wider range over which frostgrid evaluates it; outside it the scalar form throws and the array form writes NaN, K. */
  readonly extrapolationK: readonly [number, number];
  /** Reference key into docs/references/physics.md, with a note on where the range comes from. */
  readonly source: string;
}

/** Description of a saturation formulation. */
export interface SaturationFormulationInfo {
  readonly name: SaturationFormulation;
  readonly ice: SaturationPhaseInfo;
  readonly water: SaturationPhaseInfo;
}

/** Phase over which saturation is taken. */
export type SaturationPhase = 'ice' | 'water';

/*
 * Extrapolation bounds are this project's choice (common practice, no source): ice forms down to
 * the lowest stated temperature of the source or 100 K, and up to 330 K so that RHi can be written
 * for warm cells (ice supersaturation itself is never flagged above 273.16 K); liquid forms that
 * were fitted above 0 °C are extrapolated down to 163.15 K (−110 °C), which covers every threshold and
 * critical temperature of the criterion (T_LC ≥ ~195 K at G ≥ 0.1 Pa/K).
 */
function deepFreeze<T>(o: T): T {
  if (o !== null && typeof o === 'object') {
    for (const v of Object.values(o)) deepFreeze(v);
    Object.freeze(o);
  }
  return o;
}

const INFO: Readonly<Record<SaturationFormulation, SaturationFormulationInfo>> = deepFreeze({
  'murphy-koop': {
    name: 'murphy-koop',
    ice: { validK: [110, 273.16], extrapolationK: [100, 330], source: 'MurphyKoop2005 eq. (7), valid T > 110 K' },
    water: { validK: [123, 332], extrapolationK: [123, 373.15], source: 'MurphyKoop2005 eq. (10), valid 123–332 K' },
  },
  sonntag: {
    name: 'sonntag',
    ice: { validK: [173.15, 273.16], extrapolationK: [100, 330], source: 'Sonntag1994 (coefficients in K, Pa from Helten1999); range −100…0.01 °C from memory' },
    water: { validK: [273.15, 373.15], extrapolationK: [163.15, 373.15], source: 'Sonntag1994; supercooled liquid is an extrapolation (MurphyKoop2005, abstract)' },
  },
  'goff-gratch': {
    name: 'goff-gratch',
    ice: { validK: [173.15, 273.16], extrapolationK: [100, 330], source: 'SMT1984 p. 350 (GoffGratch1946), e_i0 = 6.1071 hPa at 273.16 K; range from memory' },
    water: { validK: [273.15, 373.15], extrapolationK: [163.15, 373.15], source: 'SMT1984 (GoffGratch1946), steam-point form Ts = 373.16 K, e_s = 1013.246 hPa; supercooled liquid is an extrapolation' },
  },
  iapws: {
    name: 'iapws',
    ice: { validK: [50, 273.16], extrapolationK: [50, 330], source: 'IAPWS-R14-08 eq. (6), valid 50–273.16 K' },
    water: { validK: [273.16, 647.096], extrapolationK: [163.15, 647.096], source: 'IAPWS-SAT92 eq. (1) (WagnerPruss1993), valid triple point to critical point' },
  },
  magnus: {
    name: 'magnus',
    ice: { validK: [193.15, 273.15], extrapolationK: [163.15, 330], source: 'AlduchovEskridge1996 AERKi, fitted −80…0 °C (from memory)' },
    water: { validK: [233.15, 323.15], extrapolationK: [163.15, 373.15], source: 'AlduchovEskridge1996 AERK, fitted −40…50 °C (from memory)' },
  },
});

/**
 * Internal: the integer code of a formulation (its index in {@link SATURATION_FORMULATIONS}).
 * @throws RangeError naming the valid formulations when `f` is not one of them.
 */
export function formulationCode(f: SaturationFormulation): number {
  const i = SATURATION_FORMULATIONS.indexOf(f);
  if (i < 0) {
    throw new RangeError(
      `unknown saturation formulation "${String(f)}"; valid: ${SATURATION_FORMULATIONS.join(', ')}`,
    );
  }
  return i;
}

/** Validity and extrapolation ranges and source of a formulation (see the table in this module). */
export function saturationFormulationInfo(f: SaturationFormulation): SaturationFormulationInfo {
  formulationCode(f);
  return INFO[f];
}

/**
 * Whether evaluating `f` over `phase` on [tMinK, tMaxK] leaves the formulation's stated validity
 * range (so that outputs can record that an extrapolated formulation was used).
 * @returns true when tMinK < validK[0] or tMaxK > validK[1].
 */
export function isExtrapolated(f: SaturationFormulation, phase: SaturationPhase, tMinK: number, tMaxK: number): boolean {
  const r = phaseInfo(f, phase).validK;
  return tMinK < r[0] || tMaxK > r[1];
}

function phaseInfo(f: SaturationFormulation, phase: SaturationPhase): SaturationPhaseInfo {
  const info = saturationFormulationInfo(f);
  if (phase === 'ice') return info.ice;
  if (phase === 'water') return info.water;
  throw new RangeError(`unknown phase "${String(phase)}"; valid: ice, water`);
}

/** Internal: extrapolation range of one phase. */
export function extrapolationRange(f: SaturationFormulation, phase: SaturationPhase): readonly [number, number] {
  return phaseInfo(f, phase).extrapolationK;
}

/**
 * Internal: the temperature range over which both phases of `f` can be evaluated (the
 * intersection of the two extrapolation ranges), K.
 */
export function commonRange(f: SaturationFormulation): [number, number] {
  const i = INFO[f].ice.extrapolationK;
  const w = INFO[f].water.extrapolationK;
  return [Math.max(i[0], w[0]), Math.min(i[1], w[1])];
}

function checkRange(f: SaturationFormulation, phase: SaturationPhase, tK: number): void {
  const [lo, hi] = INFO[f][phase].extrapolationK;
  if (!(tK >= lo && tK <= hi)) {
    throw new RangeError(
      `temperature ${tK} K is outside the ${phase} extrapolation range ${lo}–${hi} K of saturation formulation "${f}"`,
    );
  }
}

/**
 * Saturation vapour pressure over a plane surface of ice.
 *
 * @param tK - temperature, K
 * @param f - formulation (default `murphy-koop`)
 * @returns e_i, Pa; NaN for NaN input
 * @throws RangeError naming the formulation and its range when tK is outside the extrapolation range
 * @remarks
 * - murphy-koop: ln e_i = 9.550426 − 5723.265/T + 3.53068 ln T − 0.00728332 T [MurphyKoop2005 eq. 7]
 * - sonntag: ln e_i = −6024.5282/T + 29.32707 + 1.0613868e−2 T − 1.3198825e−5 T² − 0.49382577 ln T [Sonntag1994]
 * - goff-gratch: log10 e_i[hPa] = −9.09718(T0/T − 1) − 3.56654 log10(T0/T) + 0.876793(1 − T/T0) + log10 6.1071, T0 = 273.16 K [SMT1984]
 * - iapws: ln(e_i/611.657 Pa) = θ⁻¹ Σ aᵢ θ^bᵢ, θ = T/273.16 K [IAPWS-R14-08 eq. 6]
 * - magnus: e_i = 611.21 Pa exp(22.587 t/(t + 273.86)), t in °C [AlduchovEskridge1996]
 *
 * Validity and extrapolation ranges: {@link saturationFormulationInfo}.
 */
export function saturationPressureIce(tK: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  if (Number.isNaN(tK)) return NaN;
  checkRange(f, 'ice', tK);
  return Math.exp(lnIce(code, tK));
}

/**
 * Saturation vapour pressure over a plane surface of liquid water, supercooled below 273.15 K.
 *
 * @param tK - temperature, K
 * @param f - formulation (default `murphy-koop`)
 * @returns e_w, Pa; NaN for NaN input
 * @throws RangeError naming the formulation and its range when tK is outside the extrapolation range
 * @remarks
 * - murphy-koop: ln e_w = 54.842763 − 6763.22/T − 4.210 ln T + 0.000367 T + tanh(0.0415(T − 218.8))
 *   (53.878 − 1331.22/T − 9.44523 ln T + 0.014025 T), valid 123–332 K [MurphyKoop2005 eq. 10]
 * - sonntag: ln e_w = −6096.9385/T + 21.2409642 − 2.711193e−2 T + 1.673952e−5 T² + 2.433502 ln T [Sonntag1994]
 * - goff-gratch: log10 e_w[hPa] = −7.90298(Ts/T − 1) + 5.02808 log10(Ts/T) − 1.3816e−7(10^(11.344(1 − T/Ts)) − 1)
 *   + 8.1328e−3(10^(−3.49149(Ts/T − 1)) − 1) + log10 1013.246, Ts = 373.16 K [SMT1984] [GoffGratch1946]
 * - iapws: ln(e_w/pc) = (Tc/T)(a1τ + a2τ^1.5 + a3τ³ + a4τ^3.5 + a5τ⁴ + a6τ^7.5), τ = 1 − T/Tc [IAPWS-SAT92 eq. 1]
 * - magnus: e_w = 610.94 Pa exp(17.625 t/(t + 243.04)), t in °C [AlduchovEskridge1996]
 *
 * Only Murphy–Koop is valid for supercooled water; the others are extrapolations there
 * ({@link isExtrapolated}).
 */
export function saturationPressureWater(tK: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  if (Number.isNaN(tK)) return NaN;
  checkRange(f, 'water', tK);
  return Math.exp(lnWater(code, tK));
}

/**
 * Temperature derivative of the saturation vapour pressure over liquid water.
 *
 * @param tK - temperature, K
 * @param f - formulation (default `murphy-koop`)
 * @returns de_w/dT, Pa K⁻¹
 * @remarks de_w/dT = e_w(T) · d ln e_w/dT, the logarithmic derivative taken analytically from the
 * formula of {@link saturationPressureWater}. Same ranges and errors as that function.
 */
export function saturationPressureWaterDerivative(tK: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  if (Number.isNaN(tK)) return NaN;
  checkRange(f, 'water', tK);
  return Math.exp(lnWater(code, tK)) * dLnWater(code, tK);
}

/**
 * Temperature derivative of the saturation vapour pressure over ice.
 *
 * @param tK - temperature, K
 * @param f - formulation (default `murphy-koop`)
 * @returns de_i/dT, Pa K⁻¹ (analytic, as {@link saturationPressureWaterDerivative})
 */
export function saturationPressureIceDerivative(tK: number, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  if (Number.isNaN(tK)) return NaN;
  checkRange(f, 'ice', tK);
  return Math.exp(lnIce(code, tK)) * dLnIce(code, tK);
}

/** Float arrays accepted by the array forms. */
export type FloatArray = Float32Array | Float64Array;

/**
 * Array form of {@link saturationPressureIce}: fills `out[i]` with e_i(tK[i]) in Pa, computed in
 * double and stored in the precision of `out`.
 *
 * @returns the number of cells outside the extrapolation range (written as NaN); NaN input gives
 * NaN and is not counted.
 * @throws RangeError when the arrays differ in length or `f` is unknown.
 */
export function saturationPressureIceArray(out: FloatArray, tK: FloatArray, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  checkLengths(out.length, tK.length);
  const [lo, hi] = INFO[f].ice.extrapolationK;
  let bad = 0;
  for (let i = 0; i < tK.length; i++) {
    const t = tK[i];
    if (t >= lo && t <= hi) {
      out[i] = Math.exp(lnIce(code, t));
    } else {
      out[i] = NaN;
      if (t === t) bad++;
    }
  }
  return bad;
}

/**
 * Array form of {@link saturationPressureWater}: fills `out[i]` with e_w(tK[i]) in Pa.
 * @returns the number of cells outside the extrapolation range (NaN written); NaN input is not counted.
 */
export function saturationPressureWaterArray(out: FloatArray, tK: FloatArray, f: SaturationFormulation = DEFAULT_SATURATION): number {
  const code = formulationCode(f);
  checkLengths(out.length, tK.length);
  const [lo, hi] = INFO[f].water.extrapolationK;
  let bad = 0;
  for (let i = 0; i < tK.length; i++) {
    const t = tK[i];
    if (t >= lo && t <= hi) {
      out[i] = Math.exp(lnWater(code, t));
    } else {
      out[i] = NaN;
      if (t === t) bad++;
    }
  }
  return bad;
}

/** Internal: RangeError when array lengths differ. */
export function checkLengths(...lengths: number[]): void {
  for (let i = 1; i < lengths.length; i++) {
    if (lengths[i] !== lengths[0]) {
      throw new RangeError(`array lengths differ: ${lengths.join(' vs ')}`);
    }
  }
}
