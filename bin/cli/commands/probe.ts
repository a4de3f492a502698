/** `frostgrid probe`: a variable's values at points, at the nearest grid node. */
import { readFile } from 'node:fs/promises';
import { open, probe, type ProbePoint } from '../../../lib/index.js';
import { UsageError, type CliIo } from '../io.js';
import { flag, num, parse, str } from '../options.js';

export const PROBE_HELP = `Usage: frostgrid probe FILE --var NAME --level HPA [--time ISO]
                      (--at LAT,LON ... | --points CSV) [--json]

Prints the value of a variable at the grid node nearest to each point, in the variable's own units
after unpacking (the numbers netCDF4-python and ecCodes report; no conversion to SI).

Options:
  --var NAME       a CF standard name (air_temperature, specific_humidity, relative_humidity,
                   geopotential, ...) or the file's own variable name
  --level HPA      pressure level in hPa
  --time ISO       valid time (ISO 8601, e.g. 2026-03-04T06:00Z); needed when the file has several
  --at LAT,LON     a point in degrees; repeat the option for more points
  --points CSV     a CSV file with columns lat,lon (a header line is optional)
  --json           print a JSON array of objects instead of CSV

Output columns: lat,lon,grid_lat,grid_lon,value

Example:
  frostgrid probe forecast.grib2 --var air_temperature --level 250 --at 52.5,13.4 --at -33.9,151.2
`;

export async function probeCommand(args: readonly string[], io: CliIo): Promise<number> {
  const p = parse(args, {
    var: { type: 'string' },
    level: { type: 'string' },
    time: { type: 'string' },
    at: { type: 'string', multiple: true },
    points: { type: 'string' },
    json: { type: 'boolean' },
    help: { type: 'boolean', short: 'h' },
  });
  if (flag(p, 'help')) {
    io.stdout(PROBE_HELP);
    return 0;
  }
  if (p.positionals.length !== 1) throw new UsageError('probe takes exactly one FILE');
  const variable = str(p, 'var');
  if (variable === undefined) throw new UsageError('probe needs --var NAME');
  const level = num(p, 'level');
  if (level === undefined) throw new UsageError('probe needs --level HPA');
  const atValues = p.values.at;
  const at = Array.isArray(atValues) ? atValues : [];
  const pointsFile = str(p, 'points');
  if (at.length === 0 && pointsFile === undefined) throw new UsageError('probe needs --at LAT,LON or --points CSV');
  const points: ProbePoint[] = at.map((s) => parsePoint(s, '--at'));
  if (pointsFile !== undefined) points.push(...parsePointsCsv(await readFile(pointsFile, 'utf8'), pointsFile));

  const ds = await open(p.positionals[0]);
  try {
    const rows = await probe(ds, { variable, levelHPa: level, time: str(p, 'time'), points });
    if (flag(p, 'json')) {
      io.stdout(JSON.stringify(rows, null, 2) + '\n');
    } else {
      io.stdout('lat,lon,grid_lat,grid_lon,value\n');
      for (const r of rows) io.stdout(`${r.lat},${r.lon},${fmt(r.grid_lat)},${fmt(r.grid_lon)},${r.value === null ? '' : r.value}\n`);
    }
  } finally {
    await ds.close();
  }
  return 0;
}

function fmt(x: number): string {
  return Number.isNaN(x) ? '' : String(Math.round(x * 1e9) / 1e9);
}

function parsePoint(s: string, where: string): ProbePoint {
  const parts = s.split(',').map((x) => Number(x.trim()));
  if (parts.length !== 2 || parts.some((x) => !Number.isFinite(x))) throw new UsageError(`${where} takes LAT,LON in degrees, got "${s}"`);
  const [lat, lon] = parts as [number, number];
  if (lat < -90 || lat > 90) throw new UsageError(`${where}: latitude ${lat} is outside -90..90`);
  return { lat, lon };
}

function parsePointsCsv(text: string, file: string): ProbePoint[] {
  const out: ProbePoint[] = [];
  const lines = text.split(/\r?\n/).map((l) => l.trim()).filter((l) => l.length > 0 && !l.startsWith('#'));
  lines.forEach((line, n) => {
    if (n === 0 && /[a-z]/i.test(line)) return; // header
    out.push(parsePoint(line.split(',').slice(0, 2).join(','), `${file} line ${n + 1}`));
  });
  if (out.length === 0) throw new UsageError(`${file} holds no points (expected lines "lat,lon")`);
  return out;
}
