/**
 * Finding the field of a quantity in a decoded dataset: the user's explicit name first, then
 * recognised quantities (standard_name matches before short-name matches), on pressure levels
 * unless asked otherwise. Two candidates of the same rank are an AmbiguityError listing them.
 */
import { AmbiguityError, MissingQuantityError, ParameterError } from '../errors.js';
import type { Field, GridDataset, Quantity, RhConvention } from './types.js';

export interface FindFieldOptions {
  /** The variable to use, named explicitly (wins over recognition). */
  readonly variable?: string;
  /** Require pressure levels (default true). */
  readonly pressureLevels?: boolean;
}

function found(ds: GridDataset): string[] {
  return ds.fields.filter((f) => f.quantity !== undefined).map((f) => `${f.name} (${f.quantity})`);
}

function describeVertical(f: Field): string {
  const v = f.encoding.extra?.verticalAxis as { name?: string; standardName?: string; units?: string } | undefined;
  if (v === undefined) return 'it has no vertical axis';
  return `its vertical axis ${v.name} is not pressure (${[v.standardName, v.units && `units ${v.units}`].filter(Boolean).join(', ') || 'no pressure units'})`;
}

export function findField(ds: GridDataset, quantity: Quantity, options: FindFieldOptions = {}): Field {
  const needLevels = options.pressureLevels ?? true;
  if (options.variable !== undefined) {
    const f = ds.fields.find((x) => x.name === options.variable);
    if (f === undefined) {
      throw new MissingQuantityError(
        `${ds.path}: variable ${options.variable} (named for ${quantity}) is not a field of the file; fields: ${ds.fields.map((x) => x.name).join(', ') || 'none'}`,
        quantity,
        found(ds),
        { file: ds.path, variable: options.variable },
      );
    }
    if (needLevels && f.levelsPa.length === 0) {
      throw new MissingQuantityError(`${ds.path}: variable ${f.name} has no pressure levels: ${describeVertical(f)}`, quantity, found(ds), {
        file: ds.path,
        variable: f.name,
      });
    }
    return f;
  }
  const all = ds.fields.filter((f) => f.quantity === quantity);
  const candidates = needLevels ? all.filter((f) => f.levelsPa.length > 0) : all;
  if (candidates.length === 0) {
    if (all.length > 0) {
      const f = all[0];
      throw new MissingQuantityError(`${ds.path}: variable ${f.name} (${quantity}) has no pressure levels: ${describeVertical(f)}`, quantity, found(ds), {
        file: ds.path,
        variable: f.name,
      });
    }
    const list = found(ds);
    throw new MissingQuantityError(
      `${ds.path}: no ${quantity} variable found (recognised: ${list.length > 0 ? list.join(', ') : 'nothing'}); name it explicitly if it is there`,
      quantity,
      list,
      { file: ds.path },
    );
  }
  if (candidates.length === 1) return candidates[0];
  const byStandardName = candidates.filter((f) => f.attrs.standard_name === quantity);
  if (byStandardName.length === 1) return byStandardName[0];
  const names = candidates.map((f) => f.name);
  throw new AmbiguityError(`${ds.path}: ${names.length} variables could be ${quantity}: ${names.join(', ')}; name one explicitly`, names, {
    file: ds.path,
  });
}

export type HumidityQuantity = 'specific_humidity' | 'humidity_mixing_ratio' | 'relative_humidity' | 'dew_point_temperature';
/** Preference order of the humidity quantities. */
export const HUMIDITY_ORDER: readonly HumidityQuantity[] = Object.freeze(['specific_humidity', 'humidity_mixing_ratio', 'relative_humidity', 'dew_point_temperature'] as const);

export interface FindHumidityOptions {
  /** The humidity variable to use, named explicitly (any humidity quantity). */
  readonly variable?: string;
  /** Variables named explicitly, by quantity. */
  readonly variables?: Partial<Record<Quantity, string>>;
  /** The RH phase convention, when the file does not say. */
  readonly rhConvention?: RhConvention;
  readonly pressureLevels?: boolean;
}

/**
 * The humidity field to use, without deciding a relative humidity's phase convention: the named
 * variable (which must be a humidity), else specific humidity, else mixing ratio, else relative
 * humidity, else dew point — the first quantity with a field on pressure levels (unless levels
 * are not required); two fields of that quantity are an AmbiguityError as in findField.
 */
export function findHumidityField(ds: GridDataset, options: Omit<FindHumidityOptions, 'rhConvention'> = {}): { field: Field; quantity: HumidityQuantity } {
  const needLevels = options.pressureLevels ?? true;
  if (options.variable !== undefined) {
    const f = ds.fields.find((x) => x.name === options.variable);
    const quantity = HUMIDITY_ORDER.find((q) => q === f?.quantity);
    if (f !== undefined && quantity === undefined) {
      throw new MissingQuantityError(`${ds.path}: variable ${f.name} is not a humidity (it is ${f.quantity ?? 'unrecognised'})`, 'humidity', found(ds), {
        file: ds.path,
        variable: f.name,
      });
    }
    return { field: findField(ds, quantity ?? 'specific_humidity', { variable: options.variable, pressureLevels: needLevels }), quantity: quantity ?? 'specific_humidity' };
  }
  for (const q of HUMIDITY_ORDER) {
    const named = options.variables?.[q];
    if (named !== undefined) return { field: findField(ds, q, { variable: named, pressureLevels: needLevels }), quantity: q };
  }
  const present = HUMIDITY_ORDER.filter((q) => ds.fields.some((f) => f.quantity === q));
  const usable = present.find((q) => !needLevels || ds.fields.some((f) => f.quantity === q && f.levelsPa.length > 0));
  // With nothing usable, findField on the first quantity present says why (no pressure levels).
  const q = usable ?? present[0];
  if (q !== undefined) return { field: findField(ds, q, { pressureLevels: needLevels }), quantity: q };
  const list = found(ds);
  throw new MissingQuantityError(
    `${ds.path}: no humidity variable found (looked for ${HUMIDITY_ORDER.join(', ')}; recognised: ${list.length > 0 ? list.join(', ') : 'nothing'})`,
    'humidity',
    list,
    { file: ds.path },
  );
}

/**
 * The humidity field to use (findHumidityField), with a relative humidity's phase convention,
 * which must be known: from the file or from the user.
 */
export function findHumidity(ds: GridDataset, options: FindHumidityOptions = {}): { field: Field; quantity: HumidityQuantity; rhConvention?: RhConvention } {
  const { field, quantity } = findHumidityField(ds, options);
  if (quantity !== 'relative_humidity') return { field, quantity };
  const convention = options.rhConvention ?? field.rhConvention?.convention;
  if (convention === undefined) {
    throw new ParameterError(
      `${ds.path}: variable ${field.name} is relative humidity, and nothing in the file says over what phase (water, ice, ECMWF mixed or CMIP); name the convention with the rhConvention option`,
      'rhConvention',
      { file: ds.path, variable: field.name },
    );
  }
  return { field, quantity, rhConvention: convention };
}
