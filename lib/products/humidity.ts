/**
 * Choice of the humidity a dataset offers, and its conversion to vapour pressure.
 *
 * Preference order (the most direct route to e first):
 *  1. specific humidity q:  e = q·p / (ε + (1 − ε) q)
 *  2. mixing ratio r:       e = r·p / (ε + r)
 *  3. relative humidity RH: e = RH·e_sat,c(T), with the phase convention c the user names, else the
 *     one the field carries (a GRIB field from ECMWF, centre 98, is ECMWF's mixed phase); with
 *     neither, a {@link ParameterError} asks the user to name one — guessing the convention would
 *     change RHi by up to ~40 % at cruise temperatures;
 *  4. dew point T_d:        e = e_w(T_d).
 * (ε = 0.622; the formulas are those of the physics core, lib/physics/humidity.ts.)
 *
 * @packageDocumentation
 */
import { ParameterError } from '../errors.js';
import type { Field, GridDataset, RhConvention } from '../grid/types.js';
import {
  HUMIDITY_CONVENTIONS,
  vapourPressureFromDewPointArray,
  vapourPressureFromMixingRatioArray,
  vapourPressureFromRelativeHumidityArray,
  vapourPressureFromSpecificHumidityArray,
} from '../physics/index.js';
import type { SaturationFormulation } from '../physics/index.js';
import { HUMIDITY_ORDER, findHumidityField, type HumidityQuantity } from '../grid/select.js';

/** The humidity quantities frostgrid can use, by CF standard name. */
export type HumiditySourceKind = HumidityQuantity;

/** Preference order of {@link selectHumidity} (grid/select's order). */
export const HUMIDITY_PREFERENCE: readonly HumiditySourceKind[] = HUMIDITY_ORDER;

/** The humidity chosen for a run. */
export interface HumiditySelection {
  readonly source: HumiditySourceKind;
  /** The file's variable name. */
  readonly variable: string;
  readonly field: Field;
  /** Phase convention (relative humidity only). */
  readonly convention?: RhConvention;
  /** Where the convention came from: "user", or the field's own record ("GRIB2 parameter …"). */
  readonly conventionSource?: string;
  /** Human-readable conversion to vapour pressure, for the outputs. */
  readonly conversion: string;
}

/** JSON record of the selection for summaries. */
export interface HumidityRecord {
  readonly source: HumiditySourceKind;
  readonly variable: string;
  readonly convention?: RhConvention;
  readonly convention_source?: string;
  readonly conversion: string;
  /** Quantisation step of the stored humidity, SI; 0 for floating-point storage. */
  readonly quantization_step: number;
  readonly stored_type: string;
}

/** Options of {@link selectHumidity}. */
export interface HumidityOptions {
  /** Phase convention of a relative humidity, overriding the file's. */
  rhConvention?: RhConvention;
  /** Use this variable (file name) instead of choosing. */
  variable?: string;
  /** Saturation formulation (named in the conversion text). */
  saturation?: SaturationFormulation;
}

/** Checks a user-supplied RH convention name. */
export function parseRhConvention(text: string): RhConvention {
  if ((HUMIDITY_CONVENTIONS as readonly string[]).includes(text)) return text as RhConvention;
  throw new ParameterError(`unknown relative-humidity convention "${text}"; use one of ${HUMIDITY_CONVENTIONS.join(', ')}`, 'rh-convention');
}

/** True when the field's metadata say it comes from ECMWF (GRIB originating centre 98 / "ecmf"). */
function fromEcmwf(field: Field): boolean {
  const vals: unknown[] = [
    field.attrs['centre'],
    field.attrs['GRIB_centre'],
    field.attrs['originating_centre'],
    field.encoding.extra?.['centre'],
    field.encoding.extra?.['originatingCentre'],
  ];
  return vals.some((v) => v === 98 || v === '98' || v === 'ecmf');
}

/**
 * Chooses the humidity field of a dataset.
 * @param ds - the dataset
 * @param options - RH convention and/or variable named by the user
 * @throws MissingQuantityError when no humidity is present (or the named variable is absent);
 * AmbiguityError when several variables are the preferred quantity; ParameterError when a relative
 * humidity has no convention and the user named none.
 */
export function selectHumidity(ds: GridDataset, options: HumidityOptions = {}): HumiditySelection {
  const { field, quantity } = findHumidityField(ds, { variable: options.variable });
  const source: HumiditySourceKind = quantity;
  const f = options.saturation ?? 'murphy-koop';
  switch (source) {
    case 'specific_humidity':
      return { source, variable: field.name, field, conversion: 'e = q·p/(ε + (1 − ε)·q), ε = 0.622' };
    case 'humidity_mixing_ratio':
      return { source, variable: field.name, field, conversion: 'e = r·p/(ε + r), ε = 0.622' };
    case 'dew_point_temperature':
      return { source, variable: field.name, field, conversion: `e = e_w(T_d), ${f} saturation over water` };
    case 'relative_humidity': {
      let convention: RhConvention | undefined = options.rhConvention;
      let conventionSource = convention !== undefined ? 'user' : undefined;
      if (convention === undefined && field.rhConvention) {
        convention = field.rhConvention.convention;
        conventionSource = field.rhConvention.source;
      }
      if (convention === undefined && fromEcmwf(field)) {
        convention = 'ecmwf-mixed';
        conventionSource = 'GRIB originating centre 98 (ECMWF)';
      }
      if (convention === undefined) {
        throw new ParameterError(
          `${ds.path}: relative humidity ${field.name} has no stated phase convention; name one with --rh-convention ${HUMIDITY_CONVENTIONS.join('|')}`,
          'rh-convention',
          { file: ds.path, variable: field.name },
        );
      }
      const over =
        convention === 'water'
          ? `e_w(T) (${f})`
          : convention === 'ice'
            ? `e_i(T) (${f})`
            : convention === 'cmip'
              ? `e_w(T) above 273.15 K, e_i(T) at or below (${f})`
              : 'ECMWF IFS mixed-phase e_sat(T): water at T ≥ 273.16 K, ice at T ≤ 250.16 K, quadratic blend between';
      return { source, variable: field.name, field, convention, conventionSource, conversion: `e = RH·${over}` };
    }
  }
}

/** JSON record of a selection. */
export function humidityRecord(sel: HumiditySelection): HumidityRecord {
  return {
    source: sel.source,
    variable: sel.variable,
    ...(sel.convention !== undefined ? { convention: sel.convention, convention_source: sel.conventionSource } : {}),
    conversion: sel.conversion,
    quantization_step: sel.field.encoding.quantizationStep,
    stored_type: sel.field.encoding.storedType,
  };
}

/**
 * Converts one humidity slice to vapour pressure.
 * @param out - e, Pa (written; may be the same array as `humidity` only for q and r)
 * @param humidity - the slice as read (SI: kg kg⁻¹, fraction, K)
 * @param temperatureK - T, K (used for relative humidity)
 * @param pressurePa - the level's pressure, Pa
 * @param selection - from {@link selectHumidity}
 * @param saturation - saturation formulation for RH and dew point
 * @returns number of cells whose temperature (RH) or dew point lies outside the formulation's
 * range (NaN written)
 */
export function vapourPressureFromHumidity(
  out: Float32Array,
  humidity: Float32Array,
  temperatureK: Float32Array,
  pressurePa: number,
  selection: Pick<HumiditySelection, 'source' | 'convention'>,
  saturation: SaturationFormulation,
): number {
  switch (selection.source) {
    case 'specific_humidity':
      vapourPressureFromSpecificHumidityArray(out, humidity, pressurePa);
      return 0;
    case 'humidity_mixing_ratio':
      vapourPressureFromMixingRatioArray(out, humidity, pressurePa);
      return 0;
    case 'relative_humidity':
      if (selection.convention === undefined) throw new ParameterError('relative humidity needs a phase convention', 'rh-convention');
      return vapourPressureFromRelativeHumidityArray(out, humidity, temperatureK, selection.convention, saturation);
    case 'dew_point_temperature':
      return vapourPressureFromDewPointArray(out, humidity, saturation);
  }
}
