/**
 * The in-process geodesic section of `npm run bench`: geodesic() (src/physics/geodesic.ts) timed per call
 * in this process, against scipy.integrate.solve_ivp (DOP853, same equations, same initial state, same
 * rtol/atol and output points) timed in the same run (bench/rivals/scipy_geodesic.py, run with python3).
 *
 * geodesic is imported from dist/src/physics/geodesic.js, the compiled build the service runs (`npm run
 * bench` builds it first); only its types come from the source. Target: at least 10× faster than scipy on
 * the 10-orbit case at rtol 1e−10. A call takes milliseconds, so the procedure is GEODESIC_TIMING (fewer
 * calls per round than the default), the same for both sides. Memory: the samples are eleven
 * Float64Arrays of (samples + 1) entries; the integrator state is fixed (16 stages of 7 components).
 */
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Geodesic, GeodesicRequest } from '../src/physics/geodesic.js';
import type { KerrNewman } from '../src/physics/spacetime.js';
import { runProgram } from './processes.js';
import { formatTable, formatTiming, machineLine, timePerCall, timingArguments, timingDescription, type Timing, type TimingProcedure } from './timing.js';

export interface GeodesicBenchCase {
  name: string;
  spacetime: KerrNewman;
  request: GeodesicRequest;
  /** Whether scipy runs the same integration. */
  rival: boolean;
}

type GeodesicModule = typeof import('../src/physics/geodesic.js');
const MODULE = 'dist/src/physics/geodesic.js';
const RIVAL_SCRIPT = 'bench/rivals/scipy_geodesic.py';
const RIVAL_TIMEOUT_MS = 600_000;
const TARGET_RATIO = 10;
const GEODESIC_TIMING: TimingProcedure = { minCalls: 3, roundSeconds: 1, rounds: 5 };
/** Agreement asked of the final positions (r, θ, φ̃), relative to max(1, |x|): both at the same rtol. */
const AGREEMENT = 1e-6;

interface RivalResult extends Timing {
  final: number[];
  nfev: number;
  python: string;
  scipy: string;
  numpy: string;
}

interface GeodesicRow {
  c: GeodesicBenchCase;
  result: Geodesic;
  sampleBytes: number;
  ours: Timing;
  rival?: RivalResult | Error;
}

async function runRival(root: string, c: GeodesicBenchCase, g: Geodesic): Promise<RivalResult> {
  const s = g.start;
  const y0 = [s.r, s.theta, s.pr, s.ptheta, 0, c.request.start.phi, 0];
  const rtol = c.request.rtol ?? 1e-10;
  // Our run ends at its terminal event or at maxLength; scipy integrates to the same end point.
  const payload = { a: c.spacetime.a, q: c.spacetime.q, E: g.constants.E, L: g.constants.L, y0, maxLength: g.length, samples: c.request.samples, rtol, atol: rtol * 1e-3 };
  const out = await runProgram('python3', [RIVAL_SCRIPT, '--case', JSON.stringify(payload), ...timingArguments(GEODESIC_TIMING)], { cwd: root, timeoutMs: RIVAL_TIMEOUT_MS });
  return JSON.parse(out) as RivalResult;
}

export async function measureGeodesics(root: string, cases: readonly GeodesicBenchCase[]): Promise<GeodesicRow[]> {
  const mod = (await import(pathToFileURL(join(root, MODULE)).href)) as GeodesicModule;
  const rows: GeodesicRow[] = [];
  for (const [i, c] of cases.entries()) {
    process.stderr.write(`[geodesic ${i + 1}/${cases.length}] ${c.name}\n`);
    const once = mod.geodesic(c.spacetime, c.request);
    if (!once.ok) throw new Error(`${c.name}: geodesic refused (${once.reason}): ${once.message}`);
    const smp = once.samples;
    const sampleBytes = [smp.lambda, smp.v, smp.river, smp.t, smp.r, smp.theta, smp.phi, smp.phiBL, smp.x, smp.y, smp.z].reduce((n, a) => n + a.byteLength, 0);
    const ours = timePerCall(() => {
      const g = mod.geodesic(c.spacetime, c.request);
      return g.ok ? g.end.r : Number.NaN;
    }, GEODESIC_TIMING);
    const row: GeodesicRow = { c, result: once, sampleBytes, ours };
    // With a stop at an event, scipy runs to the same λ (the event's), so both do the same work.
    if (c.rival) row.rival = await runRival(root, c, once).catch((err: unknown) => (err instanceof Error ? err : new Error(String(err))));
    rows.push(row);
  }
  return rows;
}

export function geodesicTable(rows: readonly GeodesicRow[], loadAtStart: number): string {
  let versions = 'rival: none measured';
  const body = rows.map(({ c, result, sampleBytes, ours, rival }) => {
    let cells = ['—', '—', '—', '—'];
    if (rival instanceof Error) cells = ['failed', '—', '—', '—'];
    else if (rival) {
      const e = result.end;
      const ref = rival.final;
      const dev = Math.max(...[e.r, e.theta].map((x, k) => Math.abs(x - ref[k]!) / Math.max(1, Math.abs(ref[k]!))), Math.abs(result.samples.phi[result.samples.count - 1]! - ref[5]!) / Math.max(1, Math.abs(ref[5]!)));
      const ratio = rival.microseconds / ours.microseconds;
      cells = [`${formatTiming(rival)}, ${rival.nfev} evals`, ratio.toFixed(1), `${dev <= AGREEMENT ? 'yes' : 'NO'} (${dev.toExponential(1)})`, ratio >= TARGET_RATIO ? 'yes' : 'no'];
      versions = `rival in the same run: Python ${rival.python} · scipy ${rival.scipy} · numpy ${rival.numpy} — solve_ivp(method="DOP853") with a plain-Python right-hand side, t_eval at the same points (${RIVAL_SCRIPT})`;
    }
    return [
      c.name,
      `${result.termination}, λ = ${result.length.toFixed(2)}`,
      `${result.steps.accepted} / ${result.steps.rejected} / ${result.steps.evaluations}`,
      `${result.samples.count} (${(sampleBytes / 1024).toFixed(1)} KiB)`,
      formatTiming(ours),
      ...cells,
    ];
  });
  const head = ['case', 'end', 'steps acc / rej / evals', 'samples (memory)', 'ours µs/call (rounds)', 'scipy µs/call (rounds)', 'scipy/ours', `final r, θ, φ agree to ${AGREEMENT.toExponential(0)}`, `target ≥ ${TARGET_RATIO}×`];
  const header = [
    machineLine(),
    `in-process geodesics: geodesic() from ${MODULE} (the compiled build), DOP853 with dense output, called in this process · ${timingDescription(GEODESIC_TIMING)} · load average at start ${loadAtStart.toFixed(2)}`,
    versions,
    `target: the 10-orbit case at rtol 1e-10 at least ${TARGET_RATIO}× faster than scipy's solve_ivp DOP853 on the same data; memory is the samples' Float64Arrays (bounded by the sample count) plus a fixed integrator state`,
  ];
  return formatTable(header, head, body);
}
