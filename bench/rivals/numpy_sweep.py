#!/usr/bin/env python3
"""Rival for the in-process sweep bench (bench/sweep.ts, case bench/cases/sweep-flow-1e6.ts).

Evaluates the flow speed (the speed, relative to the static frame, of a particle falling from rest at
infinity; units of c, G = c = M = 1) of a Kerr hole with spin a on the grid theta (linear, outer) x r
(logarithmic, fastest) with numpy, as the closed form

    v = sqrt((r^2 + a^2) (2 r - q^2) / A),  A = (r^2 + a^2)^2 - a^2 Delta sin^2 theta,
    Delta = r^2 - 2 r + a^2 + q^2   (here q = 0),

vectorised over the whole grid at once (theta as a column, r as a row, broadcast to n1 x n2; NaN where
the root does not exist). One timed call evaluates every point and returns the NaN-skipping sum of v,
which bench/sweep.ts compares with the service's column. Timing as in bench/timing.ts, through
rival_timing.py beside this file (with the minimum number of calls the caller passes).

Prints one JSON object on stdout: microseconds (median), min and max (fastest and slowest round, in
microseconds per call), callsPerRound, rounds, sum, points, and the python and numpy versions.
Bench-only: nothing in src/ uses it.
"""
import argparse
import json
import platform

import numpy as np

from rival_timing import add_timing_arguments, time_per_call


def flow_speed(a: float, theta: np.ndarray, r: np.ndarray) -> np.ndarray:
    """v on the grid theta x r (theta outer), units of c; NaN where it does not exist."""
    a2 = a * a
    rr = r[None, :]
    sin2 = np.sin(theta)[:, None] ** 2
    rho2 = rr * rr + a2
    mu = 2.0 * rr
    delta = rho2 - mu
    big_a = rho2 * rho2 - a2 * delta * sin2
    with np.errstate(invalid="ignore", divide="ignore"):
        return np.sqrt(rho2 * mu / big_a)


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--spin", type=float, required=True)
    ap.add_argument("--theta-deg", type=float, nargs=3, required=True, metavar=("FROM", "TO", "COUNT"))
    ap.add_argument("--r-rg", type=float, nargs=3, required=True, metavar=("FROM", "TO", "COUNT"))
    add_timing_arguments(ap)
    args = ap.parse_args()
    t0, t1, n1 = args.theta_deg
    r0, r1, n2 = args.r_rg
    theta = np.radians(np.linspace(t0, t1, int(n1)))
    r = np.geomspace(r0, r1, int(n2))

    def once() -> float:
        return float(np.nansum(flow_speed(args.spin, theta, r)))

    print(
        json.dumps(
            {
                **time_per_call(once, args),
                "sum": once(),
                "points": int(n1) * int(n2),
                "python": platform.python_version(),
                "numpy": np.__version__,
            }
        )
    )


if __name__ == "__main__":
    main()
