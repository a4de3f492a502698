/**
 * Column products on the demo NetCDF through the dataset API: heights from its geopotential z.
 * The demo's z is the hydrostatic integral of its own temperature (data-samples/demo/make_demo.py),
 * so each flagged layer's depth must agree with the hypsometric thickness (R_d·T/g0)·ln(p_lo/p_up)
 * from the level's temperature (hypsometric equation, e.g. WMO-No. 8) to within the temperature
 * change across the layer (measured 0.7 %, bound 1.5 %).
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { DEFAULT_CRITERION } from '../../lib/physics/index.js';
import {
  ColumnAccumulator,
  LevelWorkspace,
  cellWeights,
  evaluateFieldLevel,
  heightProviderFor,
  layerBounds,
  selectHumidity,
  selectTemperature,
} from '../../lib/products/index.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DEMO = join(ROOT, 'data-samples/demo/frostgrid-demo.nc');
const haveOpen = existsSync(join(ROOT, 'lib/open.ts'));
const R = 287.05287; // J kg-1 K-1 (ICAO Doc 7488)
const G0 = 9.80665; // m s-2 (ICAO Doc 7488)

describe('column products on the demo', () => {
  it.skipIf(!haveOpen)('count = sum of persistent masks; depths from z match the hypsometric thickness; heights recorded as geopotential', async () => {
    const { open } = (await import('../../lib/open.js')) as typeof import('../../lib/open.js');
    const ds = await open(DEMO);
    try {
      const T = selectTemperature(ds);
      const hum = selectHumidity(ds);
      const levels = Array.from(T.levelsPa);
      const n = T.grid.npoints;
      const ws = new LevelWorkspace(n);
      const weights = cellWeights(T.grid);
      const b = layerBounds(levels);
      for (const time of T.times) {
        const acc = new ColumnAccumulator(n, levels);
        const sum = new Float64Array(n);
        const missing = new Uint8Array(n);
        const hyps = new Float64Array(n);
        // Evaluate in a scrambled order: the accumulator must not care.
        for (const k of [2, 4, 0, 3, 1]) {
          await evaluateFieldLevel(ws, T, hum, time, levels[k], DEFAULT_CRITERION, weights);
          acc.addLevel(k, ws.persistentContrail);
          const thick = Math.log(b.lowerPa[k] / b.upperPa[k]) * (R / G0);
          for (let i = 0; i < n; i++) {
            const m = ws.persistentContrail[i];
            if (m === 255) missing[i] = 1;
            else if (m === 1) {
              sum[i]++;
              hyps[i] += thick * ws.temperatureK[i];
            }
          }
        }
        const heights = heightProviderFor(ds, time, levels, n);
        expect(heights?.source).toBe('geopotential');
        const col = await acc.finalize(heights);
        expect(col.heightSource).toBe('geopotential');
        let flagged = 0;
        let worst = 0;
        for (let i = 0; i < n; i++) {
          if (missing[i]) {
            expect(Number.isNaN(col.count[i])).toBe(true);
            continue;
          }
          expect(col.count[i]).toBe(sum[i]);
          if (sum[i] === 0) {
            expect(Number.isNaN(col.depthM[i])).toBe(true);
            continue;
          }
          flagged++;
          worst = Math.max(worst, Math.abs(col.depthM[i] - hyps[i]) / hyps[i]);
          expect(col.baseHPa[i]).toBeGreaterThan(col.topHPa[i]);
          expect(col.topFL[i]).toBeGreaterThan(col.baseFL[i]);
        }
        expect(flagged).toBeGreaterThan(100);
        expect(worst).toBeLessThan(0.015); // measured 0.7 %
      }
    } finally {
      await ds.close();
    }
  });
});
