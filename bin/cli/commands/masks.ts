/** `frostgrid masks`: the main job — level products, column summaries and statistics per valid time. */
import cliProgress from 'cli-progress';
import { runMaskJob, type RhConvention } from '../../../lib/index.js';
import { UsageError, type CliIo } from '../io.js';
import { CRITERION_OPTIONS, criterionFromOptions, flag, list, parse, parseBbox, parseLevels, str } from '../options.js';

export const MASKS_HELP = `Usage: frostgrid masks FILE --out DIR [options]

For every valid time and pressure level: relative humidity over ice, the ice-supersaturated,
contrail-forming (Schmidt–Appleman criterion) and persistent-contrail masks, the formation margin
T_LC - T, and per column the persistent layers' base, top and depth; as GeoTIFFs with a summary.

Writes under DIR/<input name>/<valid time YYYYMMDDTHHMMZ>/:
  rhi.tif, ice-supersaturated.tif, contrail-forming.tif, persistent-contrail.tif,
  formation-margin.tif (one band per level), column.tif, summary.json, summary.csv
  (and quicklook/*.png with --quicklook). Masks are 0/1 with 255 where an input is missing.

Options:
  --out DIR                   output folder (created if needed; files are replaced when complete)
  --levels LIST|RANGE         pressure levels in hPa: 200,250,300 or 150-300 (default: all)
  --times LIST                valid times, ISO 8601, comma separated (default: all)
  --fuel NAME                 kerosene (default), synthetic-kerosene, hydrogen
  --ei-h2o KG_PER_KG          water emission index of a fuel of your own (with --lhv)
  --hydrogen-fraction X       hydrogen mass fraction of a fuel of your own (with --lhv)
  --lhv MJ_PER_KG             lower heating value of a fuel of your own
  --efficiency ETA            overall propulsion efficiency, 0 <= ETA < 1 (default 0.3)
  --ice-threshold PERCENT     RHi at or above which air counts as ice-supersaturated (default 100)
  --freezing-temperature K    plume droplets freeze below this temperature (default 235)
  --saturation NAME           murphy-koop (default), sonntag, goff-gratch, iapws, magnus
  --humidity-scale F          multiply the file's vapour pressure by F (capped at water
                              saturation) before RHi and the criterion (default 1: off)
  --rh-convention NAME        phase convention of a relative humidity the file does not state:
                              water, ice, ecmwf-mixed, cmip
  --temperature-var NAME      use this variable as air temperature
  --humidity-var NAME         use this variable as the humidity
  --bbox W,S,E,N              restrict the statistics to a box (degrees); rasters stay whole
  --keep-longitudes           keep 0..360 longitudes in the rasters (default: -180..180)
  --quicklook                 also write a PNG map per level
  --workers N                 worker threads evaluating levels; 0 evaluates on the main thread
                              (default: both cores when the job has 4 million cells or more)
  --quiet                     no progress bar and no notes (the output folders are still listed)
  --debug                     full error traces

Example:
  frostgrid masks data-samples/demo/frostgrid-demo.nc --out results --levels 200-300 --quicklook

frostgrid informs research and planning; it is not an operational flight-planning tool.
`;

const RH_CONVENTIONS: readonly RhConvention[] = ['water', 'ice', 'ecmwf-mixed', 'cmip'];

export async function masksCommand(args: readonly string[], io: CliIo): Promise<number> {
  const p = parse(args, {
    ...CRITERION_OPTIONS,
    out: { type: 'string' },
    levels: { type: 'string', multiple: true },
    times: { type: 'string', multiple: true },
    'ice-threshold': { type: 'string' },
    'freezing-temperature': { type: 'string' },
    'humidity-scale': { type: 'string' },
    'rh-convention': { type: 'string' },
    'temperature-var': { type: 'string' },
    'humidity-var': { type: 'string' },
    bbox: { type: 'string' },
    'keep-longitudes': { type: 'boolean' },
    quicklook: { type: 'boolean' },
    workers: { type: 'string' },
    quiet: { type: 'boolean', short: 'q' },
    help: { type: 'boolean', short: 'h' },
  });
  if (flag(p, 'help')) {
    io.stdout(MASKS_HELP);
    return 0;
  }
  if (p.positionals.length !== 1) throw new UsageError('masks takes exactly one FILE');
  const outDir = str(p, 'out');
  if (outDir === undefined) throw new UsageError('masks needs --out DIR');
  const criterion = criterionFromOptions(p);
  const rh = str(p, 'rh-convention');
  if (rh !== undefined && !(RH_CONVENTIONS as readonly string[]).includes(rh)) {
    throw new UsageError(`unknown --rh-convention "${rh}"; known: ${RH_CONVENTIONS.join(', ')}`);
  }
  const tVar = str(p, 'temperature-var');
  const hVar = str(p, 'humidity-var');
  const workersText = str(p, 'workers');
  let workers: number | undefined;
  if (workersText !== undefined) {
    workers = Number(workersText);
    if (!/^\d+$/.test(workersText.trim()) || workers > 64) throw new UsageError(`--workers must be a whole number from 0 to 64, got "${workersText}"`);
  }

  const showProgress = io.stderrIsTTY && !flag(p, 'quiet');
  const bar = showProgress
    ? new cliProgress.SingleBar(
        { format: 'frostgrid masks |{bar}| {value}/{total} slices {label}', stream: process.stderr, hideCursor: true },
        cliProgress.Presets.shades_classic,
      )
    : undefined;
  let started = false;
  try {
    const result = await runMaskJob({
      input: p.positionals[0],
      outDir,
      levels: parseLevels(p),
      times: list(p, 'times'),
      criterion,
      bbox: parseBbox(p),
      quicklook: flag(p, 'quicklook'),
      keepLongitude0To360: flag(p, 'keep-longitudes'),
      rhConvention: rh as RhConvention | undefined,
      temperatureVariable: tVar,
      humidityVariable: hVar,
      workers,
      progress: bar
        ? (done, total, label) => {
            if (!started) {
              bar.start(total, 0, { label });
              started = true;
            }
            bar.update(done, { label });
          }
        : undefined,
    });
    bar?.stop();
    if (!flag(p, 'quiet')) for (const n of result.notes) io.stderr(`note: ${n}\n`);
    for (const f of result.folders) io.stdout(`${f}\n`);
  } catch (e) {
    bar?.stop();
    throw e;
  }
  return 0;
}
