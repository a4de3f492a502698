import { describe, expect, it } from 'vitest';
import { DEFAULT_CRITERION } from '../../lib/physics/index.js';
import {
  LevelWorkspace,
  SUMMARY_CSV_COLUMNS,
  SummaryBuilder,
  cellWeights,
  evaluateFieldLevel,
  humidityRecord,
  maskArea,
  selectHumidity,
  selectTemperature,
  summaryParameters,
  summaryToCsv,
  summaryToJson,
} from '../../lib/products/index.js';
import { globalRegularGrid, memoryDataset, memoryField, timeAt } from './grids.js';

// Invented test atmosphere (not the demo): T falls with latitude, q follows a smooth pattern.
const grid = globalRegularGrid(1);
const levels = [20000, 25000];
const times = [timeAt('2031-05-02T00:00:00Z'), timeAt('2031-05-02T03:00:00Z')];
const T = memoryField({
  name: 'ta',
  quantity: 'air_temperature',
  units: 'K',
  grid,
  levelsPa: levels,
  times,
  values: (t, k, i) => 212 + 8 * k + 10 * Math.cos(((90 - Math.floor(i / 360)) * Math.PI) / 180) + t,
});
const Q = memoryField({
  name: 'hus',
  quantity: 'specific_humidity',
  units: 'kg kg-1',
  grid,
  levelsPa: levels,
  times,
  quantizationStep: 1e-8,
  values: (t, k, i) => (i % 997 === 0 ? NaN : (4 + 3 * Math.sin(i / 500 + t)) * 1e-5 * (k + 1)),
});

async function buildSummary() {
  const ds = memoryDataset([T, Q], 'invented.nc');
  const hum = selectHumidity(ds);
  const temperature = selectTemperature(ds);
  const box = { west: -30, south: -60, east: 60, north: 70 };
  const weights = cellWeights(grid, box);
  const ws = new LevelWorkspace(grid.npoints);
  const builder = new SummaryBuilder({ input: ds.path, format: ds.format, parameters: summaryParameters(DEFAULT_CRITERION, box), humidity: humidityRecord(hum) });
  const perLevel: { cells: number[]; areas: number[]; valid: number }[] = [];
  for (const time of times) {
    for (const p of [...levels].reverse()) {
      const r = await evaluateFieldLevel(ws, temperature, hum, time, p, DEFAULT_CRITERION, weights);
      builder.addLevel(time, r);
      const ms = [ws.iceSupersaturated, ws.contrailForming, ws.persistentContrail].map((m) => maskArea(m, weights));
      let valid = 0;
      for (let i = 0; i < grid.npoints; i++) if (weights.inside![i] && ws.iceSupersaturated[i] !== 255) valid++;
      perLevel.push({ cells: ms.map((m) => m.cells), areas: ms.map((m) => m.area_km2), valid });
    }
  }
  return { summary: builder.build(), perLevel };
}

describe('summary', () => {
  it('has exactly the contract shape, levels by increasing pressure, counts and areas equal to the masks', async () => {
    const { summary, perLevel } = await buildSummary();
    const json = JSON.parse(summaryToJson(summary));
    expect(json.input).toBe('invented.nc');
    expect(Object.keys(json.parameters)).toEqual(
      expect.arrayContaining(['fuel', 'efficiency', 'saturation', 'ice_threshold_percent', 'freezing_temperature_K', 'humidity_scale', 'bbox']),
    );
    expect(json.parameters.bbox).toEqual([-30, -60, 60, 70]);
    expect(json.humidity.source).toBe('specific_humidity');
    expect(json.times).toHaveLength(2);
    expect(json.times[0].time).toBe('2031-05-02T00:00:00Z');
    for (const [ti, t] of json.times.entries()) {
      expect(t.levels.map((l: { pressure_hPa: number }) => l.pressure_hPa)).toEqual([200, 250]);
      for (const [li, l] of t.levels.entries()) {
        for (const key of ['pressure_hPa', 'flight_level', 'valid_cells']) expect(typeof l[key]).toBe('number');
        // Levels were added 250 then 200 hPa: perLevel holds them in that order.
        const ref = perLevel[ti * 2 + (1 - li)];
        expect(l.valid_cells).toBe(ref.valid);
        ['ice_supersaturated', 'contrail_forming', 'persistent_contrail'].forEach((k, j) => {
          expect(Object.keys(l[k]).sort()).toEqual(['area_km2', 'cells', 'fraction']);
          expect(l[k].cells).toBe(ref.cells[j]);
          expect(l[k].area_km2).toBe(ref.areas[j]);
          expect(l[k].fraction).toBe(ref.cells[j] / ref.valid);
        });
        expect(l.rhi_uncertainty.step).toBe(1e-8);
      }
    }
    // Something of everything happens in this invented atmosphere, so the checks above bite.
    const all = json.times.flatMap((t: { levels: unknown[] }) => t.levels) as { contrail_forming: { cells: number }; ice_supersaturated: { cells: number } }[];
    expect(all.some((l) => l.contrail_forming.cells > 0)).toBe(true);
    expect(all.some((l) => l.ice_supersaturated.cells > 0)).toBe(true);
  });

  it('CSV twin: header, one row per time × level, values equal to the JSON', async () => {
    const { summary } = await buildSummary();
    const lines = summaryToCsv(summary).trimEnd().split('\n');
    expect(lines[0].split(',')).toEqual([...SUMMARY_CSV_COLUMNS]);
    expect(lines).toHaveLength(1 + 2 * 2);
    const rows = lines.slice(1).map((l) => Object.fromEntries(l.split(',').map((v, i) => [SUMMARY_CSV_COLUMNS[i], v])));
    const flat = summary.times.flatMap((t) => t.levels.map((l) => ({ t, l })));
    rows.forEach((row, i) => {
      const { t, l } = flat[i];
      expect(row.time).toBe(t.time);
      expect(Number(row.pressure_hPa)).toBe(l.pressure_hPa);
      expect(Number(row.valid_cells)).toBe(l.valid_cells);
      expect(Number(row.persistent_contrail_cells)).toBe(l.persistent_contrail.cells);
      expect(Number(row.ice_supersaturated_area_km2)).toBe(l.ice_supersaturated.area_km2);
      expect(Number(row.contrail_forming_fraction)).toBe(l.contrail_forming.fraction);
    });
  });

  it('flight level of a level is the ISA pressure altitude in hundreds of feet (250 hPa ≈ FL340; ICAO Doc 7488)', async () => {
    const { summary } = await buildSummary();
    const l250 = summary.times[0].levels[1];
    // 250 hPa lies at 10 363 m in the ISA troposphere (from T0/L·(1 − (p/p0)^(RL/g0))): FL 340.0.
    const h = (288.15 / 0.0065) * (1 - Math.pow(25000 / 101325, (287.05287 * 0.0065) / 9.80665));
    expect(l250.flight_level).toBeCloseTo(h / 30.48, 6);
    expect(Math.round(l250.flight_level)).toBe(340);
  });
});
