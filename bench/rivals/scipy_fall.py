#!/usr/bin/env python3
"""Rival for the in-process free-fall bench (bench/fall.ts, case bench/cases/fall-rn-infinity.ts).

Times scipy.integrate.quad (QUADPACK's adaptive Gauss–Kronrod, called with an ordinary Python
function) on the proper time of a radial fall in Reissner–Nordström, in units G = c = M = 1:

    tau = integral from r_min to r_max of dr / sqrt(E^2 - f(r)),   f(r) = 1 - 2/r + q^2/r^2,

with epsabs = 0 and the given epsrel. Timing follows bench/harness.ts (timePerCall): a warm-up of
--min-calls calls that also sizes the rounds to last about --round-seconds each, then --rounds rounds
of that many calls; the median round's mean time per call is reported.

Prints one JSON object on stdout: microseconds (median), min and max (fastest and slowest round, in
microseconds per call), callsPerRound, rounds, value, abserr and neval (of one call), and the
python, scipy and numpy versions. Bench-only: nothing in src/ uses it.
"""
import argparse
import json
import math
import platform
import statistics
import time

import numpy
import scipy
from scipy.integrate import quad


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--q", type=float, required=True)
    ap.add_argument("--energy", type=float, required=True)
    ap.add_argument("--r-min", type=float, required=True)
    ap.add_argument("--r-max", type=float, required=True)
    ap.add_argument("--epsrel", type=float, required=True)
    ap.add_argument("--min-calls", type=int, required=True)
    ap.add_argument("--round-seconds", type=float, required=True)
    ap.add_argument("--rounds", type=int, required=True)
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

    def run(n: int) -> float:
        sink = 0.0
        start = time.perf_counter()
        for _ in range(n):
            sink += once()
        elapsed = time.perf_counter() - start
        if not math.isfinite(sink):
            raise SystemExit("quad returned a value that is not finite")
        return elapsed / n  # seconds per call

    warm = run(args.min_calls)
    calls = max(args.min_calls, math.ceil(args.round_seconds / max(warm, 1e-12)))
    per_call = [run(calls) * 1e6 for _ in range(args.rounds)]

    print(
        json.dumps(
            {
                "microseconds": statistics.median(per_call),
                "min": min(per_call),
                "max": max(per_call),
                "callsPerRound": calls,
                "rounds": args.rounds,
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
