/**
 * `npm run bench`, five tables (BENCH_PARTS picks some: http, fall, light, geodesic, sweep):
 *
 * 1. HTTP: /v1/local, /v1/clocks, /v1/orbits/circular and a small sweep under autocannon against bare
 *    fastify JSON routes measured in the same run. Target for GET and POST /v1/local, against the
 *    service as the README starts it: at least 60% of the bare tiny route's requests per second and
 *    p99 under 5 ms at 50 connections, without errors. Rows marked (computed) run against a second
 *    service with the result cache off, so every request is computed. Cases with their own goal
 *    (POST /v1/clocks: "a clock comparison costs no more than /v1/local"; GET /v1/orbits/circular:
 *    "within the same ratio as /v1/local") are held to it against GET /v1/local (computed).
 *    The machine is shared and noisy, so every case runs in BENCH_ROUNDS rounds (default 3) of
 *    BENCH_SECONDS measured seconds (default 5), each run between two runs of the bare tiny route,
 *    and its ratio to that route is taken against those two.
 * 2. In-process: free fall by quadrature against scipy (./fall.ts).
 * 3. In-process: the Kerr shadow against numpy and the deflection of light against scipy (./light.ts).
 * 4. Geodesics (./geodesic.ts): a 10-orbit Kerr geodesic against scipy's solve_ivp DOP853 (target ≥ 10×).
 * 5. Sweeps (./sweep.ts): a 1e6-point compute rate against numpy, and the same sweep as columnar JSON
 *    over HTTP from a fresh service (cold, cached repeat, peak RSS).
 *
 * Benchmarks report; they do not fail: a missed target still exits 0. A server that cannot start exits 1.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import barePayloadPost from './cases/bare-payload-post.js';
import barePayload from './cases/bare-payload.js';
import bareTiny from './cases/bare-tiny.js';
import clocksGps from './cases/clocks-gps.js';
import deflectionKerrNewmanRetrograde from './cases/deflection-kerr-newman-retrograde.js';
import deflectionSchwarzschildR4 from './cases/deflection-schwarzschild-r4.js';
import fallKerrEquator from './cases/fall-kerr-equator.js';
import fallRnInfinity from './cases/fall-rn-infinity.js';
import fallSchwarzschildRest from './cases/fall-schwarzschild-rest.js';
import geodesicKerrInclined10k from './cases/geodesic-kerr-inclined-10k.js';
import geodesicKerrInclined from './cases/geodesic-kerr-inclined.js';
import geodesicKerrPlunge from './cases/geodesic-kerr-plunge.js';
import localEarth from './cases/local-earth.js';
import localGetComputed from './cases/local-get-computed.js';
import localGet from './cases/local-get.js';
import localPostComputed from './cases/local-post-computed.js';
import localPost from './cases/local-post.js';
import orbitsCircular from './cases/orbits-circular.js';
import shadowKerr17deg from './cases/shadow-kerr-17deg.js';
import sweepSmallCached from './cases/sweep-small-cached.js';
import sweepFlow1e6 from './cases/sweep-flow-1e6.js';
import { fallTable, measureFalls, type FallCase } from './fall.js';
import { geodesicTable, measureGeodesics, type GeodesicBenchCase } from './geodesic.js';
import { lightTable, measureLight, type LightCase } from './light.js';
import {
  CONNECTIONS,
  installCleanup,
  measure,
  send,
  startServer,
  stopAll,
  type BenchCase,
  combineRuns,
  type Measurement,
  type Run,
  type Server,
  type Target,
} from './processes.js';
import { measureSweeps, sweepTable, type SweepCase } from './sweep.js';
import { formatTable, machineLine, median } from './timing.js';

/** Benchmarks measure speed: shedding on event-loop delay would turn a slow moment into 503s. */
const NO_SHEDDING = { MAX_EVENT_LOOP_DELAY_MS: '0' };

const CASES: readonly BenchCase[] = [
  bareTiny,
  barePayload,
  barePayloadPost,
  localGet,
  localPost,
  localGetComputed,
  localPostComputed,
  localEarth,
  clocksGps,
  orbitsCircular,
  sweepSmallCached,
];
/** The rows that carry the /v1/local target (the service as deployed). */
const TARGET_CASES: readonly BenchCase[] = [localGet, localPost];
const FALL_CASES: readonly FallCase[] = [fallKerrEquator, fallRnInfinity, fallSchwarzschildRest];
const LIGHT_CASES: readonly LightCase[] = [shadowKerr17deg, deflectionSchwarzschildR4, deflectionKerrNewmanRetrograde];
const SWEEP_CASES: readonly SweepCase[] = [sweepFlow1e6];
const GEODESIC_CASES: readonly GeodesicBenchCase[] = [geodesicKerrInclined, geodesicKerrInclined10k, geodesicKerrPlunge];
const TARGET_RATIO = 0.6;
const TARGET_P99_MS = 5;
/** The row the "vs GET /v1/local (computed)" column divides by. */
const LOCAL_REFERENCE = localGetComputed;

const ROOT = dirname(dirname(fileURLToPath(import.meta.url)));

function benchSeconds(text: string | undefined): number {
  if (text === undefined || text.trim() === '') return 5;
  const n = Number(text);
  if (!Number.isFinite(n) || n < 1 || n > 600) throw new Error(`BENCH_SECONDS must be a number of seconds in [1, 600], got "${text}"`);
  return Math.round(n);
}

function benchRounds(text: string | undefined): number {
  if (text === undefined || text.trim() === '') return 3;
  const n = Number(text);
  if (!Number.isInteger(n) || n < 1 || n > 20) throw new Error(`BENCH_ROUNDS must be a whole number in [1, 20], got "${text}"`);
  return n;
}

const PARTS = ['http', 'fall', 'light', 'geodesic', 'sweep'] as const;
type Part = (typeof PARTS)[number];

/** BENCH_PARTS: a comma-separated subset of PARTS (default all); the tables print in PARTS order. */
function benchParts(text: string | undefined): ReadonlySet<Part> {
  if (text === undefined || text.trim() === '') return new Set(PARTS);
  const names = text.split(',').map((p) => p.trim());
  const unknown = names.filter((p) => !(PARTS as readonly string[]).includes(p));
  if (unknown.length > 0 || names.length === 0) throw new Error(`BENCH_PARTS must list some of ${PARTS.join(', ')}; got "${text}"`);
  return new Set(names as Part[]);
}

function autocannonVersion(): string {
  const require = createRequire(import.meta.url);
  const pkg = join(dirname(require.resolve('autocannon')), 'package.json');
  return (JSON.parse(readFileSync(pkg, 'utf8')) as { version: string }).version;
}

/** One request, checked for 200, returning the body text. */
async function probe(server: Server, c: BenchCase): Promise<string> {
  const { status, text } = await send(server.url, c);
  if (status !== 200) throw new Error(`${c.name}: status ${status}: ${text.slice(0, 500)}`);
  return text;
}

/**
 * Starts the service, then each bare server; a same-payload server gets a copy of the service's
 * response to the case it mirrors, and must send back exactly those bytes.
 */
async function startAll(payloadDir: string): Promise<Record<Target, Server>> {
  // As the README starts it — the default in-memory result cache, so repeated requests are served from
  // it — except LOG_LEVEL=warn: at the default (info) every request writes an access-log line.
  const service = await startServer('service', ['dist/src/server.js'], {
    cwd: ROOT,
    env: { HOST: '127.0.0.1', LOG_LEVEL: 'warn', ...NO_SHEDDING },
    ready: { method: 'GET', path: '/' },
  });
  for (const c of CASES) if (c.target === 'service') await probe(service, c);
  // The compute path: the result cache switched off, so every request is computed (ETags remain).
  const serviceComputed = await startServer('service (cache off)', ['dist/src/server.js'], {
    cwd: ROOT,
    env: { HOST: '127.0.0.1', LOG_LEVEL: 'warn', ...NO_SHEDDING, CACHE_MAX_BYTES: '0' },
    ready: { method: 'GET', path: '/' },
  });
  for (const c of CASES) if (c.target === 'serviceComputed') await probe(serviceComputed, c);

  const bare = async (c: BenchCase, variant: string): Promise<Server> => {
    const args = ['--import', 'tsx', 'bench/bare-server.ts', '{port}', variant];
    if (!c.sameBytesAs) return startServer(`bare ${variant}`, args, { cwd: ROOT, ready: c });
    const document = await probe(service, c.sameBytesAs);
    const file = join(payloadDir, `${variant}.json`);
    writeFileSync(file, document);
    const server = await startServer(`bare ${variant}`, [...args, file], { cwd: ROOT, ready: c });
    if ((await probe(server, c)) !== document) throw new Error(`${c.name} does not send the bytes of ${c.sameBytesAs.name}`);
    return server;
  };
  return {
    service,
    serviceComputed,
    bareTiny: await bare(bareTiny, 'tiny'),
    barePayload: await bare(barePayload, 'payload'),
    barePayloadPost: await bare(barePayloadPost, 'payload-post'),
  };
}

interface Row {
  c: BenchCase;
  m: Measurement;
  /** Per round: the bare tiny route's req/s just before and just after this case, averaged. */
  tinyAround: number[];
}

/** a / b round by round: the median ratio and the rounds' range. */
function roundRatio(a: readonly number[], b: readonly number[]): { median: number; min: number; max: number } {
  const ratios = a.map((x, i) => x / (b[i] ?? Number.NaN));
  return { median: median(ratios), min: Math.min(...ratios), max: Math.max(...ratios) };
}

function httpTable(rows: Row[], header: string[]): string {
  const measured = (c: BenchCase): Measurement | undefined => rows.find((r) => r.c === c)?.m;
  const ms = (x: number) => (Number.isFinite(x) ? x.toFixed(2) : '—');
  const ratioText = (m: Measurement, against: readonly number[] | undefined, withRange: boolean) => {
    if (!against) return '—';
    const r = roundRatio(m.perRound, against);
    return withRange && m.perRound.length > 1 ? `${r.median.toFixed(2)} (${r.min.toFixed(2)}–${r.max.toFixed(2)})` : r.median.toFixed(2);
  };
  const body = rows.map(({ c, m, tinyAround }) => {
    const clean = m.errors === 0 && m.non2xx === 0;
    const isService = c.target === 'service' || c.target === 'serviceComputed';
    const rival = CASES.find((r) => r.sameBytesAs === c);
    let met = '—';
    const relative = c.goal ? measured(c.goal.relativeTo) : undefined;
    if (c.goal && relative) met = roundRatio(m.perRound, relative.perRound).median >= c.goal.atLeast && clean ? 'yes' : 'no';
    else if (isService) met = roundRatio(m.perRound, tinyAround).median >= TARGET_RATIO && m.p99 < TARGET_P99_MS && clean ? 'yes' : 'no';
    return [
      c.name,
      Math.round(m.requestsPerSecond).toLocaleString('en-US'),
      ms(m.p50),
      ms(m.p99),
      `${m.errors} / ${m.non2xx}`,
      Number.isFinite(m.serverCpuMicros) ? m.serverCpuMicros.toFixed(1) : '—',
      ratioText(m, tinyAround, true),
      ratioText(m, rival ? measured(rival)?.perRound : undefined, false),
      isService ? ratioText(m, measured(LOCAL_REFERENCE)?.perRound, false) : '—',
      met,
    ];
  });
  const head = ['case', 'req/s', 'p50 ms', 'p99 ms', 'errors / non-2xx', 'server CPU µs/req', 'vs bare tiny', 'vs same payload', `vs ${LOCAL_REFERENCE.name}`, 'target met'];
  return formatTable(header, head, body);
}

function goalLines(): string[] {
  return CASES.flatMap((c) =>
    c.goal
      ? [
          `target for ${c.name}: "${c.goal.statement}" — req/s ≥ ${c.goal.atLeast} × ${c.goal.relativeTo.name} in this run ` +
            `(${c.goal.atLeast} rather than 1 is the allowance for run-to-run noise), no errors`,
        ]
      : [],
  );
}

async function main(): Promise<void> {
  if (!existsSync(join(ROOT, 'dist/src/server.js'))) throw new Error('dist/src/server.js is missing: run `npm run build` first');
  installCleanup();
  const parts = benchParts(process.env.BENCH_PARTS);
  const tables: string[] = [];
  // Other work on the machine skews every row; the load average at the start is printed with each table.
  const inProcess: [Part, (load: number) => Promise<string>][] = [
    ['fall', async (load) => fallTable(await measureFalls(ROOT, FALL_CASES), load)],
    ['light', async (load) => lightTable(await measureLight(ROOT, LIGHT_CASES), load)],
    ['geodesic', async (load) => geodesicTable(await measureGeodesics(ROOT, GEODESIC_CASES), load)],
    ['sweep', async (load) => sweepTable(await measureSweeps(ROOT, SWEEP_CASES), load)],
  ];
  for (const [part, table] of inProcess) if (parts.has(part)) tables.push(await table(loadavg()[0] ?? Number.NaN));
  if (parts.has('http')) tables.unshift(await httpPart());
  process.stdout.write(`${tables.join('\n\n')}\n`);
}

/** The HTTP table: every server started, every case measured in rounds, every server stopped. */
async function httpPart(): Promise<string> {
  const seconds = benchSeconds(process.env.BENCH_SECONDS);
  const rounds = benchRounds(process.env.BENCH_ROUNDS);
  const warmupSeconds = Math.min(3, Math.max(1, Math.round(seconds / 5)));
  const httpLoad = loadavg()[0] ?? Number.NaN;
  const payloadDir = mkdtempSync(join(tmpdir(), 'spacetide-bench-'));
  process.on('exit', () => rmSync(payloadDir, { recursive: true, force: true }));
  const rows: Row[] = [];
  try {
    const servers = await startAll(payloadDir);
    // Rounds: every case once per round, in the same order, each between two runs of the bare tiny
    // route; its ratio to tiny is taken against the mean of those two, measured seconds before and
    // after it. The machine is shared and its speed drifts within a minute: so a slow spell costs one
    // round of a case and the tiny runs beside it alike, rather than skewing one side of a ratio.
    const others = CASES.filter((c) => c !== bareTiny);
    const runs = new Map<BenchCase, Run[]>(CASES.map((c) => [c, []]));
    const around = new Map<BenchCase, number[]>(CASES.map((c) => [c, []]));
    const step = async (c: BenchCase, label: string): Promise<Run> => {
      process.stderr.write(`${label} ${c.name}: ${warmupSeconds} s warm-up, ${seconds} s measured\n`);
      return measure(servers[c.target], c, seconds, warmupSeconds);
    };
    for (let round = 1; round <= rounds; round++) {
      let before = await step(bareTiny, `[round ${round}/${rounds}]`);
      runs.get(bareTiny)?.push(before);
      for (const [i, c] of others.entries()) {
        runs.get(c)?.push(await step(c, `[round ${round}/${rounds}, ${i + 1}/${others.length}]`));
        const after = await step(bareTiny, `[round ${round}/${rounds}]`);
        runs.get(bareTiny)?.push(after);
        around.get(c)?.push((before.requestsPerSecond + after.requestsPerSecond) / 2);
        before = after;
      }
    }
    for (const c of CASES) {
      const m = combineRuns(runs.get(c) ?? []);
      rows.push({ c, m, tinyAround: c === bareTiny ? m.perRound : (around.get(c) ?? []) });
    }
  } finally {
    await stopAll();
  }

  const header = [
    machineLine(),
    `autocannon ${autocannonVersion()} · ${CONNECTIONS} connections · ${rounds} rounds of every case, ${seconds} s measured each after ${warmupSeconds} s warm-up · each server and the client in its own process, on 127.0.0.1 · load average at start ${httpLoad.toFixed(2)}`,
    'req/s: median over the rounds (the bare tiny route: over all its runs, one before each case and one after the last); "vs bare tiny": each round\'s req/s over the mean of the tiny runs just before and after it, median with the rounds\' range in brackets; other ratios: round by round; p50/p99: all rounds\' responses pooled',
    `target for ${TARGET_CASES.map((c) => c.name).join(' and ')}: ≥ ${TARGET_RATIO * 100}% of the bare tiny route's req/s and p99 < ${TARGET_P99_MS} ms, no errors, with the service as the README starts it (default in-memory result cache: autocannon repeats one request, so after the first each is a cache hit) but LOG_LEVEL=warn (the default, info, writes an access-log line per request)`,
    'rows marked (computed) run against a second service with CACHE_MAX_BYTES=0, so every request is validated, keyed, computed and serialised; "target met" applies the same test to them for context',
    '"vs same payload": against a bare route sending the same response bytes, pre-serialised (no work but fastify\'s own)',
    '"server CPU µs/req": user + system CPU time of the server process over the measured seconds (/proc/<pid>/stat) per request answered, median over the rounds; the client (autocannon, in this process) shares this machine’s cores, so req/s also depends on what each response costs the client to read',
    ...goalLines(),
  ];
  return httpTable(rows, header);
}

main().catch((err: unknown) => {
  process.stderr.write(`bench failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
  process.exitCode = 1;
});
