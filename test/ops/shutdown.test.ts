/**
 * Graceful shutdown of the real process under load: slow sweeps (1e5 points each) in flight and a
 * stream of fast requests on kept-alive connections when SIGTERM arrives. Every request the service
 * had received before the signal completes with a 200 and its whole body; a request that reaches it
 * afterwards on an open connection gets a 503 problem with Retry-After; nothing the service received
 * is cut off; new connections are refused while the in-flight sweeps finish; the process exits 0.
 *
 * Which requests the service received, and when, is read from its own log lines (each carries the
 * request id the client sent in x-request-id, and a time) — not guessed from the client's clock.
 * Shedding on event-loop delay is off here: the sweeps hold the loop on purpose, and what is tested
 * is shutdown, not shedding (protection.test.ts tests that).
 */
import { connect } from 'node:net';
import { Agent, request } from 'undici';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startService, type ServiceProcess } from './service-process.js';

const SLOW = 3;
/** Some 24 MB of CSV each: more than the socket buffers hold, so a slow reader holds it in flight. */
const SLOW_POINTS = 400_000;
const FAST_LOOPS = 4;
/** Pause after each chunk a slow client reads, ms (a 24 MB response then takes seconds). */
const READ_PAUSE_MS = 10;

let service: ServiceProcess;
beforeAll(async () => {
  // debug: the access log's arrival line ("incoming request") tells which requests reached the service, and when.
  service = await startService({ MAX_EVENT_LOOP_DELAY_MS: '0', SHUTDOWN_GRACE_MS: '120000', RETRY_AFTER_S: '2', LOG_LEVEL: 'debug' });
}, 120_000);
afterAll(() => service?.kill());

interface Outcome {
  id: string;
  status?: number;
  contentType?: string;
  retryAfter?: string;
  body?: string;
  error?: string;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Tries a fresh TCP connection: 'accepted' or the error code. */
function tryConnect(port: number): Promise<string> {
  return new Promise((resolve) => {
    const socket = connect({ port, host: '127.0.0.1' });
    socket.once('connect', () => {
      socket.destroy();
      resolve('accepted');
    });
    socket.once('error', (err: NodeJS.ErrnoException) => resolve(err.code ?? err.message));
  });
}

describe('SIGTERM under load', () => {
  it('finishes every request in flight, refuses new connections, exits 0', { timeout: 180_000 }, async () => {
    const agent = new Agent({ keepAliveTimeout: 30_000, connections: FAST_LOOPS + SLOW });
    const outcomes: Outcome[] = [];
    const headersReceived = new Set<string>();
    const send = async (id: string, method: 'GET' | 'POST', path: string, body?: string, slowReader = false): Promise<Outcome> => {
      const o: Outcome = { id };
      outcomes.push(o);
      try {
        const res = await request(`${service.url}${path}`, {
          method,
          dispatcher: agent,
          headers: { 'x-request-id': id, ...(body ? { 'content-type': 'application/json' } : {}), ...(slowReader ? { accept: 'text/csv' } : {}) },
          ...(body ? { body } : {}),
        });
        o.status = res.statusCode;
        o.contentType = String(res.headers['content-type']);
        o.retryAfter = res.headers['retry-after'] as string | undefined;
        headersReceived.add(id);
        if (slowReader) {
          // A client on a slow link: the service must keep sending (the response stays in flight).
          const chunks: Buffer[] = [];
          for await (const chunk of res.body) {
            chunks.push(chunk as Buffer);
            await sleep(READ_PAUSE_MS);
          }
          o.body = Buffer.concat(chunks).toString('utf8');
        } else {
          o.body = await res.body.text();
        }
      } catch (err) {
        o.error = (err as NodeJS.ErrnoException).code ?? String(err);
      }
      return o;
    };

    // Slow requests: sweeps of 4e5 points as CSV, each a different grid (no cache, no coalescing),
    // read by a slow client, so they are still being sent when the signal comes.
    const slow = Array.from({ length: SLOW }, (_, i) =>
      send(
        `slow-${i}`,
        'POST',
        '/v1/sweep',
        JSON.stringify({ body: { mass: '10 Msun', spin: 0.7 }, point: { r: '10 rg' }, quantities: ['flowSpeed', 'staticClockRate'], axes: [{ variable: 'r', from: `${3 + i} rg`, to: '1000 rg', count: SLOW_POINTS }] }),
        true,
      ),
    );
    // Fast requests on kept-alive connections until the process has exited.
    let running = true;
    let n = 0;
    const fast = Array.from({ length: FAST_LOOPS }, async () => {
      while (running) {
        const o = await send(`fast-${n++}`, 'GET', `/v1/local?body=earth&altitude=${n}%20km`);
        if (o.error) await sleep(20);
      }
    });

    // The signal goes once every slow response has begun (each is then in flight until read).
    for (let waited = 0; ![...Array(SLOW).keys()].every((i) => headersReceived.has(`slow-${i}`)); waited += 20) {
      if (waited > 60_000) throw new Error('the slow responses never began');
      await sleep(20);
    }
    service.child.kill('SIGTERM');

    // New connections: refused once the service has stopped listening, while the sweeps still run.
    let refusedWhileRunning = false;
    const exitedAt = service.exited.then((e) => ({ ...e, at: Date.now() }));
    let alive = true;
    void exitedAt.then(() => {
      alive = false;
    });
    while (alive) {
      const r = await tryConnect(service.port);
      if (r === 'ECONNREFUSED' && alive) {
        refusedWhileRunning = true;
        break;
      }
      await sleep(10);
    }
    const exit = await exitedAt;
    running = false;
    await Promise.all([...slow, ...fast]);
    await agent.close();

    expect(exit.code, JSON.stringify(service.lines.slice(-5))).toBe(0);
    expect(refusedWhileRunning).toBe(true);
    expect(await tryConnect(service.port)).toBe('ECONNREFUSED');

    // The slow ones: each a complete 200 with all its points (a header row, then one row per point).
    for (const o of await Promise.all(slow)) {
      expect(o.error, o.id).toBeUndefined();
      expect(o.status, o.id).toBe(200);
      expect(o.contentType, o.id).toMatch(/^text\/csv/);
      const rows = (o.body as string).split('\r\n');
      expect(rows.pop(), `${o.id} ends with a whole row`).toBe('');
      expect(rows).toHaveLength(SLOW_POINTS + 1);
      expect(rows[SLOW_POINTS]?.split(',')).toHaveLength(rows[0]?.split(',').length ?? -1);
    }

    // Every request the service received: answered in full. Before the signal: 200. After it (on a
    // connection that was open): 200 if it was already being served, else a 503 problem.
    const lines = service.lines;
    const shutdownAt = Number(lines.find((l) => l.msg === 'shutting down: no new connections, finishing in-flight requests')?.time);
    expect(Number.isFinite(shutdownAt)).toBe(true);
    // (The start-up probes of /healthz carry ids of the service's own; only this test's count.)
    const receivedAt = new Map(
      lines.filter((l) => l.msg === 'incoming request' && /^(slow|fast)-\d+$/.test(String(l.reqId))).map((l) => [String(l.reqId), Number(l.time)]),
    );
    const byId = new Map(outcomes.map((o) => [o.id, o]));
    let before = 0;
    for (const [id, at] of receivedAt) {
      const o = byId.get(id);
      expect(o, id).toBeDefined();
      expect(o?.error, `${id} was received by the service but cut off`).toBeUndefined();
      if (at < shutdownAt) {
        before++;
        expect(o?.status, id).toBe(200);
      } else if (o?.status !== 200) {
        expect(o?.status, id).toBe(503);
        expect(o?.contentType, id).toMatch(/^application\/problem\+json/);
        expect(o?.retryAfter, id).toBe('2');
        expect(JSON.parse(o?.body as string)).toMatchObject({ type: '/problems/service-unavailable' });
      }
    }
    expect(before).toBeGreaterThan(SLOW);
    // The sweeps were truly in flight: the service was still sending when the signal came (the last
    // to begin, at least: the earlier ones may have gone into the socket buffers by then).
    const completedAt = new Map(lines.filter((l) => l.msg === 'request completed').map((l) => [String(l.reqId), Number(l.time)]));
    const finishedAfter = [...Array(SLOW).keys()].filter((i) => (completedAt.get(`slow-${i}`) ?? 0) > shutdownAt);
    expect(finishedAfter.length, JSON.stringify({ shutdownAt, completed: [...Array(SLOW).keys()].map((i) => completedAt.get(`slow-${i}`)) })).toBeGreaterThan(0);
    // Requests the client sent that never reached the service (refused or on a socket the service had
    // closed as idle) failed at the connection, never with a 5xx other than the 503 above.
    for (const o of outcomes) {
      if (receivedAt.has(o.id)) continue;
      expect(o.status, `${o.id} has a response but the service never logged receiving it`).toBeUndefined();
      expect(o.error, o.id).toBeDefined();
    }
    expect(lines.some((l) => l.msg === 'closed: every in-flight request answered, cache closed')).toBe(true);
  });
});
