/**
 * Child processes and load for the benchmarks: starting a server or a helper program (a Python rival)
 * as a child process, always stopped again, also on errors and signals; one autocannon measurement
 * of an HTTP case against a server. Timing in this process and the printed tables are ./timing.ts.
 *
 * Servers and the load generator run in different processes, so on a small machine they take
 * different cores. Traffic goes to 127.0.0.1 only.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import autocannon from 'autocannon';
import { median } from './timing.js';

export const HOST = '127.0.0.1';
export const CONNECTIONS = 50;

/**
 * Which server a case runs against: a bare fastify route, the service as the README starts it
 * (default in-memory result cache), or the service with the cache off (every request computed).
 */
export type Target = 'bareTiny' | 'barePayload' | 'barePayloadPost' | 'service' | 'serviceComputed';

/** One benchmark case: a request repeated by every connection. */
export interface BenchCase {
  name: string;
  target: Target;
  method: 'GET' | 'POST';
  /** Path with query string. */
  path: string;
  body?: string;
  headers?: Record<string, string>;
  /**
   * Bare routes only: the service case whose request this route takes and whose response bytes it
   * sends back, so that case's "vs same payload" is read against this one.
   */
  sameBytesAs?: BenchCase;
  /**
   * A service case's own target, replacing the default /v1/local one: req/s at least `atLeast` times
   * that of `relativeTo` measured in the same run, without errors.
   */
  goal?: { relativeTo: BenchCase; atLeast: number; statement: string };
}

/** One autocannon run of a case. */
export interface Run {
  requestsPerSecond: number;
  /** Per-response times of 2xx responses, ms (autocannon's own histogram has whole ms only). */
  times: Float64Array;
  /** Connection errors and timeouts. */
  errors: number;
  non2xx: number;
  /**
   * CPU time (user + system) the server process spent per request during the measured seconds, µs;
   * NaN where /proc is not available.
   */
  serverCpuMicros: number;
}

/** A case over several rounds: the rounds' throughputs, and latencies pooled over every round. */
export interface Measurement {
  /** Median over the rounds. */
  requestsPerSecond: number;
  /** Each round's requests per second, in round order (ratios are taken round by round). */
  perRound: number[];
  /** Latency percentiles of the 2xx responses of all rounds together, ms. */
  p50: number;
  p99: number;
  /** Connection errors and timeouts, all rounds. */
  errors: number;
  non2xx: number;
  /** Median over the rounds of the server's CPU time per request, µs (NaN without /proc). */
  serverCpuMicros: number;
}

export interface Server {
  name: string;
  url: string;
  /** Process id of the child (for /proc reads such as peak RSS); undefined if it failed to spawn. */
  pid: number | undefined;
  stop: () => Promise<void>;
}

const children = new Set<ChildProcess>();
const running = new Set<Server>();
const TAIL_CHARS = 4000;
const READY_ATTEMPTS = 150;
const READY_INTERVAL_MS = 100;
const STOP_GRACE_MS = 5000;

const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/** Kills every child still running; installed once for exit, signals and crashes. */
export function installCleanup(): void {
  const killAll = () => {
    for (const child of children) child.kill('SIGKILL');
    children.clear();
  };
  process.on('exit', killAll);
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.on(signal, () => {
      killAll();
      process.exit(130);
    });
  }
}

/** A port the OS reports free on 127.0.0.1 (closed again before the child binds it). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, HOST, () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => (port > 0 ? resolve(port) : reject(new Error('no free port'))));
    });
  });
}

interface Tracked {
  child: ChildProcess;
  /** Resolves with the exit code (null when killed by a signal) once the child has exited. */
  exit: Promise<number | null>;
  /** Resolves once the child's stdout and stderr are closed too (all of its output has been read). */
  closed: Promise<void>;
  exited: () => boolean;
  stdout: () => string;
  /** The last TAIL_CHARS of stdout and stderr, interleaved, for error messages. */
  tail: () => string;
}

/** Spawns a child that installCleanup() kills if this process ends first. */
function spawnTracked(command: string, args: string[], options: { cwd: string; env?: Record<string, string> }): Tracked {
  const child = spawn(command, args, {
    cwd: options.cwd,
    env: { ...process.env, ...options.env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(child);
  let out = '';
  let tail = '';
  let done = false;
  const keep = (chunk: Buffer) => {
    tail = (tail + chunk.toString('utf8')).slice(-TAIL_CHARS);
  };
  child.stdout?.on('data', (chunk: Buffer) => {
    out += chunk.toString('utf8');
    keep(chunk);
  });
  child.stderr?.on('data', keep);
  const exit = new Promise<number | null>((resolve) => {
    child.once('error', (err) => {
      keep(Buffer.from(`${err.message}\n`));
      done = true;
      children.delete(child);
      resolve(null);
    });
    child.once('exit', (code) => {
      done = true;
      children.delete(child);
      resolve(code);
    });
  });
  const closed = new Promise<void>((resolve) => {
    child.once('close', () => resolve());
    child.once('error', () => resolve());
  });
  return { child, exit, closed, exited: () => done, stdout: () => out, tail: () => tail };
}

/**
 * Runs `command args` to completion (killed after `timeoutMs`) and returns its stdout; throws with the
 * end of its output when it fails.
 */
export async function runProgram(command: string, args: string[], options: { cwd: string; timeoutMs: number }): Promise<string> {
  const p = spawnTracked(command, args, { cwd: options.cwd });
  let timedOut = false;
  const timer = setTimeout(() => {
    timedOut = true;
    p.child.kill('SIGKILL');
  }, options.timeoutMs);
  const code = await p.exit;
  await p.closed;
  clearTimeout(timer);
  if (code !== 0) {
    const how = timedOut ? `was killed after ${options.timeoutMs} ms` : `exited with ${code ?? 'a signal or a spawn error'}`;
    throw new Error(`${command} ${how}; its output ended with:\n${p.tail()}`);
  }
  return p.stdout();
}

/** A request as a case makes it; also what tells that a server is ready. */
export type Request = Pick<BenchCase, 'method' | 'path' | 'body' | 'headers'>;

/** Sends `req` once to `url` and returns the status and the body text. */
export async function send(url: string, req: Request, timeoutMs = 5000): Promise<{ status: number; text: string }> {
  const res = await fetch(url + req.path, {
    method: req.method,
    ...(req.headers ? { headers: req.headers } : {}),
    ...(req.body !== undefined ? { body: req.body } : {}),
    signal: AbortSignal.timeout(timeoutMs),
  });
  return { status: res.status, text: await res.text() };
}

/**
 * Starts `node <args>` as a child process and resolves once `ready` answers 200. `args` may use the
 * placeholder "{port}" for the port chosen here; `env` is added to the current environment.
 */
export async function startServer(
  name: string,
  args: string[],
  options: { env?: Record<string, string>; ready: Request; cwd: string },
): Promise<Server> {
  const port = await freePort();
  const p = spawnTracked(process.execPath, args.map((a) => a.replace('{port}', String(port))), {
    cwd: options.cwd,
    env: { ...options.env, PORT: String(port) },
  });

  const url = `http://${HOST}:${port}`;
  const stop = async () => {
    if (p.exited()) return;
    p.child.kill('SIGTERM');
    const timer = setTimeout(() => p.child.kill('SIGKILL'), STOP_GRACE_MS);
    await p.exit;
    clearTimeout(timer);
  };

  const server: Server = { name, url, pid: p.child.pid, stop };
  running.add(server);
  void p.exit.then(() => running.delete(server));
  for (let attempt = 0; attempt < READY_ATTEMPTS && !p.exited(); attempt++) {
    try {
      if ((await send(url, options.ready, 1000)).status === 200) return server;
    } catch {
      // not listening yet
    }
    await sleep(READY_INTERVAL_MS);
  }
  await stop();
  throw new Error(`${name} did not become ready on ${url} (${options.ready.method} ${options.ready.path}); its output ended with:\n${p.tail()}`);
}

/** Stops every server started here that is still running (their pipes would keep this process alive). */
export async function stopAll(): Promise<void> {
  await Promise.all([...running].map((s) => s.stop()));
}

function percentile(sorted: Float64Array, q: number): number {
  if (sorted.length === 0) return Number.NaN;
  const index = Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1);
  return sorted[Math.max(0, index)] ?? Number.NaN;
}

/** Clock ticks per second of the times in /proc/<pid>/stat (getconf CLK_TCK; 100 on Linux if unknown). */
let clockTicks: number | undefined;
function ticksPerSecond(): number {
  if (clockTicks === undefined) {
    try {
      clockTicks = Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;
    } catch {
      clockTicks = 100;
    }
  }
  return clockTicks;
}

/**
 * CPU time (user + system) a process has used so far, µs, from /proc/<pid>/stat (fields 14 and 15,
 * utime and stime, in clock ticks; counted after the parenthesised command name, which may hold
 * spaces); NaN where /proc is not available.
 */
export function processCpuMicros(pid: number | undefined): number {
  if (pid === undefined) return Number.NaN;
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return ((Number(fields[11]) + Number(fields[12])) * 1e6) / ticksPerSecond();
  } catch {
    return Number.NaN;
  }
}

/**
 * Runs autocannon against `server`: a warm-up run of `warmupSeconds`, then the measured run of
 * `seconds`, with the server's CPU time read just before and after it.
 */
export async function measure(server: Server, c: BenchCase, seconds: number, warmupSeconds: number): Promise<Run> {
  const options = {
    url: server.url + c.path,
    connections: CONNECTIONS,
    timeout: 10,
    method: c.method,
    ...(c.body !== undefined ? { body: c.body } : {}),
    ...(c.headers ? { headers: c.headers } : {}),
  };
  await autocannon({ ...options, duration: warmupSeconds });
  // Capacity is bounded; past it the sample is the first `capacity` responses.
  const capacity = Math.min(20_000_000, Math.max(100_000, 200_000 * seconds));
  let times = new Float64Array(Math.min(capacity, 1_000_000));
  let count = 0;
  const cpuBefore = processCpuMicros(server.pid);
  const instance = autocannon({ ...options, duration: seconds });
  instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
    if (statusCode < 200 || statusCode > 299 || count >= capacity) return;
    if (count === times.length) {
      const grown = new Float64Array(Math.min(capacity, times.length * 2));
      grown.set(times);
      times = grown;
    }
    times[count++] = responseTime;
  });
  const result = await instance;
  const cpu = processCpuMicros(server.pid) - cpuBefore;
  return {
    requestsPerSecond: result.requests.total / result.duration,
    times: times.slice(0, count),
    errors: result.errors,
    non2xx: result.non2xx,
    serverCpuMicros: result.requests.total > 0 ? cpu / result.requests.total : Number.NaN,
  };
}

/** One case's rounds summarised: median throughput, the rounds' throughputs, pooled latency percentiles. */
export function combineRuns(runs: readonly Run[]): Measurement {
  const pooled = new Float64Array(runs.reduce((n, r) => n + r.times.length, 0));
  let offset = 0;
  for (const r of runs) {
    pooled.set(r.times, offset);
    offset += r.times.length;
  }
  pooled.sort();
  const perRound = runs.map((r) => r.requestsPerSecond);
  return {
    requestsPerSecond: median(perRound),
    perRound,
    p50: percentile(pooled, 0.5),
    p99: percentile(pooled, 0.99),
    errors: runs.reduce((n, r) => n + r.errors, 0),
    non2xx: runs.reduce((n, r) => n + r.non2xx, 0),
    serverCpuMicros: median(runs.map((r) => r.serverCpuMicros)),
  };
}
