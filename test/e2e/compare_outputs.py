#!/usr/bin/python3
"""Reads one time folder written by `frostgrid masks` with GDAL and compares it with the oracle
(test/oracle/level_masks.py output) cell by cell, independently of frostgrid:

- every GeoTIFF opens in GDAL; geotransform, CRS, band descriptions and nodata are reported;
- the oracle's slices (file storage order) are placed on the raster by the file's own latitude and
  longitude (read with netCDF4-python), so orientation and longitude rotation are checked too;
- masks must agree except on cells the oracle flags as within rounding of a threshold;
- RHi must agree to float32 rounding (relative 1e-5);
- summary.json counts must equal the mask sums read by GDAL, and its areas the sum of the cells'
  WGS84 areas computed here from the authalic latitude (numpy, formula from Snyder 1987,
  "Map Projections — A Working Manual", USGS PP 1395, eqs. 3-11 and 3-12).

Usage: compare_outputs.py FOLDER ORACLE_PREFIX NCFILE TIME_INDEX LAT LON
Prints a JSON report.
"""
import json
import os
import sys

import numpy as np
import netCDF4
from osgeo import gdal

gdal.UseExceptions()

A = 6378137.0
F = 1 / 298.257223563
E2 = F * (2 - F)
E = np.sqrt(E2)


def q_authalic(phi):
    s = np.sin(phi)
    return (1 - E2) * (s / (1 - E2 * s * s) - (1 / (2 * E)) * np.log((1 - E * s) / (1 + E * s)))


def band_area(lat1, lat2, dlon_deg):
    """Area between two parallels over dlon degrees on the WGS84 ellipsoid (m²)."""
    return (A * A / 2) * np.abs(q_authalic(np.radians(lat2)) - q_authalic(np.radians(lat1))) * np.radians(dlon_deg)


def read_tif(path):
    ds = gdal.Open(path)
    bands = []
    desc = []
    nodata = []
    for i in range(ds.RasterCount):
        b = ds.GetRasterBand(i + 1)
        bands.append(b.ReadAsArray())
        desc.append(b.GetDescription())
        nodata.append(b.GetNoDataValue())
    info = {
        "geotransform": list(ds.GetGeoTransform()),
        "epsg": ds.GetSpatialRef().GetAuthorityCode(None) if ds.GetSpatialRef() else None,
        "bands": ds.RasterCount,
        "descriptions": desc,
        "nodata": [None if v is None or np.isnan(v) else v for v in nodata],
        "nodata_is_nan": [v is not None and bool(np.isnan(v)) for v in nodata],
        "metadata": ds.GetMetadata(),
        "size": [ds.RasterXSize, ds.RasterYSize],
    }
    return info, bands


def main():
    folder, oracle, ncfile, tindex, latname, lonname = sys.argv[1:7]
    tindex = int(tindex)
    manifest = json.load(open(oracle + ".json"))
    blob = open(oracle + ".bin", "rb").read()
    with netCDF4.Dataset(ncfile) as nc:
        lat = np.asarray(nc[latname][:], dtype=np.float64)
        lon = np.asarray(nc[lonname][:], dtype=np.float64)
    ny, nx = lat.size, lon.size
    summary = json.load(open(os.path.join(folder, "summary.json")))
    report = {"files": {}, "levels": []}
    tifs = {}
    for name in ["rhi", "ice-supersaturated", "contrail-forming", "persistent-contrail", "formation-margin", "column"]:
        info, bands = read_tif(os.path.join(folder, name + ".tif"))
        report["files"][name] = info
        tifs[name] = bands
    gt = report["files"]["rhi"]["geotransform"]
    w, h = report["files"]["rhi"]["size"]
    # Raster cell centres -> storage indices, by the file's own coordinates.
    rlat = gt[3] + (np.arange(h) + 0.5) * gt[5]
    rlon = gt[0] + (np.arange(w) + 0.5) * gt[1]
    jidx = np.array([int(np.argmin(np.abs(lat - v))) for v in rlat])
    lon360 = np.mod(lon, 360)
    iidx = np.array([int(np.argmin(np.abs(((lon360 - np.mod(v, 360)) + 180) % 360 - 180))) for v in rlon])
    report["max_coordinate_offset_deg"] = float(
        max(np.max(np.abs(lat[jidx] - rlat)), np.max(np.abs(((lon360[iidx] - np.mod(rlon, 360)) + 180) % 360 - 180)))
    )
    # Cell areas of the raster rows (bounds at midpoints, clipped at the poles).
    dlat = abs(gt[5])
    top = np.clip(rlat + dlat / 2, -90, 90)
    bot = np.clip(rlat - dlat / 2, -90, 90)
    row_area = band_area(bot, top, abs(gt[1]))  # m² per cell in each row
    levels = summary["times"][0]["levels"]
    by_p = {round(s["pressure_Pa"], 3): s for s in manifest["slices"] if s["time_index"] == tindex}
    slices = [by_p[round(l["pressure_hPa"] * 100, 3)] for l in levels]
    n = ny * nx
    for k, s in enumerate(slices):
        offs = s["offsets"]
        pick = lambda name, dt: np.frombuffer(blob, dt, n, offs[name]).reshape(ny, nx)[jidx][:, iidx]
        rhi_o = pick("rhi", "<f4")
        masks_o = [pick(m, "u1") for m in ("ice_supersaturated", "contrail_forming", "persistent_contrail")]
        flags = pick("flags", "u1")
        entry = {"pressure_Pa": s["pressure_Pa"], "flagged": int(np.count_nonzero(flags)), "mismatches": {}, "counts": {}, "areas_rel_err": {}}
        for name, mo in zip(["ice-supersaturated", "contrail-forming", "persistent-contrail"], masks_o):
            ours = tifs[name][k]
            diff = (ours != mo) & (flags == 0)
            entry["mismatches"][name] = int(np.count_nonzero(diff))
            key = name.replace("-", "_")
            cells = int(np.count_nonzero(ours == 1))
            entry["counts"][name] = [cells, levels[k][key]["cells"], int(np.count_nonzero(mo == 1))]
            area_km2 = float(np.sum((ours == 1) * row_area[:, None]) / 1e6)
            got = levels[k][key]["area_km2"]
            entry["areas_rel_err"][name] = abs(area_km2 - got) / max(area_km2, 1e-30) if area_km2 > 0 else abs(got)
        rhi = tifs["rhi"][k].astype(np.float64)
        both = np.isfinite(rhi) & np.isfinite(rhi_o)
        entry["rhi_nan_mismatch"] = int(np.count_nonzero(np.isfinite(rhi) != np.isfinite(rhi_o)))
        entry["rhi_max_rel_diff"] = float(np.max(np.abs(rhi[both] - rhi_o[both]) / np.maximum(np.abs(rhi_o[both]), 1e-30))) if both.any() else 0.0
        entry["valid_cells"] = [int(np.count_nonzero(tifs["ice-supersaturated"][k] != 255)), levels[k]["valid_cells"]]
        entry["summary_pressure_hPa"] = levels[k]["pressure_hPa"]
        report["levels"].append(entry)
    report["total_area_km2"] = float(np.sum(row_area) * w / 1e6)
    print(json.dumps(report))


if __name__ == "__main__":
    main()
