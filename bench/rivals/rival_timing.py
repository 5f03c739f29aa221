"""Timing shared by the Python rivals (bench/rivals/*.py), the same procedure as bench/timing.ts
(timePerCall): a warm-up of `min_calls` calls that also sizes the rounds to last about `round_seconds`
each, then `rounds` rounds of that many calls; the median round's mean time per call is reported.

The rivals take the procedure's three numbers on the command line (add_timing_arguments), so that
bench/timing.ts's TIMING is the one place they are set. Bench-only: nothing in src/ uses it.
"""
import argparse
import math
import statistics
import time
from typing import Callable


def add_timing_arguments(ap: argparse.ArgumentParser) -> None:
    ap.add_argument("--min-calls", type=int, required=True)
    ap.add_argument("--round-seconds", type=float, required=True)
    ap.add_argument("--rounds", type=int, required=True)


def time_per_call(fn: Callable[[], float], args: argparse.Namespace) -> dict:
    """Times fn (which returns a number, summed and checked so its work is used); microseconds per call."""

    def run(n: int) -> float:
        sink = 0.0
        start = time.perf_counter()
        for _ in range(n):
            sink += fn()
        elapsed = time.perf_counter() - start
        if not math.isfinite(sink):
            raise SystemExit("the timed function returned a value that is not finite")
        return elapsed / n  # seconds per call

    warm = run(args.min_calls)
    calls = max(args.min_calls, math.ceil(args.round_seconds / max(warm, 1e-12)))
    per_call = [run(calls) * 1e6 for _ in range(args.rounds)]
    return {
        "microseconds": statistics.median(per_call),
        "min": min(per_call),
        "max": max(per_call),
        "callsPerRound": calls,
        "rounds": args.rounds,
    }
