/**
 * Worker threads are an implementation detail of `frostgrid masks`: with levels evaluated on two
 * worker threads the job must write exactly the bytes it writes on the main thread, on NetCDF and
 * on GRIB input (the outputs themselves are checked against outside oracles in
 * masks-oracle.test.ts). Errors raised inside a worker reach the caller as FrostgridErrors that
 * name the file and the problem.
 */
import { mkdtempSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_CRITERION, FrostgridError, open, runMaskJob } from '../../lib/index.js';
import { workerPoolEvaluator } from '../../lib/jobs/level-evaluator.js';
import { cli } from '../cli/support.js';

function filesUnder(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string): void => {
    for (const name of readdirSync(d).sort()) {
      const p = join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else out.push(relative(dir, p));
    }
  };
  walk(dir);
  return out;
}

describe.each([['data-samples/demo/frostgrid-demo.nc'], ['data-samples/demo/frostgrid-demo.grib2']])('workers on %s', (input) => {
  it('two worker threads write the same bytes as the main thread', async () => {
    const base = mkdtempSync(join(tmpdir(), 'frostgrid-workers-'));
    const common = { input, criterion: { ...DEFAULT_CRITERION }, levels: { values: [], ranges: [[200, 300]] as [number, number][] } };
    const a = await runMaskJob({ ...common, outDir: join(base, 'main'), workers: 0 });
    const b = await runMaskJob({ ...common, outDir: join(base, 'pool'), workers: 2 });
    expect(a.folders).toHaveLength(2);
    expect(b.folders).toHaveLength(2);
    const filesA = filesUnder(join(base, 'main'));
    expect(filesUnder(join(base, 'pool'))).toEqual(filesA);
    expect(filesA.filter((f) => f.endsWith('.tif'))).toHaveLength(12);
    for (const f of filesA) {
      const bytesA = readFileSync(join(base, 'main', f));
      const bytesB = readFileSync(join(base, 'pool', f));
      expect(bytesB.equals(bytesA), f).toBe(true);
    }
    expect(b.summaries).toEqual(a.summaries);
  }, 60_000);
});

describe('worker errors', () => {
  const params = { ...DEFAULT_CRITERION };

  it('a worker that cannot open the file fails the pool with the file named', async () => {
    const missing = join(tmpdir(), 'frostgrid-no-such-file.nc');
    const err = await workerPoolEvaluator(
      { path: missing, temperatureVariable: 't', humidityVariable: 'q', params, levelsPa: [25000] },
      1,
    ).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(FrostgridError);
    expect((err as FrostgridError).message).toContain(missing);
  }, 30_000);

  it('a slice the worker cannot evaluate rejects that slice only, with the reason', async () => {
    const pool = await workerPoolEvaluator(
      { path: 'data-samples/demo/frostgrid-demo.nc', temperatureVariable: 't', humidityVariable: 'q', params, levelsPa: [25000, 12345] },
      1,
    );
    const ds = await open('data-samples/demo/frostgrid-demo.nc');
    const t = ds.fields.find((f) => f.name === 't');
    await ds.close();
    try {
      const time = t!.times[0];
      const bad = await pool.evaluate(time, 12345, 1).catch((e: unknown) => e);
      expect(bad).toBeInstanceOf(FrostgridError);
      expect((bad as Error).message).toMatch(/no 123\.45 hPa/);
      const good = await pool.evaluate(time, 25000, 0);
      expect(good.arrays.rhiPercent.length).toBe(t!.grid.npoints);
      expect(good.result.statistics.validCells).toBeGreaterThan(0);
    } finally {
      await pool.close();
    }
  }, 30_000);

  it('--workers rejects a value that is not a whole number', async () => {
    const r = await cli('masks', 'data-samples/demo/frostgrid-demo.nc', '--out', tmpdir(), '--workers', 'two');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--workers must be a whole number from 0 to 64, got "two"/);
  });
});
