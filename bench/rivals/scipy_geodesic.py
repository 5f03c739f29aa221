#!/usr/bin/env python3
"""Rival for the in-process geodesic bench (bench/geodesic.ts).

Times scipy.integrate.solve_ivp with method DOP853 (Hairer's Dormand-Prince 8(5,3), as in scipy) on
the same Hamiltonian geodesic equations of Kerr-Newman in ingoing Kerr coordinates as
src/physics/geodesic-equations.ts, written here as a plain Python function (math module, no numpy in
the right-hand side, which is faster than numpy for 7 components), from the same initial state, with
the same rtol and atol, and the same evenly spaced output points (t_eval, solve_ivp's dense output).
Units G = c = M = 1; y = (r, theta, p_r, p_theta, v, phi, T).

Timing as in bench/timing.ts (timePerCall) through rival_timing.py, with the procedure numbers given
on the command line. Prints one JSON object: microseconds (median), min, max, callsPerRound, rounds,
the final state, nfev, and the python, scipy and numpy versions. Bench-only: nothing in src/ uses it.
"""
import argparse
import json
import math
import platform

import numpy
import scipy
from scipy.integrate import solve_ivp

from rival_timing import add_timing_arguments, time_per_call


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--case", required=True, help="JSON: a, q, E, L, y0 (7 numbers), maxLength, samples, rtol, atol")
    add_timing_arguments(ap)
    args = ap.parse_args()
    c = json.loads(args.case)
    a, q2, E, L = c["a"], c["q"] ** 2, c["E"], c["L"]
    a2 = a * a

    def rhs(_l, y):
        r, th, pr, pth = y[0], y[1], y[2], y[3]
        sn, cs = math.sin(th), math.cos(th)
        sin2 = sn * sn
        rho2 = r * r + a2
        mu = 2 * r - q2
        delta = rho2 - mu
        sigma = r * r + a2 * cs * cs
        P = E * rho2 - a * L
        w0 = L - a * E * sin2
        N = delta * pr * pr - 2 * P * pr + pth * pth + w0 * w0 / sin2
        inv = 1 / sigma
        drdl = (delta * pr - P) * inv
        dW = -2 * L * L * cs / (sin2 * sn) + 2 * a2 * E * E * sn * cs
        dv = (rho2 * pr - a2 * E * sin2 + a * L) * inv
        rho = math.sqrt(rho2)
        return [
            drdl,
            pth * inv,
            (-((2 * r - 2) * pr * pr - 4 * E * r * pr) * 0.5 + N * r * inv) * inv,
            (-0.5 * dW - N * a2 * sn * cs * inv) * inv,
            dv,
            (a * pr - a * E + L / sin2) * inv,
            dv - rho / (rho + math.sqrt(max(mu, 0.0))) * drdl,
        ]

    grid = numpy.linspace(0.0, c["maxLength"], c["samples"])

    def run():
        return solve_ivp(rhs, (0.0, c["maxLength"]), c["y0"], method="DOP853", rtol=c["rtol"], atol=c["atol"], t_eval=grid)

    sol = run()
    if sol.status != 0:
        raise SystemExit("solve_ivp failed: %s" % sol.message)

    def once() -> float:
        return float(run().y[0, -1])

    print(
        json.dumps(
            {
                **time_per_call(once, args),
                "final": [float(x) for x in sol.y[:, -1]],
                "nfev": int(sol.nfev),
                "python": platform.python_version(),
                "scipy": scipy.__version__,
                "numpy": numpy.__version__,
            }
        )
    )


if __name__ == "__main__":
    main()
