/**
 * The main job: open a file, evaluate every selected (time, pressure level) slice with the
 * products layer, and write per valid time the level GeoTIFFs, the column GeoTIFF and the summary
 * (JSON and CSV) into DIR/<input name>/<valid time>/.
 *
 * Streaming: one (time, level) slice of temperature and humidity is in memory at a time, plus the
 * compressed output bands. Each time folder is built under a temporary name beside its target and
 * renamed into place when complete, so the output folder is never half-written; a rerun replaces
 * it.
 */
import { mkdir, rename, rm, writeFile } from 'node:fs/promises';
import { basename, extname, join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { MissingQuantityError, OutputError, ParameterError } from '../errors.js';
import type { Field, GridDataset, HorizontalGrid, RhConvention, TimeCoordinate, WarningSink } from '../grid/types.js';
import { open } from '../open.js';
import type { CriterionParameters } from '../physics/index.js';
import { flightLevelFromPressure, prepareLevel, validateCriterionParameters } from '../physics/index.js';
import {
  COLUMN_BANDS,
  ColumnAccumulator,
  SummaryBuilder,
  cellWeights,
  heightProviderFor,
  humidityRecord,
  levelIndexOf,
  selectHumidity,
  selectTemperature,
  summaryParameters,
  summaryToCsv,
  timeIndexOf,
  type BoundingBox,
  type HumiditySelection,
  type Summary,
} from '../products/index.js';
import { openGeoTiffWriter, rasterLayout, writeGeoTiff, writeQuicklook, type RasterLayout, type RasterMetadata, type RasterProfile } from '../output/index.js';
import { regridToLatLon, type Regridder } from '../grid/regrid.js';
import { VERSION } from '../version.js';
import { parseIsoTime } from './probe.js';
import { defaultWorkerCount, inProcessEvaluator, workerPoolEvaluator, type EvaluatedLevel, type LevelArrays, type LevelEvaluator } from './level-evaluator.js';

/** Pressure levels to evaluate, in hPa: single values and inclusive ranges. */
export interface LevelSelection {
  readonly values: readonly number[];
  readonly ranges: readonly (readonly [number, number])[];
}

export interface MaskJobOptions {
  readonly input: string;
  readonly outDir: string;
  readonly levels?: LevelSelection;
  /** Valid times (ISO 8601) to evaluate; all when empty. */
  readonly times?: readonly string[];
  readonly criterion: CriterionParameters;
  readonly bbox?: BoundingBox;
  readonly quicklook?: boolean;
  readonly keepLongitude0To360?: boolean;
  readonly rhConvention?: RhConvention;
  readonly temperatureVariable?: string;
  readonly humidityVariable?: string;
  /**
   * Worker threads evaluating slices (0: on the calling thread). Default: both cores for large
   * jobs (≥ 4 million cells in all), none for small ones.
   */
  readonly workers?: number;
  /** Called after each (time, level) slice. */
  readonly progress?: (done: number, total: number, label: string) => void;
  readonly warn?: WarningSink;
}

export interface MaskJobResult {
  /** One folder per evaluated time coordinate. */
  readonly folders: readonly string[];
  readonly summaries: readonly Summary[];
  /** Decoding and method notes the user should see. */
  readonly notes: readonly string[];
}

/** File names of the outputs: a contract other tools rely on. */
export const OUTPUT_FILES = {
  rhi: 'rhi.tif',
  iceSupersaturated: 'ice-supersaturated.tif',
  contrailForming: 'contrail-forming.tif',
  persistentContrail: 'persistent-contrail.tif',
  formationMargin: 'formation-margin.tif',
  column: 'column.tif',
  summaryJson: 'summary.json',
  summaryCsv: 'summary.csv',
  quicklookDir: 'quicklook',
} as const;

const MASK_NODATA = 255;

export async function runMaskJob(options: MaskJobOptions): Promise<MaskJobResult> {
  validateCriterionParameters(options.criterion);
  if (options.workers !== undefined && !(Number.isInteger(options.workers) && options.workers >= 0 && options.workers <= 64)) {
    throw new ParameterError(`workers must be a whole number from 0 to 64, got ${options.workers}`, 'workers', { file: options.input });
  }
  const ds = await open(options.input, {
    variables: options.temperatureVariable ? { air_temperature: options.temperatureVariable } : undefined,
    rhConvention: options.rhConvention,
    warn: options.warn,
  });
  try {
    return await runOnDataset(ds, options);
  } finally {
    await ds.close();
  }
}

/** Levels (Pa) present in both fields and selected, by increasing pressure. */
export function selectLevels(t: Field, h: Field, sel: LevelSelection | undefined, file: string): number[] {
  const common = Array.from(t.levelsPa).filter((p) => levelIndexOf(h, p) >= 0);
  if (common.length === 0) {
    throw new MissingQuantityError(
      `${file}: temperature ${t.name} and humidity ${h.name} share no pressure level`,
      'pressure levels',
      [t.name, h.name],
      { file },
    );
  }
  const chosen =
    sel === undefined
      ? common
      : common.filter((p) => {
          const hPa = p / 100;
          return sel.values.some((v) => Math.abs(v - hPa) < 1e-3) || sel.ranges.some(([a, b]) => hPa >= a - 1e-9 && hPa <= b + 1e-9);
        });
  if (sel !== undefined) {
    for (const v of sel.values) {
      if (!common.some((p) => Math.abs(p / 100 - v) < 1e-3)) {
        throw new ParameterError(`${file}: no ${v} hPa level; levels: ${common.map((p) => p / 100).join(', ')} hPa`, 'levels', { file });
      }
    }
  }
  if (chosen.length === 0) {
    throw new ParameterError(`${file}: --levels selects none of the levels ${common.map((p) => p / 100).join(', ')} hPa`, 'levels', { file });
  }
  return chosen.sort((a, b) => a - b);
}

/** Time coordinates of T that humidity also has, filtered by the requested ISO times. */
export function selectTimes(t: Field, h: Field, requested: readonly string[], file: string): TimeCoordinate[] {
  const both = t.times.filter((c) => timeIndexOf(h, c) >= 0);
  if (both.length === 0) throw new MissingQuantityError(`${file}: temperature and humidity share no time`, 'time', [t.name, h.name], { file });
  if (requested.length === 0) return both;
  const out: TimeCoordinate[] = [];
  for (const r of requested) {
    const ms = parseIsoTime(r);
    const hits = both.filter((c) => (ms !== undefined && c.valid.epochMs !== undefined ? c.valid.epochMs === ms : c.valid.iso.startsWith(r)));
    if (hits.length === 0) {
      throw new ParameterError(`${file}: no valid time ${r}; times: ${both.map((c) => c.valid.iso).join(', ')}`, 'times', { file });
    }
    for (const c of hits) if (!out.includes(c)) out.push(c);
  }
  return out;
}

/** "20260304T0600Z" from a calendar date (model calendars keep their own date). */
export function compactTime(t: TimeCoordinate['valid']): string {
  const p = (n: number, w = 2) => String(n).padStart(w, '0');
  return `${p(t.year, 4)}${p(t.month)}${p(t.day)}T${p(t.hour)}${p(t.minute)}Z`;
}

/** Folder name of a time coordinate; reference time and member are added when they distinguish it. */
export function timeFolderName(c: TimeCoordinate, all: readonly TimeCoordinate[]): string {
  let name = compactTime(c.valid);
  const sameValid = all.filter((o) => o.valid.iso === c.valid.iso);
  if (sameValid.length > 1) {
    if (c.reference !== undefined && new Set(sameValid.map((o) => o.reference?.iso)).size > 1) name += `_ref${compactTime(c.reference)}`;
    if (c.member !== undefined && new Set(sameValid.map((o) => o.member)).size > 1) name += `_m${c.member}`;
  }
  return name;
}

function levelLabel(pPa: number): string {
  const hPa = Math.round((pPa / 100) * 1000) / 1000;
  return `${hPa} hPa (FL${String(Math.round(flightLevelFromPressure(pPa))).padStart(3, '0')})`;
}

function inputStem(path: string): string {
  const b = basename(path);
  const e = extname(b);
  return e.length > 0 && e.length < b.length ? b.slice(0, -e.length) : b;
}

interface LayerSpec {
  readonly file: string;
  readonly quantity: string;
  readonly units: string;
  readonly dtype: 'uint8' | 'float32';
  readonly kind: 'mask' | 'continuous';
  readonly pick: (a: LevelArrays) => Uint8Array | Float32Array;
}

const LAYERS: readonly LayerSpec[] = [
  { file: OUTPUT_FILES.rhi, quantity: 'relative humidity over ice', units: '%', dtype: 'float32', kind: 'continuous', pick: (w) => w.rhiPercent },
  { file: OUTPUT_FILES.iceSupersaturated, quantity: 'ice-supersaturated (RHi >= threshold)', units: '1', dtype: 'uint8', kind: 'mask', pick: (w) => w.iceSupersaturated },
  { file: OUTPUT_FILES.contrailForming, quantity: 'contrail-forming (Schmidt–Appleman criterion)', units: '1', dtype: 'uint8', kind: 'mask', pick: (w) => w.contrailForming },
  { file: OUTPUT_FILES.persistentContrail, quantity: 'persistent contrail (forming and ice-supersaturated, below the freezing temperature)', units: '1', dtype: 'uint8', kind: 'mask', pick: (w) => w.persistentContrail },
  { file: OUTPUT_FILES.formationMargin, quantity: 'formation margin T_LC - T', units: 'K', dtype: 'float32', kind: 'continuous', pick: (w) => w.formationMarginK },
];

async function runOnDataset(ds: GridDataset, options: MaskJobOptions): Promise<MaskJobResult> {
  const params = options.criterion;
  const temperature = selectTemperature(ds, options.temperatureVariable);
  const humidity = selectHumidity(ds, { rhConvention: options.rhConvention, variable: options.humidityVariable, saturation: params.saturation });
  if (humidity.field.grid.npoints !== temperature.grid.npoints || humidity.field.grid.kind !== temperature.grid.kind) {
    throw new ParameterError(
      `${ds.path}: temperature ${temperature.name} and humidity ${humidity.variable} are on different grids`,
      'grid',
      { file: ds.path },
    );
  }
  const grid: HorizontalGrid = temperature.grid;
  const levelsPa = selectLevels(temperature, humidity.field, options.levels, ds.path);
  const times = selectTimes(temperature, humidity.field, options.times ?? [], ds.path);
  const raster = rasterPlan(grid, options.keepLongitude0To360 ?? false);
  const weights = cellWeights(grid, options.bbox);
  const criteria = levelsPa.map((p) => prepareLevel(p, params));
  const workers = options.workers ?? defaultWorkerCount(grid.npoints * levelsPa.length * times.length);
  const evaluator: LevelEvaluator =
    workers > 0
      ? await workerPoolEvaluator(
          {
            path: ds.path,
            temperatureVariable: temperature.name,
            humidityVariable: humidity.variable,
            rhConvention: humidity.convention ?? options.rhConvention,
            params,
            bbox: options.bbox,
            levelsPa,
          },
          workers,
        )
      : inProcessEvaluator(temperature, humidity, params, weights, criteria);
  try {
    return await evaluateAll(ds, options, { humidity, grid, levelsPa, times, raster, evaluator });
  } finally {
    await evaluator.close();
  }
}

interface JobPlan {
  readonly humidity: HumiditySelection;
  readonly grid: HorizontalGrid;
  readonly levelsPa: number[];
  readonly times: TimeCoordinate[];
  readonly raster: RasterPlan;
  readonly evaluator: LevelEvaluator;
}

async function evaluateAll(ds: GridDataset, options: MaskJobOptions, plan: JobPlan): Promise<MaskJobResult> {
  const { humidity, grid, levelsPa, times, raster, evaluator } = plan;
  const params = options.criterion;
  const layout = raster.layout;
  const notes = [...ds.notes];
  const total = times.length * levelsPa.length;
  let done = 0;

  const root = join(options.outDir, inputStem(ds.path));
  try {
    await mkdir(root, { recursive: true });
  } catch (e) {
    throw new OutputError(`cannot create output folder ${root}: ${(e as Error).message}`, { file: root, cause: e });
  }

  const folders: string[] = [];
  const summaries: Summary[] = [];
  for (const time of times) {
    const folderName = timeFolderName(time, times);
    const target = join(root, folderName);
    const tmp = join(root, `.${folderName}.partial-${process.pid}-${randomBytes(3).toString('hex')}`);
    await mkdir(tmp, { recursive: true });
    try {
      const summary = new SummaryBuilder({
        input: ds.path,
        format: ds.format,
        parameters: summaryParameters(params, options.bbox),
        humidity: humidityRecord(humidity),
      });
      const fileItems = (extrapolated: boolean) => ({ ...datasetItems(ds, params, humidity.conversion, time, extrapolated, options), ...raster.items });
      const descriptions = levelsPa.map(levelLabel);
      const bandItems = levelsPa.map((p) => ({ pressure_hPa: String(p / 100), flight_level: String(Math.round(flightLevelFromPressure(p) * 10) / 10) }));
      const layerMetadata = (items: Record<string, string>, layer: LayerSpec): RasterMetadata => ({
        bandDescriptions: descriptions,
        bandItems,
        items: { ...items, quantity: layer.quantity, units: layer.units },
      });
      const opening = fileItems(false);
      // One band-by-band writer per layer, spooling its compressed chunks into the partial folder:
      // memory holds the slices in flight, not the outputs.
      const writers = LAYERS.map((layer) =>
        openGeoTiffWriter(join(tmp, layer.file), layerProfile(layout, levelsPa.length, layer.dtype, layer.kind), layerMetadata(opening, layer), {
          spoolDirectory: tmp,
        }),
      );
      const column = new ColumnAccumulator(grid.npoints, levelsPa);
      let extrapolated = false;
      const queue: Promise<EvaluatedLevel>[] = [];
      let asked = 0;
      try {
        for (let k = 0; k < levelsPa.length; k++) {
          while (asked < levelsPa.length && queue.length < evaluator.concurrency) {
            const p = evaluator.evaluate(time, levelsPa[asked], asked);
            p.catch(() => undefined); // awaited below, in order
            queue.push(p);
            asked++;
          }
          const { result: r, arrays } = await (queue.shift() as Promise<EvaluatedLevel>);
          extrapolated ||= r.saturationExtrapolated;
          summary.addLevel(time, r);
          column.addLevel(k, arrays.persistentContrail);
          for (let li = 0; li < LAYERS.length; li++) await writers[li].addBand(raster.toRaster(LAYERS[li].pick(arrays), LAYERS[li].kind));
          if (options.quicklook) await writeLevelQuicklooks(tmp, raster, arrays, levelsPa[k], time);
          options.progress?.(++done, total, `${time.valid.iso} ${levelsPa[k] / 100} hPa`);
        }
        const final = extrapolated ? fileItems(true) : opening;
        for (let li = 0; li < LAYERS.length; li++) await writers[li].finish(layerMetadata(final, LAYERS[li]));
      } catch (e) {
        await Promise.all(writers.map((w) => w.abort()));
        // Slices still in flight are settled before the folder is removed.
        await Promise.allSettled(queue);
        throw e;
      }
      const heights = heightProviderFor(ds, time, levelsPa, grid.npoints);
      const col = await column.finalize(heights);
      summary.setColumnHeightSource(time, col.heightSource);
      const built = summary.build();
      await writeGeoTiff(
        join(tmp, OUTPUT_FILES.column),
        layerProfile(layout, COLUMN_BANDS.length, 'float32', 'continuous'),
        COLUMN_BANDS.map((b) => raster.toRaster(col[b.key] as Float32Array, 'mask')),
        {
          bandDescriptions: COLUMN_BANDS.map((b) => b.description),
          bandItems: COLUMN_BANDS.map((b) => ({ name: b.name })),
          items: {
            ...fileItems(extrapolated),
            quantity: 'persistent-contrail layers per column',
            column_height_source: col.heightSource + (col.heightVariable ? ` (${col.heightVariable})` : ''),
            layer_rule: 'each level stands for the layer between the log-pressure midpoints to its neighbours',
          },
        },
      );
      await writeFile(join(tmp, OUTPUT_FILES.summaryJson), JSON.stringify(built, null, 2) + '\n');
      await writeFile(join(tmp, OUTPUT_FILES.summaryCsv), summaryToCsv(built));
      await replaceFolder(tmp, target);
      folders.push(target);
      summaries.push(built);
      if (extrapolated) notes.push(`${time.valid.iso}: the ${params.saturation} saturation formulation was used outside its fitted range (extrapolated); recorded in the outputs`);
    } catch (e) {
      await rm(tmp, { recursive: true, force: true });
      throw e;
    }
  }
  return { folders, summaries, notes: [...new Set(notes)] };
}

function datasetItems(
  ds: GridDataset,
  params: CriterionParameters,
  humidityConversion: string,
  time: TimeCoordinate,
  extrapolated: boolean,
  options: MaskJobOptions,
): Record<string, string> {
  return {
    valid_time: time.valid.iso,
    ...(time.reference ? { reference_time: time.reference.iso } : {}),
    ...(time.member !== undefined ? { member: String(time.member) } : {}),
    input_file: ds.path,
    input_format: ds.format,
    fuel: params.fuel.name,
    ei_h2o_kg_per_kg: String(params.fuel.eiH2O),
    lhv_MJ_per_kg: String(params.fuel.lhvJPerKg / 1e6),
    efficiency: String(params.efficiency),
    saturation_formulation: params.saturation,
    saturation_extrapolated: String(extrapolated),
    ice_threshold_percent: String(params.iceThresholdPercent),
    freezing_temperature_K: String(params.freezingTemperatureK),
    humidity_scale: String(params.humidityScale),
    humidity_cap: params.humidityScale === 1 ? 'none (scale off)' : 'scaled vapour pressure capped at water saturation',
    humidity_conversion: humidityConversion,
    ...(options.bbox ? { statistics_bbox: `${options.bbox.west},${options.bbox.south},${options.bbox.east},${options.bbox.north}` } : {}),
    software: `frostgrid ${VERSION}`,
    caution: 'for research and planning; not an operational flight-planning tool',
  };
}

function layerProfile(layout: RasterLayout, count: number, dtype: 'uint8' | 'float32', kind: 'mask' | 'continuous'): RasterProfile {
  return {
    width: layout.width,
    height: layout.height,
    count,
    dtype,
    crs: layout.crs,
    transform: layout.transform,
    nodata: dtype === 'uint8' ? MASK_NODATA : Number.NaN,
    compress: 'deflate',
    tiled: true,
    cog: true,
    overviewResampling: kind === 'mask' ? 'nearest' : 'average',
  };
}

/**
 * How slices become rasters: grids an affine transform describes are only reordered north-up;
 * Gaussian and rotated-pole grids are first regridded to a regular latitude–longitude grid,
 * nearest neighbour for masks (and the column summary, derived from masks), bilinear for
 * continuous fields, and the method is recorded in every file.
 */
interface RasterPlan {
  readonly layout: RasterLayout;
  toRaster(values: Float32Array | Uint8Array, kind: 'mask' | 'continuous'): Float32Array | Uint8Array;
  readonly items: Record<string, string>;
}

function rasterPlan(grid: HorizontalGrid, keepLongitude0To360: boolean): RasterPlan {
  if (grid.kind !== 'gaussian' && grid.kind !== 'rotated_ll') {
    const layout = rasterLayout(grid, { keepLongitude0To360 });
    return { layout, toRaster: (v) => layout.toRasterOrder(v as Float32Array), items: {} };
  }
  const nearest: Regridder = regridToLatLon(grid, 'nearest');
  const bilinear: Regridder = regridToLatLon(grid, 'bilinear');
  const layout = rasterLayout(nearest.target, { keepLongitude0To360 });
  const describe =
    grid.kind === 'gaussian'
      ? `${grid.reduced ? (grid.octahedral ? 'octahedral reduced' : 'reduced') : 'regular'} Gaussian N${grid.N}`
      : `rotated latitude-longitude (south pole ${grid.southPoleLat}, ${grid.southPoleLon})`;
  return {
    layout,
    toRaster(values, kind) {
      if (kind === 'mask') {
        // Nearest neighbour keeps the mask values (0, 1, 255) exactly.
        const f = nearest.apply(values);
        const out = values instanceof Uint8Array ? Uint8Array.from(f) : f;
        return layout.toRasterOrder(out as Float32Array);
      }
      return layout.toRasterOrder(bilinear.apply(values));
    },
    items: {
      regridding: `${describe} regridded to a regular ${nearest.target.dLat.toFixed(4)}° x ${nearest.target.dLon.toFixed(4)}° latitude-longitude grid: nearest neighbour for masks and the column summary, bilinear for RHi and the formation margin; statistics are computed on the native grid`,
    },
  };
}

async function writeLevelQuicklooks(dir: string, raster: RasterPlan, ws: LevelArrays, pPa: number, time: TimeCoordinate): Promise<void> {
  const layout = raster.layout;
  const qdir = join(dir, OUTPUT_FILES.quicklookDir);
  await mkdir(qdir, { recursive: true });
  const hPa = Math.round(pPa / 100);
  const base = { width: layout.width, height: layout.height, transform: layout.transform, crs: layout.crs };
  await writeQuicklook(join(qdir, `persistent-contrail-${hPa}hPa.png`), {
    ...base,
    values: raster.toRaster(ws.persistentContrail, 'mask'),
    kind: 'mask',
    title: `persistent contrail  ${levelLabel(pPa)}  ${time.valid.iso}`,
    nodata: MASK_NODATA,
  });
  await writeQuicklook(join(qdir, `rhi-${hPa}hPa.png`), {
    ...base,
    values: raster.toRaster(ws.rhiPercent, 'continuous'),
    kind: 'continuous',
    title: `RHi  ${levelLabel(pPa)}  ${time.valid.iso}`,
    units: '%',
    range: [0, 150],
  });
}

/** Moves a completed folder into place, replacing an older one. */
async function replaceFolder(tmp: string, target: string): Promise<void> {
  const old = `${target}.old-${process.pid}-${randomBytes(3).toString('hex')}`;
  let moved = false;
  try {
    try {
      await rename(target, old);
      moved = true;
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw e;
    }
    await rename(tmp, target);
  } catch (e) {
    if (moved) await rename(old, target).catch(() => undefined);
    throw new OutputError(`cannot move outputs into ${target}: ${(e as Error).message}`, { file: target, cause: e });
  }
  if (moved) await rm(old, { recursive: true, force: true });
}
