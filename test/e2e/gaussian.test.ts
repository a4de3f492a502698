/**
 * A regular Gaussian N32 GRIB2 file (made with ecCodes: data-samples/fixtures/cli/make_gaussian.py)
 * through `frostgrid masks`: statistics on the native grid agree with the numpy oracle reading the
 * same file with ecCodes; the rasters are regridded to a regular latitude–longitude grid that GDAL
 * reads as a geographic CRS, with the regridding recorded in the metadata.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PYTHON, run, toolAvailable } from '../support/tools.js';
import { cli } from '../cli/support.js';

const FILE = 'data-samples/fixtures/cli/gaussian_n32_tq.grib2';

describe('Gaussian grid end to end', () => {
  it('native-grid counts match the oracle; rasters are regridded and georeferenced', async () => {
    if (!(toolAvailable('python', 'eccodes') && toolAvailable('python', 'osgeo'))) return;
    const dir = mkdtempSync(join(tmpdir(), 'frostgrid-gg-'));
    const r = await cli('masks', FILE, '--out', dir, '--quiet');
    expect(r.code).toBe(0);
    const folder = r.stdout.trim();
    const summary = JSON.parse(readFileSync(join(folder, 'summary.json'), 'utf8'));
    run(PYTHON, ['test/oracle/level_masks.py', '--grib', FILE, join(dir, 'oracle')]);
    const manifest = JSON.parse(readFileSync(join(dir, 'oracle.json'), 'utf8'));
    const levels = summary.times[0].levels;
    expect(levels.map((l: { pressure_hPa: number }) => l.pressure_hPa)).toEqual([200, 250, 300]);
    for (const l of levels) {
      const o = manifest.slices.find((s: { pressure_Pa: number }) => s.pressure_Pa === l.pressure_hPa * 100);
      expect(l.valid_cells).toBe(o.valid_cells);
      for (const k of ['ice_supersaturated', 'contrail_forming', 'persistent_contrail']) {
        expect(Math.abs(l[k].cells - o.counts[k]), k).toBeLessThanOrEqual(o.counts.flagged);
      }
      expect(l.persistent_contrail.cells).toBeGreaterThan(0);
      // Gaussian cell areas from the latitude bounds sum to the WGS84 surface (510.0656 million km²).
      expect(l.valid_area_km2 / 510.0656e6).toBeCloseTo(1, 5);
    }
    const info = JSON.parse(run('gdalinfo', ['-json', join(folder, 'persistent-contrail.tif')]));
    expect(info.size).toEqual([128, 64]);
    expect(info.geoTransform[1]).toBeCloseTo(2.8125, 12);
    // Geographic, on the earth shape the GRIB message states (the ecCodes sample's sphere).
    expect(info.coordinateSystem.wkt).toMatch(/^GEOGCRS\[/);
    expect(info.metadata[''].regridding).toMatch(/^regular Gaussian N32 regridded to a regular 2\.8125° x 2\.8125° latitude-longitude grid: nearest neighbour for masks/);
    const values = run(PYTHON, ['-c', `from osgeo import gdal; import numpy as np; a=gdal.Open('${join(folder, 'persistent-contrail.tif')}').ReadAsArray(); print(sorted(set(np.unique(a).tolist())))`]);
    expect(JSON.parse(values)).toEqual([0, 1]);
  });
});
