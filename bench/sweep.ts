/**
 * The sweep section of `npm run bench`, one table for one 1e6-point case (bench/cases/sweep-*.ts):
 *
 * (a) compute rate: computeSweepColumns (the physics pass over the typed-array grid, from the compiled
 *     build dist/src/api/sweep-columns.js, after prepareSweep from sweep-prepare.js) in this process, in points/s, against numpy evaluating the same
 *     closed form on the same grid (bench/rivals/numpy_sweep.py) in the same run. Target: ≥ 0.5 of
 *     numpy's rate.
 * (b) over HTTP: the service (dist/src/server.js) started as a child process for this section alone;
 *     one POST /v1/sweep for columnar JSON to 127.0.0.1 with undici (cold: a miss, computed), then identical
 *     repeats (hits in the result cache); latency is from sending the request to the last byte read.
 *     Targets: cold < 1.5 s, the repeat ≥ 20× faster than cold.
 * (c) peak RSS of the service process during the cold sweep: VmHWM from /proc/<pid>/status after the
 *     request (the process does nothing else before it). Target: < 400 MB.
 *
 * Targets are printed, never asserted.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { pathToFileURL } from 'node:url';
import { request } from 'undici';
import { runProgram, startServer, type Server } from './processes.js';
import { formatTable, machineLine, TIMING } from './timing.js';

/** Benchmarks measure speed: shedding on event-loop delay would turn a slow moment into 503s. */
const NO_SHEDDING = { MAX_EVENT_LOOP_DELAY_MS: '0' };

/** One 1e6-point sweep: the request body, and the same grid for the numpy rival. */
export interface SweepCase {
  name: string;
  /** POST /v1/sweep body; its first quantity is the one timed against numpy (flowSpeed). */
  request: { body: unknown; point?: unknown; quantities: string[]; axes: unknown[] };
  /** θ in degrees (linear) × r in rg (log), [from, to, count] each: the grid of `request`. */
  rival: { spin: number; thetaDeg: [number, number, number]; rRg: [number, number, number] };
}

type ColumnsModule = typeof import('../src/api/sweep-columns.js');
type PrepareModule = typeof import('../src/api/sweep-prepare.js');
const SWEEP_MODULE = 'dist/src/api/sweep-columns.js';
const PREPARE_MODULE = 'dist/src/api/sweep-prepare.js';
const RIVAL_SCRIPT = 'bench/rivals/numpy_sweep.py';
const RIVAL_TIMEOUT_MS = 300_000;
/** One call evaluates 1e6 points (tens of ms), so a round holds a few calls rather than TIMING.minCalls. */
const MIN_CALLS = 2;
const REPEATS = 9;
const C = 299_792_458;
/**
 * Relative agreement of the NaN-skipping sums of v/c: the same closed form in double precision, summed
 * in another order over 1e6 terms (≈ 1e-16 × 1e3 relative at worst); 1e-10 leaves room.
 */
const AGREEMENT = 1e-10;
const TARGET = { rateRatio: 0.5, coldMs: 1500, repeatSpeedup: 20, peakRssMb: 400 };

interface Rate {
  /** Median round, ms per call; fastest and slowest round. */
  ms: number;
  min: number;
  max: number;
  callsPerRound: number;
}

interface RivalResult {
  microseconds: number;
  min: number;
  max: number;
  callsPerRound: number;
  sum: number;
  points: number;
  python: string;
  numpy: string;
}

export interface SweepResult {
  c: SweepCase;
  points: number;
  ours: Rate;
  oursSum: number;
  rival: RivalResult | Error;
  http: { coldMs: number; repeatMs: number; repeats: number[]; bytes: number; peakRssMb: number | null } | Error;
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};

/** bench/timing.ts's procedure with MIN_CALLS calls at least per round. */
function timeRounds(fn: () => number): Rate {
  let sink = 0;
  const run = (n: number) => {
    const start = performance.now();
    for (let i = 0; i < n; i++) sink += fn();
    return (performance.now() - start) / n;
  };
  const warm = run(MIN_CALLS);
  const calls = Math.max(MIN_CALLS, Math.ceil((TIMING.roundSeconds * 1000) / warm));
  const per: number[] = [];
  for (let r = 0; r < TIMING.rounds; r++) per.push(run(calls));
  if (!Number.isFinite(sink)) throw new Error('the timed function returned a value that is not finite');
  return { ms: median(per), min: Math.min(...per), max: Math.max(...per), callsPerRound: calls };
}

/** NaN-skipping sum of a column, in units of c. */
function nanSum(values: Float64Array): number {
  let s = 0;
  for (let i = 0; i < values.length; i++) if (values[i] === values[i]) s += values[i]! / C;
  return s;
}

async function runRival(root: string, c: SweepCase): Promise<RivalResult> {
  const args = [
    RIVAL_SCRIPT,
    '--spin', String(c.rival.spin),
    '--theta-deg', ...c.rival.thetaDeg.map(String),
    '--r-rg', ...c.rival.rRg.map(String),
    '--min-calls', String(MIN_CALLS), '--round-seconds', String(TIMING.roundSeconds), '--rounds', String(TIMING.rounds),
  ];
  return JSON.parse(await runProgram('python3', args, { cwd: root, timeoutMs: RIVAL_TIMEOUT_MS })) as RivalResult;
}

/** Peak resident set (VmHWM) of a process, MB; null where /proc is not available. */
function peakRssMb(pid: number): number | null {
  try {
    const m = /^VmHWM:\s+(\d+) kB/m.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) / 1024 : null;
  } catch {
    return null;
  }
}

/**
 * One POST with undici's request (fetch's web streams cost several times more than the server for an
 * 18 MB body), timed from sending to the last byte read; the chunks are counted, not kept. Checks 200.
 */
async function timedPost(server: Server, body: string): Promise<{ ms: number; bytes: number }> {
  const start = performance.now();
  const res = await request(`${server.url}/v1/sweep`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', accept: 'application/json' },
    body,
    headersTimeout: 60_000,
    bodyTimeout: 60_000,
  });
  let bytes = 0;
  for await (const chunk of res.body) bytes += (chunk as Buffer).length;
  const ms = performance.now() - start;
  if (res.statusCode !== 200) throw new Error(`POST /v1/sweep: status ${res.statusCode}`);
  return { ms, bytes };
}

async function measureHttp(root: string, c: SweepCase): Promise<SweepResult['http']> {
  const server = await startServer('service (sweep)', ['dist/src/server.js'], {
    cwd: root,
    env: { HOST: '127.0.0.1', LOG_LEVEL: 'warn', ...NO_SHEDDING },
    ready: { method: 'GET', path: '/' },
  });
  try {
    const body = JSON.stringify(c.request);
    const cold = await timedPost(server, body);
    const peak = server.pid === undefined ? null : peakRssMb(server.pid);
    const repeats: number[] = [];
    for (let i = 0; i < REPEATS; i++) repeats.push((await timedPost(server, body)).ms);
    return { coldMs: cold.ms, repeatMs: median(repeats), repeats, bytes: cold.bytes, peakRssMb: peak };
  } finally {
    await server.stop();
  }
}

const asError = (err: unknown) => (err instanceof Error ? err : new Error(String(err)));

/** Measures each case: the HTTP rows on a fresh service, then the in-process rate and its rival. */
export async function measureSweeps(root: string, cases: readonly SweepCase[]): Promise<SweepResult[]> {
  const mod = {
    ...((await import(pathToFileURL(join(root, SWEEP_MODULE)).href)) as ColumnsModule),
    ...((await import(pathToFileURL(join(root, PREPARE_MODULE)).href)) as PrepareModule),
  };
  const out: SweepResult[] = [];
  for (const [i, c] of cases.entries()) {
    process.stderr.write(`[sweep ${i + 1}/${cases.length}] ${c.name}\n`);
    // HTTP first, while this process (the client) holds no 1e6-point arrays for its collector to walk.
    const http = await measureHttp(root, c).catch(asError);
    const one = { ...c.request, quantities: c.request.quantities.slice(0, 1) };
    const prepared = mod.prepareSweep(one);
    const first = mod.computeSweepColumns(prepared).columns[0]!.values;
    const ours = timeRounds(() => mod.computeSweepColumns(prepared).columns[0]!.values[prepared.n - 1]!);
    const rival = await runRival(root, c).catch(asError);
    out.push({ c, points: prepared.n, ours, oursSum: nanSum(first), rival, http });
  }
  return out;
}

const fmt = (x: number, digits = 1) => (Number.isFinite(x) ? x.toFixed(digits) : '—');
const rate = (points: number, ms: number) => `${((points / ms) * 1000 / 1e6).toFixed(1)} M`;
const yesNo = (ok: boolean) => (ok ? 'yes' : 'no');

export function sweepTable(results: readonly SweepResult[], loadAtStart: number): string {
  const body: string[][] = [];
  const notes: string[] = [];
  for (const r of results) {
    const short = r.c.name.split(',')[0]!;
    body.push([`${short}: compute rate, ours`, `${rate(r.points, r.ours.ms)} points/s`, `${fmt(r.ours.ms)} ms/sweep (${fmt(r.ours.min)}–${fmt(r.ours.max)})`, '', '']);
    if (r.rival instanceof Error) {
      body.push([`${short}: compute rate, numpy`, 'failed', '', `≥ ${TARGET.rateRatio} × numpy`, '—']);
      notes.push(`numpy rival failed: ${r.rival.message.split('\n').slice(0, 3).join(' ')}`);
    } else {
      const rivalMs = r.rival.microseconds / 1000;
      const ratio = rivalMs / r.ours.ms;
      const rel = Math.abs(r.oursSum - r.rival.sum) / Math.abs(r.rival.sum);
      body.push([`${short}: compute rate, numpy`, `${rate(r.rival.points, rivalMs)} points/s`, `${fmt(rivalMs)} ms/sweep (${fmt(r.rival.min / 1000)}–${fmt(r.rival.max / 1000)})`, '', '']);
      body.push([`${short}: ours / numpy (rate)`, fmt(ratio, 2), `sums agree: ${rel <= AGREEMENT ? 'yes' : 'NO'} (${rel.toExponential(1)} vs ${AGREEMENT.toExponential(0)})`, `≥ ${TARGET.rateRatio}`, yesNo(ratio >= TARGET.rateRatio)]);
      notes.push(
        `numpy rival: Python ${r.rival.python} · numpy ${r.rival.numpy} — v = √((r²+a²)(2r−q²)/A), A = (r²+a²)² − a²Δ sin²θ, broadcast over the same ` +
          `${r.rival.points.toLocaleString('en-US')}-point grid (${RIVAL_SCRIPT}); ours: computeSweepColumns from ${SWEEP_MODULE} (domain pass, flowSpeed pass, SI factor)`,
      );
    }
    if (r.http instanceof Error) {
      body.push([`${short}: HTTP`, 'failed', '', '', '—']);
      notes.push(`HTTP rows failed: ${r.http.message.split('\n').slice(0, 3).join(' ')}`);
    } else {
      const h = r.http;
      const speedup = h.coldMs / h.repeatMs;
      const mb = (h.bytes / 1e6).toFixed(1);
      body.push([`${short}: JSON over HTTP, cold`, `${fmt(h.coldMs)} ms`, `${mb} MB body`, `< ${TARGET.coldMs} ms`, yesNo(h.coldMs < TARGET.coldMs)]);
      body.push([`${short}: JSON over HTTP, repeat (hit)`, `${fmt(h.repeatMs)} ms`, `median of ${h.repeats.length} (${h.repeats.map((x) => fmt(x)).join(', ')})`, '', '']);
      body.push([`${short}: cold / repeat`, `${fmt(speedup)}×`, '', `≥ ${TARGET.repeatSpeedup}×`, yesNo(speedup >= TARGET.repeatSpeedup)]);
      body.push([
        `${short}: service peak RSS (cold)`,
        h.peakRssMb === null ? 'n/a' : `${fmt(h.peakRssMb)} MB`,
        'VmHWM after the cold request',
        `< ${TARGET.peakRssMb} MB`,
        h.peakRssMb === null ? '—' : yesNo(h.peakRssMb < TARGET.peakRssMb),
      ]);
    }
  }
  const header = [
    machineLine(),
    `sweeps: ${results.map((r) => `"${r.c.name}"`).join('; ')} · compute rate: ${TIMING.rounds} rounds of ≥ ${MIN_CALLS} sweeps (≥ ${TIMING.roundSeconds} s each), ` +
      `median round, fastest–slowest in brackets · HTTP: a fresh service child process, POST /v1/sweep (columnar JSON) with undici.request to 127.0.0.1, ` +
      `time to the last byte · load average at start ${loadAtStart.toFixed(2)}`,
    ...notes,
  ];
  return formatTable(header, ['case', 'result', 'detail', 'target', 'target met'], body);
}
