/**
 * GDAL as the outside reader of the GeoTIFFs frostgrid writes: gdalinfo -json, python3-gdal
 * pixel reads, OSR projection parameters and the COG validator shipped with python3-gdal
 * (osgeo_utils.samples.validate_cloud_optimized_geotiff).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PYTHON, run, toolAvailable } from '../support/tools.js';

export const haveGdal = toolAvailable('command', 'gdalinfo') && toolAvailable('python', 'osgeo');

/** A fresh temporary directory; remove it with `rmSync(dir, { recursive: true })`. */
export function tempDir(prefix = 'frostgrid-output-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

export function removeDir(dir: string): void {
  rmSync(dir, { recursive: true, force: true });
}

/** gdalinfo -json, with GDAL's bare NaN / Infinity tokens turned into strings so JSON.parse takes them. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function gdalinfo(path: string): any {
  const text = run('gdalinfo', ['-json', path]).replace(/:\s*(-?)(NaN|Infinity)\b/g, ': "$1$2"');
  return JSON.parse(text);
}

const READ_SCRIPT = `
import sys
from osgeo import gdal
gdal.UseExceptions()
ds = gdal.Open(sys.argv[1])
ovr = int(sys.argv[3])
with open(sys.argv[2], 'wb') as f:
    for b in range(ds.RasterCount):
        band = ds.GetRasterBand(b + 1)
        if ovr >= 0:
            band = band.GetOverview(ovr)
        a = band.ReadAsArray()
        f.write(a.astype(a.dtype.newbyteorder('<')).tobytes())
`;

type Ctor<T> = { new (buffer: ArrayBuffer, offset: number, length: number): T; BYTES_PER_ELEMENT: number };

/** Every band (or one overview level of every band) as read by python3-gdal's ReadAsArray. */
export function gdalReadBands<T>(path: string, ctor: Ctor<T>, count: number, overview = -1): T[] {
  const dir = tempDir('frostgrid-gdalread-');
  try {
    const out = join(dir, 'bands.raw');
    run(PYTHON, ['-c', READ_SCRIPT, path, out, String(overview)]);
    const bytes = readFileSync(out);
    const buf = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
    const per = buf.byteLength / ctor.BYTES_PER_ELEMENT / count;
    return Array.from({ length: count }, (_, b) => new ctor(buf, b * per * ctor.BYTES_PER_ELEMENT, per));
  } finally {
    removeDir(dir);
  }
}

const COG_SCRIPT = `
import sys, json
from osgeo_utils.samples import validate_cloud_optimized_geotiff as v
errors, details = v.validate(sys.argv[1], full_check=True)[0:2]
print(json.dumps({"errors": errors}))
`;

/** Errors reported by GDAL's COG validator (full check of block leaders and trailers). */
export function cogErrors(path: string): string[] {
  return JSON.parse(run(PYTHON, ['-c', COG_SCRIPT, path])).errors;
}

/** The validator's command-line verdict text. */
export function cogValidatorVerdict(path: string): string {
  return run(PYTHON, ['-m', 'osgeo_utils.samples.validate_cloud_optimized_geotiff', '--full-check=yes', path]);
}

const SRS_SCRIPT = `
import sys, json
from osgeo import gdal, osr
gdal.UseExceptions()
ds = gdal.Open(sys.argv[1])
srs = osr.SpatialReference(wkt=ds.GetProjection())
names = sys.argv[2].split(',')
out = {"projection": srs.GetAttrValue("PROJECTION"), "semiMajor": srs.GetSemiMajor(), "semiMinor": srs.GetSemiMinor(),
       "invFlattening": srs.GetInvFlattening(), "geographic": bool(srs.IsGeographic()), "projected": bool(srs.IsProjected()),
       "authority": srs.GetAuthorityCode(None), "params": {n: srs.GetProjParm(n) for n in names if n}}
print(json.dumps(out))
`;

export interface GdalSrs {
  projection: string | null;
  semiMajor: number;
  semiMinor: number;
  invFlattening: number;
  geographic: boolean;
  projected: boolean;
  authority: string | null;
  params: Record<string, number>;
}

/** The CRS GDAL builds from the file's GeoKeys, through OSR (WKT1 parameter names). */
export function gdalSrs(path: string, paramNames: string[] = []): GdalSrs {
  return JSON.parse(run(PYTHON, ['-c', SRS_SCRIPT, path, paramNames.join(',')]));
}

/** gdallocationinfo -valonly -geoloc: the value of each band at a georeferenced point. */
export function gdalValueAt(path: string, x: number, y: number): number[] {
  return run('gdallocationinfo', ['-valonly', '-geoloc', path, String(x), String(y)])
    .trim()
    .split(/\s+/)
    .map(Number);
}

/** Deterministic pseudo-random numbers in [0, 1) (mulberry32). */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
