/**
 * Column products of one valid time: per horizontal cell, how many levels hold persistent
 * contrails, where the persistent layers start and end (pressure and flight level) and how deep
 * they are (metres).
 *
 * Layer rule. Each evaluated level stands for the layer between the log-pressure midpoints to its
 * neighbouring evaluated levels, √(p_k·p_k±1). The outermost levels' outer bounds are mirrored in
 * log pressure, so their layers are symmetric in ln p about the level: the top level's upper bound
 * is p_top·√(p_top/p_next), the bottom level's lower bound p_bot·√(p_bot/p_prev). A single flagged
 * level therefore has a depth. With only one level evaluated there is no spacing: bounds collapse
 * to the level and the depth is NaN.
 *
 * Outputs (float32, the grid's point count each):
 *  - count: number of flagged levels (0 where none);
 *  - base_hPa / top_hPa: the lower (highest-pressure) bound of the lowest flagged layer and the
 *    upper (lowest-pressure) bound of the highest flagged layer;
 *  - base_FL / top_FL: the same bounds as flight levels (ISA pressure altitude / 100 ft);
 *  - depth_m: the summed thickness of the flagged layers (gaps between separate layers excluded).
 * base/top/depth are NaN where no level is flagged; every output is NaN where any level of the
 * column is missing (mask 255).
 *
 * Heights. With geopotential (z / g0, g0 = 9.80665 m s⁻²) or geopotential height in the file, the
 * layer bounds' heights are interpolated linearly in ln p between the two levels (at a log-midpoint
 * that is the mean of the two heights) and extrapolated linearly beyond the outer levels, so the
 * thickness of level k is (Z_k−1 − Z_k+1)/2 inside the column and Z_top − Z_next, Z_prev − Z_bot at
 * the ends (geopotential metres). Otherwise the thickness is the ISA pressure-altitude difference of
 * the bounds (ICAO Doc 7488). The output records which.
 *
 * Levels may be added in any order; the accumulator keeps, per cell, the count, the ranks of the
 * lowest and highest flagged levels, an ISA depth sum and one bit per level (memory ≈ cells ×
 * (15 + levels/8) bytes). Geopotential depths are
 * formed in {@link ColumnAccumulator.finalize}, which reads the heights one level at a time.
 *
 * @packageDocumentation
 */
import { MissingQuantityError, ParameterError } from '../errors.js';
import type { Field, GridDataset, TimeCoordinate } from '../grid/types.js';
import { flightLevelFromPressure, geopotentialHeightFromGeopotentialArray, isaAltitudeFromPressure } from '../physics/index.js';
import { MASK_MISSING } from './stats.js';

/** Where column depths come from. */
export type ColumnHeightSource = 'geopotential' | 'geopotential_height' | 'isa_pressure_altitude';

/** Layer bounds of the evaluated levels, in the order the levels were given. */
export interface LayerBounds {
  /** Upper (lower-pressure) bound of each level's layer, Pa. */
  readonly upperPa: Float64Array;
  /** Lower (higher-pressure) bound of each level's layer, Pa. */
  readonly lowerPa: Float64Array;
  /** Position of each level in increasing-pressure order (0 = top level). */
  readonly rank: Int32Array;
  /** Level indices sorted by increasing pressure. */
  readonly order: Int32Array;
}

/**
 * Layer bounds by the log-midpoint rule (see the module description).
 * @param levelsPa - pressures of the evaluated levels, Pa, any order, distinct and positive
 * @throws ParameterError on duplicate or non-positive pressures
 */
export function layerBounds(levelsPa: ArrayLike<number>): LayerBounds {
  const n = levelsPa.length;
  const order = Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => levelsPa[a] - levelsPa[b]);
  const rank = new Int32Array(n);
  for (let s = 0; s < n; s++) rank[order[s]] = s;
  for (let s = 0; s < n; s++) {
    const p = levelsPa[order[s]];
    if (!(p > 0) || !Number.isFinite(p)) throw new ParameterError(`level pressure ${p} Pa is not a positive number`, 'levels');
    if (s > 0 && p === levelsPa[order[s - 1]]) throw new ParameterError(`level ${p / 100} hPa is given twice`, 'levels');
  }
  const upperPa = new Float64Array(n);
  const lowerPa = new Float64Array(n);
  for (let s = 0; s < n; s++) {
    const k = order[s];
    const p = levelsPa[k];
    if (n === 1) {
      upperPa[k] = p;
      lowerPa[k] = p;
      continue;
    }
    const above = s > 0 ? levelsPa[order[s - 1]] : undefined;
    const below = s < n - 1 ? levelsPa[order[s + 1]] : undefined;
    lowerPa[k] = below !== undefined ? Math.sqrt(p * below) : p * Math.sqrt(p / (above as number));
    upperPa[k] = above !== undefined ? Math.sqrt(p * above) : p * Math.sqrt(p / (below as number));
  }
  return { upperPa, lowerPa, rank, order };
}

/** ISA thickness (m) of each level's layer: H(upper bound) − H(lower bound); NaN with one level. */
export function isaLayerThickness(bounds: LayerBounds): Float64Array {
  const n = bounds.upperPa.length;
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    out[k] = n === 1 ? NaN : isaAltitudeFromPressure(bounds.upperPa[k]) - isaAltitudeFromPressure(bounds.lowerPa[k]);
  }
  return out;
}

/**
 * Reads geopotential height (m) of one evaluated level (index into the accumulator's levels) for
 * the accumulator's time.
 */
export interface HeightProvider {
  readonly source: 'geopotential' | 'geopotential_height';
  /** Variable the heights come from. */
  readonly variable: string;
  read(levelIndex: number, out: Float32Array): Promise<Float32Array>;
}

/** Column outputs of one time (float32, grid point count each; NaN as documented). */
export interface ColumnProducts {
  readonly count: Float32Array;
  readonly baseHPa: Float32Array;
  readonly topHPa: Float32Array;
  readonly baseFL: Float32Array;
  readonly topFL: Float32Array;
  readonly depthM: Float32Array;
  readonly heightSource: ColumnHeightSource;
  /** Variable the heights came from, when not ISA. */
  readonly heightVariable?: string;
}

/** Band names and descriptions for writing {@link ColumnProducts} (in band order). */
export const COLUMN_BANDS: readonly { key: keyof ColumnProducts; name: string; description: string }[] = Object.freeze([
  { key: 'count', name: 'count', description: 'number of persistent-contrail levels' },
  { key: 'baseHPa', name: 'base_hPa', description: 'base of the persistent-contrail layers, hPa (lower bound of the lowest flagged layer)' },
  { key: 'topHPa', name: 'top_hPa', description: 'top of the persistent-contrail layers, hPa (upper bound of the highest flagged layer)' },
  { key: 'baseFL', name: 'base_FL', description: 'base of the persistent-contrail layers, flight level (ISA pressure altitude / 100 ft)' },
  { key: 'topFL', name: 'top_FL', description: 'top of the persistent-contrail layers, flight level (ISA pressure altitude / 100 ft)' },
  { key: 'depthM', name: 'depth_m', description: 'summed depth of the persistent-contrail layers, m' },
]);

/**
 * Per-column accumulation of a persistent-contrail mask over the levels of one time.
 *
 * Usage: `const acc = new ColumnAccumulator(grid.npoints, levelsPa)`; `acc.addLevel(k, mask)` for
 * every level k (any order); `await acc.finalize(heights?)`.
 */
export class ColumnAccumulator {
  readonly npoints: number;
  readonly levelsPa: Float64Array;
  readonly bounds: LayerBounds;
  private readonly isaThickness: Float64Array;
  private readonly count: Uint16Array;
  private readonly missing: Uint8Array;
  /** Rank (position by increasing pressure) of the lowest and highest flagged level; −1 none. */
  private readonly baseRank: Int16Array;
  private readonly topRank: Int16Array;
  private readonly isaDepth: Float64Array;
  private readonly bits: Uint8Array;
  private readonly bytesPerCell: number;
  private readonly added: Uint8Array;

  constructor(npoints: number, levelsPa: ArrayLike<number>) {
    if (levelsPa.length === 0) throw new ParameterError('a column needs at least one level', 'levels');
    if (levelsPa.length > 32767) throw new ParameterError('too many levels', 'levels');
    this.npoints = npoints;
    this.levelsPa = Float64Array.from(levelsPa);
    this.bounds = layerBounds(this.levelsPa);
    this.isaThickness = isaLayerThickness(this.bounds);
    this.count = new Uint16Array(npoints);
    this.missing = new Uint8Array(npoints);
    this.baseRank = new Int16Array(npoints).fill(-1);
    this.topRank = new Int16Array(npoints).fill(-1);
    this.isaDepth = new Float64Array(npoints);
    this.bytesPerCell = Math.ceil(levelsPa.length / 8);
    this.bits = new Uint8Array(npoints * this.bytesPerCell);
    this.added = new Uint8Array(levelsPa.length);
  }

  /**
   * Adds one level's persistent-contrail mask (0, 1, 255 = missing).
   * @param levelIndex - index into the constructor's levelsPa
   * @throws ParameterError for a bad index, a level added twice, or a wrong mask length
   */
  addLevel(levelIndex: number, persistent: Uint8Array): void {
    if (!(levelIndex >= 0 && levelIndex < this.levelsPa.length) || !Number.isInteger(levelIndex)) {
      throw new ParameterError(`level index ${levelIndex} is outside 0..${this.levelsPa.length - 1}`, 'levels');
    }
    if (this.added[levelIndex]) throw new ParameterError(`level ${this.levelsPa[levelIndex] / 100} hPa was added twice`, 'levels');
    if (persistent.length !== this.npoints) {
      throw new ParameterError(`mask has ${persistent.length} cells, the grid ${this.npoints}`, 'mask');
    }
    this.added[levelIndex] = 1;
    const rank = this.bounds.rank[levelIndex];
    const thick = this.isaThickness[levelIndex];
    const byte = levelIndex >> 3;
    const bit = 1 << (levelIndex & 7);
    const bpc = this.bytesPerCell;
    const { count, missing, baseRank, topRank, isaDepth, bits } = this;
    for (let i = 0; i < persistent.length; i++) {
      const m = persistent[i];
      if (m === 0) continue;
      if (m === MASK_MISSING) {
        missing[i] = 1;
        continue;
      }
      count[i]++;
      bits[i * bpc + byte] |= bit;
      if (baseRank[i] < rank) baseRank[i] = rank;
      if (topRank[i] < 0 || topRank[i] > rank) topRank[i] = rank;
      isaDepth[i] += thick;
    }
  }

  /**
   * Forms the column outputs. Every level must have been added.
   * @param heights - geopotential heights of the levels; ISA pressure altitude when omitted
   * @throws ParameterError when a level is missing
   */
  async finalize(heights?: HeightProvider): Promise<ColumnProducts> {
    const n = this.levelsPa.length;
    for (let k = 0; k < n; k++) {
      if (!this.added[k]) throw new ParameterError(`level ${this.levelsPa[k] / 100} hPa was not added to the column`, 'levels');
    }
    const np = this.npoints;
    const count = new Float32Array(np);
    const baseHPa = new Float32Array(np).fill(NaN);
    const topHPa = new Float32Array(np).fill(NaN);
    const baseFL = new Float32Array(np).fill(NaN);
    const topFL = new Float32Array(np).fill(NaN);
    const depthM = new Float32Array(np).fill(NaN);
    // Bounds by rank, in hPa and as flight levels: a handful of values, computed once.
    const order = this.bounds.order;
    const lowerHPa = new Float32Array(n);
    const upperHPa = new Float32Array(n);
    const lowerFL = new Float32Array(n);
    const upperFL = new Float32Array(n);
    for (let s = 0; s < n; s++) {
      const k = order[s];
      lowerHPa[s] = this.bounds.lowerPa[k] / 100;
      upperHPa[s] = this.bounds.upperPa[k] / 100;
      lowerFL[s] = flightLevelFromPressure(this.bounds.lowerPa[k]);
      upperFL[s] = flightLevelFromPressure(this.bounds.upperPa[k]);
    }
    for (let i = 0; i < np; i++) {
      if (this.missing[i]) {
        count[i] = NaN;
        continue;
      }
      const c = this.count[i];
      count[i] = c;
      if (c === 0) continue;
      const b = this.baseRank[i];
      const t = this.topRank[i];
      baseHPa[i] = lowerHPa[b];
      topHPa[i] = upperHPa[t];
      baseFL[i] = lowerFL[b];
      topFL[i] = upperFL[t];
      depthM[i] = this.isaDepth[i];
    }
    if (heights === undefined || n === 1) {
      return { count, baseHPa, topHPa, baseFL, topFL, depthM, heightSource: heights?.source ?? 'isa_pressure_altitude', heightVariable: heights?.variable };
    }
    // Geopotential depths: slide a window of three levels down the column (increasing pressure).
    for (let i = 0; i < np; i++) depthM[i] = count[i] > 0 ? 0 : NaN;
    const bufs = [new Float32Array(np), new Float32Array(np), new Float32Array(np)];
    let prev: Float32Array | undefined;
    let cur = await heights.read(order[0], bufs[0]);
    let next: Float32Array | undefined = await heights.read(order[1], bufs[1]);
    const bpc = this.bytesPerCell;
    for (let s = 0; s < n; s++) {
      const k = order[s];
      const byte = k >> 3;
      const bit = 1 << (k & 7);
      for (let i = 0; i < np; i++) {
        if (!(this.bits[i * bpc + byte] & bit) || this.missing[i]) continue;
        let t: number;
        if (prev === undefined) t = cur[i] - (next as Float32Array)[i];
        else if (next === undefined) t = prev[i] - cur[i];
        else t = 0.5 * (prev[i] - next[i]);
        depthM[i] += t;
      }
      if (s + 1 < n) {
        const spare: Float32Array = prev ?? bufs[2];
        prev = cur;
        cur = next as Float32Array;
        next = s + 2 < n ? await heights.read(order[s + 2], spare) : undefined;
      }
    }
    return { count, baseHPa, topHPa, baseFL, topFL, depthM, heightSource: heights.source, heightVariable: heights.variable };
  }
}

const samePressure = (a: number, b: number): boolean => Math.abs(a - b) <= 1e-6 * Math.max(Math.abs(a), Math.abs(b));

function sameTime(a: TimeCoordinate, b: TimeCoordinate): boolean {
  return a.valid.iso === b.valid.iso && a.reference?.iso === b.reference?.iso && a.member === b.member;
}

/**
 * Height source for the column of one time: the dataset's geopotential (preferred) or
 * geopotential-height field on the same grid, covering all the evaluated levels and the time;
 * undefined (ISA pressure altitude) otherwise.
 * @param ds - the dataset
 * @param time - the time coordinate being evaluated (matched by valid time, reference time, member)
 * @param levelsPa - the evaluated levels, Pa (the accumulator's levels)
 * @param npoints - the grid's point count
 */
export function heightProviderFor(
  ds: GridDataset,
  time: TimeCoordinate,
  levelsPa: ArrayLike<number>,
  npoints: number,
): HeightProvider | undefined {
  for (const quantity of ['geopotential', 'geopotential_height'] as const) {
    for (const f of ds.fields) {
      if (f.quantity !== quantity || f.grid.npoints !== npoints) continue;
      const provider = heightProviderFromField(f, time, levelsPa);
      if (provider) return provider;
    }
  }
  return undefined;
}

/**
 * Height provider reading a geopotential (m² s⁻², divided by g0) or geopotential-height (m) field;
 * undefined when the field lacks the time or one of the levels.
 */
export function heightProviderFromField(field: Field, time: TimeCoordinate, levelsPa: ArrayLike<number>): HeightProvider | undefined {
  if (field.quantity !== 'geopotential' && field.quantity !== 'geopotential_height') {
    throw new MissingQuantityError(`variable ${field.name} is neither geopotential nor geopotential height`, 'geopotential', [field.name]);
  }
  const t = field.times.findIndex((c) => sameTime(c, time));
  if (t < 0) return undefined;
  const map = new Int32Array(levelsPa.length);
  for (let k = 0; k < levelsPa.length; k++) {
    const j = Array.prototype.findIndex.call(field.levelsPa, (p: number) => samePressure(p, levelsPa[k]));
    if (j < 0) return undefined;
    map[k] = j;
  }
  const source = field.quantity;
  return {
    source,
    variable: field.name,
    async read(levelIndex: number, out: Float32Array): Promise<Float32Array> {
      const v = await field.readSlice(t, map[levelIndex], out);
      if (source === 'geopotential') geopotentialHeightFromGeopotentialArray(v, v);
      return v;
    },
  };
}
