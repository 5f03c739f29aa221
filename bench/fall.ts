/**
 * The in-process section of `npm run bench`: free fall by quadrature, timed per call of freeFall in
 * this process, against scipy.integrate.quad on the same proper-time integral timed in the same run
 * (bench/rivals/scipy_fall.py, run with python3).
 *
 * freeFall is imported from dist/src/physics/free-fall.js, the compiled build the service runs
 * (`npm run bench` builds it first); only its types come from the source. Target: under 50 µs per
 * quadrature call; the closed-form row is context.
 */
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { FreeFallOptions, FreeFallRequest } from '../src/physics/free-fall-types.js';
import type { KerrNewman } from '../src/physics/spacetime.js';
import { runProgram } from './processes.js';
import { formatTable, formatTiming, machineLine, timePerCall, timingArguments, timingDescription, type Timing } from './timing.js';

/** One in-process case: a call of freeFall (src/physics/free-fall.ts), timed by timePerCall. */
export interface FallCase {
  name: string;
  spacetime: KerrNewman;
  request: FreeFallRequest;
  options: FreeFallOptions;
  /** The method freeFall must choose here; quadrature cases are held to the per-call target. */
  method: 'quadrature' | 'closedForm';
  /**
   * The same proper-time integral for the scipy rival (bench/rivals/scipy_fall.py), a = 0 only:
   * τ = ∫ dr/√(E² − f(r)) from rMin to rMax, f = 1 − 2/r + q²/r², at relative tolerance epsrel.
   */
  rival?: { q: number; energy: number; rMin: number; rMax: number; epsrel: number };
}

type FreeFallModule = typeof import('../src/physics/free-fall.js');
/** The compiled module timed here; its source is src/physics/free-fall.ts. */
const MODULE = 'dist/src/physics/free-fall.js';

const TARGET_MICROSECONDS = 50;
/** Relative agreement asked of the two results: both quadratures run at relative tolerance 1e−12; 1e−10 leaves room for error estimates that are loose. */
const AGREEMENT = 1e-10;
const RIVAL_SCRIPT = 'bench/rivals/scipy_fall.py';
const RIVAL_TIMEOUT_MS = 300_000;

interface RivalResult extends Timing {
  value: number;
  abserr: number;
  neval: number;
  warning: string | null;
  python: string;
  scipy: string;
  numpy: string;
}

interface FallRow {
  c: FallCase;
  properTime: number;
  evaluations: number;
  ours: Timing;
  rival?: RivalResult | Error;
}

async function loadFreeFall(root: string): Promise<FreeFallModule['freeFall']> {
  const url = pathToFileURL(join(root, MODULE)).href;
  return ((await import(url)) as FreeFallModule).freeFall;
}

async function runRival(root: string, rival: NonNullable<FallCase['rival']>): Promise<RivalResult> {
  const args = [
    RIVAL_SCRIPT,
    ...['--q', rival.q, '--energy', rival.energy, '--r-min', rival.rMin, '--r-max', rival.rMax, '--epsrel', rival.epsrel].map(String),
    ...timingArguments(),
  ];
  const out = await runProgram('python3', args, { cwd: root, timeoutMs: RIVAL_TIMEOUT_MS });
  return JSON.parse(out) as RivalResult;
}

/** Times every case (ours first, then its rival, one at a time) and returns the rows. */
export async function measureFalls(root: string, cases: readonly FallCase[]): Promise<FallRow[]> {
  const freeFall = await loadFreeFall(root);
  const rows: FallRow[] = [];
  for (const [i, c] of cases.entries()) {
    process.stderr.write(`[in-process ${i + 1}/${cases.length}] ${c.name}\n`);
    const once = freeFall(c.spacetime, c.request, c.options);
    if (!once.ok) throw new Error(`${c.name}: freeFall refused (${once.reason}): ${once.message}`);
    if (once.method !== c.method) throw new Error(`${c.name}: freeFall used ${once.method}, the case expects ${c.method}`);
    const ours = timePerCall(() => {
      const r = freeFall(c.spacetime, c.request, c.options);
      return r.ok ? r.properTime : Number.NaN;
    });
    const row: FallRow = { c, properTime: once.properTime, evaluations: once.evaluations, ours };
    if (c.rival) row.rival = await runRival(root, c.rival).catch((err: unknown) => (err instanceof Error ? err : new Error(String(err))));
    rows.push(row);
  }
  return rows;
}

function rivalLine(rows: readonly FallRow[]): string {
  const row = rows.find((r) => r.rival !== undefined);
  const rival = row?.rival;
  if (!row || !rival) return 'rival: none measured';
  if (rival instanceof Error) return `rival: the scipy run failed — ${rival.message.split('\n').slice(0, 3).join(' ')}`;
  return (
    `rival in the same run: Python ${rival.python} · scipy ${rival.scipy} · numpy ${rival.numpy} — scipy.integrate.quad with a Python callable, epsabs=0, ` +
    `epsrel=${row.c.rival?.epsrel ?? '?'}, ${rival.neval} evaluations, on τ = ∫ dr/√(E² − f), f = 1 − 2/r + q²/r², for "${row.c.name}" ` +
    `(${RIVAL_SCRIPT}, same timing procedure)` +
    (rival.warning ? ` · quad warned: ${rival.warning}` : '')
  );
}

export function fallTable(rows: readonly FallRow[], loadAtStart: number): string {
  const body = rows.map(({ c, properTime, evaluations, ours, rival }) => {
    let rivalCells = ['—', '—', '—'];
    if (rival instanceof Error) {
      rivalCells = ['failed', '—', '—'];
    } else if (rival) {
      const rel = Math.abs(properTime - rival.value) / Math.abs(rival.value);
      rivalCells = [
        formatTiming(rival),
        (rival.microseconds / ours.microseconds).toFixed(2),
        `${rel <= AGREEMENT ? 'yes' : 'NO'} (${rel.toExponential(1)})`,
      ];
    }
    return [
      c.name,
      c.method === 'quadrature' ? `quadrature, ${evaluations} evals` : 'closed form',
      properTime.toPrecision(16),
      formatTiming(ours),
      ours.callsPerRound.toLocaleString('en-US'),
      ...rivalCells,
      c.method === 'quadrature' ? (ours.microseconds < TARGET_MICROSECONDS ? 'yes' : 'no') : '—',
    ];
  });
  const head = ['case', 'method', 'proper time τ', 'ours µs/call (rounds)', 'calls/round', 'scipy µs/call (rounds)', 'scipy/ours', `agree to ${AGREEMENT.toExponential(0)}`, 'target met'];
  const header = [
    machineLine(),
    `in-process free fall: freeFall from ${MODULE} (the compiled build), called in this process before any server starts · ` +
      `${timingDescription()} · load average at start ${loadAtStart.toFixed(2)}`,
    'each call computes τ and the river time T in one vector quadrature (relative tolerance 1e-12) after checking the path; r in GM/c², τ in GM/c³',
    rivalLine(rows),
    `target: < ${TARGET_MICROSECONDS} µs per quadrature call; scipy/ours > 1: ours is faster; agreement: |τ_ours − τ_scipy|/τ_scipy ≤ ${AGREEMENT.toExponential(0)}`,
  ];
  return formatTable(header, head, body);
}
