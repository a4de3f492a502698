import { describe, expect, it } from 'vitest';
import { boundingBoxMask, cellAreas, levelStatistics, maskArea } from '../../lib/products/index.js';
import { globalRegularGrid } from './grids.js';

// WGS84: a = 6378137 m, 1/f = 298.257223563 (NIMA TR8350.2 table 3.1). Zone surface from the
// equator to φ: π b² [sin φ/(1 − e² sin² φ) + atanh(e sin φ)/e] (oblate-spheroid zone, closed form).
const A = 6378137;
const F = 1 / 298.257223563;
const E2 = F * (2 - F);
const E = Math.sqrt(E2);
function zoneArea(phiDeg: number): number {
  const s = Math.sin((phiDeg * Math.PI) / 180);
  return Math.PI * A * A * (1 - E2) * (s / (1 - E2 * s * s) + Math.atanh(E * s) / E);
}

/** Deterministic pseudo-random masks with some missing cells (a small LCG; data invented for the test). */
function masks(n: number, seed: number): { a: Uint8Array; b: Uint8Array; c: Uint8Array } {
  let s = seed >>> 0;
  const rnd = (): number => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  const a = new Uint8Array(n);
  const b = new Uint8Array(n);
  const c = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (rnd() < 0.02) {
      a[i] = b[i] = c[i] = 255;
      continue;
    }
    a[i] = rnd() < 0.2 ? 1 : 0;
    b[i] = rnd() < 0.5 ? 1 : 0;
    c[i] = a[i] & b[i];
  }
  return { a, b, c };
}

describe('level statistics', () => {
  const g = globalRegularGrid(1);
  const areaM2 = cellAreas(g);

  it('counts, fractions and areas equal the sums over the masks (with missing cells and a box)', () => {
    const { a, b, c } = masks(g.npoints, 7);
    for (const inside of [undefined, boundingBoxMask(g, { west: 160, south: -30, east: -140, north: 45 })]) {
      const s = levelStatistics({ iceSupersaturated: a, contrailForming: b, persistentContrail: c }, { areaM2, inside });
      let valid = 0;
      const cells = [0, 0, 0];
      const area = [0, 0, 0];
      for (let i = 0; i < g.npoints; i++) {
        if (inside && !inside[i]) continue;
        if (a[i] === 255) continue;
        valid++;
        [a, b, c].forEach((m, j) => {
          if (m[i] === 1) {
            cells[j]++;
            area[j] += areaM2[i];
          }
        });
      }
      expect(s.validCells).toBe(valid);
      expect(valid).toBeGreaterThan(0);
      const got = [s.iceSupersaturated, s.contrailForming, s.persistentContrail];
      got.forEach((m, j) => {
        expect(m.cells).toBe(cells[j]);
        expect(m.fraction).toBe(cells[j] / valid);
        expect(m.area_km2).toBe(area[j] / 1e6);
        expect(maskArea([a, b, c][j], { areaM2, inside })).toEqual({ cells: cells[j], area_km2: area[j] / 1e6 });
      });
    }
  });

  it('a mask covering the band 30°N–40°N (cell bounds 29.5°–40.5°) has the closed-form zone area', () => {
    const m = new Uint8Array(g.npoints);
    for (let j = 0; j < g.ny; j++) if (g.lat[j] >= 30 && g.lat[j] <= 40) m.fill(1, j * g.nx, (j + 1) * g.nx);
    const zero = new Uint8Array(g.npoints);
    const s = levelStatistics({ iceSupersaturated: m, contrailForming: zero, persistentContrail: zero }, { areaM2 });
    const exp = (zoneArea(40.5) - zoneArea(29.5)) / 1e6;
    expect(s.iceSupersaturated.cells).toBe(11 * 360);
    expect(Math.abs(s.iceSupersaturated.area_km2 - exp) / exp).toBeLessThan(1e-9);
    expect(s.contrailForming.cells).toBe(0);
  });

  it('a level with no valid cell has null fractions', () => {
    const m = new Uint8Array(4).fill(255);
    const s = levelStatistics({ iceSupersaturated: m, contrailForming: m, persistentContrail: m }, { areaM2: new Float64Array(4).fill(1) });
    expect(s.validCells).toBe(0);
    expect(s.persistentContrail.fraction).toBeNull();
  });

  it('rejects masks of different lengths', () => {
    expect(() =>
      levelStatistics({ iceSupersaturated: new Uint8Array(3), contrailForming: new Uint8Array(4), persistentContrail: new Uint8Array(4) }, { areaM2: new Float64Array(4) }),
    ).toThrow(/lengths differ/);
  });
});
