import { describe, expect, it } from 'vitest';
import { ColumnAccumulator, layerBounds, type HeightProvider } from '../../lib/products/index.js';

// ISA (ICAO Doc 7488, 3rd ed.): T0 = 288.15 K, p0 = 101325 Pa, L = 0.0065 K/m up to 11 km, then
// isothermal 216.65 K; R = 287.05287 J/(kg K), g0 = 9.80665 m/s². Geopotential pressure altitude,
// written here independently of lib/physics:
const R = 287.05287;
const G0 = 9.80665;
const P11 = 101325 * Math.pow(216.65 / 288.15, G0 / (R * 0.0065)); // ≈ 22632 Pa
function isaAltitude(p: number): number {
  if (p >= P11) return (288.15 / 0.0065) * (1 - Math.pow(p / 101325, (R * 0.0065) / G0));
  return 11000 + ((R * 216.65) / G0) * Math.log(P11 / p);
}

const LEVELS_HPA = [150, 200, 250, 300, 350];
const LEVELS_PA = LEVELS_HPA.map((h) => h * 100);

function maskOf(n: number, cells: number[], missing: number[] = []): Uint8Array {
  const m = new Uint8Array(n);
  for (const c of cells) m[c] = 1;
  for (const c of missing) m[c] = 255;
  return m;
}

describe('layer bounds (log-pressure midpoints, mirrored at the ends)', () => {
  it('inner bounds are geometric means of neighbouring pressures; outer bounds mirror in ln p', () => {
    const b = layerBounds([30000, 15000, 35000, 20000, 25000]); // any order
    // 250 hPa: between √(250·200) and √(250·300).
    expect(b.upperPa[4]).toBeCloseTo(Math.sqrt(25000 * 20000), 6);
    expect(b.lowerPa[4]).toBeCloseTo(Math.sqrt(25000 * 30000), 6);
    // Top level 150 hPa: ln p_up = ln 150 − (ln √(150·200) − ln 150).
    expect(Math.log(b.upperPa[1])).toBeCloseTo(2 * Math.log(15000) - Math.log(Math.sqrt(15000 * 20000)), 12);
    expect(Math.log(b.lowerPa[2])).toBeCloseTo(2 * Math.log(35000) - Math.log(Math.sqrt(35000 * 30000)), 12);
    expect(Array.from(b.order)).toEqual([1, 3, 4, 0, 2]);
  });
  it('rejects duplicate levels', () => {
    expect(() => layerBounds([25000, 25000])).toThrow(/twice/);
  });
});

describe('column accumulation', () => {
  it('a single flagged level has the ISA thickness of its log-midpoint layer (ICAO Doc 7488 formulas)', async () => {
    const acc = new ColumnAccumulator(3, LEVELS_PA);
    for (let k = 0; k < 5; k++) acc.addLevel(k, maskOf(3, k === 2 ? [1] : []));
    const c = await acc.finalize();
    const up = Math.sqrt(25000 * 20000); // 223.6 hPa: above the 11 km tropopause (226.3 hPa)
    const lo = Math.sqrt(25000 * 30000);
    expect(c.heightSource).toBe('isa_pressure_altitude');
    expect(c.count[1]).toBe(1);
    expect(c.depthM[1]).toBeCloseTo(isaAltitude(up) - isaAltitude(lo), 1);
    expect(c.topHPa[1]).toBeCloseTo(up / 100, 3);
    expect(c.baseHPa[1]).toBeCloseTo(lo / 100, 3);
    // FL = pressure altitude / (100 ft), 1 ft = 0.3048 m exactly.
    expect(c.topFL[1]).toBeCloseTo(isaAltitude(up) / 30.48, 2);
    expect(c.baseFL[1]).toBeCloseTo(isaAltitude(lo) / 30.48, 2);
    // Unflagged columns: count 0, the rest NaN.
    expect(c.count[0]).toBe(0);
    expect(Number.isNaN(c.baseHPa[0]) && Number.isNaN(c.depthM[0]) && Number.isNaN(c.topFL[0])).toBe(true);
  });

  it('the top level layer reaches its mirrored midpoint; several levels sum; order of arrival does not matter', async () => {
    const masks = [maskOf(4, [0, 2]), maskOf(4, [0, 2]), maskOf(4, [2]), maskOf(4, [3]), maskOf(4, [2, 3])];
    const a = new ColumnAccumulator(4, LEVELS_PA);
    for (const k of [3, 0, 4, 1, 2]) a.addLevel(k, masks[k]);
    const c = await a.finalize();
    const b = layerBounds(LEVELS_PA);
    // Column 0: 150 and 200 hPa, contiguous: depth = H(top bound of 150) − H(lower bound of 200).
    expect(c.count[0]).toBe(2);
    expect(c.depthM[0]).toBeCloseTo(isaAltitude(b.upperPa[0]) - isaAltitude(b.lowerPa[1]), 1);
    expect(c.topHPa[0]).toBeCloseTo(15000 * Math.sqrt(15000 / 20000) / 100, 3);
    // Column 2: all levels but 300 hPa: two separate layers; depth excludes the 300 hPa layer.
    expect(c.count[2]).toBe(4);
    const whole = isaAltitude(b.upperPa[0]) - isaAltitude(b.lowerPa[4]);
    const gap = isaAltitude(b.upperPa[3]) - isaAltitude(b.lowerPa[3]);
    expect(c.depthM[2]).toBeCloseTo(whole - gap, 1);
    expect(c.baseHPa[2]).toBeCloseTo(b.lowerPa[4] / 100, 3);
  });

  it('a missing value anywhere in a column makes every output NaN', async () => {
    const a = new ColumnAccumulator(2, LEVELS_PA);
    for (let k = 0; k < 5; k++) a.addLevel(k, maskOf(2, [0, 1], k === 3 ? [1] : []));
    const c = await a.finalize();
    expect(c.count[0]).toBe(5);
    expect(Number.isNaN(c.count[1]) && Number.isNaN(c.depthM[1])).toBe(true);
  });

  it('with geopotential: depths in an isothermal column equal the hypsometric thickness (R·T/g0)·ln(p_lower/p_upper)', async () => {
    // Isothermal atmosphere: Z(p) = (R T/g0) ln(p0/p) exactly (hypsometric equation, e.g. WMO-No. 8).
    const T = [220, 205]; // two columns with different temperatures
    const z = (p: number, i: number): number => ((R * T[i]) / G0) * Math.log(101325 / p);
    const provider: HeightProvider = {
      source: 'geopotential',
      variable: 'z',
      async read(k, out) {
        for (let i = 0; i < out.length; i++) out[i] = z(LEVELS_PA[k], i);
        return out;
      },
    };
    const b = layerBounds(LEVELS_PA);
    for (const k of [0, 2, 4]) {
      const a = new ColumnAccumulator(2, LEVELS_PA);
      for (let j = 0; j < 5; j++) a.addLevel(j, maskOf(2, j === k ? [0, 1] : []));
      const c = await a.finalize(provider);
      expect(c.heightSource).toBe('geopotential');
      for (let i = 0; i < 2; i++) {
        const exp = ((R * T[i]) / G0) * Math.log(b.lowerPa[k] / b.upperPa[k]);
        expect(Math.abs(c.depthM[i] - exp)).toBeLessThan(0.01);
      }
    }
    // The whole column: thickness between the outermost bounds.
    const a = new ColumnAccumulator(2, LEVELS_PA);
    for (let j = 0; j < 5; j++) a.addLevel(j, maskOf(2, [0]));
    const c = await a.finalize(provider);
    expect(Math.abs(c.depthM[0] - ((R * 220) / G0) * Math.log(b.lowerPa[4] / b.upperPa[0]))).toBeLessThan(0.01);
    expect(Number.isNaN(c.depthM[1])).toBe(true);
  });

  it('refuses a level added twice and finalising with a level missing', async () => {
    const a = new ColumnAccumulator(1, LEVELS_PA);
    a.addLevel(0, maskOf(1, []));
    expect(() => a.addLevel(0, maskOf(1, []))).toThrow(/twice/);
    await expect(a.finalize()).rejects.toThrow(/not added/);
  });
});
