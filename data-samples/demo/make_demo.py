#!/usr/bin/python3
"""Build the frostgrid demo scenario: a small synthetic global atmosphere.

Scenario (invented; no observation, analysis or forecast went into it)
---------------------------------------------------------------------
"frostgrid synthetic atmosphere", valid 2029-10-17 06:00 UTC and 12:00 UTC (an invented date).

* Grid: regular 1 degree latitude-longitude, 360 x 181 points, latitude 90 .. -90 (north to
  south), longitude 0 .. 359 east, WGS84 ellipsoid.
* Levels: 150, 200, 250, 300, 350 hPa.
* Temperature: a zonal-mean troposphere with a constant lapse rate of 6.5 K/km written in
  pressure coordinates, T = Ts(lat) * (p / 1013.25 hPa)^(R*Gamma/g), with a surface temperature
  of 300 K at the equator falling to 250 K at the poles, floored by a tropopause temperature of
  196 K (equator) to 220 K (poles); a zonal wavenumber-3 wave of 3 K amplitude drifts eastward
  by 4 degrees between the two times.
* Humidity: relative humidity over ice in a dry-above, moister-below background (20 % at
  150 hPa to 65 % at 350 hPa) with a gentle wavenumber-2 modulation and a small seeded random
  jitter; on top, four ice-supersaturated patches (peak RHi 118-130 %):
    A  northern mid-latitude, 250-300 hPa, centred 50N 40E at 06Z, moving 6 degrees east;
    B  southern mid-latitude, 200-250 hPa, centred 45S 200E at 06Z, moving 5 degrees east
       and 2 degrees poleward;
    C  tropical, 350 hPa, centred 5N 300E: ice-supersaturated but too warm for contrails to
       form (about 245 K), so persistence conditions hold without formation;
    D  northern polar, 300 hPa, centred 75N 150E, drifting 8 degrees east.
  Outside the patches, cold and dry air at 200-250 hPa lets contrails form without persisting.
  Specific humidity follows from RHi through the Murphy & Koop (2005, eq. 7) ice saturation
  pressure: q = eps*e / (p - (1 - eps)*e), eps = 0.622.
* Geopotential z is the hydrostatic integral of the same temperature profile from 1013.25 hPa
  at zero height: Phi(p) = R_d * integral_p^ps T d(ln p), R_d = 287.05 J kg-1 K-1.
* A data gap: q is missing on a 3 x 4 block (near 10S 100E) at 250 hPa, first time only, so
  readers and products meet missing values.

Encoding: t and q are int16 with scale_factor/add_offset (so the humidity has a quantisation
step), z float32; zlib compressed. The GRIB2 twin holds the same decoded values, simple packing
at 16 bits per value, one message per (time, level, variable), WGS84 earth shape, centre 255
(missing). Deterministic: fixed seed, no clocks.

Run with Debian's python (numpy, netCDF4, eccodes):  /usr/bin/python3 make_demo.py
"""
import os
import numpy as np
import netCDF4
import eccodes

HERE = os.path.dirname(os.path.abspath(__file__))
NC_PATH = os.path.join(HERE, "frostgrid-demo.nc")
GRIB_PATH = os.path.join(HERE, "frostgrid-demo.grib2")

SEED = 20291017
EPS = 0.622
R_D = 287.05
G0 = 9.80665
P_SURF = 101325.0
LAPSE = 0.0065

LEVELS_HPA = np.array([150.0, 200.0, 250.0, 300.0, 350.0])
TIMES_H = np.array([6.0, 12.0])  # hours since 2029-10-17 00:00 UTC
LAT = 90.0 - np.arange(181, dtype=np.float64)
LON = np.arange(360, dtype=np.float64)


def e_ice_murphy_koop(t):
    """Murphy & Koop (2005) eq. 7, Pa, T in K."""
    return np.exp(9.550426 - 5723.265 / t + 3.53068 * np.log(t) - 0.00728332 * t)


def temperature(p_pa, time_index):
    lat = np.deg2rad(LAT)[:, None]
    lon = np.deg2rad(LON)[None, :]
    s2 = np.sin(lat) ** 2
    t_surf = 300.0 - 50.0 * s2
    t_trop = 196.0 + 24.0 * s2
    shift = np.deg2rad(4.0 * time_index)
    wave = 3.0 * np.cos(lat) ** 2 * np.cos(3.0 * (lon - np.deg2rad(20.0) - shift))
    t = t_surf * (p_pa / P_SURF) ** (R_D * LAPSE / G0)
    return np.maximum(t, t_trop) + wave


def geopotential(p_pa, time_index, steps=400):
    """Hydrostatic integral of temperature() from the surface pressure to p, m2 s-2."""
    lnp = np.linspace(np.log(P_SURF), np.log(p_pa), steps + 1)
    phi = np.zeros((LAT.size, LON.size))
    t_prev = temperature(np.exp(lnp[0]), time_index)
    for i in range(1, steps + 1):
        t_next = temperature(np.exp(lnp[i]), time_index)
        phi += R_D * 0.5 * (t_prev + t_next) * (lnp[i - 1] - lnp[i])
        t_prev = t_next
    return phi


PATCHES = [
    # name, lat0, lon0, dlat per step, dlon per step, radius deg, peak RHi %, levels hPa
    # (radius: great-circle scale; the bump is Gaussian with sigma = 0.8 radius)
    ("A", 50.0, 40.0, 0.0, 6.0, 12.0, 130.0, (250.0, 300.0)),
    ("B", -45.0, 200.0, -2.0, 5.0, 10.0, 124.0, (200.0, 250.0)),
    ("C", 5.0, 300.0, 0.0, 0.0, 10.0, 122.0, (350.0,)),
    ("D", 75.0, 150.0, 0.0, 8.0, 9.0, 118.0, (300.0,)),
]


def great_circle_deg(lat0, lon0):
    la = np.deg2rad(LAT)[:, None]
    lo = np.deg2rad(LON)[None, :]
    la0, lo0 = np.deg2rad(lat0), np.deg2rad(lon0)
    c = np.sin(la) * np.sin(la0) + np.cos(la) * np.cos(la0) * np.cos(lo - lo0)
    return np.rad2deg(np.arccos(np.clip(c, -1.0, 1.0)))


def rhi_percent(level_hpa, time_index, rng):
    background = {150.0: 20.0, 200.0: 35.0, 250.0: 50.0, 300.0: 60.0, 350.0: 65.0}[level_hpa]
    lat = np.deg2rad(LAT)[:, None]
    lon = np.deg2rad(LON)[None, :]
    rhi = background * (1.0 + 0.25 * np.cos(lat) * np.sin(2.0 * lon + 0.5 * time_index))
    rhi = rhi + rng.uniform(-2.0, 2.0, size=rhi.shape)
    for _name, lat0, lon0, dlat, dlon, radius, peak, levels in PATCHES:
        if level_hpa not in levels:
            continue
        d = great_circle_deg(lat0 + dlat * time_index, lon0 + dlon * time_index)
        bump = np.exp(-0.5 * (d / (0.8 * radius)) ** 2)
        rhi = rhi + (peak - rhi) * bump
    return np.clip(rhi, 1.0, None)


def pack_int16(values):
    """scale_factor/add_offset covering the data range with 65533 steps; -32767 is the fill."""
    finite = values[np.isfinite(values)]
    lo, hi = float(finite.min()), float(finite.max())
    scale = (hi - lo) / 65532.0
    offset = lo + 32766.0 * scale
    return scale, offset


def build():
    rng = np.random.default_rng(SEED)
    nt, nk = TIMES_H.size, LEVELS_HPA.size
    t = np.empty((nt, nk, LAT.size, LON.size))
    q = np.empty_like(t)
    z = np.empty_like(t)
    for it in range(nt):
        for k, lev in enumerate(LEVELS_HPA):
            p = lev * 100.0
            tk = temperature(p, it)
            e = rhi_percent(lev, it, rng) / 100.0 * e_ice_murphy_koop(tk)
            t[it, k] = tk
            q[it, k] = EPS * e / (p - (1.0 - EPS) * e)
            z[it, k] = geopotential(p, it)
    gap_rows = slice(100, 103)   # 10S .. 12S
    gap_cols = slice(100, 104)   # 100E .. 103E
    k250 = int(np.where(LEVELS_HPA == 250.0)[0][0])
    q[0, k250, gap_rows, gap_cols] = np.nan
    return t, q, z


def write_netcdf(t, q, z):
    if os.path.exists(NC_PATH):
        os.remove(NC_PATH)
    ds = netCDF4.Dataset(NC_PATH, "w", format="NETCDF4")
    ds.Conventions = "CF-1.8"
    ds.title = "frostgrid demo: synthetic global upper-troposphere atmosphere"
    ds.institution = "frostgrid synthetic atmosphere"
    ds.source = "data-samples/demo/make_demo.py (analytic fields, no observations)"
    ds.comment = "Invented scenario for demonstrating and testing frostgrid; not real weather."
    ds.createDimension("time", None)
    ds.createDimension("level", LEVELS_HPA.size)
    ds.createDimension("latitude", LAT.size)
    ds.createDimension("longitude", LON.size)

    v = ds.createVariable("time", "f8", ("time",))
    v.standard_name = "time"
    v.units = "hours since 2029-10-17 00:00:00"
    v.calendar = "standard"
    v.axis = "T"
    v[:] = TIMES_H
    v = ds.createVariable("level", "f8", ("level",))
    v.standard_name = "air_pressure"
    v.long_name = "pressure level"
    v.units = "hPa"
    v.positive = "down"
    v.axis = "Z"
    v[:] = LEVELS_HPA
    v = ds.createVariable("latitude", "f8", ("latitude",))
    v.standard_name = "latitude"
    v.units = "degrees_north"
    v.axis = "Y"
    v[:] = LAT
    v = ds.createVariable("longitude", "f8", ("longitude",))
    v.standard_name = "longitude"
    v.units = "degrees_east"
    v.axis = "X"
    v[:] = LON

    dims = ("time", "level", "latitude", "longitude")
    chunks = (1, 1, LAT.size, LON.size)
    for name, data, std, long_name, units in (
        ("t", t, "air_temperature", "air temperature", "K"),
        ("q", q, "specific_humidity", "specific humidity", "kg kg-1"),
    ):
        scale, offset = pack_int16(data)
        var = ds.createVariable(name, "i2", dims, zlib=True, complevel=6, shuffle=True,
                                chunksizes=chunks, fill_value=np.int16(-32767))
        var.scale_factor = np.float64(scale)
        var.add_offset = np.float64(offset)
        var.standard_name = std
        var.long_name = long_name
        var.units = units
        var.set_auto_maskandscale(True)
        var[:] = np.ma.masked_invalid(data)
    var = ds.createVariable("z", "f4", dims, zlib=True, complevel=6, shuffle=True,
                            chunksizes=chunks)
    var.standard_name = "geopotential"
    var.long_name = "geopotential"
    var.units = "m2 s-2"
    var[:] = z.astype(np.float32)
    ds.close()


def write_grib(path):
    """Writes the NetCDF file's decoded values (after int16 packing) as GRIB2, simple packing."""
    src = netCDF4.Dataset(NC_PATH)
    sample = eccodes.codes_grib_new_from_samples("GRIB2")
    params = {"t": (0, 0), "q": (1, 0), "z": (3, 4)}
    with open(path, "wb") as out:
        for it, hours in enumerate(TIMES_H):
            for k, lev in enumerate(LEVELS_HPA):
                for name in ("t", "q", "z"):
                    data = src.variables[name][it, k, :, :]
                    values = np.ma.filled(data.astype(np.float64), np.nan).ravel()
                    h = eccodes.codes_clone(sample)
                    cat, num = params[name]
                    for key, val in (
                        ("centre", 255), ("subCentre", 0), ("tablesVersion", 4),
                        ("localTablesVersion", 0), ("significanceOfReferenceTime", 0),
                        ("dataDate", 20291017), ("dataTime", int(hours) * 100),
                        ("productionStatusOfProcessedData", 2), ("typeOfProcessedData", 0),
                        ("shapeOfTheEarth", 5),
                        ("Ni", LON.size), ("Nj", LAT.size),
                        ("latitudeOfFirstGridPointInDegrees", 90.0),
                        ("longitudeOfFirstGridPointInDegrees", 0.0),
                        ("latitudeOfLastGridPointInDegrees", -90.0),
                        ("longitudeOfLastGridPointInDegrees", 359.0),
                        ("iDirectionIncrementInDegrees", 1.0),
                        ("jDirectionIncrementInDegrees", 1.0),
                        ("scanningMode", 0),
                        ("discipline", 0), ("parameterCategory", cat), ("parameterNumber", num),
                        ("typeOfGeneratingProcess", 0), ("generatingProcessIdentifier", 255),
                        ("forecastTime", 0),
                        ("typeOfFirstFixedSurface", 100), ("scaleFactorOfFirstFixedSurface", 0),
                        ("scaledValueOfFirstFixedSurface", int(lev * 100)),
                        ("packingType", "grid_simple"), ("bitsPerValue", 16),
                    ):
                        if isinstance(val, float):
                            eccodes.codes_set_double(h, key, val)
                        elif isinstance(val, str):
                            eccodes.codes_set_string(h, key, val)
                        else:
                            eccodes.codes_set_long(h, key, val)
                    missing = ~np.isfinite(values)
                    if missing.any():
                        eccodes.codes_set_long(h, "bitmapPresent", 1)
                        eccodes.codes_set_double(h, "missingValue", 9999.0)
                        values = np.where(missing, 9999.0, values)
                    eccodes.codes_set_values(h, values)
                    eccodes.codes_write(h, out)
                    eccodes.codes_release(h)
    eccodes.codes_release(sample)
    src.close()


def main():
    t, q, z = build()
    write_netcdf(t, q, z)
    write_grib(GRIB_PATH)
    for p in (NC_PATH, GRIB_PATH):
        print(f"{os.path.basename(p)}: {os.path.getsize(p)} bytes")


if __name__ == "__main__":
    main()
