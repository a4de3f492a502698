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

/**
 * Block sums and counts of valid values for every level, each level from the one before
 * (sums and counts add exactly, so level k is the mean over its whole 2^k × 2^k block).
 */
function averageLevels(band: RasterArray, W: number, H: number, levels: readonly OverviewLevel[], p: ResolvedProfile): RasterArray[] {
  const nd = p.nodata;
  const hasNd = nd !== undefined && !Number.isNaN(nd);
  const empty = emptyValue(p);
  const round = p.info.kind !== 'float';
  const out: RasterArray[] = [];
  let prevSum: Float64Array | undefined;
  let prevCnt: Uint32Array | undefined;
  let pw = W;
  let ph = H;
  for (const lv of levels) {
    const sum = new Float64Array(lv.width * lv.height);
    const cnt = new Uint32Array(lv.width * lv.height);
    if (prevSum === undefined || prevCnt === undefined) {
      for (let y = 0; y < H; y++) {
        const row = y * W;
        const o = (y >> 1) * lv.width;
        for (let x = 0; x < W; x++) {
          const v = band[row + x];
          if (v !== v || (hasNd && v === nd)) continue;
          sum[o + (x >> 1)] += v;
          cnt[o + (x >> 1)]++;
        }
      }
    } else {
      for (let y = 0; y < ph; y++) {
        const row = y * pw;
        const o = (y >> 1) * lv.width;
        for (let x = 0; x < pw; x++) {
          sum[o + (x >> 1)] += prevSum[row + x];
          cnt[o + (x >> 1)] += prevCnt[row + x];
        }
      }
    }
    const img = p.info.create(lv.width * lv.height);
    for (let i = 0; i < img.length; i++) {
      if (cnt[i] === 0) img[i] = empty;
      else {
        const m = sum[i] / cnt[i];
        img[i] = round ? Math.sign(m) * Math.round(Math.abs(m)) : m;
      }
    }
    out.push(img);
    prevSum = sum;
    prevCnt = cnt;
    pw = lv.width;
    ph = lv.height;
  }
  return out;
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

/** Computes every overview level of one band. */
export function overviewBands(band: RasterArray, width: number, height: number, levels: readonly OverviewLevel[], p: ResolvedProfile): RasterArray[] {
  if (p.overviewResampling === 'average') return averageLevels(band, width, height, levels, p);
  return levels.map((lv) => {
    const out = p.info.create(lv.width * lv.height);
    if (p.overviewResampling === 'nearest') nearest(band, width, lv, out);
    else mode(band, width, height, lv, p, out);
    return out;
  });
}
