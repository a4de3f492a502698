#!/usr/bin/python3
"""Independent oracle for frostgrid's level products.

Reads temperature and specific humidity (or mixing ratio) on pressure levels from a NetCDF file
with netCDF4-python, or from a GRIB file with ecCodes' python bindings (--grib; shortNames from
--t and --q/--r, isobaricInhPa levels, times sorted by validity date and time), and computes, per (time, level), with numpy only:

  e    = q p / (eps + (1 - eps) q)          (or r p / (eps + r)),  eps = 0.622
  RHi  = 100 e / e_i(T)                      e_i: Murphy & Koop (2005), eq. 7
  e_w  : Murphy & Koop (2005), eq. 10 (supercooled liquid water)
  G    = EI_H2O cp p / (eps Q (1 - eta))     mixing-line slope, Schumann (1996), cp = 1004
  T_LM : de_w/dT (T_LM) = G, solved by Newton's method
  forms      <=>  T <= T_LM  and  U e_w(T) + G (T_LM - T) >= e_w(T_LM),  U = e / e_w(T)
               (the plume mixing line through the ambient state reaches water saturation;
                Schumann 1996)
  ice-supersaturated  <=>  RHi >= threshold and T < 273.16 K
  persistent          <=>  forms and ice-supersaturated and T < freezing temperature

It shares no code with frostgrid. Decoded values are rounded to float32 first, as frostgrid's
readers hand out float32 slices, so both start from the same numbers.

Cells where rounding could decide the outcome are flagged (bit 0: |RHi - thr| < 1e-3 thr;
bit 1: formation residual within a relative 1e-5 of e_w(T_LM), or |T - T_LM| < 1e-5 T_LM;
bit 2: |T - T_freeze| < 1e-5 K or |T - 273.16| < 1e-5 K) so a comparing test can leave them out.

Output: OUT.json (manifest) and OUT.bin. For each (time, level) the .bin holds, little-endian and
in the file's (lat, lon) storage order: RHi float32 (NaN invalid), then uint8 arrays
ice_supersaturated, contrail_forming, persistent_contrail (0/1, 255 invalid) and flags.
The manifest lists per slice: time index, pressure (Pa), T_LM (K), G (Pa/K), byte offsets.

Usage:
  /usr/bin/python3 level_masks.py FILE OUT [--grib] [--t t] [--q q | --r r] [--ei-h2o 1.25]
      [--lhv-mj 43.2] [--efficiency 0.3] [--threshold 100] [--freezing-temperature 235]
"""
import argparse
import json
import sys

import numpy as np
import netCDF4

EPS = 0.622
CP = 1004.0
T_TRIPLE = 273.16


def ln_e_ice(t):
    """Murphy & Koop (2005) eq. 7: ln(e_i / Pa), T in K (valid T > 110 K)."""
    return 9.550426 - 5723.265 / t + 3.53068 * np.log(t) - 0.00728332 * t


def ln_e_water_and_derivatives(t):
    """Murphy & Koop (2005) eq. 10: ln(e_w / Pa) and its first two T derivatives (123 < T < 332 K)."""
    k = 0.0415
    h = np.tanh(k * (t - 218.8))
    h1 = k * (1.0 - h * h)
    h2 = -2.0 * k * h * h1
    g = 53.878 - 1331.22 / t - 9.44523 * np.log(t) + 0.014025 * t
    g1 = 1331.22 / t**2 - 9.44523 / t + 0.014025
    g2 = -2.0 * 1331.22 / t**3 + 9.44523 / t**2
    L = 54.842763 - 6763.22 / t - 4.210 * np.log(t) + 0.000367 * t + h * g
    L1 = 6763.22 / t**2 - 4.210 / t + 0.000367 + h1 * g + h * g1
    L2 = -2.0 * 6763.22 / t**3 + 4.210 / t**2 + h2 * g + 2.0 * h1 * g1 + h * g2
    return L, L1, L2


def e_water(t):
    return np.exp(ln_e_water_and_derivatives(t)[0])


def threshold_temperature(G):
    """T_LM with de_w/dT = G: Newton on f(T) = e_w(T) L'(T) - G, f' = e_w (L'' + L'^2)."""
    t = 226.69 + 9.43 * np.log(G - 0.053) + 0.72 * np.log(G - 0.053) ** 2  # Schumann 1996 eq. 31 as a start
    for _ in range(100):
        L, L1, L2 = ln_e_water_and_derivatives(t)
        ew = np.exp(L)
        f = ew * L1 - G
        step = f / (ew * (L2 + L1 * L1))
        t = t - step
        if abs(step) < 1e-12:
            break
    return float(t)


def find_var(ds, name):
    if name not in ds.variables:
        sys.exit(f"level_masks.py: no variable {name} in {ds.filepath()}")
    return ds.variables[name]


def pressure_levels_pa(ds, var):
    for dim in var.dimensions:
        if dim in ds.variables:
            c = ds.variables[dim]
            if getattr(c, "standard_name", "") == "air_pressure" or getattr(c, "units", "") in ("hPa", "Pa", "mbar", "millibar"):
                units = getattr(c, "units", "Pa")
                scale = 100.0 if units in ("hPa", "mbar", "millibar") else 1.0
                return var.dimensions.index(dim), np.asarray(c[:], dtype=np.float64) * scale
    sys.exit("level_masks.py: no pressure coordinate found")


def read_netcdf(path, tname, hname):
    """(t, h, levels_pa): t and h as float64 arrays (time, level, y, x) with NaN for missing."""
    ds = netCDF4.Dataset(path)
    tv = find_var(ds, tname)
    hv = find_var(ds, hname)
    tv.set_auto_maskandscale(True)
    hv.set_auto_maskandscale(True)
    kdim, levels = pressure_levels_pa(ds, tv)
    if tv.dimensions[0] != "time" or kdim != 1:
        sys.exit("level_masks.py: expects (time, level, y, x) variables")
    t = np.ma.filled(tv[:].astype(np.float64), np.nan)
    h = np.ma.filled(hv[:].astype(np.float64), np.nan)
    ds.close()
    return t, h, levels


def read_grib(path, tname, hname):
    """The same from GRIB messages on isobaric levels (hPa), via ecCodes."""
    import eccodes
    found = {}
    shape = None
    with open(path, "rb") as f:
        while True:
            h = eccodes.codes_grib_new_from_file(f)
            if h is None:
                break
            try:
                name = eccodes.codes_get_string(h, "shortName")
                if name not in (tname, hname) or eccodes.codes_get_string(h, "typeOfLevel") != "isobaricInhPa":
                    continue
                key = (eccodes.codes_get_long(h, "validityDate"), eccodes.codes_get_long(h, "validityTime"))
                level = float(eccodes.codes_get_double(h, "level")) * 100.0
                nj, ni = eccodes.codes_get_long(h, "Nj"), eccodes.codes_get_long(h, "Ni")
                shape = (nj, ni)
                vals = eccodes.codes_get_values(h).astype(np.float64)
                if eccodes.codes_get_long(h, "bitmapPresent"):
                    vals[vals == eccodes.codes_get_double(h, "missingValue")] = np.nan
                found[(name, key, level)] = vals.reshape(nj, ni)
            finally:
                eccodes.codes_release(h)
    times = sorted({k[1] for k in found})
    levels = np.array(sorted({k[2] for k in found if k[0] == tname}))
    t = np.full((len(times), len(levels)) + shape, np.nan)
    hh = np.full_like(t, np.nan)
    for i, tm in enumerate(times):
        for k, lev in enumerate(levels):
            t[i, k] = found[(tname, tm, lev)]
            hh[i, k] = found[(hname, tm, lev)]
    return t, hh, levels


def main():
    ap = argparse.ArgumentParser(description="independent numpy oracle for level masks")
    ap.add_argument("input")
    ap.add_argument("out")
    ap.add_argument("--grib", action="store_true", help="read GRIB with ecCodes instead of NetCDF")
    ap.add_argument("--t", default="t")
    ap.add_argument("--q", default=None)
    ap.add_argument("--r", default=None)
    ap.add_argument("--ei-h2o", type=float, default=1.25)
    ap.add_argument("--lhv-mj", type=float, default=43.2)
    ap.add_argument("--efficiency", type=float, default=0.3)
    ap.add_argument("--threshold", type=float, default=100.0)
    ap.add_argument("--freezing-temperature", type=float, default=235.0)
    a = ap.parse_args()

    hname, kind = (a.r, "r") if a.r else (a.q or "q", "q")
    if a.grib:
        T, H, levels = read_grib(a.input, a.t, hname)
    else:
        T, H, levels = read_netcdf(a.input, a.t, hname)
    nt = T.shape[0]
    Q = a.lhv_mj * 1e6

    manifest = {"input": a.input, "parameters": vars(a), "shape": list(T.shape[2:]), "slices": []}
    offset = 0
    with open(a.out + ".bin", "wb") as out:
        for it in range(nt):
            for k, p in enumerate(levels):
                t = T[it, k].astype(np.float32).astype(np.float64)
                h = H[it, k].astype(np.float32).astype(np.float64)
                if kind == "q":
                    e = h * p / (EPS + (1.0 - EPS) * h)
                else:
                    e = h * p / (EPS + h)
                # frostgrid holds e in a float32 buffer between conversion and criterion.
                e = e.astype(np.float32).astype(np.float64)
                valid = np.isfinite(t) & np.isfinite(e) & (e >= 0) & (t >= 123.0) & (t <= 330.0)
                ts = np.where(valid, t, 220.0)
                es = np.where(valid, e, 0.0)
                ei = np.exp(ln_e_ice(ts))
                ew = e_water(ts)
                rhi = 100.0 * es / ei
                G = a.ei_h2o * CP * p / (EPS * Q * (1.0 - a.efficiency))
                tlm = threshold_temperature(G)
                ew_tlm = float(e_water(np.float64(tlm)))
                U = es / ew
                residual = U * ew + G * (tlm - ts) - ew_tlm
                forms = (ts <= tlm) & (residual >= 0)
                iss = (rhi >= a.threshold) & (ts < T_TRIPLE)
                pers = forms & iss & (ts < a.freezing_temperature)
                flags = np.zeros(t.shape, dtype=np.uint8)
                flags |= (np.abs(rhi - a.threshold) < 1e-3 * a.threshold).astype(np.uint8)
                near_form = (np.abs(residual) < 1e-5 * ew_tlm) | (np.abs(ts - tlm) < 1e-5 * tlm)
                flags |= near_form.astype(np.uint8) << 1
                near_t = (np.abs(ts - a.freezing_temperature) < 1e-5) | (np.abs(ts - T_TRIPLE) < 1e-5)
                flags |= near_t.astype(np.uint8) << 2
                flags[~valid] = 0

                def mask(m):
                    return np.where(valid, m.astype(np.uint8), np.uint8(255)).astype(np.uint8)

                blocks = [
                    np.where(valid, rhi, np.nan).astype("<f4"),
                    mask(iss), mask(forms), mask(pers), flags,
                ]
                entry = {"time_index": it, "pressure_Pa": float(p), "threshold_temperature_K": tlm,
                         "mixing_line_slope_Pa_per_K": G, "offsets": {}}
                for name, b in zip(("rhi", "ice_supersaturated", "contrail_forming", "persistent_contrail", "flags"), blocks):
                    data = np.ascontiguousarray(b).tobytes()
                    entry["offsets"][name] = offset
                    out.write(data)
                    offset += len(data)
                entry["valid_cells"] = int(valid.sum())
                entry["counts"] = {"ice_supersaturated": int(iss[valid].sum()), "contrail_forming": int(forms[valid].sum()),
                                   "persistent_contrail": int(pers[valid].sum()), "flagged": int((flags > 0).sum())}
                manifest["slices"].append(entry)
    with open(a.out + ".json", "w") as f:
        json.dump(manifest, f, indent=1)


if __name__ == "__main__":
    main()
