/**
 * The run summary (summary.json) and its CSV twin (summary.csv).
 *
 * JSON contract (keys never renamed; extra keys may be added):
 *
 * ```
 * { "input": "<file>",
 *   "parameters": { "fuel": {...}, "efficiency", "saturation", "ice_threshold_percent",
 *                   "freezing_temperature_K", "humidity_scale", "humidity_cap", "bbox" },
 *   "times": [ { "time": "<ISO valid time>",
 *                "levels": [ { "pressure_hPa", "flight_level", "valid_cells",
 *                              "ice_supersaturated": { "cells", "fraction", "area_km2" },
 *                              "contrail_forming":   { "cells", "fraction", "area_km2" },
 *                              "persistent_contrail":{ "cells", "fraction", "area_km2" } } ] } ] }
 * ```
 *
 * Extra keys: top level "format", "humidity" (source, variable, convention, conversion, step),
 * "area" (earth and rule), "column_height_source"; per time "reference_time", "step_hours",
 * "member", "column_height_source"; per level "valid_area_km2", "out_of_range_cells",
 * "humidity_out_of_range_cells", "capped_cells", "saturation_extrapolated",
 * "temperature_range_K", "mixing_line_slope_Pa_per_K", "threshold_temperature_K",
 * "rhi_uncertainty" (see uncertainty.ts). Levels are listed by increasing pressure, times in the
 * order they were added. `fraction` is null when a level has no valid cell; `flight_level` is the
 * unrounded ISA flight level (hundreds of feet).
 *
 * CSV: one row per time × level, a header line, comma-separated, no quoting needed (no field holds
 * a comma), empty for null. Columns, in order: {@link SUMMARY_CSV_COLUMNS}.
 *
 * @packageDocumentation
 */
import type { TimeCoordinate } from '../grid/types.js';
import { flightLevelFromPressure } from '../physics/index.js';
import type { CriterionParameters } from '../physics/index.js';
import type { BoundingBox } from './area.js';
import type { ColumnHeightSource } from './column.js';
import type { HumidityRecord } from './humidity.js';
import type { LevelResult } from './level.js';
import type { MaskStatistics } from './stats.js';
import type { RhiUncertainty } from './uncertainty.js';

/** Parameters as written in the summary. */
export interface SummaryParameters {
  readonly fuel: {
    readonly name: string;
    readonly ei_h2o_kg_per_kg: number;
    readonly lhv_MJ_per_kg: number;
    readonly hydrogen_mass_fraction?: number;
  };
  readonly efficiency: number;
  readonly saturation: string;
  readonly ice_threshold_percent: number;
  readonly freezing_temperature_K: number;
  readonly humidity_scale: number;
  /** What happens to F·e above water saturation. */
  readonly humidity_cap: string;
  /** [W, S, E, N] degrees, or null for the whole grid. */
  readonly bbox: readonly [number, number, number, number] | null;
}

/** One level entry. */
export interface SummaryLevel {
  readonly pressure_hPa: number;
  readonly flight_level: number;
  readonly valid_cells: number;
  readonly ice_supersaturated: MaskStatistics;
  readonly contrail_forming: MaskStatistics;
  readonly persistent_contrail: MaskStatistics;
  readonly valid_area_km2: number;
  readonly out_of_range_cells: number;
  readonly humidity_out_of_range_cells: number;
  readonly capped_cells: number;
  readonly saturation_extrapolated: boolean;
  readonly temperature_range_K: readonly [number, number] | null;
  readonly mixing_line_slope_Pa_per_K: number;
  readonly threshold_temperature_K: number;
  readonly rhi_uncertainty: RhiUncertainty;
}

/** One time entry. */
export interface SummaryTime {
  readonly time: string;
  readonly reference_time?: string;
  readonly step_hours?: number;
  readonly member?: number;
  readonly column_height_source?: ColumnHeightSource;
  readonly levels: SummaryLevel[];
}

/** The whole summary. */
export interface Summary {
  readonly input: string;
  readonly format?: string;
  readonly parameters: SummaryParameters;
  readonly humidity?: HumidityRecord;
  readonly area: { readonly earth: string; readonly rule: string };
  readonly column_height_source?: ColumnHeightSource;
  readonly times: SummaryTime[];
}

/** Summary form of the criterion parameters and box. */
export function summaryParameters(params: CriterionParameters, bbox?: BoundingBox): SummaryParameters {
  const fuel = params.fuel;
  return {
    fuel: {
      name: fuel.name,
      ei_h2o_kg_per_kg: fuel.eiH2O,
      lhv_MJ_per_kg: fuel.lhvJPerKg / 1e6,
      ...(fuel.hydrogenMassFraction !== undefined ? { hydrogen_mass_fraction: fuel.hydrogenMassFraction } : {}),
    },
    efficiency: params.efficiency,
    saturation: params.saturation,
    ice_threshold_percent: params.iceThresholdPercent,
    freezing_temperature_K: params.freezingTemperatureK,
    humidity_scale: params.humidityScale,
    humidity_cap: params.humidityScale === 1 ? 'none (scale off)' : 'scaled vapour pressure capped at water saturation (cells counted in capped_cells)',
    bbox: bbox ? [bbox.west, bbox.south, bbox.east, bbox.north] : null,
  };
}

/** Summary entry of one evaluated level. */
export function summaryLevel(r: LevelResult): SummaryLevel {
  const s = r.statistics;
  const [tMin, tMax] = r.temperatureRangeK;
  return {
    pressure_hPa: r.pressurePa / 100,
    flight_level: flightLevelFromPressure(r.pressurePa),
    valid_cells: s.validCells,
    ice_supersaturated: s.iceSupersaturated,
    contrail_forming: s.contrailForming,
    persistent_contrail: s.persistentContrail,
    valid_area_km2: s.validAreaKm2,
    out_of_range_cells: r.counts.outOfRange,
    humidity_out_of_range_cells: r.humidityOutOfRange,
    capped_cells: r.counts.cappedCells,
    saturation_extrapolated: r.saturationExtrapolated,
    temperature_range_K: tMin === tMin && tMax === tMax ? [tMin, tMax] : null,
    mixing_line_slope_Pa_per_K: r.criterion.mixingLineSlopePaPerK,
    threshold_temperature_K: r.criterion.thresholdTemperatureK,
    rhi_uncertainty: r.uncertainty,
  };
}

const timeKey = (t: TimeCoordinate): string => `${t.valid.iso}|${t.reference?.iso ?? ''}|${t.member ?? ''}`;

/**
 * Collects level results (in any order) into a {@link Summary}.
 */
export class SummaryBuilder {
  private readonly head: Omit<Summary, 'times'>;
  private readonly times = new Map<string, { entry: Omit<SummaryTime, 'levels'>; levels: SummaryLevel[] }>();

  constructor(init: {
    input: string;
    format?: string;
    parameters: SummaryParameters;
    humidity?: HumidityRecord;
    columnHeightSource?: ColumnHeightSource;
    areaEarth?: string;
  }) {
    this.head = {
      input: init.input,
      ...(init.format !== undefined ? { format: init.format } : {}),
      parameters: init.parameters,
      ...(init.humidity !== undefined ? { humidity: init.humidity } : {}),
      area: {
        earth: init.areaEarth ?? 'WGS84 ellipsoid',
        rule: 'cells centred on grid points, bounds at midpoints, pole rows clipped at ±90°; band areas via the authalic latitude',
      },
      ...(init.columnHeightSource !== undefined ? { column_height_source: init.columnHeightSource } : {}),
    };
  }

  /** Adds (or replaces) a time's column height source. */
  setColumnHeightSource(time: TimeCoordinate, source: ColumnHeightSource): void {
    const t = this.timeEntry(time);
    t.entry = { ...t.entry, column_height_source: source };
  }

  /** Adds one level of one time. */
  addLevel(time: TimeCoordinate, level: SummaryLevel | LevelResult): void {
    const entry = 'statistics' in level ? summaryLevel(level) : level;
    this.timeEntry(time).levels.push(entry);
  }

  private timeEntry(time: TimeCoordinate): { entry: Omit<SummaryTime, 'levels'>; levels: SummaryLevel[] } {
    const key = timeKey(time);
    let t = this.times.get(key);
    if (!t) {
      t = {
        entry: {
          time: time.valid.iso,
          ...(time.reference !== undefined ? { reference_time: time.reference.iso } : {}),
          ...(time.stepHours !== undefined ? { step_hours: time.stepHours } : {}),
          ...(time.member !== undefined ? { member: time.member } : {}),
        },
        levels: [],
      };
      this.times.set(key, t);
    }
    return t;
  }

  /** The summary object (levels sorted by increasing pressure). */
  build(): Summary {
    const times: SummaryTime[] = [];
    for (const { entry, levels } of this.times.values()) {
      times.push({ ...entry, levels: [...levels].sort((a, b) => a.pressure_hPa - b.pressure_hPa) });
    }
    return { ...this.head, times };
  }
}

/** Columns of the CSV twin, in order. */
export const SUMMARY_CSV_COLUMNS: readonly string[] = Object.freeze([
  'time',
  'reference_time',
  'member',
  'pressure_hPa',
  'flight_level',
  'valid_cells',
  'ice_supersaturated_cells',
  'ice_supersaturated_fraction',
  'ice_supersaturated_area_km2',
  'contrail_forming_cells',
  'contrail_forming_fraction',
  'contrail_forming_area_km2',
  'persistent_contrail_cells',
  'persistent_contrail_fraction',
  'persistent_contrail_area_km2',
  'rhi_uncertainty_max_percentage_points',
  'rhi_uncertainty_median_percentage_points',
  'cells_within_threshold_uncertainty',
]);

const cell = (v: string | number | null | undefined): string => (v === null || v === undefined ? '' : String(v));

/**
 * The CSV twin of a summary: header line plus one row per time × level, "\n" line ends.
 * Numbers are written in JavaScript's shortest round-trip form, so they equal the JSON values.
 */
export function summaryToCsv(summary: Summary): string {
  const lines = [SUMMARY_CSV_COLUMNS.join(',')];
  for (const t of summary.times) {
    for (const l of t.levels) {
      lines.push(
        [
          t.time,
          t.reference_time,
          t.member,
          l.pressure_hPa,
          l.flight_level,
          l.valid_cells,
          l.ice_supersaturated.cells,
          l.ice_supersaturated.fraction,
          l.ice_supersaturated.area_km2,
          l.contrail_forming.cells,
          l.contrail_forming.fraction,
          l.contrail_forming.area_km2,
          l.persistent_contrail.cells,
          l.persistent_contrail.fraction,
          l.persistent_contrail.area_km2,
          l.rhi_uncertainty?.max_percentage_points,
          l.rhi_uncertainty?.median_percentage_points,
          l.rhi_uncertainty?.cells_within_threshold_uncertainty,
        ]
          .map(cell)
          .join(','),
      );
    }
  }
  return lines.join('\n') + '\n';
}

/** summary.json text: two-space indented JSON with a final newline. */
export function summaryToJson(summary: Summary): string {
  return JSON.stringify(summary, null, 2) + '\n';
}
