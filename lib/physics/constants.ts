/**
 * Physical constants of the physics core, each with its source (keys refer to
 * docs/references/physics.md). Derived constants are computed from these, never retyped.
 *
 * @packageDocumentation
 */

/** Specific heat of dry air at constant pressure, J kg⁻¹ K⁻¹, as used in the Schmidt–Appleman criterion [Schumann1996]. */
export const CP_DRY_AIR = 1004;

/**
 * Ratio of the molar masses of water and dry air, M_w/M_d (dimensionless), rounded to 0.622 as in
 * [Schumann1996]. One constant for the whole core: it enters the mixing-line slope G and every
 * q ↔ e and r ↔ e conversion. The unrounded value 18.015268/28.96546 = 0.6219569 ([IAPWS95] molar mass of water, [CIPM2007] of dry air)
 * differs by 7e-5 relative (check-values §2), below the spread between saturation formulations.
 */
export const EPSILON = 0.622;

/** Standard acceleration of gravity, m s⁻², [ICAO7488] [ISO2533]. */
export const G0 = 9.80665;

/** Specific gas constant of dry air, J kg⁻¹ K⁻¹, [ICAO7488]. */
export const R_DRY_AIR = 287.05287;

/** ISA mean-sea-level temperature, K, [ICAO7488]. */
export const ISA_T0 = 288.15;

/** ISA mean-sea-level pressure, Pa, [ICAO7488]. */
export const ISA_P0 = 101325;

/** Earth radius used to relate geopotential and geometric altitude, m, [ICAO7488] [COESA1976]. */
export const EARTH_RADIUS_ISA = 6356766;

/** One international foot, m (exact by definition, international yard and pound agreement 1959). */
export const FOOT = 0.3048;

/** Triple point of water: temperature, K [IAPWS-R14-08]. */
export const TRIPLE_POINT_T = 273.16;

/** Triple point of water: pressure, Pa [IAPWS-R14-08]. */
export const TRIPLE_POINT_P = 611.657;

/** Critical temperature of water, K [IAPWS-SAT92] [IAPWS95]. */
export const WATER_CRITICAL_T = 647.096;

/** Critical pressure of water, Pa [IAPWS-SAT92] [IAPWS95]. */
export const WATER_CRITICAL_P = 22.064e6;

/** 0 °C in kelvin (exact by definition of the Celsius scale). */
export const CELSIUS_ZERO = 273.15;

/** Standard atomic weight of hydrogen, conventional value, g mol⁻¹ [CIAAW2021]. */
export const ATOMIC_MASS_H = 1.008;

/** Standard atomic weight of carbon, conventional value, g mol⁻¹ [CIAAW2021]. */
export const ATOMIC_MASS_C = 12.011;

/** Standard atomic weight of oxygen, conventional value, g mol⁻¹ [CIAAW2021]. */
export const ATOMIC_MASS_O = 15.999;

/** Molar mass of H2O, g mol⁻¹ (derived: 2 H + O). */
export const MOLAR_MASS_H2O = 2 * ATOMIC_MASS_H + ATOMIC_MASS_O;

/** Molar mass of CO2, g mol⁻¹ (derived: C + 2 O). */
export const MOLAR_MASS_CO2 = ATOMIC_MASS_C + 2 * ATOMIC_MASS_O;

/** Molar mass of O2, g mol⁻¹ (derived: 2 O). */
export const MOLAR_MASS_O2 = 2 * ATOMIC_MASS_O;

/** kg of H2O formed per kg of hydrogen burnt, M(H2O)/(2 M(H)) ≈ 8.936 (derived). */
export const WATER_PER_HYDROGEN = MOLAR_MASS_H2O / (2 * ATOMIC_MASS_H);

/** kg of CO2 formed per kg of carbon burnt, M(CO2)/M(C) ≈ 3.664 (derived). */
export const CO2_PER_CARBON = MOLAR_MASS_CO2 / ATOMIC_MASS_C;

/** kg of O2 consumed per kg of carbon burnt to CO2, M(O2)/M(C) (derived). */
export const OXYGEN_PER_CARBON = MOLAR_MASS_O2 / ATOMIC_MASS_C;

/** kg of O2 consumed per kg of hydrogen burnt to H2O, M(O)/(2 M(H)) (derived). */
export const OXYGEN_PER_HYDROGEN = ATOMIC_MASS_O / (2 * ATOMIC_MASS_H);
