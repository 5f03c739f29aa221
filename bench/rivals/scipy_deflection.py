#!/usr/bin/env python3
"""Rival for the in-process deflection bench (bench/light.ts, case bench/cases/deflection-schwarzschild-r4.ts).

Times scipy.integrate.quad (QUADPACK's adaptive Gauss–Kronrod, called with an ordinary Python
function) on the deflection of light by a Schwarzschild hole, in units G = c = M = 1, for the ray
whose closest approach is r0 (impact parameter b, 1/b^2 = u0^2 - 2 u0^3, u0 = 1/r0):

    alpha = 2 * integral from 0 to u0 of du / sqrt(1/b^2 - u^2 + 2 u^3)  -  pi.

The radicand vanishes at u0: 1/b^2 - u^2 + 2 u^3 = (u0 - u) G(u), G(u) = u0 + u - 2 (u0^2 + u0 u + u^2),
and G > 0 on [0, u0] for r0 > 3. The substitution u = u0 - s^2 (du = -2 s ds) removes the 1/sqrt
endpoint singularity:

    alpha = 4 * integral from 0 to sqrt(u0) of ds / sqrt(G(u0 - s^2))  -  pi,

a smooth integrand that quad is given, with epsabs = 0 and the given epsrel. Timing as in
bench/timing.ts (timePerCall), through rival_timing.py beside this file.

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
    ap.add_argument("--r0", type=float, required=True)
    ap.add_argument("--epsrel", type=float, required=True)
    add_timing_arguments(ap)
    args = ap.parse_args()
    if not args.r0 > 3.0:
        raise SystemExit("the closest approach must lie outside the photon sphere, r0 > 3")

    u0 = 1.0 / args.r0
    u02 = u0 * u0
    top = math.sqrt(u0)
    epsrel = args.epsrel

    def integrand(s: float) -> float:
        u = u0 - s * s
        return 1.0 / math.sqrt(u0 + u - 2.0 * (u02 + u0 * u + u * u))

    def once() -> float:
        return 4.0 * quad(integrand, 0.0, top, epsabs=0.0, epsrel=epsrel)[0] - math.pi

    full = quad(integrand, 0.0, top, epsabs=0.0, epsrel=epsrel, full_output=1)
    value, abserr, info = 4.0 * full[0] - math.pi, 4.0 * full[1], full[2]
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
