/**
 * Outside references shared by the physics tests: the npm package psychrolib (ASHRAE Handbook –
 * Fundamentals 2017 ch. 1 eqs. 5–6, Hyland–Wexler) and the points generated with python3-iapws and
 * scipy by data-samples/physics/make-reference.py (committed as reference.json).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

/** The part of psychrolib 1.1.1 the tests use (the package ships no types). */
export interface Psychrolib {
  readonly SI: number;
  SetUnitSystem(units: number): void;
  /** Saturation vapour pressure, Pa, from dry-bulb temperature in °C (SI); over ice at ≤ 0.01 °C. */
  GetSatVapPres(tC: number): number;
  /** Dew point in °C (over ice below 0.01 °C, i.e. a frost point) from dry-bulb °C and vapour pressure Pa; Newton to 0.001 °C. */
  GetTDewPointFromVapPres(tDryC: number, vapPresPa: number): number;
}

const require = createRequire(import.meta.url);

/** psychrolib in SI units. */
export function loadPsychrolib(): Psychrolib {
  const lib = require('psychrolib') as Psychrolib;
  lib.SetUnitSystem(lib.SI);
  return lib;
}

export interface PressurePoint {
  tK: number;
  pPa: number;
}

export interface CriterionPoint {
  fuel: string;
  eiH2O: number;
  lhvJPerKg: number;
  pPa: number;
  efficiency: number;
  saturation: 'murphy-koop' | 'sonntag';
  G: number;
  tlmK: number;
  tlcK: Record<string, number>;
}

export interface ReferenceData {
  versions: Record<string, string>;
  iapwsSublimation: PressurePoint[];
  iapwsAuxiliary: PressurePoint[];
  iapws95Saturation: PressurePoint[];
  criterion: CriterionPoint[];
}

/** data-samples/physics/reference.json. */
export const REFERENCE: ReferenceData = JSON.parse(
  readFileSync(new URL('../../data-samples/physics/reference.json', import.meta.url), 'utf8'),
) as ReferenceData;

/** |actual/expected − 1| ≤ rtol, with a readable failure. */
export function relErr(actual: number, expected: number): number {
  return Math.abs(actual / expected - 1);
}
