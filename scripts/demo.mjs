#!/usr/bin/env node
// Runs the main job on the bundled synthetic demo scenario and says where the outputs are.
// `npm ci` builds dist/ (the "prepare" script); this script builds it too when it is missing.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

const root = resolve(new URL('..', import.meta.url).pathname);
const cli = join(root, 'dist', 'bin', 'frostgrid.js');
if (!existsSync(cli)) {
  const b = spawnSync('npx', ['tsc', '-p', 'tsconfig.build.json'], { cwd: root, stdio: 'inherit' });
  if (b.status !== 0) process.exit(b.status ?? 1);
}
const input = join(root, 'data-samples', 'demo', 'frostgrid-demo.nc');
const out = join(root, 'demo-output');
console.log(`frostgrid demo: ${input}\n  (an invented, synthetic atmosphere; not real weather)\n`);
const run = spawnSync(process.execPath, [cli, 'masks', input, '--out', out, '--quicklook'], { cwd: root, stdio: ['ignore', 'pipe', 'inherit'] });
if (run.status !== 0) process.exit(run.status ?? 1);
const folders = run.stdout.toString().trim().split('\n').filter(Boolean);
for (const folder of folders) {
  console.log(`outputs in ${folder}:`);
  for (const f of readdirSync(folder).sort()) console.log(`  ${f}`);
  const summary = JSON.parse(readFileSync(join(folder, 'summary.json'), 'utf8'));
  for (const t of summary.times) {
    for (const l of t.levels) {
      console.log(
        `  ${t.time}  ${String(l.pressure_hPa).padStart(4)} hPa (FL${Math.round(l.flight_level)}):` +
          ` ice-supersaturated ${(100 * l.ice_supersaturated.fraction).toFixed(1)} %,` +
          ` contrail-forming ${(100 * l.contrail_forming.fraction).toFixed(1)} %,` +
          ` persistent ${(100 * l.persistent_contrail.fraction).toFixed(1)} % (${Math.round(l.persistent_contrail.area_km2).toLocaleString('en')} km²)`,
      );
    }
  }
  console.log('');
}
console.log('Open the .tif files in a desktop GIS (QGIS: Layer > Add Raster Layer), or inspect them with gdalinfo.');
console.log('frostgrid informs research and planning; it is not an operational flight-planning tool.');
