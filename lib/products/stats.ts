/**
 * Per-level statistics of the masks: valid cells, and for each mask the number of flagged cells,
 * their fraction of the valid cells and their area, optionally restricted to a bounding box.
 *
 * The numbers are exact functions of the masks: a cell counts when its mask value is 1 (and it is
 * inside the box when one is given); a cell is valid when none of the three masks holds the
 * missing value 255. Areas are the float64 sum, in storage order, of the cell areas from
 * {@link cellAreas} (m²), divided by 10⁶ to give km².
 *
 * @packageDocumentation
 */
import { ParameterError } from '../errors.js';

/** Mask value of a cell whose inputs are missing or out of range. */
export const MASK_MISSING = 255;

/** Statistics of one mask on one level. */
export interface MaskStatistics {
  /** Cells with mask value 1 (inside the box when one is given). */
  readonly cells: number;
  /** cells / valid cells; null when no cell is valid. */
  readonly fraction: number | null;
  /** Total area of those cells, km² (WGS84 ellipsoid unless the area options said otherwise). */
  readonly area_km2: number;
}

/** Statistics of one level. */
export interface LevelStatistics {
  /** Cells where no mask holds 255 (inside the box when one is given). */
  readonly validCells: number;
  /** Area of the valid cells, km². */
  readonly validAreaKm2: number;
  readonly iceSupersaturated: MaskStatistics;
  readonly contrailForming: MaskStatistics;
  readonly persistentContrail: MaskStatistics;
}

/** The three masks of a level (uint8: 0, 1, 255 = missing). */
export interface LevelMasks {
  readonly iceSupersaturated: Uint8Array;
  readonly contrailForming: Uint8Array;
  readonly persistentContrail: Uint8Array;
}

/** Cell weights: areas (m²) and the optional bounding-box inclusion mask (1 inside). */
export interface CellWeights {
  readonly areaM2: Float64Array;
  readonly inside?: Uint8Array;
}

/**
 * Counts and areas of the three masks of one level.
 * @param masks - the level's masks, each of the grid's point count
 * @param weights - cell areas in m² and, optionally, the box inclusion mask
 * @returns valid cells and, per mask, cells, fraction of valid cells and area in km²
 * @throws ParameterError when array lengths differ
 */
export function levelStatistics(masks: LevelMasks, weights: CellWeights): LevelStatistics {
  const { iceSupersaturated: a, contrailForming: b, persistentContrail: c } = masks;
  const area = weights.areaM2;
  const inside = weights.inside;
  const n = a.length;
  if (b.length !== n || c.length !== n || area.length !== n || (inside !== undefined && inside.length !== n)) {
    throw new ParameterError(
      `mask and weight lengths differ (${[a.length, b.length, c.length, area.length, inside?.length ?? n].join(', ')})`,
      'masks',
    );
  }
  let valid = 0;
  let validArea = 0;
  let na = 0;
  let nb = 0;
  let nc = 0;
  let aa = 0;
  let ab = 0;
  let ac = 0;
  for (let i = 0; i < n; i++) {
    if (inside !== undefined && inside[i] !== 1) continue;
    const va = a[i];
    const vb = b[i];
    const vc = c[i];
    if (va === MASK_MISSING || vb === MASK_MISSING || vc === MASK_MISSING) continue;
    const w = area[i];
    valid++;
    validArea += w;
    if (va === 1) {
      na++;
      aa += w;
    }
    if (vb === 1) {
      nb++;
      ab += w;
    }
    if (vc === 1) {
      nc++;
      ac += w;
    }
  }
  const stat = (cells: number, areaM2: number): MaskStatistics => ({
    cells,
    fraction: valid > 0 ? cells / valid : null,
    area_km2: areaM2 / 1e6,
  });
  return {
    validCells: valid,
    validAreaKm2: validArea / 1e6,
    iceSupersaturated: stat(na, aa),
    contrailForming: stat(nb, ab),
    persistentContrail: stat(nc, ac),
  };
}

/**
 * Cells and area (km²) of one mask's value-1 cells: the same rule as {@link levelStatistics}, for
 * checking a single mask (e.g. one read back from a GeoTIFF band).
 */
export function maskArea(mask: Uint8Array, weights: CellWeights): { cells: number; area_km2: number } {
  const area = weights.areaM2;
  const inside = weights.inside;
  if (area.length !== mask.length) throw new ParameterError('mask and area lengths differ', 'mask');
  let cells = 0;
  let sum = 0;
  for (let i = 0; i < mask.length; i++) {
    if (mask[i] !== 1 || (inside !== undefined && inside[i] !== 1)) continue;
    cells++;
    sum += area[i];
  }
  return { cells, area_km2: sum / 1e6 };
}
