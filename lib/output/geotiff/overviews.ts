/**
 * Internal overviews for the cloud-optimized layout: successive halvings (factors 2, 4, 8, …)
 * until both dimensions fit in one block, each level ceil(size / factor) pixels as GDAL sizes
 * them. Level k is computed from the full-resolution band:
 *  - nearest: the top-left pixel of each factor × factor block;
 *  - mode: the most frequent valid value of the block (ties go to the smaller value), for masks;
 *  - average: the mean of the valid values of the block, for continuous fields.
 * "Valid" excludes NaN and the nodata value; a block with no valid value becomes nodata (NaN
 * for float bands without nodata). Integer averages are rounded half away from zero.
 */
import type { RasterArray, ResolvedProfile } from './profile.js';

export interface OverviewLevel {
  readonly width: number;
  readonly height: number;
  readonly factor: number;
}

/** The overview levels a COG of this size gets. */
export function overviewLevels(width: number, height: number, blockSize: number): OverviewLevel[] {
  const levels: OverviewLevel[] = [];
  let factor = 1;
  let w = width;
  let h = height;
  while (w > blockSize || h > blockSize) {
    factor *= 2;
    w = Math.ceil(width / factor);
    h = Math.ceil(height / factor);
    levels.push({ width: w, height: h, factor });
  }
  return levels;
}

function emptyValue(p: ResolvedProfile): number {
  return p.nodata !== undefined ? p.nodata : p.info.kind === 'float' ? NaN : 0;
}

function nearest(band: RasterArray, W: number, lv: OverviewLevel, out: RasterArray): void {
  const f = lv.factor;
  for (let oy = 0; oy < lv.height; oy++) {
    const row = oy * f * W;
    const o = oy * lv.width;
    for (let ox = 0; ox < lv.width; ox++) out[o + ox] = band[row + ox * f];
  }
}

function average(band: RasterArray, W: number, H: number, lv: OverviewLevel, p: ResolvedProfile, out: RasterArray): void {
  const f = lv.factor;
  const shift = Math.log2(f);
  const sum = new Float64Array(lv.width);
  const cnt = new Int32Array(lv.width);
  const nd = p.nodata;
  const hasNd = nd !== undefined && !Number.isNaN(nd);
  const empty = emptyValue(p);
  const round = p.info.kind !== 'float';
  for (let oy = 0; oy < lv.height; oy++) {
    sum.fill(0);
    cnt.fill(0);
    const yEnd = Math.min(H, (oy + 1) * f);
    for (let y = oy * f; y < yEnd; y++) {
      const row = y * W;
      for (let x = 0; x < W; x++) {
        const v = band[row + x];
        if (v !== v || (hasNd && v === nd)) continue;
        const ox = x >> shift;
        sum[ox] += v;
        cnt[ox]++;
      }
    }
    const o = oy * lv.width;
    for (let ox = 0; ox < lv.width; ox++) {
      if (cnt[ox] === 0) out[o + ox] = empty;
      else {
        const m = sum[ox] / cnt[ox];
        out[o + ox] = round ? Math.sign(m) * Math.round(Math.abs(m)) : m;
      }
    }
  }
}

function mode(band: RasterArray, W: number, H: number, lv: OverviewLevel, p: ResolvedProfile, out: RasterArray): void {
  const f = lv.factor;
  const nd = p.nodata;
  const hasNd = nd !== undefined && !Number.isNaN(nd);
  const empty = emptyValue(p);
  const buf = new Float64Array(f * f);
  for (let oy = 0; oy < lv.height; oy++) {
    const yEnd = Math.min(H, (oy + 1) * f);
    for (let ox = 0; ox < lv.width; ox++) {
      const xEnd = Math.min(W, (ox + 1) * f);
      let n = 0;
      for (let y = oy * f; y < yEnd; y++) {
        for (let x = ox * f, i = y * W + x; x < xEnd; x++, i++) {
          const v = band[i];
          if (v !== v || (hasNd && v === nd)) continue;
          buf[n++] = v;
        }
      }
      if (n === 0) {
        out[oy * lv.width + ox] = empty;
        continue;
      }
      const vals = buf.subarray(0, n).sort();
      let best = vals[0];
      let bestCount = 0;
      for (let i = 0; i < n; ) {
        let j = i + 1;
        while (j < n && vals[j] === vals[i]) j++;
        if (j - i > bestCount) {
          bestCount = j - i;
          best = vals[i];
        }
        i = j;
      }
      out[oy * lv.width + ox] = best;
    }
  }
}

/** Computes one overview level of one band. */
export function overviewBand(band: RasterArray, width: number, height: number, lv: OverviewLevel, p: ResolvedProfile): RasterArray {
  const out = p.info.create(lv.width * lv.height);
  if (p.overviewResampling === 'nearest') nearest(band, width, lv, out);
  else if (p.overviewResampling === 'average') average(band, width, height, lv, p, out);
  else mode(band, width, height, lv, p, out);
  return out;
}
