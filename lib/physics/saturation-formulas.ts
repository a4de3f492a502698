/**
 * The saturation vapour pressure formulas themselves, as natural logarithms of the pressure in Pa
 * and their analytic temperature derivatives. Internal module: the public, range-checked API is in
 * saturation.ts. The formulations are addressed by a small integer code so that hot loops can
 * select one with a `switch` instead of calling through a closure.
 *
 * Every formula: T in K, ln(e / Pa). Sources are keys into docs/references/physics.md.
 *
 * @packageDocumentation
 */

import { CELSIUS_ZERO, TRIPLE_POINT_P, TRIPLE_POINT_T, WATER_CRITICAL_P, WATER_CRITICAL_T } from './constants.js';

/** Integer codes of the formulations, in the order of SATURATION_FORMULATIONS. */
export const CODE_MURPHY_KOOP = 0;
export const CODE_SONNTAG = 1;
export const CODE_GOFF_GRATCH = 2;
export const CODE_IAPWS = 3;
export const CODE_MAGNUS = 4;

const LN10 = Math.LN10;
const LN_HPA = Math.log(100);

// --- Murphy & Koop (2005) [MurphyKoop2005] -----------------------------------------------------
// Ice, eq. (7): ln e_i = 9.550426 − 5723.265/T + 3.53068 ln T − 0.00728332 T
const MK_I1 = -5723.265;
const MK_I2 = 3.53068;
const MK_I3 = -0.00728332;
// Liquid, eq. (10): ln e_w = 54.842763 − 6763.22/T − 4.210 ln T + 0.000367 T
//   + tanh(0.0415 (T − 218.8)) (53.878 − 1331.22/T − 9.44523 ln T + 0.014025 T)
const MK_W1 = -6763.22;
const MK_W2 = -4.21;
const MK_W3 = 0.000367;
const MK_WK = 0.0415;
const MK_WT = 218.8;
const MK_W4 = 53.878;
const MK_W5 = -1331.22;
const MK_W6 = -9.44523;
const MK_W7 = 0.014025;

// --- Sonntag (1994) [Sonntag1994], coefficients for K and Pa as quoted by [Helten1999] ----------
// ln e = a/T + b + c T + d T² + e ln T
const SO_IA = -6024.5282;
const SO_IB = 29.32707;
const SO_IC = 1.0613868e-2;
const SO_ID = -1.3198825e-5;
const SO_IE = -0.49382577;
const SO_WA = -6096.9385;
const SO_WB = 21.2409642;
const SO_WC = -2.711193e-2;
const SO_WD = 1.673952e-5;
const SO_WE = 2.433502;

// --- Goff–Gratch (1946), Smithsonian Meteorological Tables form [SMT1984] [GoffGratch1946] ------
// Ice: log10 e_i[hPa] = −9.09718 (T0/T − 1) − 3.56654 log10(T0/T) + 0.876793 (1 − T/T0) + log10 6.1071,
//   T0 = 273.16 K.
const GG_T0 = TRIPLE_POINT_T;
const GG_IA = -9.09718;
const GG_IB = -3.56654;
const GG_IC = 0.876793;
const GG_ILOG_E0 = Math.log10(6.1071);
// Liquid: log10 e_w[hPa] = −7.90298 (Ts/T − 1) + 5.02808 log10(Ts/T)
//   − 1.3816e−7 (10^(11.344 (1 − T/Ts)) − 1) + 8.1328e−3 (10^(−3.49149 (Ts/T − 1)) − 1) + log10 1013.246,
//   Ts = 373.16 K (steam point).
const GG_TS = 373.16;
const GG_WA = -7.90298;
const GG_WB = 5.02808;
const GG_WC = -1.3816e-7;
const GG_WCK = 11.344;
const GG_WD = 8.1328e-3;
const GG_WDK = -3.49149;
const GG_WLOG_ES = Math.log10(1013.246);

// --- IAPWS [IAPWS-R14-08] (ice) and [IAPWS-SAT92] / [WagnerPruss1993] (liquid) ------------------
// Sublimation, R14-08 eq. (6): ln(p/pt) = θ⁻¹ Σ a_i θ^b_i, θ = T/Tt.
const IA_A1 = -21.2144006;
const IA_A2 = 27.3203819;
const IA_A3 = -6.1059813;
const IA_B1 = 0.00333333333;
const IA_B2 = 1.20666667;
const IA_B3 = 1.70333333;
const IA_LN_PT = Math.log(TRIPLE_POINT_P);
// Liquid–vapour, auxiliary equation: ln(p/pc) = (Tc/T)(a1 τ + a2 τ^1.5 + a3 τ³ + a4 τ^3.5 + a5 τ⁴ + a6 τ^7.5),
//   τ = 1 − T/Tc.
const IW_A1 = -7.85951783;
const IW_A2 = 1.84408259;
const IW_A3 = -11.7866497;
const IW_A4 = 22.6807411;
const IW_A5 = -15.9618719;
const IW_A6 = 1.80122502;
const IW_LN_PC = Math.log(WATER_CRITICAL_P);

// --- Magnus forms of Alduchov & Eskridge (1996) [AlduchovEskridge1996], t in °C -----------------
// Water (AERK): e = 610.94 Pa exp(17.625 t/(t + 243.04)); ice (AERKi): e = 611.21 Pa exp(22.587 t/(t + 273.86)).
const MA_WLN0 = Math.log(610.94);
const MA_WA = 17.625;
const MA_WB = 243.04;
const MA_ILN0 = Math.log(611.21);
const MA_IA = 22.587;
const MA_IB = 273.86;

/*
 * The two Murphy–Koop functions below write the coefficients of eqs. (7) and (10) (the MK_*
 * constants above) as literals: V8 folds literals into the machine code of hot loops, whereas
 * module-level constants are loaded from the module context on every cell. The derivative tests
 * (analytic dLn* from the MK_* constants against finite differences of these) keep the two copies
 * equal.
 */

/** ln(e_i/Pa) over ice, Murphy & Koop (2005) eq. (7); small enough to be inlined into hot loops. */
export function lnIceMurphyKoop(t: number): number {
  return 9.550426 - 5723.265 / t + 3.53068 * Math.log(t) - 0.00728332 * t;
}

/** ln(e_w/Pa) over liquid water, Murphy & Koop (2005) eq. (10); small enough to be inlined into hot loops. */
export function lnWaterMurphyKoop(t: number): number {
  const lt = Math.log(t);
  return (
    54.842763 - 6763.22 / t - 4.21 * lt + 0.000367 * t +
    Math.tanh(0.0415 * (t - 218.8)) * (53.878 - 1331.22 / t - 9.44523 * lt + 0.014025 * t)
  );
}

/** ln(e_i/Pa) over ice for formulation `code` at T (K); no range check. */
export function lnIce(code: number, t: number): number {
  switch (code) {
    case CODE_MURPHY_KOOP:
      return lnIceMurphyKoop(t);
    case CODE_SONNTAG:
      return SO_IA / t + SO_IB + t * (SO_IC + SO_ID * t) + SO_IE * Math.log(t);
    case CODE_GOFF_GRATCH: {
      const r = GG_T0 / t;
      return LN10 * (GG_IA * (r - 1) + GG_IB * Math.log10(r) + GG_IC * (1 - 1 / r) + GG_ILOG_E0) + LN_HPA;
    }
    case CODE_IAPWS: {
      // θ^b = exp(b ln θ), sharing ln θ
      const lth = Math.log(t / TRIPLE_POINT_T);
      return IA_LN_PT + IA_A1 * Math.exp((IA_B1 - 1) * lth) + IA_A2 * Math.exp((IA_B2 - 1) * lth) + IA_A3 * Math.exp((IA_B3 - 1) * lth);
    }
    default: {
      const tc = t - CELSIUS_ZERO;
      return MA_ILN0 + (MA_IA * tc) / (tc + MA_IB);
    }
  }
}

/** d ln(e_i)/dT over ice, K⁻¹, for formulation `code`; analytic derivative of {@link lnIce}. */
export function dLnIce(code: number, t: number): number {
  switch (code) {
    case CODE_MURPHY_KOOP:
      return -MK_I1 / (t * t) + MK_I2 / t + MK_I3;
    case CODE_SONNTAG:
      return -SO_IA / (t * t) + SO_IC + 2 * SO_ID * t + SO_IE / t;
    case CODE_GOFF_GRATCH:
      return LN10 * (-GG_IA * GG_T0 / (t * t) - GG_IB / (t * LN10) - GG_IC / GG_T0);
    case CODE_IAPWS: {
      const lth = Math.log(t / TRIPLE_POINT_T);
      return (
        (IA_A1 * (IA_B1 - 1) * Math.exp((IA_B1 - 2) * lth) +
          IA_A2 * (IA_B2 - 1) * Math.exp((IA_B2 - 2) * lth) +
          IA_A3 * (IA_B3 - 1) * Math.exp((IA_B3 - 2) * lth)) /
        TRIPLE_POINT_T
      );
    }
    default: {
      const d = t - CELSIUS_ZERO + MA_IB;
      return (MA_IA * MA_IB) / (d * d);
    }
  }
}

/** ln(e_w/Pa) over liquid water for formulation `code` at T (K); no range check. */
export function lnWater(code: number, t: number): number {
  switch (code) {
    case CODE_MURPHY_KOOP:
      return lnWaterMurphyKoop(t);
    case CODE_SONNTAG:
      return SO_WA / t + SO_WB + t * (SO_WC + SO_WD * t) + SO_WE * Math.log(t);
    case CODE_GOFF_GRATCH: {
      const r = GG_TS / t;
      return (
        LN10 *
          (GG_WA * (r - 1) + GG_WB * Math.log10(r) +
            GG_WC * (10 ** (GG_WCK * (1 - 1 / r)) - 1) +
            GG_WD * (10 ** (GG_WDK * (r - 1)) - 1) + GG_WLOG_ES) +
        LN_HPA
      );
    }
    case CODE_IAPWS: {
      const tau = 1 - t / WATER_CRITICAL_T;
      const s = Math.sqrt(tau);
      const t3 = tau * tau * tau;
      const sum = IW_A1 * tau + IW_A2 * tau * s + IW_A3 * t3 + IW_A4 * t3 * s + IW_A5 * t3 * tau + IW_A6 * t3 * t3 * tau * s;
      return IW_LN_PC + (WATER_CRITICAL_T / t) * sum;
    }
    default: {
      const tc = t - CELSIUS_ZERO;
      return MA_WLN0 + (MA_WA * tc) / (tc + MA_WB);
    }
  }
}

/** d ln(e_w)/dT over liquid water, K⁻¹, for formulation `code`; analytic derivative of {@link lnWater}. */
export function dLnWater(code: number, t: number): number {
  switch (code) {
    case CODE_MURPHY_KOOP: {
      const lt = Math.log(t);
      const th = Math.tanh(MK_WK * (t - MK_WT));
      const b = MK_W4 + MK_W5 / t + MK_W6 * lt + MK_W7 * t;
      const db = -MK_W5 / (t * t) + MK_W6 / t + MK_W7;
      return -MK_W1 / (t * t) + MK_W2 / t + MK_W3 + MK_WK * (1 - th * th) * b + th * db;
    }
    case CODE_SONNTAG:
      return -SO_WA / (t * t) + SO_WC + 2 * SO_WD * t + SO_WE / t;
    case CODE_GOFF_GRATCH: {
      const r = GG_TS / t;
      return (
        LN10 *
        (-GG_WA * GG_TS / (t * t) - GG_WB / (t * LN10) +
          GG_WC * 10 ** (GG_WCK * (1 - 1 / r)) * LN10 * (-GG_WCK / GG_TS) +
          GG_WD * 10 ** (GG_WDK * (r - 1)) * LN10 * (-GG_WDK * GG_TS / (t * t)))
      );
    }
    case CODE_IAPWS: {
      const tau = 1 - t / WATER_CRITICAL_T;
      const s = Math.sqrt(tau);
      const t2 = tau * tau;
      const t3 = t2 * tau;
      const sum = IW_A1 * tau + IW_A2 * tau * s + IW_A3 * t3 + IW_A4 * t3 * s + IW_A5 * t3 * tau + IW_A6 * t3 * t3 * tau * s;
      const dsum = IW_A1 + 1.5 * IW_A2 * s + 3 * IW_A3 * t2 + 3.5 * IW_A4 * t2 * s + 4 * IW_A5 * t3 + 7.5 * IW_A6 * t3 * t3 * s;
      return -(WATER_CRITICAL_T / (t * t)) * sum - dsum / t;
    }
    default: {
      const d = t - CELSIUS_ZERO + MA_WB;
      return (MA_WA * MA_WB) / (d * d);
    }
  }
}
