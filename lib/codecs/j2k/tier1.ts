/**
 * Tier-1 decoding (ISO/IEC 15444-1 Annex D): the bit-plane coding passes of one code-block.
 *
 * Coefficients are held as magnitudes with one extra fractional bit ("×2 units"): a coefficient
 * that becomes significant in bit-plane p is set to 3·2^p (1.5 of that plane), and each later
 * refinement bit moves it by ±2^p' for its plane p'. Fully decoded, the magnitude is 2m + 1 for
 * the integer magnitude m; when passes were truncated the value sits at the middle of the
 * interval the decoded bits leave open (the usual reconstruction point r = ½, E.1.1.2).
 *
 * State per coefficient, in arrays padded by one column and row on every side:
 *   flags: significant, coded in this bit-plane's significance pass, refined before, negative;
 *   nb:    counts of significant neighbours, horizontal (2 bits), vertical (2), diagonal (3),
 *          which index the zero-coding context tables D.1 directly.
 */
import { DecodeError } from '../../errors.js';
import * as mqModule from './mq.js';
import { concatBytes } from './bytes.js';
import { AFTER_LPS, AFTER_MPS, MqDecoder, QE_OF, RawDecoder } from './mq.js';

// Module-local copies: the hot loops below read plain constants, not imported bindings.
const CTX_REFINE: number = mqModule.CTX_REFINE;
const CTX_RUN: number = mqModule.CTX_RUN;
const CTX_SIGN: number = mqModule.CTX_SIGN;
const CTX_UNIFORM: number = mqModule.CTX_UNIFORM;

/** Code-block style bits of COD/COC SPcod (Table A.19). */
export const CB_BYPASS = 0x01;
export const CB_RESET = 0x02;
export const CB_TERMALL = 0x04;
export const CB_VCAUSAL = 0x08;
export const CB_PREDICTABLE = 0x10;
export const CB_SEGSYM = 0x20;

const SIG = 1;
const VISITED = 2;
const REFINED = 4;
const NEG = 8;

/** Pass types in coding order within a bit-plane. */
export const PASS_SIGNIFICANCE = 0;
export const PASS_REFINEMENT = 1;
export const PASS_CLEANUP = 2;

/** The type of coding pass number `k` of a code-block (pass 0 is the first cleanup pass). */
export function passType(k: number): number {
  return k === 0 ? PASS_CLEANUP : (k - 1) % 3;
}

/** Zero-coding contexts (Table D.1) by the packed neighbour count h + 4v + 16d, per orientation. */
function zeroCodingTable(kind: 'h' | 'v' | 'd'): Uint8Array {
  const t = new Uint8Array(128);
  for (let d = 0; d <= 4; d++) {
    for (let v = 0; v <= 2; v++) {
      for (let h = 0; h <= 2; h++) {
        let cx: number;
        if (kind === 'd') {
          const hv = h + v;
          if (d >= 3) cx = 8;
          else if (d === 2) cx = hv >= 1 ? 7 : 6;
          else if (d === 1) cx = hv >= 2 ? 5 : hv === 1 ? 4 : 3;
          else cx = hv >= 2 ? 2 : hv;
        } else {
          const a = kind === 'h' ? h : v; // the direction along which the subband is low-pass
          const b = kind === 'h' ? v : h;
          if (a === 2) cx = 8;
          else if (a === 1) cx = b >= 1 ? 7 : d >= 1 ? 6 : 5;
          else if (b === 2) cx = 4;
          else if (b === 1) cx = 3;
          else cx = d >= 2 ? 2 : d;
        }
        t[h + 4 * v + 16 * d] = cx;
      }
    }
  }
  return t;
}
/** By band type: LL and LH (vertically high-pass), HL (horizontally high-pass), HH. */
const ZC_BY_BAND = [zeroCodingTable('h'), zeroCodingTable('v'), zeroCodingTable('h'), zeroCodingTable('d')];

/** One codeword segment of a code-block: its bytes (gathered over layers) and passes. */
export interface Segment {
  /** Passes this segment may hold (termination rules of D.4.1 and Table D.8). */
  maxPasses: number;
  passes: number;
  /** True when its passes are raw (arithmetic-coding bypass). */
  raw: boolean;
  chunks: Uint8Array[];
  length: number;
}

/** What tier-1 needs to know about a code-block. */
export interface CodeBlockCoding {
  width: number;
  height: number;
  /** Band type: 0 LL, 1 HL, 2 LH, 3 HH. */
  band: number;
  style: number;
  /** Magnitude bit-planes coded: Mb − zero bit-planes + ROI shift. */
  planes: number;
  segments: readonly Segment[];
}

/**
 * Decodes code-blocks one after another, reusing its arrays. After `decode`, `mag` and `flags`
 * hold the block's coefficients in the padded layout (stride = width + 2, first sample at
 * stride + 1); `FLAG_NEGATIVE` in `flags` marks the negative ones.
 */
export class CodeBlockDecoder {
  flags = new Uint8Array(0);
  nb = new Uint8Array(0);
  mag = new Int32Array(0);
  private readonly mq = new MqDecoder();
  private readonly raw = new RawDecoder();
  private w = 0;
  private h = 0;
  private stride = 0;
  private zc: Uint8Array = ZC_BY_BAND[0];
  private vcausal = false;

  private prepare(size: number): void {
    if (this.flags.length < size) {
      this.flags = new Uint8Array(size);
      this.nb = new Uint8Array(size);
      this.mag = new Int32Array(size);
    } else {
      this.flags.fill(0, 0, size);
      this.nb.fill(0, 0, size);
      this.mag.fill(0, 0, size);
    }
  }

  /** Decodes the block's passes. @returns the stride of the padded arrays. */
  decode(cb: CodeBlockCoding): number {
    this.w = cb.width;
    this.h = cb.height;
    const stride = (this.stride = cb.width + 2);
    this.prepare(stride * (cb.height + 2));
    this.zc = ZC_BY_BAND[cb.band];
    this.vcausal = (cb.style & CB_VCAUSAL) !== 0;
    const reset = (cb.style & CB_RESET) !== 0;
    const segsym = (cb.style & CB_SEGSYM) !== 0;
    const mq = this.mq;
    mq.resetContexts();
    let plane = cb.planes - 1;
    let type = PASS_CLEANUP;
    for (const seg of cb.segments) {
      if (seg.passes === 0) continue;
      const data = concatBytes(seg.chunks);
      if (seg.raw) this.raw.init(data, 0, data.length);
      else mq.init(data, 0, data.length);
      for (let k = 0; k < seg.passes; k++) {
        if (plane < 0) {
          throw new DecodeError(`JPEG 2000: code-block has more coding passes than its ${cb.planes} bit-planes allow`);
        }
        if (type === PASS_SIGNIFICANCE) {
          if (seg.raw) this.significanceRaw(plane);
          else this.significance(plane);
        } else if (type === PASS_REFINEMENT) this.refinement(plane, seg.raw);
        else {
          this.cleanup(plane);
          if (segsym) this.segmentationSymbol();
        }
        if (reset) mq.resetContexts();
        if (type === PASS_CLEANUP) {
          type = PASS_SIGNIFICANCE;
          plane--;
        } else type++;
      }
    }
    return stride;
  }

  /** Marks the coefficient at i (row y) significant and tells its neighbours. */
  private becomeSignificant(i: number, y: number, negative: number, plane: number): void {
    const nb = this.nb;
    const stride = this.stride;
    this.flags[i] |= negative ? SIG | NEG : SIG;
    this.mag[i] = 3 << plane;
    // horizontal neighbours +1, vertical +4, diagonal +16
    nb[i - 1] += 1;
    nb[i + 1] += 1;
    nb[i + stride] += 4;
    nb[i + stride - 1] += 16;
    nb[i + stride + 1] += 16;
    if (!(this.vcausal && (y & 3) === 0)) {
      nb[i - stride] += 4;
      nb[i - stride - 1] += 16;
      nb[i - stride + 1] += 16;
    }
  }

  /** Sign decoding (D.3.2, Tables D.2 and D.3) of the coefficient at i, row y. */
  private decodeSign(i: number, y: number): number {
    const flags = this.flags;
    const stride = this.stride;
    const fl = flags[i - 1];
    const fr = flags[i + 1];
    const fu = flags[i - stride];
    const fd = this.vcausal && (y & 3) === 3 ? 0 : flags[i + stride];
    let hc = (fl & SIG ? (fl & NEG ? -1 : 1) : 0) + (fr & SIG ? (fr & NEG ? -1 : 1) : 0);
    let vc = (fu & SIG ? (fu & NEG ? -1 : 1) : 0) + (fd & SIG ? (fd & NEG ? -1 : 1) : 0);
    hc = hc > 0 ? 1 : hc < 0 ? -1 : 0;
    vc = vc > 0 ? 1 : vc < 0 ? -1 : 0;
    let xor = 0;
    if (hc < 0 || (hc === 0 && vc < 0)) {
      hc = -hc;
      vc = -vc;
      xor = 1;
    }
    // (1,1)→13 (1,0)→12 (1,−1)→11 (0,1)→10 (0,0)→9
    return this.mq.decode(hc === 1 ? CTX_SIGN + 3 + vc : CTX_SIGN + vc) ^ xor;
  }

  private significance(plane: number): void {
    const { flags, nb, zc, mq, w, h, stride } = this;
    for (let y0 = 0; y0 < h; y0 += 4) {
      const y1 = Math.min(y0 + 4, h);
      for (let x = 0; x < w; x++) {
        for (let y = y0, i = (y0 + 1) * stride + x + 1; y < y1; y++, i += stride) {
          if ((flags[i] & SIG) !== 0 || nb[i] === 0) continue;
          if (mq.decode(zc[nb[i]]) === 1) this.becomeSignificant(i, y, this.decodeSign(i, y), plane);
          flags[i] |= VISITED;
        }
      }
    }
  }

  private significanceRaw(plane: number): void {
    const { flags, nb, raw, w, h, stride } = this;
    for (let y0 = 0; y0 < h; y0 += 4) {
      const y1 = Math.min(y0 + 4, h);
      for (let x = 0; x < w; x++) {
        for (let y = y0, i = (y0 + 1) * stride + x + 1; y < y1; y++, i += stride) {
          if ((flags[i] & SIG) !== 0 || nb[i] === 0) continue;
          if (raw.bit() === 1) this.becomeSignificant(i, y, raw.bit(), plane);
          flags[i] |= VISITED;
        }
      }
    }
  }

  private refinement(plane: number, bypass: boolean): void {
    const { flags, nb, mag, mq, raw, w, h, stride } = this;
    const step = 1 << plane;
    if (bypass) {
      for (let y0 = 0; y0 < h; y0 += 4) {
        const y1 = Math.min(y0 + 4, h);
        for (let x = 0; x < w; x++) {
          for (let y = y0, i = (y0 + 1) * stride + x + 1; y < y1; y++, i += stride) {
            const f = flags[i];
            if ((f & (SIG | VISITED)) !== SIG) continue;
            mag[i] += raw.bit() ? step : -step;
            flags[i] = f | REFINED;
          }
        }
      }
      return;
    }
    // The busiest pass: the MQ decoder's DECODE (C.3.2) is written out here with its registers
    // in locals; the other passes call mq.decode.
    const contexts = mq.contexts;
    let a = mq.a;
    let c = mq.c;
    let ct = mq.ct;
    for (let y0 = 0; y0 < h; y0 += 4) {
      const y1 = Math.min(y0 + 4, h);
      for (let x = 0; x < w; x++) {
        for (let y = y0, i = (y0 + 1) * stride + x + 1; y < y1; y++, i += stride) {
          const f = flags[i];
          if ((f & (SIG | VISITED)) !== SIG) continue;
          const cx = f & REFINED ? CTX_REFINE + 2 : nb[i] !== 0 ? CTX_REFINE + 1 : CTX_REFINE;
          const v = contexts[cx];
          const qe = QE_OF[v];
          let bit: number;
          a -= qe;
          let renormalise = true;
          if (c >>> 16 < qe) {
            if (a < qe) {
              bit = v & 1;
              contexts[cx] = AFTER_MPS[v];
            } else {
              bit = 1 - (v & 1);
              contexts[cx] = AFTER_LPS[v];
            }
            a = qe;
          } else {
            c = (c - (qe << 16)) | 0;
            if ((a & 0x8000) !== 0) {
              bit = v & 1;
              renormalise = false;
            } else if (a < qe) {
              bit = 1 - (v & 1);
              contexts[cx] = AFTER_LPS[v];
            } else {
              bit = v & 1;
              contexts[cx] = AFTER_MPS[v];
            }
          }
          if (renormalise) {
            do {
              if (ct === 0) {
                mq.c = c;
                mq.byteIn();
                c = mq.c;
                ct = mq.ct;
              }
              a <<= 1;
              c <<= 1;
              ct--;
            } while ((a & 0x8000) === 0);
          }
          mag[i] += bit ? step : -step;
          flags[i] = f | REFINED;
        }
      }
    }
    mq.a = a;
    mq.c = c;
    mq.ct = ct;
  }

  private cleanup(plane: number): void {
    const { flags, nb, zc, mq, w, h, stride } = this;
    for (let y0 = 0; y0 < h; y0 += 4) {
      const y1 = Math.min(y0 + 4, h);
      for (let x = 0; x < w; x++) {
        const top = (y0 + 1) * stride + x + 1;
        let y = y0;
        if (y0 + 4 <= h) {
          const i1 = top + stride;
          const i2 = i1 + stride;
          const i3 = i2 + stride;
          if (
            ((flags[top] | flags[i1] | flags[i2] | flags[i3]) & (SIG | VISITED)) === 0 &&
            (nb[top] | nb[i1] | nb[i2] | nb[i3]) === 0
          ) {
            if (mq.decode(CTX_RUN) === 0) continue; // all four stay insignificant
            const r = (mq.decode(CTX_UNIFORM) << 1) | mq.decode(CTX_UNIFORM);
            y = y0 + r;
            const i = top + r * stride;
            this.becomeSignificant(i, y, this.decodeSign(i, y), plane);
            y++;
          }
        }
        for (let i = top + (y - y0) * stride; y < y1; y++, i += stride) {
          if ((flags[i] & (SIG | VISITED)) === 0 && mq.decode(zc[nb[i]]) === 1) {
            this.becomeSignificant(i, y, this.decodeSign(i, y), plane);
          }
        }
        for (let y2 = y0, i = top; y2 < y1; y2++, i += stride) flags[i] &= ~VISITED;
      }
    }
  }

  /** D.5: after each cleanup pass, four uniform-context decisions that must read 1010. */
  private segmentationSymbol(): void {
    let symbol = 0;
    for (let k = 0; k < 4; k++) symbol = (symbol << 1) | this.mq.decode(CTX_UNIFORM);
    if (symbol !== 0b1010) throw new DecodeError(`JPEG 2000: code-block segmentation symbol is ${symbol.toString(2)}, not 1010`);
  }
}

/** Bit of the negative flag, for callers looping over `flags`. */
export const FLAG_NEGATIVE = NEG;
