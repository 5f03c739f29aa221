/**
 * `npm run bench`: /v1/local under autocannon against a bare fastify JSON route measured in the same
 * run, printed as one table. Target (for each /v1/local case): at least 60% of the bare tiny route's
 * requests per second and p99 under 5 ms at 50 connections, without errors.
 *
 * BENCH_SECONDS sets the measured seconds per case (default 10). Benchmarks report; they do not fail:
 * a missed target still exits 0. A server that cannot start exits 1.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { arch, availableParallelism, cpus, loadavg, platform, tmpdir, totalmem } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import barePayload from './cases/bare-payload.js';
import bareTiny from './cases/bare-tiny.js';
import localEarth from './cases/local-earth.js';
import localGet from './cases/local-get.js';
import localPost from './cases/local-post.js';
import {
  CONNECTIONS,
  installCleanup,
  measure,
  startServer,
  stopAll,
  type BenchCase,
  type Measurement,
  type Server,
  type Target,
} from './harness.js';

const CASES: readonly BenchCase[] = [bareTiny, barePayload, localGet, localPost, localEarth];
const TARGET_RATIO = 0.6;
const TARGET_P99_MS = 5;

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
  const res = await fetch(server.url + c.path, {
    method: c.method,
    ...(c.headers ? { headers: c.headers } : {}),
    ...(c.body !== undefined ? { body: c.body } : {}),
    signal: AbortSignal.timeout(5000),
  });
  const text = await res.text();
  if (res.status !== 200) throw new Error(`${c.name}: status ${res.status}: ${text.slice(0, 500)}`);
  return text;
}

async function startAll(payloadDir: string): Promise<Record<Target, Server>> {
  const service = await startServer('service', ['dist/src/server.js'], {
    cwd: ROOT,
    env: { HOST: '127.0.0.1', LOG_LEVEL: 'warn' },
    readyPath: '/',
  });
  for (const c of CASES) if (c.target === 'service') await probe(service, c);
  const document = await probe(service, localGet);
  const payloadFile = join(payloadDir, 'local.json');
  writeFileSync(payloadFile, document);

  const bare = (variant: string[], readyPath: string) =>
    startServer(`bare ${variant[0]}`, ['--import', 'tsx', 'bench/bare-server.ts', '{port}', ...variant], { cwd: ROOT, readyPath });
  const tiny = await bare(['tiny'], bareTiny.path);
  const payload = await bare(['payload', payloadFile], barePayload.path);
  if ((await probe(payload, barePayload)) !== document) throw new Error('the same-payload route does not send the service\'s bytes');
  return { bareTiny: tiny, barePayload: payload, service };
}

interface Row {
  c: BenchCase;
  m: Measurement;
}

function table(rows: Row[], header: string[]): string {
  const tiny = rows.find((r) => r.c.target === 'bareTiny')?.m.requestsPerSecond ?? Number.NaN;
  const same = rows.find((r) => r.c.target === 'barePayload')?.m.requestsPerSecond ?? Number.NaN;
  const ms = (x: number) => (Number.isFinite(x) ? x.toFixed(2) : '—');
  const body = rows.map(({ c, m }) => {
    const vsTiny = m.requestsPerSecond / tiny;
    const met = vsTiny >= TARGET_RATIO && m.p99 < TARGET_P99_MS && m.errors === 0 && m.non2xx === 0;
    return [
      c.name,
      Math.round(m.requestsPerSecond).toLocaleString('en-US'),
      ms(m.p50),
      ms(m.p99),
      `${m.errors} / ${m.non2xx}`,
      vsTiny.toFixed(2),
      (m.requestsPerSecond / same).toFixed(2),
      c.target === 'service' ? (met ? 'yes' : 'no') : '—',
    ];
  });
  const head = ['case', 'req/s', 'p50 ms', 'p99 ms', 'errors / non-2xx', 'vs bare tiny', 'vs same payload', 'target met'];
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) =>
    cells.map((cell, i) => (i === 0 ? cell.padEnd(widths[i] ?? 0) : cell.padStart(widths[i] ?? 0))).join('  ');
  const rule = '-'.repeat(widths.reduce((a, w) => a + w + 2, -2));
  return [...header, rule, line(head), rule, ...body.map(line), rule].join('\n');
}

async function main(): Promise<void> {
  const seconds = benchSeconds(process.env.BENCH_SECONDS);
  const warmupSeconds = Math.min(3, Math.max(1, Math.round(seconds / 5)));
  if (!existsSync(join(ROOT, 'dist/src/server.js'))) throw new Error('dist/src/server.js is missing: run `npm run build` first');
  installCleanup();
  // Other work on the machine skews every row; the load average at the start is printed with the table.
  const loadAtStart = loadavg()[0] ?? Number.NaN;

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

  const gib = (totalmem() / 2 ** 30).toFixed(1);
  const header = [
    `spacetide bench — Node ${process.version} · ${cpus()[0]?.model.trim() ?? 'unknown CPU'} · ${availableParallelism()} cores · ${gib} GiB RAM · ${platform()} ${arch()}`,
    `autocannon ${autocannonVersion()} · ${CONNECTIONS} connections · ${seconds} s per case after ${warmupSeconds} s warm-up · each server and the client in its own process, on 127.0.0.1 · load average at start ${loadAtStart.toFixed(2)}`,
    `target for /v1/local: ≥ ${TARGET_RATIO * 100}% of the bare tiny route's req/s (headline) and p99 < ${TARGET_P99_MS} ms, no errors; "vs same payload" is context`,
  ];
  process.stdout.write(`${table(rows, header)}\n`);
}

main().catch((err: unknown) => {
  process.stderr.write(`bench failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
  process.exitCode = 1;
});
