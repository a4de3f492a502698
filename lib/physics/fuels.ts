/**
 * Fuels for the Schmidt–Appleman criterion: emission indices from composition (stoichiometry of
 * complete combustion) and lower heating values.
 *
 * @packageDocumentation
 */

import { CO2_PER_CARBON, OXYGEN_PER_CARBON, OXYGEN_PER_HYDROGEN, WATER_PER_HYDROGEN } from './constants.js';

/** A fuel as the criterion sees it. */
export interface Fuel {
  readonly name: string;
  /** Emission index of water vapour, kg H2O per kg fuel. */
  readonly eiH2O: number;
  /** Lower heating value Q, J kg⁻¹. */
  readonly lhvJPerKg: number;
  /** Hydrogen mass fraction x_H of the fuel (0…1), when known. */
  readonly hydrogenMassFraction?: number;
  /** Emission index of CO2, kg CO2 per kg fuel, when known. */
  readonly eiCO2?: number;
}

/** Names of the presets; the command line's `--fuel` contract. */
export type FuelPresetName = 'kerosene' | 'synthetic-kerosene' | 'hydrogen';

/**
 * Emission index of water vapour from the hydrogen mass fraction.
 * @param xH - hydrogen mass fraction of the fuel, kg kg⁻¹, in [0, 1]
 * @returns EI_H2O, kg kg⁻¹
 * @remarks EI_H2O = x_H · M(H2O)/(2 M(H)) ≈ 8.936 x_H: one water molecule per two hydrogen atoms,
 * complete combustion; atomic weights [CIAAW2021].
 * @throws RangeError when xH is outside [0, 1].
 */
export function emissionIndexH2O(xH: number): number {
  checkFraction('hydrogenMassFraction', xH);
  return xH * WATER_PER_HYDROGEN;
}

/**
 * Emission index of CO2 from the carbon mass fraction.
 * @param xC - carbon mass fraction of the fuel, kg kg⁻¹, in [0, 1]
 * @returns EI_CO2, kg kg⁻¹
 * @remarks EI_CO2 = x_C · M(CO2)/M(C) ≈ 3.664 x_C, complete combustion [CIAAW2021].
 * @throws RangeError when xC is outside [0, 1].
 */
export function emissionIndexCO2(xC: number): number {
  checkFraction('carbonMassFraction', xC);
  return xC * CO2_PER_CARBON;
}

/**
 * Oxygen consumed by complete combustion of one kg of fuel.
 * @param xH - hydrogen mass fraction, in [0, 1]
 * @param xC - carbon mass fraction, in [0, 1]
 * @returns kg O2 per kg fuel: x_C M(O2)/M(C) + x_H M(O)/(2 M(H)) [CIAAW2021]
 */
export function oxygenPerFuelMass(xH: number, xC: number): number {
  checkFraction('hydrogenMassFraction', xH);
  checkFraction('carbonMassFraction', xC);
  return xC * OXYGEN_PER_CARBON + xH * OXYGEN_PER_HYDROGEN;
}

function checkFraction(name: string, x: number): void {
  if (!(x >= 0 && x <= 1)) throw new RangeError(`${name} must be in [0, 1], got ${x}`);
}

function checkLhv(lhvMJPerKg: number): void {
  if (!(lhvMJPerKg > 0 && lhvMJPerKg < 1000)) throw new RangeError(`lhvMJPerKg must be in (0, 1000) MJ/kg, got ${lhvMJPerKg}`);
}

/**
 * A fuel from its composition.
 * @param spec.hydrogenMassFraction - x_H in [0, 1]
 * @param spec.carbonMassFraction - x_C in [0, 1] (default 1 − x_H: a pure hydrocarbon); x_H + x_C ≤ 1
 * @param spec.lhvMJPerKg - lower heating value, MJ kg⁻¹ (stored in J kg⁻¹)
 * @returns the fuel, with EI_H2O and EI_CO2 from {@link emissionIndexH2O} and {@link emissionIndexCO2}
 */
export function fuelFromComposition(spec: {
  name?: string;
  hydrogenMassFraction: number;
  carbonMassFraction?: number;
  lhvMJPerKg: number;
}): Fuel {
  const xH = spec.hydrogenMassFraction;
  checkFraction('hydrogenMassFraction', xH);
  const xC = spec.carbonMassFraction ?? 1 - xH;
  checkFraction('carbonMassFraction', xC);
  if (xH + xC > 1 + 1e-12) throw new RangeError(`hydrogenMassFraction + carbonMassFraction must be ≤ 1, got ${xH + xC}`);
  checkLhv(spec.lhvMJPerKg);
  return Object.freeze({
    name: spec.name ?? `custom (x_H = ${xH}, Q = ${spec.lhvMJPerKg} MJ/kg)`,
    eiH2O: emissionIndexH2O(xH),
    lhvJPerKg: spec.lhvMJPerKg * 1e6,
    hydrogenMassFraction: xH,
    eiCO2: emissionIndexCO2(xC),
  });
}

/**
 * A fuel from its water-vapour emission index and heating value.
 * @param spec.eiH2O - kg kg⁻¹, in (0, 10] (pure hydrogen gives 8.936)
 * @param spec.lhvMJPerKg - lower heating value, MJ kg⁻¹
 */
export function fuelFromEmissionIndex(spec: { name?: string; eiH2O: number; lhvMJPerKg: number }): Fuel {
  if (!(spec.eiH2O > 0 && spec.eiH2O <= 10)) throw new RangeError(`eiH2O must be in (0, 10] kg/kg, got ${spec.eiH2O}`);
  checkLhv(spec.lhvMJPerKg);
  return Object.freeze({
    name: spec.name ?? `custom (EI_H2O = ${spec.eiH2O}, Q = ${spec.lhvMJPerKg} MJ/kg)`,
    eiH2O: spec.eiH2O,
    lhvJPerKg: spec.lhvMJPerKg * 1e6,
    hydrogenMassFraction: spec.eiH2O / WATER_PER_HYDROGEN,
  });
}

/**
 * Fuel presets:
 * - `kerosene`: EI_H2O = 1.25 kg/kg, Q = 43.2 MJ/kg [Schumann1996]; x_H = 1.25/8.936 ≈ 0.140
 *   (derived); EI_CO2 = 3.16 kg/kg [CORSIA] [IPCC1999].
 * - `synthetic-kerosene`: x_H = 0.153, x_C = 0.847 (paraffinic synthetic kerosene; common practice,
 *   no source), Q = 44.0 MJ/kg (common practice, no source).
 * - `hydrogen`: liquid hydrogen, x_H = 1 → EI_H2O ≈ 8.936, no CO2, Q = 120 MJ/kg [NRC2004 Table H-2].
 */
export const FUEL_PRESETS: Readonly<Record<FuelPresetName, Fuel>> = Object.freeze({
  kerosene: Object.freeze({
    name: 'kerosene',
    eiH2O: 1.25,
    lhvJPerKg: 43.2e6,
    hydrogenMassFraction: 1.25 / WATER_PER_HYDROGEN,
    eiCO2: 3.16,
  }),
  'synthetic-kerosene': fuelFromComposition({ name: 'synthetic-kerosene', hydrogenMassFraction: 0.153, carbonMassFraction: 0.847, lhvMJPerKg: 44.0 }),
  hydrogen: fuelFromComposition({ name: 'hydrogen', hydrogenMassFraction: 1, carbonMassFraction: 0, lhvMJPerKg: 120 }),
});

/** Preset names, for listings and validation. */
export const FUEL_PRESET_NAMES: readonly FuelPresetName[] = Object.freeze(['kerosene', 'synthetic-kerosene', 'hydrogen'] as const);

/**
 * A preset by name.
 * @throws RangeError listing the valid names when `name` is not a preset.
 */
export function resolveFuel(name: string): Fuel {
  if ((FUEL_PRESET_NAMES as readonly string[]).includes(name)) return FUEL_PRESETS[name as FuelPresetName];
  throw new RangeError(`unknown fuel "${name}"; valid: ${FUEL_PRESET_NAMES.join(', ')}`);
}
