/**
 * `frostgrid masks`, `info` and `probe` in-process: wording and exit codes of errors. Every error
 * is one line on stderr naming the file and the problem, exit 1 for data/file errors and 2 for
 * usage errors, and no output folder is left behind.
 */
import { existsSync, mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { cli } from './support.js';

const NC = 'data-samples/fixtures/netcdf';
const DEMO = 'data-samples/demo/frostgrid-demo.nc';

function tmp(): string {
  return mkdtempSync(join(tmpdir(), 'frostgrid-cli-'));
}

describe('frostgrid masks: data and file errors (exit 1, one line)', () => {
  it.each([
    { what: 'missing file', file: 'data-samples/no-such-file.nc', msg: 'data-samples/no-such-file.nc: cannot open' },
    {
      what: 'not a grid file',
      file: `${NC}/bad/not_netcdf.nc`,
      msg: `${NC}/bad/not_netcdf.nc: not a recognised format (known formats: netcdf3, netcdf4, grib)`,
    },
    {
      what: 'no temperature',
      file: 'data-samples/fixtures/cli/no_temperature.nc',
      msg: 'data-samples/fixtures/cli/no_temperature.nc: no air_temperature variable found (recognised: q (specific_humidity)); name it explicitly if it is there',
    },
    {
      what: 'no humidity',
      file: `${NC}/bad/missing_humidity.nc`,
      msg: `${NC}/bad/missing_humidity.nc: no humidity variable found (looked for specific_humidity, humidity_mixing_ratio, relative_humidity, dew_point_temperature; recognised: t (air_temperature), z (geopotential))`,
    },
    {
      what: 'no pressure levels',
      file: `${NC}/bad/no_pressure.nc`,
      msg: `${NC}/bad/no_pressure.nc: variable t (air_temperature) has no pressure levels: its vertical axis lev is not pressure (atmosphere_hybrid_sigma_pressure_coordinate, units 1)`,
    },
    {
      what: 'relative humidity without a convention',
      file: `${NC}/rh_only.nc`,
      msg: 'relative humidity r has no stated phase convention; name one with --rh-convention water|ice|ecmwf-mixed|cmip',
    },
    { what: 'truncated file', file: `${NC}/bad/truncated.nc`, msg: `${NC}/bad/truncated.nc: truncated file` },
  ])('$what', async ({ file, msg }) => {
    const out = tmp();
    const r = await cli('masks', file, '--out', out);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr.startsWith(`frostgrid masks: `)).toBe(true);
    expect(r.stderr).toContain(msg);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
    expect(readdirSync(out)).toEqual([]);
  });

  it('unwritable --out (a regular file stands where the folder should be)', async () => {
    const dir = tmp();
    const blocker = join(dir, 'not-a-folder');
    writeFileSync(blocker, 'x');
    const r = await cli('masks', DEMO, '--out', blocker, '--levels', '250', '--quiet');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain(`frostgrid masks: cannot create output folder ${join(blocker, 'frostgrid-demo')}`);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('--debug adds the trace', async () => {
    const r = await cli('masks', `${NC}/bad/not_netcdf.nc`, '--out', tmp(), '--debug');
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/\n\s+at /);
  });

  it('a level the file does not have names the levels it has', async () => {
    const out = tmp();
    const r = await cli('masks', DEMO, '--out', out, '--levels', '275');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('no 275 hPa level; levels: 150, 200, 250, 300, 350 hPa');
    expect(readdirSync(out)).toEqual([]);
  });
});

describe('frostgrid masks: usage errors (exit 2)', () => {
  it.each([
    { args: [DEMO, '--out', 'x', '--fuel', 'diesel'], msg: 'unknown --fuel "diesel"; known fuels: kerosene, synthetic-kerosene, hydrogen' },
    { args: [DEMO, '--out', 'x', '--efficiency', '1.2'], msg: '--efficiency must lie in [0, 1), got 1.2' },
    { args: [DEMO, '--out', 'x', '--efficiency', '-0.5'], msg: '--efficiency must lie in [0, 1), got -0.5' },
    { args: [DEMO], msg: 'masks needs --out DIR' },
    { args: ['--out', 'x'], msg: 'masks takes exactly one FILE' },
    { args: [DEMO, '--out', 'x', '--bbox', '10,20,30'], msg: '--bbox must be four numbers W,S,E,N in degrees' },
    { args: [DEMO, '--out', 'x', '--levels', 'low'], msg: '--levels takes pressures in hPa' },
    { args: [DEMO, '--out', 'x', '--rh-convention', 'liquid'], msg: 'unknown --rh-convention "liquid"' },
    { args: [DEMO, '--out', 'x', '--lhv', '50'], msg: '--lhv goes with --ei-h2o or --hydrogen-fraction' },
    { args: [DEMO, '--out', 'x', '--ice-threshold', '0'], msg: '--ice-threshold must be in (0, 200] %, got 0' },
    { args: [DEMO, '--out', 'x', '--freezing-temperature', '100'], msg: '--freezing-temperature must be in [150, 273.16] K, got 100' },
    { args: [DEMO, '--out', 'x', '--humidity-scale', '20'], msg: '--humidity-scale must be in (0, 10], got 20' },
    { args: [DEMO, '--out', 'x', '--workers', '-1'], msg: '--workers must be a whole number from 0 to 64, got "-1"' },
  ])('$msg', async ({ args, msg }) => {
    const r = await cli('masks', ...args);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`frostgrid masks: ${msg}`);
    expect(r.stderr).toContain('(see frostgrid masks --help)');
    expect(existsSync('x')).toBe(false);
  });
});

describe('frostgrid info and probe errors', () => {
  it('info on a missing file', async () => {
    const r = await cli('info', 'nowhere.grib2');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('frostgrid info: nowhere.grib2: cannot open');
  });
  it('probe of a variable the file lacks lists what it has', async () => {
    const r = await cli('probe', DEMO, '--var', 'relative_humidity', '--level', '250', '--time', '2029-10-17T06:00Z', '--at', '0,0');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('no variable relative_humidity; the file has t (air_temperature), q (specific_humidity), z (geopotential)');
  });
  it('probe without --time on a two-time file names the times', async () => {
    const r = await cli('probe', DEMO, '--var', 't', '--level', '250', '--at', '0,0');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('has 2 times; choose one with --time (2029-10-17T06:00:00Z, 2029-10-17T12:00:00Z)');
  });
  it('probe with a bad point is a usage error', async () => {
    const r = await cli('probe', DEMO, '--var', 't', '--level', '250', '--at', '95,0');
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--at: latitude 95 is outside -90..90');
  });
});
