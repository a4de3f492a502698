/**
 * The main job end to end: `frostgrid masks` runs in-process on the demo and on fixture files;
 * GDAL (python3-gdal) reads every output, and the masks are compared cell by cell with an
 * independent numpy oracle (test/oracle/level_masks.py: Murphy & Koop 2005 eqs. 7 and 10,
 * Schumann 1996) computed from the same file read by netCDF4-python, except cells within rounding
 * of a threshold. The summary's counts must equal the mask sums GDAL reads and its areas the WGS84
 * cell areas computed independently in test/e2e/compare_outputs.py.
 */
import { mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PYTHON, run, toolAvailable } from '../support/tools.js';
import { cli } from '../cli/support.js';

interface LevelReport {
  pressure_Pa: number;
  flagged: number;
  mismatches: Record<string, number>;
  counts: Record<string, [number, number, number]>;
  areas_rel_err: Record<string, number>;
  rhi_nan_mismatch: number;
  rhi_max_rel_diff: number;
  valid_cells: [number, number];
  summary_pressure_hPa: number;
}
interface FileReport {
  geotransform: number[];
  epsg: string | null;
  bands: number;
  descriptions: string[];
  nodata: (number | null)[];
  nodata_is_nan: boolean[];
  metadata: Record<string, string>;
  size: [number, number];
}
interface Report {
  files: Record<string, FileReport>;
  levels: LevelReport[];
  max_coordinate_offset_deg: number;
  total_area_km2: number;
}

function haveTools(): boolean {
  return toolAvailable('python', 'numpy') && toolAvailable('python', 'netCDF4') && toolAvailable('python', 'osgeo');
}

interface Case {
  name: string;
  file: string;
  cliArgs: string[];
  oracleArgs: string[];
  lat: string;
  lon: string;
  times: number;
  levels: number;
}

const CASES: Case[] = [
  {
    name: 'demo scenario, default parameters (kerosene, η 0.3, 100 %, 235 K)',
    file: 'data-samples/demo/frostgrid-demo.nc',
    cliArgs: [],
    oracleArgs: [],
    lat: 'latitude',
    lon: 'longitude',
    times: 2,
    levels: 5,
  },
  {
    name: 'demo scenario, a hydrogen-like fuel of our own, η 0.4, threshold 95 %, freezing 233 K',
    file: 'data-samples/demo/frostgrid-demo.nc',
    cliArgs: ['--ei-h2o', '8.936', '--lhv', '120', '--efficiency', '0.4', '--ice-threshold', '95', '--freezing-temperature', '233'],
    oracleArgs: ['--ei-h2o', '8.936', '--lhv-mj', '120', '--efficiency', '0.4', '--threshold', '95', '--freezing-temperature', '233'],
    lat: 'latitude',
    lon: 'longitude',
    times: 2,
    levels: 5,
  },
  {
    name: 'CMIP-style names (ta/hus), plev in Pa ascending, latitude south→north, longitude −180..180, 360_day calendar',
    file: 'data-samples/fixtures/netcdf/cf_other_names.nc',
    cliArgs: [],
    oracleArgs: ['--t', 'ta', '--q', 'hus'],
    lat: 'lat',
    lon: 'lon',
    times: 2,
    levels: 3,
  },
];

describe('frostgrid masks against the numpy oracle, read back by GDAL', () => {
  it.each(CASES)('$name', async (c) => {
    if (!haveTools()) return;
    const dir = mkdtempSync(join(tmpdir(), 'frostgrid-e2e-'));
    const out = join(dir, 'out');
    const r = await cli('masks', c.file, '--out', out, '--quiet', ...c.cliArgs);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const folders = r.stdout.trim().split('\n');
    expect(folders).toHaveLength(c.times);
    const oracle = join(dir, 'oracle');
    run(PYTHON, ['test/oracle/level_masks.py', c.file, oracle, ...c.oracleArgs]);
    folders.forEach((folder, t) => {
      expect(readdirSync(folder).sort()).toEqual(
        ['column.tif', 'contrail-forming.tif', 'formation-margin.tif', 'ice-supersaturated.tif', 'persistent-contrail.tif', 'rhi.tif', 'summary.csv', 'summary.json'],
      );
      const report = JSON.parse(run(PYTHON, ['test/e2e/compare_outputs.py', folder, oracle, c.file, String(t), c.lat, c.lon])) as Report;
      // Orientation: every raster cell centre lies on a grid point of the file.
      expect(report.max_coordinate_offset_deg).toBeLessThan(1e-6);
      for (const [name, f] of Object.entries(report.files)) {
        expect(f.epsg, name).toBe('4326');
        expect(f.bands, name).toBe(name === 'column' ? 6 : c.levels);
        expect(f.metadata.software, name).toMatch(/^frostgrid /);
        expect(f.metadata.valid_time, name).toBeTruthy();
        if (name === 'ice-supersaturated' || name === 'contrail-forming' || name === 'persistent-contrail') {
          expect(f.nodata.every((v) => v === 255), name).toBe(true);
        } else {
          expect(f.nodata_is_nan.every(Boolean), name).toBe(true);
        }
      }
      expect(report.files['rhi'].descriptions[0]).toMatch(/^\d+ hPa \(FL\d{3}\)$/);
      expect(report.levels).toHaveLength(c.levels);
      for (const l of report.levels) {
        const where = `${folder} ${l.pressure_Pa} Pa`;
        expect(l.summary_pressure_hPa * 100, where).toBeCloseTo(l.pressure_Pa, 6);
        expect(l.mismatches, where).toEqual({ 'ice-supersaturated': 0, 'contrail-forming': 0, 'persistent-contrail': 0 });
        expect(l.rhi_nan_mismatch, where).toBe(0);
        expect(l.rhi_max_rel_diff, where).toBeLessThan(1e-5);
        expect(l.valid_cells[0], where).toBe(l.valid_cells[1]);
        for (const [name, [gdalCells, summaryCells]] of Object.entries(l.counts)) {
          expect(summaryCells, `${where} ${name}`).toBe(gdalCells);
          expect(l.areas_rel_err[name], `${where} ${name}`).toBeLessThan(1e-9);
        }
        // The flagged (within-rounding) cells are few: the comparison is not hollow.
        expect(l.flagged, where).toBeLessThan(l.valid_cells[0] * 0.01 + 5);
      }
    });
    if (c.file.endsWith('frostgrid-demo.nc')) {
      // The demo's invented patches make every mask non-trivial somewhere.
      const summary = JSON.parse(run('cat', [join(folders[0], 'summary.json')]));
      const persistent = summary.times[0].levels.reduce((s: number, l: { persistent_contrail: { cells: number } }) => s + l.persistent_contrail.cells, 0);
      expect(persistent).toBeGreaterThan(0);
    }
  });

  it('a full global grid sums to the WGS84 surface area (510.0656 million km²; NIMA TR8350.2 / Moritz 1980 GRS80 area)', async () => {
    if (!haveTools()) return;
    const dir = mkdtempSync(join(tmpdir(), 'frostgrid-e2e-'));
    const r = await cli('masks', 'data-samples/demo/frostgrid-demo.nc', '--out', dir, '--quiet', '--levels', '250', '--times', '2029-10-17T06:00Z');
    expect(r.code).toBe(0);
    const oracle = join(dir, 'oracle');
    run(PYTHON, ['test/oracle/level_masks.py', 'data-samples/demo/frostgrid-demo.nc', oracle]);
    const report = JSON.parse(run(PYTHON, ['test/e2e/compare_outputs.py', r.stdout.trim(), oracle, 'data-samples/demo/frostgrid-demo.nc', '0', 'latitude', 'longitude'])) as Report;
    expect(report.total_area_km2 / 510.0656e6).toBeCloseTo(1, 6);
  });
});
