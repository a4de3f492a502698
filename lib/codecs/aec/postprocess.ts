/**
 * Inverse of the CCSDS 121.0-B-3 preprocessor (§4): unit-delay predictor followed by the
 * prediction-error mapper. Each reference sample interval starts with a raw reference sample;
 * every later sample is reconstructed from its mapped prediction error δ' and the previous
 * sample x̂ (the prediction):
 *
 *   θ = min(x̂ − x_min, x_max − x̂)
 *   δ' ≤ 2θ, δ' even:  x = x̂ + δ'/2
 *   δ' ≤ 2θ, δ' odd:   x = x̂ − (δ' + 1)/2
 *   δ' > 2θ:           x = x_min + δ'  when θ = x̂ − x_min, else x = x_max − δ'
 *
 * with x_min = 0, x_max = 2^n − 1 for unsigned and x_min = −2^(n−1), x_max = 2^(n−1) − 1 for
 * signed samples.
 */

/**
 * Reconstructs unsigned samples in place. `values[start]` of every interval of `intervalLength`
 * samples holds the raw reference sample, the others mapped prediction errors (each ≤ 2^n − 1).
 */
export function unmapUnsigned(values: Uint32Array, count: number, bitsPerSample: number, intervalLength: number): void {
  const xmax = bitsPerSample === 32 ? 0xffffffff : 2 ** bitsPerSample - 1;
  const v = new Int32Array(values.buffer, values.byteOffset, values.length);
  for (let start = 0; start < count; start += intervalLength) {
    const end = Math.min(start + intervalLength, count);
    if (bitsPerSample <= 30) {
      // All quantities fit in a positive int32: integer arithmetic only, through an Int32Array
      // view (V8 reads Uint32Array elements as possibly above 2^31, which is much slower).
      let x = v[start] | 0;
      for (let i = start + 1; i < end; i++) {
        const d = v[i];
        const up = xmax - x;
        const th = x < up ? x : up;
        if (d <= th << 1) {
          // even δ' → +δ'/2, odd δ' → −(δ'+1)/2, without a branch on the parity
          x = (x + ((d >>> 1) ^ -(d & 1))) | 0;
        } else {
          x = x < up ? d : xmax - d;
        }
        v[i] = x;
      }
    } else {
      let x = values[start];
      for (let i = start + 1; i < end; i++) {
        const d = values[i];
        const up = xmax - x;
        const th = x < up ? x : up;
        if (d <= 2 * th) {
          x = d % 2 === 0 ? x + d / 2 : x - (d + 1) / 2;
        } else {
          x = x < up ? d : xmax - d;
        }
        values[i] = x;
      }
    }
  }
}

/**
 * Reconstructs signed samples in place. Reference samples are n-bit two's-complement patterns;
 * results are stored sign-extended to 32 bits (read them through an Int32Array view).
 */
export function unmapSigned(values: Uint32Array, count: number, bitsPerSample: number, intervalLength: number): void {
  const half = 2 ** (bitsPerSample - 1);
  const xmin = -half;
  const xmax = half - 1;
  for (let start = 0; start < count; start += intervalLength) {
    const end = Math.min(start + intervalLength, count);
    const raw = values[start] % (2 * half);
    let x = raw >= half ? raw - 2 * half : raw;
    values[start] = x;
    for (let i = start + 1; i < end; i++) {
      const d = values[i];
      const down = x - xmin;
      const up = xmax - x;
      const th = down < up ? down : up;
      if (d <= 2 * th) {
        x = d % 2 === 0 ? x + d / 2 : x - (d + 1) / 2;
      } else {
        x = down < up ? xmin + d : xmax - d;
      }
      values[i] = x;
    }
  }
}

/** Sign-extends n-bit two's-complement patterns to 32 bits in place (no preprocessor). */
export function signExtend(values: Uint32Array, count: number, bitsPerSample: number): void {
  if (bitsPerSample === 32) return;
  const shift = 32 - bitsPerSample;
  for (let i = 0; i < count; i++) values[i] = (values[i] << shift) >> shift;
}
