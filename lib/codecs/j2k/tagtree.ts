/**
 * Tag trees (ISO/IEC 15444-1 B.10.2): a quad-tree over a grid of code-blocks whose nodes hold the
 * minimum of their children, coded incrementally against rising thresholds.
 */

/** Reads one bit of a packet header. */
export interface BitSource {
  bit(): number;
}

const UNKNOWN = 0x7fffffff;

export class TagTree {
  /** Node values (UNKNOWN until decoded) and the lower bound known so far, level by level. */
  private readonly value: Int32Array;
  private readonly low: Int32Array;
  /** Parent of every node (−1 at the root). */
  private readonly parent: Int32Array;
  private readonly path: Int32Array;

  constructor(width: number, height: number) {
    const sizes: number[] = [];
    let w = Math.max(width, 1);
    let h = Math.max(height, 1);
    for (;;) {
      sizes.push(w, h);
      if (w === 1 && h === 1) break;
      w = Math.ceil(w / 2);
      h = Math.ceil(h / 2);
    }
    let total = 0;
    for (let k = 0; k < sizes.length; k += 2) total += sizes[k] * sizes[k + 1];
    this.value = new Int32Array(total).fill(UNKNOWN);
    this.low = new Int32Array(total);
    this.parent = new Int32Array(total).fill(-1);
    this.path = new Int32Array(sizes.length / 2);
    let base = 0;
    for (let k = 0; k + 2 < sizes.length; k += 2) {
      const lw = sizes[k];
      const lh = sizes[k + 1];
      const next = base + lw * lh;
      const pw = sizes[k + 2];
      for (let y = 0; y < lh; y++) {
        for (let x = 0; x < lw; x++) this.parent[base + y * lw + x] = next + (y >> 1) * pw + (x >> 1);
      }
      base = next;
    }
  }

  /**
   * Decodes leaf `leaf` against `threshold`: reads bits until the leaf's value is known to be
   * below the threshold or at least it. @returns whether value < threshold.
   */
  decode(bits: BitSource, leaf: number, threshold: number): boolean {
    let depth = 0;
    for (let n = leaf; n >= 0; n = this.parent[n]) this.path[depth++] = n;
    let low = 0;
    for (let k = depth - 1; k >= 0; k--) {
      const n = this.path[k];
      if (low > this.low[n]) this.low[n] = low;
      else low = this.low[n];
      while (low < threshold && low < this.value[n]) {
        if (bits.bit() === 1) this.value[n] = low;
        else low++;
      }
      this.low[n] = low;
    }
    return this.value[leaf] < threshold;
  }

  /** Decodes the leaf's value completely (as for the zero bit-plane count). */
  decodeValue(bits: BitSource, leaf: number): number {
    let threshold = 1;
    while (!this.decode(bits, leaf, threshold)) threshold++;
    return this.value[leaf];
  }
}
