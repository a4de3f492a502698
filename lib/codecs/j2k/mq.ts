/**
 * The MQ arithmetic decoder of JPEG 2000 (ISO/IEC 15444-1 Annex C) and the raw bit reader of the
 * arithmetic-coding bypass (Annex D.6).
 *
 * A code-block's 19 contexts are one small typed array, a byte each. Bytes past the end of a
 * codeword segment read as 0xFF, as C.3.4 prescribes for the decoder (the encoder's flushed
 * tail is implied).
 */

/** Table C.2: probability estimate Qe, next state after MPS and after LPS, and the MPS switch. */
const QE = new Uint16Array([
  0x5601, 0x3401, 0x1801, 0x0ac1, 0x0521, 0x0221, 0x5601, 0x5401, 0x4801, 0x3801, 0x3001, 0x2401, 0x1c01, 0x1601,
  0x5601, 0x5401, 0x5101, 0x4801, 0x3801, 0x3401, 0x3001, 0x2801, 0x2401, 0x2201, 0x1c01, 0x1801, 0x1601, 0x1401,
  0x1201, 0x1101, 0x0ac1, 0x09c1, 0x08a1, 0x0521, 0x0441, 0x02a1, 0x0221, 0x0141, 0x0111, 0x0085, 0x0049, 0x0025,
  0x0015, 0x0009, 0x0005, 0x0001, 0x5601,
]);
const NMPS = new Uint8Array([
  1, 2, 3, 4, 5, 38, 7, 8, 9, 10, 11, 12, 13, 29, 15, 16, 17, 18, 19, 20, 21, 22, 23, 24, 25, 26, 27, 28, 29, 30, 31,
  32, 33, 34, 35, 36, 37, 38, 39, 40, 41, 42, 43, 44, 45, 45, 46,
]);
const NLPS = new Uint8Array([
  1, 6, 9, 12, 29, 33, 6, 14, 14, 14, 17, 18, 20, 21, 14, 14, 15, 16, 17, 18, 19, 19, 20, 21, 22, 23, 24, 25, 26, 27,
  28, 29, 30, 31, 32, 33, 34, 35, 36, 37, 38, 39, 40, 41, 42, 43, 46,
]);
const SWITCH = new Uint8Array([
  1, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0,
  0, 0, 0, 0, 0, 0, 0, 0, 0,
]);

/** Context numbers of Annex D: 0–8 significance, 9–13 sign, 14–16 refinement, run-length, uniform. */
export const CTX_SIGN = 9;
export const CTX_REFINE = 14;
export const CTX_RUN = 17;
export const CTX_UNIFORM = 18;
export const CONTEXT_COUNT = 19;

/*
 * A context is one byte, state index × 2 + MPS; these tables give, by that byte, Qe and the byte
 * after an MPS or an LPS renormalisation (the LPS one with the MPS switch applied).
 */
const PACKED = 2 * QE.length;
export const QE_OF = new Uint16Array(PACKED);
export const AFTER_MPS = new Uint8Array(PACKED);
export const AFTER_LPS = new Uint8Array(PACKED);
for (let v = 0; v < PACKED; v++) {
  const s = v >> 1;
  const mps = v & 1;
  QE_OF[v] = QE[s];
  AFTER_MPS[v] = (NMPS[s] << 1) | mps;
  AFTER_LPS[v] = (NLPS[s] << 1) | (SWITCH[s] === 1 ? 1 - mps : mps);
}

/** C.3: the decoder registers over one codeword segment, and a code-block's 19 contexts. */
export class MqDecoder {
  /** Contexts, state × 2 + MPS each. */
  readonly contexts = new Uint8Array(CONTEXT_COUNT);
  private data: Uint8Array = new Uint8Array(0);
  private pos = 0;
  private end = 0;
  /**
   * The registers A, C (a signed 32-bit integer: its bit pattern is what counts) and CT. Public
   * for the hottest pass, which keeps them in locals and calls `byteIn` itself.
   */
  a = 0;
  c = 0;
  ct = 0;

  /** Table D.7: every context starts in state 0 except uniform (46), run-length (3) and zero-coding context 0 (4). */
  resetContexts(): void {
    const x = this.contexts;
    x.fill(0);
    x[CTX_UNIFORM] = 46 << 1;
    x[CTX_RUN] = 3 << 1;
    x[0] = 4 << 1;
  }

  /** INITDEC (C.3.5) on a new codeword segment. */
  init(data: Uint8Array, start: number, end: number): void {
    this.data = data;
    this.pos = start;
    this.end = end;
    const b = start < end ? data[start] : 0xff;
    this.c = b << 16;
    this.byteIn();
    this.c = this.c << 7;
    this.ct -= 7;
    this.a = 0x8000;
  }

  /** BYTEIN (C.3.4): a 0xFF followed by a byte above 0x8F is a marker; feed 1 bits from then on. */
  byteIn(): void {
    const d = this.data;
    const cur = this.pos < this.end ? d[this.pos] : 0xff;
    if (cur === 0xff) {
      const next = this.pos + 1 < this.end ? d[this.pos + 1] : 0xff;
      if (next > 0x8f) {
        this.c = (this.c + 0xff00) | 0;
        this.ct = 8;
      } else {
        this.pos++;
        this.c = (this.c + (next << 9)) | 0;
        this.ct = 7;
      }
    } else {
      this.pos++;
      const b = this.pos < this.end ? d[this.pos] : 0xff;
      this.c = (this.c + (b << 8)) | 0;
      this.ct = 8;
    }
  }

  /** DECODE (C.3.2) one binary decision in context `cx`. */
  decode(cx: number): number {
    const contexts = this.contexts;
    const v = contexts[cx];
    const qe = QE_OF[v];
    let a = this.a - qe;
    let c = this.c;
    let d: number;
    if (c >>> 16 < qe) {
      // the LPS sub-interval [0, Qe) lies below the MPS one; LPS_EXCHANGE (Figure C.17)
      if (a < qe) {
        d = v & 1;
        contexts[cx] = AFTER_MPS[v];
      } else {
        d = 1 - (v & 1);
        contexts[cx] = AFTER_LPS[v];
      }
      a = qe;
    } else {
      c = (c - (qe << 16)) | 0;
      if ((a & 0x8000) !== 0) {
        this.a = a;
        this.c = c;
        return v & 1;
      }
      // MPS_EXCHANGE (Figure C.16)
      if (a < qe) {
        d = 1 - (v & 1);
        contexts[cx] = AFTER_LPS[v];
      } else {
        d = v & 1;
        contexts[cx] = AFTER_MPS[v];
      }
    }
    // RENORMD
    let ct = this.ct;
    do {
      if (ct === 0) {
        this.c = c;
        this.byteIn();
        c = this.c;
        ct = this.ct;
      }
      a <<= 1;
      c = c << 1;
      ct--;
    } while ((a & 0x8000) === 0);
    this.a = a;
    this.c = c;
    this.ct = ct;
    return d;
  }
}

/** D.6: raw (bypassed) bits, MSB first; after a 0xFF byte the next byte carries only 7 bits. */
export class RawDecoder {
  private data: Uint8Array = new Uint8Array(0);
  private pos = 0;
  private end = 0;
  private byte = 0;
  private bits = 0;

  init(data: Uint8Array, start: number, end: number): void {
    this.data = data;
    this.pos = start;
    this.end = end;
    this.byte = 0;
    this.bits = 0;
  }

  bit(): number {
    if (this.bits === 0) {
      const previous = this.byte;
      this.byte = this.pos < this.end ? this.data[this.pos] : 0xff;
      this.pos++;
      this.bits = previous === 0xff ? 7 : 8;
    }
    this.bits--;
    return (this.byte >> this.bits) & 1;
  }
}
