/**
 * Inverse discrete wavelet transforms of ISO/IEC 15444-1 Annex F, in place over a tile buffer.
 *
 * Before level r is reconstructed, the buffer's top-left (width × height of resolution r) holds
 * the subbands side by side: low-pass columns first, then high-pass columns; low-pass rows first,
 * then high-pass rows (the layout `tile.ts` places code-blocks in). Each level interleaves one
 * row at a time (2D_INTERLEAVE), runs the 1-D synthesis along rows (HOR_SR), then along columns
 * (VER_SR), with the periodic symmetric extension of F.3.7 at the ends. The vertical pass works on
 * whole rows, so it walks memory in order.
 *
 * 5/3 reversible (F.3.8.1), integer lifting:
 *   X(2n)   = Y(2n)   − ⌊(Y(2n−1) + Y(2n+1) + 2) / 4⌋
 *   X(2n+1) = Y(2n+1) + ⌊(X(2n) + X(2n+2)) / 2⌋
 * in 32-bit integers (the arithmetic the encoders use, so a wrap in either is undone by the other).
 * 9/7 irreversible (F.3.8.2): scaling by K (low) and about 1/K (high), then four lifting steps
 * with δ, γ, β, α, every operation rounded to 32-bit floating point. The high-band scale is
 * OpenJPEG's 13318/8192 ÷ 2 (2/K to 13 bits, 3·10⁻⁵ below 1/K): OpenJPEG is the decoder inside
 * ecCodes and GDAL, whose values we match to the last sample; with the exact 1/K a third of the
 * samples of a 16-bit irreversible stream come out one unit off.
 */
import type { TileLayout } from './tile.js';

const fround = Math.fround;
/** Lifting coefficients of Table F.4 as 32-bit floats, negated: each step adds c·(left + right). */
const ALPHA = fround(1.586134342);
const BETA = fround(0.052980118);
const GAMMA = fround(-0.882911075);
const DELTA = fround(-0.443506852);
const K = fround(1.230174105);
/** High-band scale: OpenJPEG's 2/K as 13318/8192, halved for our step-size convention (E.1.1.1). */
const HIGH_SCALE = 13318 / 8192 / 2;

/** Copies one row of `len` samples out of its L…H halves into natural order. */
function interleaveRow(src: Int32Array | Float32Array, at: number, len: number, lowCount: number, parity: number, out: Int32Array | Float32Array): void {
  for (let k = 0; k < len; k++) {
    out[k] = ((k + parity) & 1) === 0 ? src[at + ((k + parity) >> 1) - parity] : src[at + lowCount + (k >> 1)];
  }
}

function lift53(x: Int32Array, n: number, parity: number): void {
  if (n === 1) {
    if (parity === 1) x[0] = (x[0] / 2) | 0;
    return;
  }
  for (let k = parity; k < n; k += 2) {
    const l = k > 0 ? x[k - 1] : x[k + 1];
    const r = k + 1 < n ? x[k + 1] : x[k - 1];
    x[k] -= (l + r + 2) >> 2;
  }
  for (let k = 1 - parity; k < n; k += 2) {
    const l = k > 0 ? x[k - 1] : x[k + 1];
    const r = k + 1 < n ? x[k + 1] : x[k - 1];
    x[k] += (l + r) >> 1;
  }
}

function step97(x: Float32Array, n: number, start: number, c: number): void {
  for (let k = start; k < n; k += 2) {
    const l = k > 0 ? x[k - 1] : x[k + 1];
    const r = k + 1 < n ? x[k + 1] : x[k - 1];
    x[k] = fround(x[k] + fround(c * fround(l + r)));
  }
}

function lift97(x: Float32Array, n: number, parity: number): void {
  if (n === 1) {
    if (parity === 1) x[0] /= 2;
    return;
  }
  for (let k = parity; k < n; k += 2) x[k] = fround(x[k] * K);
  for (let k = 1 - parity; k < n; k += 2) x[k] *= HIGH_SCALE;
  step97(x, n, parity, DELTA);
  step97(x, n, 1 - parity, GAMMA);
  step97(x, n, parity, BETA);
  step97(x, n, 1 - parity, ALPHA);
}

/** The same steps applied down columns: `rows` rows of `w` samples, row k at t[k·w]. */
function liftRows53(t: Int32Array, w: number, rows: number, parity: number): void {
  if (rows === 1) {
    if (parity === 1) for (let x = 0; x < w; x++) t[x] = (t[x] / 2) | 0;
    return;
  }
  for (let k = parity; k < rows; k += 2) {
    const l = (k > 0 ? k - 1 : k + 1) * w;
    const r = (k + 1 < rows ? k + 1 : k - 1) * w;
    const c = k * w;
    for (let x = 0; x < w; x++) t[c + x] -= (t[l + x] + t[r + x] + 2) >> 2;
  }
  for (let k = 1 - parity; k < rows; k += 2) {
    const l = (k > 0 ? k - 1 : k + 1) * w;
    const r = (k + 1 < rows ? k + 1 : k - 1) * w;
    const c = k * w;
    for (let x = 0; x < w; x++) t[c + x] += (t[l + x] + t[r + x]) >> 1;
  }
}

function stepRows97(t: Float32Array, w: number, rows: number, start: number, coef: number): void {
  for (let k = start; k < rows; k += 2) {
    const l = (k > 0 ? k - 1 : k + 1) * w;
    const r = (k + 1 < rows ? k + 1 : k - 1) * w;
    const c = k * w;
    for (let x = 0; x < w; x++) t[c + x] = fround(t[c + x] + fround(coef * fround(t[l + x] + t[r + x])));
  }
}

function liftRows97(t: Float32Array, w: number, rows: number, parity: number): void {
  if (rows === 1) {
    if (parity === 1) for (let x = 0; x < w; x++) t[x] /= 2;
    return;
  }
  for (let k = 0; k < rows; k++) {
    const s = ((k + parity) & 1) === 0 ? K : HIGH_SCALE;
    for (let x = k * w, e = x + w; x < e; x++) t[x] *= s;
  }
  stepRows97(t, w, rows, parity, DELTA);
  stepRows97(t, w, rows, 1 - parity, GAMMA);
  stepRows97(t, w, rows, parity, BETA);
  stepRows97(t, w, rows, 1 - parity, ALPHA);
}

/** Reconstructs the tile buffer (stride = tile width) from its subbands, level by level. */
export function inverseTransform(buf: Int32Array | Float32Array, stride: number, layout: TileLayout): void {
  const res = layout.resolutions;
  if (res.length < 2) return;
  const top = res[res.length - 1];
  const maxW = top.x1 - top.x0;
  const maxH = top.y1 - top.y0;
  const reversible = buf instanceof Int32Array;
  const row = reversible ? new Int32Array(maxW) : new Float32Array(maxW);
  const plane = reversible ? new Int32Array(maxW * maxH) : new Float32Array(maxW * maxH);
  for (let r = 1; r < res.length; r++) {
    const cur = res[r];
    const low = res[r - 1];
    const w = cur.x1 - cur.x0;
    const h = cur.y1 - cur.y0;
    if (w === 0 || h === 0) continue;
    const px = cur.x0 & 1;
    const py = cur.y0 & 1;
    const lowW = low.x1 - low.x0;
    const lowH = low.y1 - low.y0;
    // rows: interleave and synthesise each, writing it to its interleaved row position
    for (let y = 0; y < h; y++) {
      interleaveRow(buf, y * stride, w, lowW, px, row);
      if (reversible) lift53(row as Int32Array, w, px);
      else lift97(row as Float32Array, w, px);
      const k = ((y < lowH ? 2 * y + py : 2 * (y - lowH) + 1 - py));
      plane.set(row.subarray(0, w), k * w);
    }
    // columns, as whole rows
    if (reversible) liftRows53(plane as Int32Array, w, h, py);
    else liftRows97(plane as Float32Array, w, h, py);
    for (let y = 0; y < h; y++) buf.set(plane.subarray(y * w, y * w + w), y * stride);
  }
}
