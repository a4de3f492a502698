/**
 * Evaluation of one (time, pressure level): read T and humidity, convert the humidity to vapour
 * pressure, run the physics kernel (RHi, ice-supersaturated, contrail-forming and persistent-
 * contrail masks, formation margin), and derive the level's statistics and RHi uncertainty.
 *
 * A {@link LevelWorkspace} holds every per-cell buffer for one grid size and is reused level after
 * level (one per worker), so evaluation allocates nothing per level beyond small records.
 *
 * @packageDocumentation
 */
import { MissingQuantityError, ParameterError } from '../errors.js';
import type { Field, GridDataset, TimeCoordinate } from '../grid/types.js';
import { findField } from '../grid/select.js';
import { evaluateLevel, isExtrapolated, prepareLevel } from '../physics/index.js';
import type { CriterionParameters, LevelCounts, LevelCriterion } from '../physics/index.js';
import { vapourPressureFromHumidity, type HumiditySelection } from './humidity.js';
import { levelStatistics, type CellWeights, type LevelStatistics } from './stats.js';
import { rhiUncertainty, type RhiUncertainty } from './uncertainty.js';

/** Per-cell buffers for one grid size, reused across levels. */
export class LevelWorkspace {
  readonly npoints: number;
  /** Temperature slice, K. */
  readonly temperatureK: Float32Array;
  /** Humidity slice as read, SI. */
  readonly humidity: Float32Array;
  /** Vapour pressure, Pa. */
  readonly vapourPressurePa: Float32Array;
  /** Kernel outputs. */
  readonly rhiPercent: Float32Array;
  readonly iceSupersaturated: Uint8Array;
  readonly contrailForming: Uint8Array;
  readonly persistentContrail: Uint8Array;
  readonly formationMarginK: Float32Array;
  /** Scratch for the uncertainty medians. */
  readonly scratch: { absolute: Float32Array; relative: Float32Array };

  constructor(npoints: number) {
    if (!(Number.isInteger(npoints) && npoints > 0)) throw new ParameterError(`grid point count ${npoints} is not a positive integer`, 'grid');
    this.npoints = npoints;
    this.temperatureK = new Float32Array(npoints);
    this.humidity = new Float32Array(npoints);
    this.vapourPressurePa = new Float32Array(npoints);
    this.rhiPercent = new Float32Array(npoints);
    this.iceSupersaturated = new Uint8Array(npoints);
    this.contrailForming = new Uint8Array(npoints);
    this.persistentContrail = new Uint8Array(npoints);
    this.formationMarginK = new Float32Array(npoints);
    this.scratch = { absolute: new Float32Array(npoints), relative: new Float32Array(npoints) };
  }
}

/** What one level's evaluation reports besides the arrays left in the workspace. */
export interface LevelResult {
  readonly pressurePa: number;
  readonly criterion: LevelCriterion;
  readonly counts: LevelCounts;
  /** Cells whose humidity could not be converted (dew point or T outside the formulation's range). */
  readonly humidityOutOfRange: number;
  /** Lowest and highest valid temperature on the level, K (NaN without valid cells). */
  readonly temperatureRangeK: readonly [number, number];
  /** True when some valid temperature lies outside the formulation's fitted range for ice or water. */
  readonly saturationExtrapolated: boolean;
  readonly statistics: LevelStatistics;
  readonly uncertainty: RhiUncertainty;
}

/**
 * Runs the kernel on the slices already in the workspace (`temperatureK`, `humidity`) and derives
 * statistics and uncertainty. The masks, RHi and formation margin stay in the workspace until the
 * next call.
 * @param ws - workspace holding the slices
 * @param pressurePa - the level's pressure, Pa
 * @param humidity - the humidity selection (quantity, convention, field encoding)
 * @param params - criterion parameters
 * @param weights - cell areas (m²) and optional box mask
 * @param criterion - the level prepared with {@link prepareLevel} for these params (prepared here when omitted)
 */
export function evaluateLevelInWorkspace(
  ws: LevelWorkspace,
  pressurePa: number,
  humidity: Pick<HumiditySelection, 'source' | 'convention'> & { field: { encoding: { quantizationStep: number } } },
  params: CriterionParameters,
  weights: CellWeights,
  criterion: LevelCriterion = prepareLevel(pressurePa, params),
): LevelResult {
  if (weights.areaM2.length !== ws.npoints) throw new ParameterError('cell weights and workspace differ in size', 'grid');
  const humidityOutOfRange = vapourPressureFromHumidity(ws.vapourPressurePa, ws.humidity, ws.temperatureK, pressurePa, humidity, params.saturation);
  const counts = evaluateLevel(ws.temperatureK, ws.vapourPressurePa, criterion, params, {
    rhiPercent: ws.rhiPercent,
    iceSupersaturated: ws.iceSupersaturated,
    contrailForming: ws.contrailForming,
    persistentContrail: ws.persistentContrail,
    formationMarginK: ws.formationMarginK,
  });
  let tMin = Infinity;
  let tMax = -Infinity;
  const t = ws.temperatureK;
  const m = ws.iceSupersaturated;
  for (let i = 0; i < t.length; i++) {
    if (m[i] === 255) continue;
    const v = t[i];
    if (v < tMin) tMin = v;
    if (v > tMax) tMax = v;
  }
  const anyValid = tMin <= tMax;
  const saturationExtrapolated =
    anyValid && (isExtrapolated(params.saturation, 'ice', tMin, tMax) || isExtrapolated(params.saturation, 'water', tMin, tMax));
  const statistics = levelStatistics(ws, weights);
  const uncertainty = rhiUncertainty({
    quantity: humidity.source,
    step: humidity.field.encoding.quantizationStep,
    humidity: ws.humidity,
    temperatureK: ws.temperatureK,
    vapourPressurePa: ws.vapourPressurePa,
    rhiPercent: ws.rhiPercent,
    convention: humidity.convention,
    saturation: params.saturation,
    iceThresholdPercent: params.iceThresholdPercent,
    humidityScale: params.humidityScale,
    inside: weights.inside,
    scratch: ws.scratch,
  });
  return {
    pressurePa,
    criterion,
    counts,
    humidityOutOfRange,
    temperatureRangeK: anyValid ? [tMin, tMax] : [NaN, NaN],
    saturationExtrapolated,
    statistics,
    uncertainty,
  };
}

const samePressure = (a: number, b: number): boolean => Math.abs(a - b) <= 1e-6 * Math.max(Math.abs(a), Math.abs(b));

/** Index of a pressure in a field's levels, or −1. */
export function levelIndexOf(field: Field, pressurePa: number): number {
  for (let k = 0; k < field.levelsPa.length; k++) if (samePressure(field.levelsPa[k], pressurePa)) return k;
  return -1;
}

/** Index of a time coordinate (valid time, reference time and member) in a field's times, or −1. */
export function timeIndexOf(field: Field, time: TimeCoordinate): number {
  return field.times.findIndex((c) => c.valid.iso === time.valid.iso && c.reference?.iso === time.reference?.iso && c.member === time.member);
}

/**
 * The air temperature field on pressure levels (grid/select findField): the named variable, else
 * the one recognised field; several are an AmbiguityError unless one alone has the standard name.
 */
export function selectTemperature(ds: GridDataset, variable?: string): Field {
  return findField(ds, 'air_temperature', { variable });
}

/**
 * Reads T and humidity of one (time, level) into the workspace and evaluates it.
 * @param ws - workspace of the grid's size
 * @param temperature - the temperature field
 * @param humidity - the humidity selection (its field must share T's grid)
 * @param time - time coordinate (matched in both fields)
 * @param pressurePa - level pressure, Pa (matched in both fields)
 * @throws MissingQuantityError when the humidity lacks the time or level; ParameterError on grid mismatch
 */
export async function evaluateFieldLevel(
  ws: LevelWorkspace,
  temperature: Field,
  humidity: HumiditySelection,
  time: TimeCoordinate,
  pressurePa: number,
  params: CriterionParameters,
  weights: CellWeights,
  criterion?: LevelCriterion,
): Promise<LevelResult> {
  if (temperature.grid.npoints !== ws.npoints || humidity.field.grid.npoints !== ws.npoints) {
    throw new ParameterError(
      `temperature ${temperature.name} (${temperature.grid.npoints} points) and humidity ${humidity.variable} (${humidity.field.grid.npoints} points) are not on one grid`,
      'grid',
    );
  }
  const tt = timeIndexOf(temperature, time);
  const tk = levelIndexOf(temperature, pressurePa);
  const ht = timeIndexOf(humidity.field, time);
  const hk = levelIndexOf(humidity.field, pressurePa);
  if (tt < 0 || tk < 0) {
    throw new MissingQuantityError(`temperature ${temperature.name} has no ${pressurePa / 100} hPa at ${time.valid.iso}`, 'air_temperature', [temperature.name]);
  }
  if (ht < 0 || hk < 0) {
    throw new MissingQuantityError(`humidity ${humidity.variable} has no ${pressurePa / 100} hPa at ${time.valid.iso}`, humidity.source, [humidity.variable]);
  }
  const tv = await temperature.readSlice(tt, tk, ws.temperatureK);
  if (tv !== ws.temperatureK) ws.temperatureK.set(tv);
  const hv = await humidity.field.readSlice(ht, hk, ws.humidity);
  if (hv !== ws.humidity) ws.humidity.set(hv);
  return evaluateLevelInWorkspace(ws, pressurePa, humidity, params, weights, criterion ?? prepareLevel(pressurePa, params));
}
