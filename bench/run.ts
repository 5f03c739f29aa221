/**
 * `npm run bench`, three tables:
 *
 * 1. HTTP: /v1/local, /v1/clocks and /v1/orbits/circular under autocannon against bare fastify JSON
 *    routes measured in the same run. Target for each /v1/local case: at least 60% of the bare tiny
 *    route's requests per second and p99 under 5 ms at 50 connections, without errors. Cases with
 *    their own goal (POST /v1/clocks: "a clock comparison costs no more than /v1/local"; GET
 *    /v1/orbits/circular: "within the same ratio as /v1/local") are held to that instead.
 * 2. In-process: free fall by quadrature against scipy (./fall.ts).
 * 3. In-process: the Kerr shadow against numpy and the deflection of light against scipy (./light.ts).
 *    Geodesics (./geodesic.ts): a 10-orbit Kerr geodesic against scipy's solve_ivp DOP853 (target ≥ 10×).
 * 4. Sweeps (./sweep.ts): a 1e6-point compute rate against numpy, and the same sweep as columnar JSON
 *    over HTTP from a fresh service (cold, cached repeat, peak RSS).
 *
 * BENCH_SECONDS sets the measured seconds per HTTP case (default 10). Benchmarks report; they do not
 * fail: a missed target still exits 0. A server that cannot start exits 1.
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
import localGetCached from './cases/local-get-cached.js';
import localGet from './cases/local-get.js';
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
  type Measurement,
  type Server,
  type Target,
} from './processes.js';
import { measureSweeps, sweepTable, type SweepCase } from './sweep.js';
import { formatTable, machineLine } from './timing.js';

/** Benchmarks measure speed: shedding on event-loop delay would turn a slow moment into 503s. */
const NO_SHEDDING = { MAX_EVENT_LOOP_DELAY_MS: '0' };

const CASES: readonly BenchCase[] = [
  bareTiny,
  barePayload,
  barePayloadPost,
  localGet,
  localPost,
  localEarth,
  clocksGps,
  orbitsCircular,
  localGetCached,
  sweepSmallCached,
];
const FALL_CASES: readonly FallCase[] = [fallKerrEquator, fallRnInfinity, fallSchwarzschildRest];
const LIGHT_CASES: readonly LightCase[] = [shadowKerr17deg, deflectionSchwarzschildR4, deflectionKerrNewmanRetrograde];
const SWEEP_CASES: readonly SweepCase[] = [sweepFlow1e6];
const GEODESIC_CASES: readonly GeodesicBenchCase[] = [geodesicKerrInclined, geodesicKerrInclined10k, geodesicKerrPlunge];
const TARGET_RATIO = 0.6;
const TARGET_P99_MS = 5;
/** The row the "vs GET /v1/local" column divides by. */
const LOCAL_REFERENCE = localGet;

const ROOT = dirname(dirname(fileURLToPath(import.meta.url)));

function benchSeconds(text: string | undefined): number {
  if (text === undefined || text.trim() === '') return 10;
  const n = Number(text);
  if (!Number.isFinite(n) || n < 1 || n > 600) throw new Error(`BENCH_SECONDS must be a number of seconds in [1, 600], got "${text}"`);
  return Math.round(n);
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
  // The compute path: the result cache switched off, so every request is computed (ETags remain).
  const service = await startServer('service', ['dist/src/server.js'], {
    cwd: ROOT,
    env: { HOST: '127.0.0.1', LOG_LEVEL: 'warn', ...NO_SHEDDING, CACHE_MAX_BYTES: '0' },
    ready: { method: 'GET', path: '/' },
  });
  for (const c of CASES) if (c.target === 'service') await probe(service, c);
  // As deployed: the default in-memory cache, so repeated requests are served from it.
  const serviceCached = await startServer('service (cached)', ['dist/src/server.js'], {
    cwd: ROOT,
    env: { HOST: '127.0.0.1', LOG_LEVEL: 'warn', ...NO_SHEDDING },
    ready: { method: 'GET', path: '/' },
  });
  for (const c of CASES) if (c.target === 'serviceCached') await probe(serviceCached, c);

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
    serviceCached,
    bareTiny: await bare(bareTiny, 'tiny'),
    barePayload: await bare(barePayload, 'payload'),
    barePayloadPost: await bare(barePayloadPost, 'payload-post'),
  };
}

interface Row {
  c: BenchCase;
  m: Measurement;
}

function httpTable(rows: Row[], header: string[]): string {
  const rps = (c: BenchCase) => rows.find((r) => r.c === c)?.m.requestsPerSecond ?? Number.NaN;
  const tiny = rps(bareTiny);
  const local = rps(LOCAL_REFERENCE);
  const ms = (x: number) => (Number.isFinite(x) ? x.toFixed(2) : '—');
  const body = rows.map(({ c, m }) => {
    const clean = m.errors === 0 && m.non2xx === 0;
    const vsTiny = m.requestsPerSecond / tiny;
    const vsLocal = m.requestsPerSecond / local;
    const rival = CASES.find((r) => r.sameBytesAs === c);
    let met = '—';
    if (c.goal) met = m.requestsPerSecond / rps(c.goal.relativeTo) >= c.goal.atLeast && clean ? 'yes' : 'no';
    else if (c.target === 'service' || c.target === 'serviceCached') met = vsTiny >= TARGET_RATIO && m.p99 < TARGET_P99_MS && clean ? 'yes' : 'no';
    return [
      c.name,
      Math.round(m.requestsPerSecond).toLocaleString('en-US'),
      ms(m.p50),
      ms(m.p99),
      `${m.errors} / ${m.non2xx}`,
      vsTiny.toFixed(2),
      rival ? (m.requestsPerSecond / rps(rival)).toFixed(2) : '—',
      c.target === 'service' || c.target === 'serviceCached' ? vsLocal.toFixed(2) : '—',
      met,
    ];
  });
  const head = ['case', 'req/s', 'p50 ms', 'p99 ms', 'errors / non-2xx', 'vs bare tiny', 'vs same payload', 'vs GET /v1/local', 'target met'];
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
  const seconds = benchSeconds(process.env.BENCH_SECONDS);
  const warmupSeconds = Math.min(3, Math.max(1, Math.round(seconds / 5)));
  if (!existsSync(join(ROOT, 'dist/src/server.js'))) throw new Error('dist/src/server.js is missing: run `npm run build` first');
  installCleanup();
  // Other work on the machine skews every row; the load average at the start is printed with each table.
  const fallLoad = loadavg()[0] ?? Number.NaN;
  const falls = await measureFalls(ROOT, FALL_CASES);
  const lightLoad = loadavg()[0] ?? Number.NaN;
  const light = await measureLight(ROOT, LIGHT_CASES);
  const geodesicLoad = loadavg()[0] ?? Number.NaN;
  const geodesics = await measureGeodesics(ROOT, GEODESIC_CASES);
  const sweepLoad = loadavg()[0] ?? Number.NaN;
  const sweeps = await measureSweeps(ROOT, SWEEP_CASES);

  const httpLoad = loadavg()[0] ?? Number.NaN;
  const payloadDir = mkdtempSync(join(tmpdir(), 'spacetide-bench-'));
  process.on('exit', () => rmSync(payloadDir, { recursive: true, force: true }));
  const rows: Row[] = [];
  try {
    const servers = await startAll(payloadDir);
    for (const [i, c] of CASES.entries()) {
      process.stderr.write(`[${i + 1}/${CASES.length}] ${c.name}: ${warmupSeconds} s warm-up, ${seconds} s measured\n`);
      rows.push({ c, m: await measure(servers[c.target], c, seconds, warmupSeconds) });
    }
  } finally {
    await stopAll();
  }

  const header = [
    machineLine(),
    `autocannon ${autocannonVersion()} · ${CONNECTIONS} connections · ${seconds} s per case after ${warmupSeconds} s warm-up · each server and the client in its own process, on 127.0.0.1 · load average at start ${httpLoad.toFixed(2)}`,
    `target for /v1/local: ≥ ${TARGET_RATIO * 100}% of the bare tiny route's req/s (headline) and p99 < ${TARGET_P99_MS} ms, no errors; "vs same payload" (a bare route sending the same bytes for the same request) is context`,
    'rows marked (cached) hit a second service with the default result cache; every other service row runs with CACHE_MAX_BYTES=0, so each request is computed',
    ...goalLines(),
    `"vs GET /v1/local" divides by ${LOCAL_REFERENCE.name}`,
  ];
  process.stdout.write(
    `${httpTable(rows, header)}\n\n${fallTable(falls, fallLoad)}\n\n${lightTable(light, lightLoad)}\n\n${geodesicTable(geodesics, geodesicLoad)}\n\n${sweepTable(sweeps, sweepLoad)}\n`,
  );
}

main().catch((err: unknown) => {
  process.stderr.write(`bench failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
  process.exitCode = 1;
});
