#!/usr/bin/python3
"""The work of `frostgrid masks` scripted with general-purpose tools, for the speed comparison in
benchmarks/masks.ts: xarray + numpy compute RHi (Murphy & Koop 2005 eq. 7), the
Schmidt-Appleman formation test (Schumann 1996; T_LM by Newton on Murphy & Koop eq. 10), the
ice-supersaturated, contrail-forming and persistent-contrail masks and the formation margin
(T_LC - T by Newton per cell, vectorised), and GDAL writes them as tiled DEFLATE GeoTIFFs, one band
per level, like frostgrid's outputs.

Usage: /usr/bin/python3 masks_reference.py INPUT.nc OUTDIR
"""
import os
import sys

import numpy as np
import xarray as xr
from osgeo import gdal, osr

EPS = 0.622
CP = 1004.0
EI = 1.25
Q = 43.2e6
ETA = 0.3


def e_ice(t):
    return np.exp(9.550426 - 5723.265 / t + 3.53068 * np.log(t) - 0.00728332 * t)


def ln_e_liq(t):
    return (54.842763 - 6763.22 / t - 4.210 * np.log(t) + 0.000367 * t
            + np.tanh(0.0415 * (t - 218.8)) * (53.878 - 1331.22 / t - 9.44523 * np.log(t) + 0.014025 * t))


def e_liq(t):
    return np.exp(ln_e_liq(t))


def de_liq(t, h=1e-4):
    return (e_liq(t + h) - e_liq(t - h)) / (2 * h)


def t_lm(g):
    t = 230.0
    for _ in range(50):
        f = de_liq(t) - g
        fp = (de_liq(t + 1e-3) - de_liq(t - 1e-3)) / 2e-3
        t -= f / fp
    return t


def t_lc(u, tlm, g):
    """Vectorised Newton on e_w(T_LM) - G (T_LM - T) - U e_w(T) = 0."""
    ew_m = e_liq(tlm)
    t = np.full(u.shape, tlm - ew_m / g)
    for _ in range(30):
        f = ew_m - g * (tlm - t) - u * e_liq(t)
        fp = g - u * de_liq(t)
        t = np.minimum(tlm, t - f / fp)
    return np.where(u >= 1, tlm, t)


def write(path, bands, dtype, nodata, lon, lat):
    ny, nx = bands[0].shape
    drv = gdal.GetDriverByName("GTiff")
    ds = drv.Create(path, nx, ny, len(bands), dtype, ["TILED=YES", "COMPRESS=DEFLATE", "INTERLEAVE=BAND"])
    dlon = float(lon[1] - lon[0])
    ds.SetGeoTransform([float(lon[0]) - dlon / 2, dlon, 0, float(lat[0]) + dlon / 2, 0, -dlon])
    srs = osr.SpatialReference()
    srs.ImportFromEPSG(4326)
    ds.SetProjection(srs.ExportToWkt())
    for i, b in enumerate(bands):
        band = ds.GetRasterBand(i + 1)
        band.SetNoDataValue(nodata)
        band.WriteArray(b)
    ds = None


def main():
    src, out = sys.argv[1], sys.argv[2]
    os.makedirs(out, exist_ok=True)
    ds = xr.open_dataset(src)
    lat = ds["latitude"].values
    lon = ds["longitude"].values
    rhi_b, iss_b, form_b, pers_b, marg_b = [], [], [], [], []
    for k, p_hpa in enumerate(ds["level"].values):
        p = float(p_hpa) * 100
        t = ds["t"].isel(time=0, level=k).values.astype(np.float64)
        q = ds["q"].isel(time=0, level=k).values.astype(np.float64)
        e = q * p / (EPS + (1 - EPS) * q)
        ei = e_ice(t)
        ew = e_liq(t)
        rhi = 100 * e / ei
        g = EI * CP * p / (EPS * Q * (1 - ETA))
        tlm = t_lm(g)
        form = (t <= tlm) & (e >= e_liq(tlm) - g * (tlm - t))
        iss = (rhi >= 100) & (t < 273.16)
        pers = form & iss & (t < 235)
        margin = t_lc(e / ew, tlm, g) - t
        bad = ~(np.isfinite(t) & np.isfinite(e))
        rhi_b.append(np.where(bad, np.nan, rhi).astype(np.float32))
        marg_b.append(np.where(bad, np.nan, margin).astype(np.float32))
        for lst, m in ((iss_b, iss), (form_b, form), (pers_b, pers)):
            lst.append(np.where(bad, 255, m).astype(np.uint8))
    write(os.path.join(out, "rhi.tif"), rhi_b, gdal.GDT_Float32, float("nan"), lon, lat)
    write(os.path.join(out, "formation-margin.tif"), marg_b, gdal.GDT_Float32, float("nan"), lon, lat)
    write(os.path.join(out, "ice-supersaturated.tif"), iss_b, gdal.GDT_Byte, 255, lon, lat)
    write(os.path.join(out, "contrail-forming.tif"), form_b, gdal.GDT_Byte, 255, lon, lat)
    write(os.path.join(out, "persistent-contrail.tif"), pers_b, gdal.GDT_Byte, 255, lon, lat)


if __name__ == "__main__":
    main()
