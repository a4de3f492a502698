#!/usr/bin/python3
"""Generates reference.json, the outside reference points for test/physics.

Run with Debian's python (python3-iapws, python3-scipy, python3-numpy):

    /usr/bin/python3 data-samples/physics/make-reference.py > data-samples/physics/reference.json

Contents (every block names its source):
- "iapwsSublimation": IAPWS R14-08(2011) eq. 6 sublimation pressure, from python3-iapws
  (iapws._iapws._Sublimation_Pressure, MPa -> Pa).
- "iapwsAuxiliary": IAPWS 1992 supplementary release eq. 1 (Wagner & Pruss 1993) saturation
  pressure over liquid, from python3-iapws (IAPWS95._Vapor_Pressure, MPa -> Pa).
- "iapws95Saturation": IAPWS-95 phase-equilibrium (Maxwell) saturation pressure, from python3-iapws
  (IAPWS95()._saturation, kPa -> Pa), only T >= 238.15 K where the solution converges.
- "criterion": T_LM and T_LC from scipy.optimize.brentq applied to this script's own few-line
  transcription of Murphy & Koop (2005) eq. 10 (and Sonntag 1994 liquid), with
  G = EI cp p / (eps Q (1 - eta)), cp = 1004, eps = 0.622 (Schumann 1996). These are an
  independent re-implementation with a different root finder, not library output.
"""
import json
import math
import sys

import iapws
import numpy
import scipy
from iapws import IAPWS95
from iapws._iapws import _Sublimation_Pressure
from scipy.optimize import brentq


def mk_liquid(t):
    """Murphy & Koop (2005) eq. 10, Pa."""
    return math.exp(54.842763 - 6763.22 / t - 4.210 * math.log(t) + 0.000367 * t
                    + math.tanh(0.0415 * (t - 218.8))
                    * (53.878 - 1331.22 / t - 9.44523 * math.log(t) + 0.014025 * t))


def sonntag_liquid(t):
    """Sonntag (1994) over liquid water, coefficients for K and Pa (Helten et al. 1999), Pa."""
    return math.exp(-6096.9385 / t + 21.2409642 - 2.711193e-2 * t + 1.673952e-5 * t * t
                    + 2.433502 * math.log(t))


def derivative(fn, t, h=1e-4):
    """Central difference de/dT, Pa/K (error ~h^2, ~1e-10 relative)."""
    return (fn(t + h) - fn(t - h)) / (2 * h)


def t_lm(fn, g):
    return brentq(lambda t: derivative(fn, t) - g, 150.0, 320.0, xtol=1e-12, rtol=1e-15)


def t_lc(fn, g, u):
    tlm = t_lm(fn, g)
    ew = fn(tlm)
    if u >= 1:
        return tlm
    dry = tlm - ew / g
    if u == 0:
        return dry
    return brentq(lambda t: ew - g * (tlm - t) - u * fn(t), dry - 1e-9, tlm - 1e-9, xtol=1e-12, rtol=1e-15)


def main():
    out = {
        "generator": "data-samples/physics/make-reference.py",
        "versions": {"iapws": iapws.__version__, "scipy": scipy.__version__, "numpy": numpy.__version__,
                     "python": sys.version.split()[0]},
    }
    out["iapwsSublimation"] = [
        {"tK": t, "pPa": _Sublimation_Pressure(t) * 1e6}
        for t in [150.0, 170.0, 180.0, 190.0, 200.0, 210.0, 220.0, 230.0, 240.0, 250.0, 260.0, 270.0, 273.16]
    ]
    out["iapwsAuxiliary"] = [
        {"tK": t, "pPa": IAPWS95._Vapor_Pressure(t) * 1e6}
        for t in [273.16, 280.0, 300.0, 330.0, 373.15, 450.0, 600.0]
    ]
    w = IAPWS95()
    sat = []
    for t in [238.15, 243.15, 248.15, 253.15, 258.15, 263.15, 268.15, 273.16, 283.15, 300.0, 320.0]:
        _rl, _rg, ps = w._saturation(t)
        sat.append({"tK": t, "pPa": ps * 1e3})
    out["iapws95Saturation"] = sat

    cp, eps = 1004.0, 0.622
    rows = []
    for fuel, ei, q in [("kerosene", 1.25, 43.2e6), ("hydrogen", 8.936011904761905, 120e6)]:
        for p_hpa in [150.0, 200.0, 250.0, 300.0, 350.0]:
            for eta in [0.2, 0.3, 0.4, 0.5]:
                g = ei * cp * p_hpa * 100 / (eps * q * (1 - eta))
                for name, fn in [("murphy-koop", mk_liquid), ("sonntag", sonntag_liquid)]:
                    tlm = t_lm(fn, g)
                    rows.append({
                        "fuel": fuel, "eiH2O": ei, "lhvJPerKg": q, "pPa": p_hpa * 100, "efficiency": eta,
                        "saturation": name, "G": g, "tlmK": tlm,
                        "tlcK": {str(u): t_lc(fn, g, u) for u in [0.0, 0.2, 0.5, 0.8, 0.95, 0.99]},
                    })
    out["criterion"] = rows
    json.dump(out, sys.stdout, indent=1)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()
