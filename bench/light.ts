/**
 * The in-process light section of `npm run bench`: the Kerr shadow and the deflection of light, timed
 * per call in this process, against Python rivals computing the same quantities timed in the same run
 * (bench/rivals/numpy_shadow.py and bench/rivals/scipy_deflection.py, run with python3).
 *
 * shadow and deflection are imported from dist/src/physics/shadow.js and deflection.js, the compiled
 * build the service runs (`npm run bench` builds it first); only their types come from the source.
 * Targets: under 1 ms per shadow call (512 points), under 20 µs per deflection call.
 */
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { DeflectionOptions, DeflectionRequest } from '../src/physics/deflection.js';
import type { KerrNewman } from '../src/physics/spacetime.js';
import { runProgram } from './processes.js';
import { formatTable, formatTiming, machineLine, timePerCall, timingArguments, timingDescription, type Timing } from './timing.js';

/** One call of shadow(spacetime, inclination, points) (src/physics/shadow.ts). */
export interface ShadowCase {
  kind: 'shadow';
  name: string;
  spacetime: KerrNewman;
  /** Radians. */
  inclination: number;
  points: number;
  /** The same curve for the numpy rival (bench/rivals/numpy_shadow.py): Kerr (q = 0), 0 < a < 1, 0 < i < π/2. */
  rival?: { spin: number; inclination: number; points: number };
}

/** One call of deflection(spacetime, request, options) (src/physics/deflection.ts). */
export interface DeflectionCase {
  kind: 'deflection';
  name: string;
  spacetime: KerrNewman;
  request: DeflectionRequest;
  options?: DeflectionOptions;
  /** The method deflection must choose here. */
  method: 'darwin' | 'quadrature';
  /**
   * The same deflection for the scipy rival (bench/rivals/scipy_deflection.py), Schwarzschild only:
   * α = 2∫₀^{u₀} du/√(b⁻² − u² + 2u³) − π for closest approach r0, at relative tolerance epsrel.
   */
  rival?: { r0: number; epsrel: number };
}

export type LightCase = ShadowCase | DeflectionCase;

type ShadowModule = typeof import('../src/physics/shadow.js');
type DeflectionModule = typeof import('../src/physics/deflection.js');
/** The compiled modules timed here; their sources are src/physics/shadow.ts and deflection.ts. */
const SHADOW_MODULE = 'dist/src/physics/shadow.js';
const DEFLECTION_MODULE = 'dist/src/physics/deflection.js';

const TARGET_MICROSECONDS: Record<LightCase['kind'], number> = { shadow: 1000, deflection: 20 };
/**
 * Relative agreement asked of ours and the rival's result. Shadow (horizontal diameter): ours is good
 * to ≈ 1e−14 (shadow.ts), the rival's uncancelled forms and brentq ends to ≈ 1e−13; 1e−9 leaves room
 * for a rival that loses digits at the ends of the visible range. Deflection: a closed form (rounding
 * only) against quad at relative tolerance 1e−12; 1e−10 leaves room for error estimates that are loose.
 */
const AGREEMENT: Record<LightCase['kind'], number> = { shadow: 1e-9, deflection: 1e-10 };
const RIVAL_SCRIPT: Record<LightCase['kind'], string> = {
  shadow: 'bench/rivals/numpy_shadow.py',
  deflection: 'bench/rivals/scipy_deflection.py',
};
const RIVAL_TIMEOUT_MS = 300_000;

interface Versions {
  python: string;
  numpy: string;
  scipy: string;
}

interface ShadowRivalResult extends Timing, Versions {
  horizontalDiameter: number;
  visibleRange: [number, number];
}

interface DeflectionRivalResult extends Timing, Versions {
  value: number;
  abserr: number;
  neval: number;
  warning: string | null;
}

/** A rival's timing and its value of the row's quantity, with the line that says what it computed. */
interface RivalRun extends Timing {
  value: number;
  description: string;
}

interface LightRow {
  c: LightCase;
  method: string;
  /** D_h (shadow, units of M) or α (deflection, radians). */
  quantity: 'D_h' | 'α';
  value: number;
  ours: Timing;
  rival?: RivalRun | Error;
}

interface Physics {
  shadow: ShadowModule['shadow'];
  deflection: DeflectionModule['deflection'];
}

async function loadPhysics(root: string): Promise<Physics> {
  const load = async <T>(file: string) => (await import(pathToFileURL(join(root, file)).href)) as T;
  return {
    shadow: (await load<ShadowModule>(SHADOW_MODULE)).shadow,
    deflection: (await load<DeflectionModule>(DEFLECTION_MODULE)).deflection,
  };
}

async function runShadowRival(root: string, c: ShadowCase, rival: NonNullable<ShadowCase['rival']>): Promise<RivalRun> {
  const args = [
    RIVAL_SCRIPT.shadow,
    ...['--spin', rival.spin, '--inclination', rival.inclination, '--points', rival.points].map(String),
    ...timingArguments(),
  ];
  const r = JSON.parse(await runProgram('python3', args, { cwd: root, timeoutMs: RIVAL_TIMEOUT_MS })) as ShadowRivalResult;
  const description =
    `numpy rival for "${c.name}": Python ${r.python} · numpy ${r.numpy} · scipy ${r.scipy} — the same ${rival.points} points from ` +
    `Bardeen's ξ(r), η(r), α = −ξ/sin i, β = ±√(η + a²cos²i − ξ²cot²i), vectorised over the points; the ends of the visible range ` +
    `(β = 0) by scipy.optimize.brentq; D_h = max α − min α (${RIVAL_SCRIPT.shadow}, same timing procedure)`;
  return { ...pickTiming(r), value: r.horizontalDiameter, description };
}

async function runDeflectionRival(root: string, c: DeflectionCase, rival: NonNullable<DeflectionCase['rival']>): Promise<RivalRun> {
  const args = [RIVAL_SCRIPT.deflection, ...['--r0', rival.r0, '--epsrel', rival.epsrel].map(String), ...timingArguments()];
  const r = JSON.parse(await runProgram('python3', args, { cwd: root, timeoutMs: RIVAL_TIMEOUT_MS })) as DeflectionRivalResult;
  const description =
    `scipy rival for "${c.name}": Python ${r.python} · scipy ${r.scipy} · numpy ${r.numpy} — scipy.integrate.quad with a Python ` +
    `callable, epsabs=0, epsrel=${rival.epsrel}, ${r.neval} evaluations, on α = 4∫₀^{√u₀} ds/√G(u₀ − s²) − π, ` +
    `G(u) = u₀ + u − 2(u₀² + u₀u + u²) (the Schwarzschild integral with u = u₀ − s², no endpoint singularity) ` +
    `(${RIVAL_SCRIPT.deflection}, same timing procedure)` +
    (r.warning ? ` · quad warned: ${r.warning}` : '');
  return { ...pickTiming(r), value: r.value, description };
}

function pickTiming(t: Timing): Timing {
  return { microseconds: t.microseconds, min: t.min, max: t.max, callsPerRound: t.callsPerRound, rounds: t.rounds };
}

const asError = (err: unknown) => (err instanceof Error ? err : new Error(String(err)));

function measureShadow(physics: Physics, c: ShadowCase): LightRow {
  const once = physics.shadow(c.spacetime, c.inclination, c.points);
  if (!once.ok) throw new Error(`${c.name}: shadow refused (${once.reason}): ${once.message}`);
  const ours = timePerCall(() => {
    const r = physics.shadow(c.spacetime, c.inclination, c.points);
    return r.ok ? r.horizontalDiameter : Number.NaN;
  });
  return { c, method: `${once.shape}, ${c.points} points`, quantity: 'D_h', value: once.horizontalDiameter, ours };
}

function measureDeflection(physics: Physics, c: DeflectionCase): LightRow {
  const once = physics.deflection(c.spacetime, c.request, c.options);
  if (!once.ok) throw new Error(`${c.name}: deflection refused (${once.reason}): ${once.message}`);
  if (once.deflection === null) throw new Error(`${c.name}: the ray is not deflected back out (${once.reason ?? '?'})`);
  if (once.method !== c.method) throw new Error(`${c.name}: deflection used ${once.method}, the case expects ${c.method}`);
  const ours = timePerCall(() => {
    const r = physics.deflection(c.spacetime, c.request, c.options);
    return r.ok ? (r.deflection ?? Number.NaN) : Number.NaN;
  });
  const method = once.method === 'darwin' ? 'Darwin, closed form' : `quadrature, ${once.evaluations} evals`;
  return { c, method, quantity: 'α', value: once.deflection, ours };
}

/** Times every case (ours first, then its rival, one at a time) and returns the rows. */
export async function measureLight(root: string, cases: readonly LightCase[]): Promise<LightRow[]> {
  const physics = await loadPhysics(root);
  const rows: LightRow[] = [];
  for (const [i, c] of cases.entries()) {
    process.stderr.write(`[in-process light ${i + 1}/${cases.length}] ${c.name}\n`);
    let row: LightRow;
    if (c.kind === 'shadow') {
      row = measureShadow(physics, c);
      if (c.rival) row.rival = await runShadowRival(root, c, c.rival).catch(asError);
    } else {
      row = measureDeflection(physics, c);
      if (c.rival) row.rival = await runDeflectionRival(root, c, c.rival).catch(asError);
    }
    rows.push(row);
  }
  return rows;
}

function rivalLines(rows: readonly LightRow[]): string[] {
  const lines = rows.flatMap(({ c, rival }) => {
    if (rival === undefined) return [];
    if (rival instanceof Error) return [`rival for "${c.name}": the Python run failed — ${rival.message.split('\n').slice(0, 3).join(' ')}`];
    return [rival.description];
  });
  return lines.length > 0 ? lines : ['rivals: none measured'];
}

export function lightTable(rows: readonly LightRow[], loadAtStart: number): string {
  const body = rows.map(({ c, method, quantity, value, ours, rival }) => {
    const tolerance = AGREEMENT[c.kind];
    let rivalCells = ['—', '—', '—'];
    if (rival instanceof Error) {
      rivalCells = ['failed', '—', '—'];
    } else if (rival) {
      const rel = Math.abs(value - rival.value) / Math.abs(rival.value);
      rivalCells = [
        formatTiming(rival),
        (rival.microseconds / ours.microseconds).toFixed(2),
        `${rel <= tolerance ? 'yes' : 'NO'} (${rel.toExponential(1)} vs ${tolerance.toExponential(0)})`,
      ];
    }
    const target = TARGET_MICROSECONDS[c.kind];
    return [
      c.name,
      method,
      `${quantity} = ${value.toPrecision(16)}`,
      formatTiming(ours),
      ours.callsPerRound.toLocaleString('en-US'),
      ...rivalCells,
      target >= 1000 ? `< ${target / 1000} ms` : `< ${target} µs`,
      ours.microseconds < target ? 'yes' : 'no',
    ];
  });
  const head = ['case', 'method', 'result', 'ours µs/call (rounds)', 'calls/round', 'rival µs/call (rounds)', 'rival/ours', 'agree (rel. diff vs tol.)', 'target', 'target met'];
  const header = [
    machineLine(),
    `in-process light: shadow from ${SHADOW_MODULE} and deflection from ${DEFLECTION_MODULE} (the compiled build), called in this process ` +
      `before any server starts · ${timingDescription()} · load average at start ${loadAtStart.toFixed(2)}`,
    'shadow: one call samples the curve and also computes its vertical diameter, centre, mean radius and circularity (the averages by a ' +
      'midpoint rule doubled until converged), which the rival does not; D_h = horizontal diameter in GM/c² · deflection: α in radians, r₀ in GM/c²',
    ...rivalLines(rows),
    'rival/ours > 1: ours is faster; agreement: |ours − rival|/|rival| of D_h (shadow, tolerance 1e-9) or α (deflection, 1e-10)',
  ];
  return formatTable(header, head, body);
}
