#!/usr/bin/python3
"""Nearest grid node and its value as ecCodes reports them (codes_grib_find_nearest), for the
probe test. ecCodes 2.28's nearest-point search on rotated grids fails (OutOfAreaError, or a node
in rotated coordinates); there the node nearest on the sphere is taken from ecCodes' own
geographic latitudes/longitudes/values arrays.
Usage: nearest_eccodes.py FILE SHORTNAME LEVEL_HPA LAT,LON [LAT,LON ...]"""
import json
import sys

import eccodes
import numpy as np

path, short, level = sys.argv[1], sys.argv[2], float(sys.argv[3])
points = [tuple(map(float, p.split(","))) for p in sys.argv[4:]]
out = []
with open(path, "rb") as f:
    while True:
        h = eccodes.codes_grib_new_from_file(f)
        if h is None:
            break
        try:
            if eccodes.codes_get_string(h, "shortName") != short or float(eccodes.codes_get_double(h, "level")) != level:
                continue
            for lat, lon in points:
                if eccodes.codes_get_string(h, "gridType") != "rotated_ll":
                    n = eccodes.codes_grib_find_nearest(h, lat, lon)[0]
                    out.append({"lat": lat, "lon": lon, "grid_lat": n["lat"], "grid_lon": n["lon"], "value": n["value"]})
                else:
                    la = np.radians(eccodes.codes_get_array(h, "latitudes"))
                    lo = np.radians(eccodes.codes_get_array(h, "longitudes"))
                    v = eccodes.codes_get_values(h)
                    p, q = np.radians(lat), np.radians(lon)
                    d = np.sin(la) * np.sin(p) + np.cos(la) * np.cos(p) * np.cos(lo - q)
                    k = int(np.argmax(d))
                    out.append({"lat": lat, "lon": lon, "grid_lat": float(np.degrees(la[k])), "grid_lon": float(np.degrees(lo[k])), "value": float(v[k])})
            break
        finally:
            eccodes.codes_release(h)
print(json.dumps(out))
