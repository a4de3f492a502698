import { describe, expect, it } from 'vitest';
import { medianOfPrefix, rhiUncertainty, rhiUncertaintyAt } from '../../lib/products/index.js';

// Independent formulas: e from q, e = q p/(ε + (1 − ε) q), ε = 0.622 (WMO-No. 8, 2018, Annex 4.B);
// ice saturation pressure of Murphy & Koop (2005, Q. J. R. Meteorol. Soc. 131, eq. 7).
const EPS = 0.622;
const eFromQ = (q: number, p: number): number => (q * p) / (EPS + (1 - EPS) * q);
const eIce = (t: number): number => Math.exp(9.550426 - 5723.265 / t + 3.53068 * Math.log(t) - 0.00728332 * t);
const rhi = (q: number, p: number, t: number): number => (100 * eFromQ(q, p)) / eIce(t);

describe('RHi uncertainty from quantisation', () => {
  it('half a step of q gives the central-difference change of RHi (known step, 150 and 250 hPa)', () => {
    for (const [p, t, q, step] of [
      [15000, 215, 8e-6, 1.4e-8],
      [25000, 225, 6e-5, 1e-7],
    ]) {
      const e = eFromQ(q, p);
      const got = rhiUncertaintyAt('specific_humidity', step, q, t, e, 1, 'murphy-koop');
      const fd = (rhi(q + step / 2, p, t) - rhi(q - step / 2, p, t)) / 2;
      expect(Math.abs(got - fd) / fd).toBeLessThan(1e-6);
    }
  });

  it('at 150 hPa a 1.4e-8 kg/kg step is worth more than half a percent of RHi for q = 1e-6', () => {
    const q = 1e-6;
    const d = rhiUncertaintyAt('specific_humidity', 1.4e-8, q, 210, eFromQ(q, 15000), 1, 'murphy-koop');
    expect(d / rhi(q, 15000, 210)).toBeGreaterThan(0.005);
  });

  it('relative humidity over ice: δRHi = 100·Δ/2 percentage points, whatever T', () => {
    for (const t of [205, 230, 250]) {
      expect(rhiUncertaintyAt('relative_humidity', 0.01, 0.9, t, 0.9 * eIce(t), 1, 'murphy-koop', 'ice')).toBeCloseTo(0.5, 9);
    }
  });

  it('dew point: δRHi = 100·(Δ/2)·(de_w/dT)/e_i, checked by central difference of Murphy–Koop eq. 10', () => {
    // Murphy & Koop (2005) eq. 10, liquid water.
    const eW = (t: number): number =>
      Math.exp(
        54.842763 - 6763.22 / t - 4.21 * Math.log(t) + 0.000367 * t +
          Math.tanh(0.0415 * (t - 218.8)) * (53.878 - 1331.22 / t - 9.44523 * Math.log(t) + 0.014025 * t),
      );
    const td = 215;
    const t = 220;
    const step = 0.02;
    const got = rhiUncertaintyAt('dew_point_temperature', step, td, t, eW(td), 1, 'murphy-koop');
    const fd = (100 * (eW(td + step / 2) - eW(td - step / 2))) / 2 / eIce(t);
    expect(Math.abs(got - fd) / fd).toBeLessThan(1e-5);
  });

  it('level summary: max, median and the count of cells within the uncertainty of the threshold', () => {
    const p = 20000;
    const t = new Float32Array([215, 215, 215, 215, 215]);
    const q = new Float32Array([2e-5, 2.5e-5, 3e-5, 3.5e-5, NaN]);
    const e = new Float32Array(5);
    const r = new Float32Array(5);
    for (let i = 0; i < 5; i++) {
      e[i] = eFromQ(q[i], p);
      r[i] = rhi(q[i], p, 215);
    }
    const step = 1e-7;
    const thr = r[2] + 0.1; // 0.1 pp above the third cell
    const u = rhiUncertainty({
      quantity: 'specific_humidity',
      step,
      humidity: q,
      temperatureK: t,
      vapourPressurePa: e,
      rhiPercent: r,
      saturation: 'murphy-koop',
      iceThresholdPercent: thr,
      humidityScale: 1,
    });
    const d = Array.from({ length: 4 }, (_, i) => rhiUncertaintyAt('specific_humidity', step, q[i], 215, e[i], 1, 'murphy-koop'));
    expect(u.max_percentage_points).toBeCloseTo(Math.max(...d), 6);
    const sorted = [...d].sort((x, y) => x - y);
    expect(u.median_percentage_points).toBeCloseTo((sorted[1] + sorted[2]) / 2, 6);
    const near = Array.from(r.slice(0, 4)).filter((v, i) => Math.abs(v - thr) <= d[i]).length;
    expect(u.cells_within_threshold_uncertainty).toBe(near);
    expect(near).toBeGreaterThan(0);
  });

  it('the quickselect median equals the sorted median', () => {
    let s = 12345;
    const rnd = (): number => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 2 ** 32);
    for (const m of [1, 2, 7, 100, 1001]) {
      const a = Float64Array.from({ length: m + 5 }, () => Math.floor(rnd() * 50));
      const sorted = Array.from(a.slice(0, m)).sort((x, y) => x - y);
      const exp = m % 2 ? sorted[(m - 1) / 2] : (sorted[m / 2 - 1] + sorted[m / 2]) / 2;
      expect(medianOfPrefix(a, m)).toBe(exp);
    }
  });
});
