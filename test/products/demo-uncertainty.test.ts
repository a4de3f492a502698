/**
 * Quantisation uncertainty on the demo NetCDF: its q is int16-packed, so its step is the CF
 * scale_factor (CF Conventions §8.1: unpacked = packed·scale_factor + add_offset), read here with
 * netCDF4-python. The largest relative δRHi of a level sits at its smallest q, where
 * δe/e = (Δ/2)·ε/(q(ε + (1 − ε)q)), ε = 0.622 (from e = q p/(ε + (1 − ε) q), WMO-No. 8 Annex 4.B).
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { PYTHON, run, toolAvailable } from '../support/tools.js';
import { DEFAULT_CRITERION } from '../../lib/physics/index.js';
import { LevelWorkspace, cellWeights, evaluateFieldLevel, selectHumidity, selectTemperature } from '../../lib/products/index.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DEMO = join(ROOT, 'data-samples/demo/frostgrid-demo.nc');
const haveOpen = existsSync(join(ROOT, 'lib/open.ts'));
const EPS = 0.622;

describe('RHi uncertainty from the demo’s packed q', () => {
  const ready = haveOpen && toolAvailable('python', 'netCDF4');
  it.skipIf(!ready)('step = scale_factor; max relative δRHi at the driest cell; above half a percent of RHi at 150 hPa', async () => {
    const scale = Number(run(PYTHON, ['-c', `import netCDF4; print(repr(float(netCDF4.Dataset(${JSON.stringify(DEMO)})['q'].scale_factor)))`]).trim());
    const { open } = (await import('../../lib/open.js')) as typeof import('../../lib/open.js');
    const ds = await open(DEMO);
    try {
      const T = selectTemperature(ds);
      const hum = selectHumidity(ds);
      expect(hum.field.encoding.quantizationStep).toBeCloseTo(scale, 20);
      const ws = new LevelWorkspace(T.grid.npoints);
      const weights = cellWeights(T.grid);
      const rel: number[] = [];
      for (const p of [15000, 25000, 35000]) {
        const r = await evaluateFieldLevel(ws, T, hum, T.times[0], p, DEFAULT_CRITERION, weights);
        let qmin = Infinity;
        for (let i = 0; i < ws.humidity.length; i++) if (ws.rhiPercent[i] === ws.rhiPercent[i] && ws.humidity[i] < qmin) qmin = ws.humidity[i];
        const expected = (100 * (scale / 2) * EPS) / (qmin * (EPS + (1 - EPS) * qmin));
        expect(r.uncertainty.max_relative_percent).not.toBeNull();
        expect(Math.abs((r.uncertainty.max_relative_percent as number) - expected) / expected).toBeLessThan(1e-5);
        expect(r.uncertainty.median_relative_percent as number).toBeLessThan(r.uncertainty.max_relative_percent as number);
        rel.push(expected);
      }
      expect(rel[0]).toBeGreaterThan(0.5);
      // Moister lower levels resolve RHi better.
      expect(rel[2]).toBeLessThan(rel[0]);
    } finally {
      await ds.close();
    }
  });
});
