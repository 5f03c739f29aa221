/**
 * Timing an in-process function and printing the results: the procedure every in-process row and
 * every Python rival (bench/rivals/rival_timing.py) follows, and the plain-text tables, each opened
 * by the Node version and the machine it ran on.
 */
import { arch, availableParallelism, cpus, platform, totalmem } from 'node:os';
import { performance } from 'node:perf_hooks';

/** How an in-process function is timed; the Python rivals follow the same procedure (timingArguments). */
export const TIMING = {
  /** Calls per round, at least; raised so that one round lasts `roundSeconds`. */
  minCalls: 20_000,
  roundSeconds: 0.25,
  rounds: 5,
} as const;

/** The numbers of a timing procedure; TIMING by default, smaller for calls that take milliseconds. */
export interface TimingProcedure {
  minCalls: number;
  roundSeconds: number;
  rounds: number;
}

export interface Timing {
  /** Median over the rounds of the mean time per call, µs. */
  microseconds: number;
  /** Fastest and slowest round, µs per call. */
  min: number;
  max: number;
  callsPerRound: number;
  rounds: number;
}

/** The median of `xs` (the mean of the middle two for an even count). */
export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 === 1 ? (s[mid] as number) : ((s[mid - 1] as number) + (s[mid] as number)) / 2;
}

/**
 * Times `fn` in this process: a warm-up of TIMING.minCalls calls (which also sizes the rounds so
 * that each lasts about TIMING.roundSeconds), then TIMING.rounds rounds of the same number of calls.
 * `fn` returns a number that is summed and checked, so its work cannot be dropped as unused.
 */
export function timePerCall(fn: () => number, procedure: TimingProcedure = TIMING): Timing {
  let sink = 0;
  const run = (n: number) => {
    const start = performance.now();
    for (let i = 0; i < n; i++) sink += fn();
    return (performance.now() - start) / n; // ms per call
  };
  const warm = run(procedure.minCalls);
  const calls = Math.max(procedure.minCalls, Math.ceil((procedure.roundSeconds * 1000) / Math.max(warm, 1e-6)));
  const perCall: number[] = [];
  for (let r = 0; r < procedure.rounds; r++) perCall.push(run(calls) * 1000);
  if (!Number.isFinite(sink)) throw new Error('the timed function returned a value that is not finite');
  return { microseconds: median(perCall), min: Math.min(...perCall), max: Math.max(...perCall), callsPerRound: calls, rounds: procedure.rounds };
}

/** The command-line arguments that hand TIMING to a Python rival (bench/rivals/rival_timing.py). */
export function timingArguments(procedure: TimingProcedure = TIMING): string[] {
  return ['--min-calls', procedure.minCalls, '--round-seconds', procedure.roundSeconds, '--rounds', procedure.rounds].map(String);
}

/** The procedure in words, for the header of an in-process table. */
export function timingDescription(procedure: TimingProcedure = TIMING): string {
  const calls = procedure.minCalls.toLocaleString('en-US');
  return (
    `${calls}-call warm-up, then ${procedure.rounds} rounds of ≥ ${calls} calls (≥ ${procedure.roundSeconds} s each); ` +
    'µs/call is the median round, fastest–slowest in brackets'
  );
}

/** "median (fastest–slowest)" in µs per call. */
export function formatTiming(t: Pick<Timing, 'microseconds' | 'min' | 'max'>): string {
  const us = (x: number) => x.toFixed(x < 10 ? 3 : 2);
  return `${us(t.microseconds)} (${us(t.min)}–${us(t.max)})`;
}

/** Node version and machine, the first line of every table. */
export function machineLine(): string {
  const gib = (totalmem() / 2 ** 30).toFixed(1);
  return `spacetide bench — Node ${process.version} · ${cpus()[0]?.model.trim() ?? 'unknown CPU'} · ${availableParallelism()} cores · ${gib} GiB RAM · ${platform()} ${arch()}`;
}

/** A plain-text table: `header` lines, then the columns (first left-aligned, the rest right-aligned). */
export function formatTable(header: string[], head: string[], body: string[][]): string {
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) =>
    cells.map((cell, i) => (i === 0 ? cell.padEnd(widths[i] ?? 0) : cell.padStart(widths[i] ?? 0))).join('  ');
  const rule = '-'.repeat(widths.reduce((a, w) => a + w + 2, -2));
  return [...header, rule, line(head), rule, ...body.map(line), rule].join('\n');
}
