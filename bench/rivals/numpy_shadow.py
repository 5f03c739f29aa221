#!/usr/bin/env python3
"""Rival for the in-process shadow bench (bench/light.ts, case bench/cases/shadow-kerr-17deg.ts).

Computes the critical curve (shadow edge) of a Kerr hole seen by a distant observer at inclination i,
sampled at N points, with numpy, in units G = c = M = 1, and times it. Each point belongs to the
spherical photon orbit of radius r, whose constants of motion are (Bardeen 1973)

    xi(r)  = -[r^2 (r - 3) + a^2 (r + 1)] / (a (r - 1)),
    eta(r) = r^3 [4 a^2 - r (r - 3)^2] / (a^2 (r - 1)^2),

seen at the celestial coordinates alpha = -xi / sin i, beta = +-sqrt(eta + a^2 cos^2 i - xi^2 cot^2 i).
The orbits lie between the equatorial prograde and retrograde circular photon orbits,
r = 2 [1 + cos(2/3 arccos(-+a))] (Bardeen, Press & Teukolsky 1972, ApJ 178, 347, eq. 2.18); the
visible range [r_lo, r_hi] is where beta^2 >= 0, its ends the roots of beta^2 on either side of the
polar orbit (xi = 0: the largest root of the cubic s^3 + (a^2 - 3) s - 2 (1 - a^2) = 0 in s = r - 1,
by the trigonometric solution of the cubic), each found with scipy.optimize.brentq.

The N points are sampled as the service samples them: t_k = 2 pi k / N, r_k = r_lo + (r_hi - r_lo)
sin^2(t_k / 2), beta of the sign of sin t_k; xi, eta, alpha and beta are then evaluated on the whole
array at once (vectorised). One timed call computes the two ends and the N points, and returns the
horizontal diameter max(alpha) - min(alpha) of the sampled curve (its ends, t = 0 and t = pi, are
samples). Timing as in bench/timing.ts (timePerCall), through rival_timing.py beside this file.

Prints one JSON object on stdout: microseconds (median), min and max (fastest and slowest round, in
microseconds per call), callsPerRound, rounds, horizontalDiameter, visibleRange (r_lo, r_hi), and the
python, numpy and scipy versions. Bench-only: nothing in src/ uses it.
"""
import argparse
import json
import math
import platform

import numpy as np
import scipy
from scipy.optimize import brentq

from rival_timing import add_timing_arguments, time_per_call


def critical_curve(a: float, inclination: float, n: int) -> tuple[np.ndarray, np.ndarray, float, float]:
    """alpha and beta of the N sampled points, and the visible range (r_lo, r_hi); 0 < a < 1, 0 < i < pi/2."""
    a2 = a * a
    sin_i = math.sin(inclination)
    cos2 = math.cos(inclination) ** 2
    cot2 = cos2 / (sin_i * sin_i)

    def beta2(r: float) -> float:
        xi = -(r * r * (r - 3.0) + a2 * (r + 1.0)) / (a * (r - 1.0))
        eta = r**3 * (4.0 * a2 - r * (r - 3.0) ** 2) / (a2 * (r - 1.0) ** 2)
        return eta + a2 * cos2 - xi * xi * cot2

    r_pro = 2.0 * (1.0 + math.cos(2.0 / 3.0 * math.acos(-a)))
    r_retro = 2.0 * (1.0 + math.cos(2.0 / 3.0 * math.acos(a)))
    p = a2 - 3.0
    s_polar = 2.0 * math.sqrt(-p / 3.0) * math.cos(math.acos(min(1.0, (-3.0 * (1.0 - a2) / p) * math.sqrt(-3.0 / p))) / 3.0)
    r_polar = 1.0 + s_polar
    r_lo = brentq(beta2, r_pro, r_polar, xtol=1e-15) if beta2(r_pro) < 0 else r_pro
    r_hi = brentq(beta2, r_polar, r_retro, xtol=1e-15) if beta2(r_retro) < 0 else r_retro

    t = (2.0 * np.pi / n) * np.arange(n)
    r = r_lo + (r_hi - r_lo) * np.sin(0.5 * t) ** 2
    rm1 = r - 1.0
    xi = -(r * r * (r - 3.0) + a2 * (r + 1.0)) / (a * rm1)
    eta = r**3 * (4.0 * a2 - r * (r - 3.0) ** 2) / (a2 * rm1 * rm1)
    alpha = -xi / sin_i
    beta = np.sign(np.sin(t)) * np.sqrt(np.maximum(eta + a2 * cos2 - xi * xi * cot2, 0.0))
    beta[0] = 0.0
    if n % 2 == 0:
        beta[n // 2] = 0.0
    return alpha, beta, r_lo, r_hi


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--spin", type=float, required=True)
    ap.add_argument("--inclination", type=float, required=True, help="radians")
    ap.add_argument("--points", type=int, required=True)
    add_timing_arguments(ap)
    args = ap.parse_args()
    if not (0.0 < args.spin < 1.0 and 0.0 < args.inclination < math.pi / 2 and args.points >= 8):
        raise SystemExit("needs 0 < spin < 1, 0 < inclination < pi/2 and at least 8 points")

    def once() -> float:
        alpha, _beta, _lo, _hi = critical_curve(args.spin, args.inclination, args.points)
        return float(alpha.max() - alpha.min())

    alpha, _beta, r_lo, r_hi = critical_curve(args.spin, args.inclination, args.points)
    print(
        json.dumps(
            {
                **time_per_call(once, args),
                "horizontalDiameter": float(alpha.max() - alpha.min()),
                "visibleRange": [r_lo, r_hi],
                "python": platform.python_version(),
                "numpy": np.__version__,
                "scipy": scipy.__version__,
            }
        )
    )


if __name__ == "__main__":
    main()
