/**
 * ndarray views of a (lat, lon) slice: latitude flips, longitude rotation and sub-boxes are
 * zero-copy views of the slice's memory; `contiguous` copies a view into a fresh row-major
 * Float32Array when a consumer needs one.
 *
 * A longitude rotation cannot be one strided view (the seam breaks the stride), so a
 * `SliceView` is a row of ndarray pieces placed side by side along longitude.
 */
import ndarray, { type NdArray } from 'ndarray';
import type { RegularLatLonGrid } from './types.js';

export interface SliceView {
  /** Pieces, left to right; each is a [ny, nxPiece] view of the same slice memory. */
  readonly pieces: readonly NdArray<Float32Array>[];
  readonly ny: number;
  readonly nx: number;
  /** Latitude of each row and longitude of each column of the view, degrees. */
  readonly lat: Float64Array;
  readonly lon: Float64Array;
}

/** The whole slice as a [ny, nx] view in storage order. */
export function sliceView(data: Float32Array, grid: RegularLatLonGrid): SliceView {
  if (data.length !== grid.ny * grid.nx) throw new RangeError(`slice has ${data.length} values, the grid ${grid.ny}×${grid.nx}`);
  return { pieces: [ndarray(data, [grid.ny, grid.nx])], ny: grid.ny, nx: grid.nx, lat: grid.lat, lon: grid.lon };
}

/** Value at row i, column j of a view. */
export function viewGet(v: SliceView, i: number, j: number): number {
  let jj = j;
  for (const p of v.pieces) {
    if (jj < p.shape[1]) return p.get(i, jj);
    jj -= p.shape[1];
  }
  throw new RangeError(`column ${j} is outside 0..${v.nx - 1}`);
}

/** Rows reversed (north↔south), zero-copy. */
export function flipLatitude(v: SliceView): SliceView {
  return { ...v, pieces: v.pieces.map((p) => p.step(-1, 1)), lat: v.lat.slice().reverse() };
}

/** Rows in north-to-south order (flipped only when they run south to north). */
export function northToSouth(v: SliceView): SliceView {
  return v.ny > 1 && v.lat[0] < v.lat[v.ny - 1] ? flipLatitude(v) : v;
}

function columns(v: SliceView, j0: number, n: number): NdArray<Float32Array>[] {
  const out: NdArray<Float32Array>[] = [];
  let skip = j0;
  let need = n;
  for (const p of v.pieces) {
    const w = p.shape[1];
    if (skip >= w) {
      skip -= w;
      continue;
    }
    const take = Math.min(w - skip, need);
    out.push(p.hi(p.shape[0], skip + take).lo(0, skip));
    need -= take;
    skip = 0;
    if (need === 0) break;
  }
  return out;
}

/** Columns rotated so that column `k` comes first (zero-copy: two pieces at most per piece). */
export function rotateColumns(v: SliceView, k: number): SliceView {
  const s = ((k % v.nx) + v.nx) % v.nx;
  if (s === 0) return v;
  const lon = new Float64Array(v.nx);
  for (let j = 0; j < v.nx; j++) lon[j] = v.lon[(j + s) % v.nx];
  return { ...v, pieces: [...columns(v, s, v.nx - s), ...columns(v, 0, s)], lon };
}

/**
 * Longitudes in the convention asked for: '0..360' puts 0° first, '-180..180' puts −180° first
 * (a rotation for a global grid; longitudes are relabelled into the range).
 */
export function toLongitudeConvention(v: SliceView, convention: '0..360' | '-180..180'): SliceView {
  const wrap = (x: number): number => (convention === '0..360' ? ((x % 360) + 360) % 360 : ((((x + 180) % 360) + 360) % 360) - 180);
  const wrapped = Array.from(v.lon, wrap);
  let first = 0;
  for (let j = 1; j < wrapped.length; j++) if (wrapped[j] < wrapped[first]) first = j;
  const r = rotateColumns(v, first);
  return { ...r, lon: Float64Array.from(r.lon, wrap) };
}

/** Rows i0..i0+ny-1 and columns j0..j0+nx-1, zero-copy. */
export function subBox(v: SliceView, i0: number, ny: number, j0: number, nx: number): SliceView {
  if (i0 < 0 || ny < 0 || i0 + ny > v.ny || j0 < 0 || nx < 0 || j0 + nx > v.nx) {
    throw new RangeError(`box rows ${i0}+${ny}, columns ${j0}+${nx} is outside ${v.ny}×${v.nx}`);
  }
  const pieces = columns(v, j0, nx).map((p) => p.hi(i0 + ny, p.shape[1]).lo(i0, 0));
  return { pieces, ny, nx, lat: v.lat.slice(i0, i0 + ny), lon: v.lon.slice(j0, j0 + nx) };
}

/** True when the view is one piece laid out row-major without gaps over its own memory. */
export function isContiguous(v: SliceView): boolean {
  if (v.pieces.length !== 1) return false;
  const p = v.pieces[0];
  return p.stride[1] === 1 && p.stride[0] === p.shape[1] && p.offset === 0 && p.data.length === p.shape[0] * p.shape[1];
}

/** A row-major Float32Array of the view (the slice memory itself when already contiguous). */
export function contiguous(v: SliceView, out?: Float32Array): Float32Array {
  if (out === undefined && isContiguous(v)) return v.pieces[0].data;
  const res = out ?? new Float32Array(v.ny * v.nx);
  let col = 0;
  for (const p of v.pieces) {
    const [ny, w] = p.shape;
    const s0 = p.stride[0];
    const s1 = p.stride[1];
    const d = p.data;
    for (let i = 0; i < ny; i++) {
      let src = p.offset + i * s0;
      const dst = i * v.nx + col;
      for (let j = 0; j < w; j++, src += s1) res[dst + j] = d[src];
    }
    col += w;
  }
  return res;
}
