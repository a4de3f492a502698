/**
 * Gaussian latitudes: the N·2 latitudes of a Gaussian grid of N parallels between a pole and the
 * equator are arcsin of the roots of the Legendre polynomial P_2N(x). Roots are found by Newton
 * iteration from the classical first guess x_k ≈ cos(π(k − 1/4)/(2N + 1/2)), with P_n and P_n'
 * from the three-term recurrence  n·P_n = (2n−1)·x·P_{n−1} − (n−1)·P_{n−2},
 * P_n'(x) = n·(x·P_n − P_{n−1})/(x² − 1).
 */

const cache = new Map<number, Float64Array>();

/**
 * Gaussian latitudes, degrees, north to south (2N values).
 * @param N parallels between a pole and the equator (1 ≤ N ≤ 8000).
 */
export function gaussianLatitudes(N: number): Float64Array {
  if (!Number.isInteger(N) || N < 1 || N > 8000) throw new RangeError(`Gaussian N ${N} is outside 1..8000`);
  const hit = cache.get(N);
  if (hit) return hit;
  const n = 2 * N;
  const lat = new Float64Array(n);
  for (let k = 1; k <= N; k++) {
    let x = Math.cos((Math.PI * (k - 0.25)) / (n + 0.5));
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1;
      let p1 = x;
      for (let m = 2; m <= n; m++) {
        const p2 = ((2 * m - 1) * x * p1 - (m - 1) * p0) / m;
        p0 = p1;
        p1 = p2;
      }
      const dp = (n * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    const deg = (Math.asin(x) * 180) / Math.PI;
    lat[k - 1] = deg;
    lat[n - k] = -deg;
  }
  cache.set(N, lat);
  return lat;
}
