import { describe, expect, it } from 'vitest';
import { AmbiguityError, MissingQuantityError, ParameterError } from '../../lib/errors.js';
import { DEFAULT_CRITERION } from '../../lib/physics/index.js';
import {
  LevelWorkspace,
  cellWeights,
  evaluateFieldLevel,
  humidityRecord,
  parseRhConvention,
  selectHumidity,
  selectTemperature,
  vapourPressureFromHumidity,
} from '../../lib/products/index.js';
import { memoryDataset, memoryField, regionalGrid, timeAt } from './grids.js';

const grid = regionalGrid(40, 0, 1, 3, 4);
const times = [timeAt('2031-05-02T00:00:00Z')];
const mk = (name: string, quantity: Parameters<typeof memoryField>[0]['quantity'], units: string, v: number, extra: Partial<Parameters<typeof memoryField>[0]> = {}) =>
  memoryField({ name, quantity, units, grid, levelsPa: [25000], times, values: () => v, ...extra });

const T = mk('t', 'air_temperature', 'K', 220);
const Q = mk('q', 'specific_humidity', 'kg kg-1', 5e-5);
const R = mk('r', 'humidity_mixing_ratio', 'kg kg-1', 5e-5);
const RH = mk('rh', 'relative_humidity', '1', 0.8);
const TD = mk('td', 'dew_point_temperature', 'K', 210);

describe('humidity selection', () => {
  it('prefers specific humidity, then mixing ratio, then relative humidity, then dew point', () => {
    expect(selectHumidity(memoryDataset([T, TD, RH, R, Q])).source).toBe('specific_humidity');
    expect(selectHumidity(memoryDataset([T, TD, RH, R])).source).toBe('humidity_mixing_ratio');
    expect(selectHumidity(memoryDataset([T, TD, RH]), { rhConvention: 'water' }).source).toBe('relative_humidity');
    expect(selectHumidity(memoryDataset([T, TD])).source).toBe('dew_point_temperature');
  });

  it('relative humidity without a convention asks the user to name one', () => {
    let err: unknown;
    try {
      selectHumidity(memoryDataset([T, RH], 'x.nc'));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ParameterError);
    expect((err as Error).message).toBe(
      'x.nc: relative humidity rh has no stated phase convention; name one with --rh-convention water|ice|ecmwf-mixed|cmip',
    );
  });

  it('uses the field’s convention, the ECMWF centre, or the user’s choice (which wins)', () => {
    const rhIce = mk('rh', 'relative_humidity', '1', 0.8, { rhConvention: { convention: 'ice', source: 'attribute' } });
    expect(selectHumidity(memoryDataset([T, rhIce])).convention).toBe('ice');
    expect(selectHumidity(memoryDataset([T, rhIce]), { rhConvention: 'water' })).toMatchObject({ convention: 'water', conventionSource: 'user' });
    const rhEc = mk('r', 'relative_humidity', '1', 0.8, { attrs: { centre: 98 } });
    expect(selectHumidity(memoryDataset([T, rhEc])).convention).toBe('ecmwf-mixed');
    const rec = humidityRecord(selectHumidity(memoryDataset([T, rhEc])));
    expect(rec.conversion).toMatch(/^e = RH·ECMWF/);
  });

  it('two temperatures or a named non-humidity are typed errors, never a silent pick', () => {
    const T2 = mk('ta', 'air_temperature', 'K', 230);
    expect(() => selectTemperature(memoryDataset([T, T2, Q], 'x.nc'))).toThrow(AmbiguityError);
    expect(() => selectTemperature(memoryDataset([T, T2, Q], 'x.nc'))).toThrow('x.nc: 2 variables could be air_temperature: t, ta; name one explicitly');
    expect(selectTemperature(memoryDataset([T, T2, Q]), 'ta').name).toBe('ta');
    expect(() => selectHumidity(memoryDataset([T, Q], 'x.nc'), { variable: 't' })).toThrow('x.nc: variable t is not a humidity (it is air_temperature)');
    expect(selectHumidity(memoryDataset([T, Q, TD]), { variable: 'td' }).source).toBe('dew_point_temperature');
  });

  it('typed errors: no humidity, ambiguous humidity, unknown convention name', () => {
    expect(() => selectHumidity(memoryDataset([T]))).toThrow(MissingQuantityError);
    expect(() => selectHumidity(memoryDataset([T, Q, mk('q2', 'specific_humidity', 'kg kg-1', 1e-5)]))).toThrow(AmbiguityError);
    expect(() => parseRhConvention('liquid')).toThrow(/water, ice, ecmwf-mixed, cmip/);
  });

  it('q and r give e = q·p/(ε + (1 − ε)q) and e = r·p/(ε + r), ε = 0.622 (WMO-No. 8, Annex 4.B)', () => {
    const out = new Float32Array(1);
    vapourPressureFromHumidity(out, new Float32Array([5e-5]), new Float32Array([220]), 25000, { source: 'specific_humidity' }, 'murphy-koop');
    expect(out[0]).toBeCloseTo((5e-5 * 25000) / (0.622 + 0.378 * 5e-5), 5);
    vapourPressureFromHumidity(out, new Float32Array([5e-5]), new Float32Array([220]), 25000, { source: 'humidity_mixing_ratio' }, 'murphy-koop');
    expect(out[0]).toBeCloseTo((5e-5 * 25000) / (0.622 + 5e-5), 5);
  });

  it('relative humidity over ice 0.8 evaluates to RHi = 80 % on every cell', async () => {
    const rhIce = mk('rh', 'relative_humidity', '1', 0.8, { rhConvention: { convention: 'ice', source: 'attribute' } });
    const ds = memoryDataset([T, rhIce]);
    const ws = new LevelWorkspace(grid.npoints);
    const r = await evaluateFieldLevel(ws, T, selectHumidity(ds), times[0], 25000, DEFAULT_CRITERION, cellWeights(grid));
    for (const v of ws.rhiPercent) expect(v).toBeCloseTo(80, 4);
    expect(r.statistics.validCells).toBe(grid.npoints);
    expect(r.statistics.iceSupersaturated.cells).toBe(0);
  });
});
