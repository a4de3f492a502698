/** `frostgrid info`: what a file holds, as the grid model sees it. */
import { describeDataset, open, type DatasetDescription } from '../../../lib/index.js';
import { UsageError, type CliIo } from '../io.js';
import { flag, parse } from '../options.js';

export const INFO_HELP = `Usage: frostgrid info FILE [--json]

Describes a NetCDF (classic or NetCDF4/HDF5) or GRIB (edition 1 or 2) file: its format, the
variables with the quantity frostgrid recognises in each (CF standard name), units, pressure
levels (hPa), valid times, and the grid (shape, first and last coordinates, spacing, CRS).

Options:
  --json    print JSON instead of text

Example:
  frostgrid info reanalysis.nc --json
`;

export async function infoCommand(args: readonly string[], io: CliIo): Promise<number> {
  const p = parse(args, { json: { type: 'boolean' }, help: { type: 'boolean', short: 'h' } });
  if (flag(p, 'help')) {
    io.stdout(INFO_HELP);
    return 0;
  }
  if (p.positionals.length !== 1) throw new UsageError('info takes exactly one FILE');
  const ds = await open(p.positionals[0]);
  try {
    const d = describeDataset(ds);
    io.stdout(flag(p, 'json') ? JSON.stringify(d, null, 2) + '\n' : formatText(d));
  } finally {
    await ds.close();
  }
  return 0;
}

function formatText(d: DatasetDescription): string {
  const lines = [`file     ${d.file}`, `format   ${d.format}`, ''];
  for (const v of d.variables) {
    lines.push(`${v.name}${v.quantity ? `  [${v.quantity}]` : ''}${v.long_name ? `  ${v.long_name}` : ''}`);
    lines.push(`  units      ${v.units}${v.units !== v.si_units ? ` (decoded to ${v.si_units})` : ''}, stored as ${v.stored_as}`);
    if (v.rh_convention) lines.push(`  RH phase   ${v.rh_convention}`);
    if (v.levels_hPa.length > 0) lines.push(`  levels     ${v.levels_hPa.join(', ')} hPa`);
    if (v.times.length > 0) lines.push(`  times      ${summariseList(v.times)}`);
    const g = v.grid;
    const first = 'lat' in g.first ? `${g.first.lat}°, ${g.first.lon}°` : `${g.first.x} m, ${g.first.y} m`;
    const last = 'lat' in g.last ? `${g.last.lat}°, ${g.last.lon}°` : `${g.last.x} m, ${g.last.y} m`;
    const spacing = Object.entries(g.spacing)
      .map(([k, s]) => `${k} ${s}`)
      .join(', ');
    lines.push(`  grid       ${g.kind} ${g.shape[0]} × ${g.shape[1]} (${g.points} points), first ${first}, last ${last}, spacing ${spacing}`);
    lines.push(`  crs        ${g.crs}`);
  }
  if (d.notes.length > 0) lines.push('', 'notes:', ...d.notes.map((n) => `  - ${n}`));
  return lines.join('\n') + '\n';
}

function summariseList(items: readonly string[]): string {
  return items.length <= 6 ? items.join(', ') : `${items.slice(0, 3).join(', ')}, … ${items.at(-1)} (${items.length} times)`;
}
