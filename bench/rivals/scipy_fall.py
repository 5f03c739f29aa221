#!/usr/bin/env python3
"""Rival for the in-process free-fall bench (bench/fall.ts, case bench/cases/fall-rn-infinity.ts).

Times scipy.integrate.quad (QUADPACK's adaptive Gauss–Kronrod, called with an ordinary Python
function) on the proper time of a radial fall in Reissner–Nordström, in units G = c = M = 1:

    tau = integral from r_min to r_max of dr / sqrt(E^2 - f(r)),   f(r) = 1 - 2/r + q^2/r^2,

with epsabs = 0 and the given epsrel. Timing as in bench/timing.ts (timePerCall), through
rival_timing.py beside this file.

Prints one JSON object on stdout: microseconds (median), min and max (fastest and slowest round, in
microseconds per call), callsPerRound, rounds, value, abserr and neval (of one call), and the
python, scipy and numpy versions. Bench-only: nothing in src/ uses it.
"""
import argparse
import json
import math
import platform

import numpy
import scipy
from scipy.integrate import quad

from rival_timing import add_timing_arguments, time_per_call


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--q", type=float, required=True)
    ap.add_argument("--energy", type=float, required=True)
    ap.add_argument("--r-min", type=float, required=True)
    ap.add_argument("--r-max", type=float, required=True)
    ap.add_argument("--epsrel", type=float, required=True)
    add_timing_arguments(ap)
    args = ap.parse_args()

    e2 = args.energy * args.energy
    q2 = args.q * args.q
    lo, hi, epsrel = args.r_min, args.r_max, args.epsrel

    def dtau_dr(r: float) -> float:
        f = 1.0 - 2.0 / r + q2 / (r * r)
        return 1.0 / math.sqrt(e2 - f)

    def once() -> float:
        return quad(dtau_dr, lo, hi, epsabs=0.0, epsrel=epsrel)[0]

    full = quad(dtau_dr, lo, hi, epsabs=0.0, epsrel=epsrel, full_output=1)
    value, abserr, info = full[0], full[1], full[2]
    warning = full[3] if len(full) > 3 else None

    print(
        json.dumps(
            {
                **time_per_call(once, args),
                "value": value,
                "abserr": abserr,
                "neval": info["neval"],
                "warning": warning,
                "python": platform.python_version(),
                "scipy": scipy.__version__,
                "numpy": numpy.__version__,
            }
        )
    )


if __name__ == "__main__":
    main()
