/**
 * Soak: a listening service on 127.0.0.1 takes, for a fixed time from several connections at once, a
 * mix of valid requests and hostile ones — random JSON to every compute route, malformed and
 * truncated JSON, wrong content types, bodies over the limit, deep nesting, absurd numbers and
 * quantity strings, sweeps over the point limit, junk query strings, long URLs, unknown routes and
 * methods, junk conditional headers. Not one answer may be a 5xx or a dropped connection; every
 * refusal is problem details with its status; the valid ones are 200 (or 304); afterwards the
 * service is still ready and its metrics count no 5xx.
 */
import type { AddressInfo } from 'node:net';
import fc from 'fast-check';
import type { FastifyInstance } from 'fastify';
import { Pool } from 'undici';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COMPUTE_ROUTES } from '../../src/api/registry.js';
import { buildApp } from '../../src/app.js';

const SECONDS = 10;
const CONCURRENCY = 12;

let app: FastifyInstance;
let pool: Pool;
beforeAll(async () => {
  // Defaults (shedding on memory, not on event-loop delay: see AppOptions.config).
  app = await buildApp({ logger: false });
  await app.listen({ port: 0, host: '127.0.0.1' });
  pool = new Pool(`http://127.0.0.1:${(app.server.address() as AddressInfo).port}`, { connections: CONCURRENCY });
});
afterAll(async () => {
  await pool?.close();
  await app?.close();
});

interface Req {
  kind: 'valid' | 'hostile';
  method: string;
  path: string;
  headers?: Record<string, string>;
  body?: string;
}

const POSTS = COMPUTE_ROUTES.map((r) => r.path);
const json = { 'content-type': 'application/json' };
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(Math.random() * xs.length)] as T;
const r = (lo: number, hi: number) => lo + Math.random() * (hi - lo);

const valid = (): Req =>
  pick<() => Req>([
    () => ({ kind: 'valid', method: 'GET', path: `/v1/local?mass=${encodeURIComponent(`${r(1, 1e9).toPrecision(6)} Msun`)}&spin=${r(0, 0.99).toFixed(3)}&r=${encodeURIComponent(`${r(2, 1e4).toPrecision(6)} rg`)}` }),
    () => ({ kind: 'valid', method: 'GET', path: `/v1/spacetime?body=${pick(['sun', 'earth'])}` }),
    () => ({ kind: 'valid', method: 'GET', path: `/v1/orbits/circular?body=earth&altitude=${Math.round(r(200, 40_000))}%20km` }),
    () => ({
      kind: 'valid',
      method: 'POST',
      path: '/v1/clocks',
      headers: json,
      body: JSON.stringify({ body: 'earth', a: { kind: 'static', point: { altitude: 0 } }, b: { kind: 'circular', point: { altitude: `${Math.round(r(300, 30_000))} km` } } }),
    }),
    () => ({
      kind: 'valid',
      method: 'POST',
      path: '/v1/sweep',
      headers: { ...json, ...(Math.random() < 0.3 ? { accept: 'text/csv' } : {}) },
      body: JSON.stringify({ body: { mass: '10 Msun', spin: r(0, 0.99) }, point: { r: '10 rg' }, quantities: ['flowSpeed', 'redshiftToInfinity'], axes: [{ variable: 'r', from: '2 rg', to: '100 rg', count: 300 }] }),
    }),
    () => ({ kind: 'valid', method: 'GET', path: '/v1/quantities' }),
    () => ({ kind: 'valid', method: 'GET', path: '/openapi.json' }),
  ])();

/** Any string as query text: its UTF-8 bytes, those outside a plain set percent-encoded ('%' kept raw). */
const rawQuery = (text: string) =>
  [...Buffer.from(text, 'utf8')].map((b) => (/[A-Za-z0-9=&%._~-]/.test(String.fromCharCode(b)) ? String.fromCharCode(b) : `%${b.toString(16).padStart(2, '0')}`)).join('');
const deep = (depth: number) => `${'['.repeat(depth)}${']'.repeat(depth)}`;
const deepObject = (depth: number) => `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`;

const hostile = (): Req =>
  pick<() => Req>([
    // Random JSON to a random compute route.
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: json, body: JSON.stringify(fc.sample(fc.jsonValue({ maxDepth: 4 }), 1)[0]) ?? 'null' }),
    // Plausible shapes with hostile values.
    () => ({
      kind: 'hostile',
      method: 'POST',
      path: pick(POSTS),
      headers: json,
      body: JSON.stringify({
        body: pick<unknown>([{ mass: pick(['1e999 kg', '-1 Msun', 'NaN', '1e308 Msun', '0', '__proto__', '10 parsecs', 'Infinity', '1e-400 kg']) }, 'moon', { mass: '1 Msun', spin: 5 }, { mass: '1 Msun', charge: -2 }, null]),
        point: pick<unknown>([{ r: '0 rg' }, { r: '-1 rg' }, { altitude: '-7000 km' }, { r: '1e70 rg' }, { theta: '400 deg', r: '5 rg' }, {}, []]),
        a: { kind: pick(['static', 'teleporting', 'zamo']), point: { r: '1 rg' } },
        b: { kind: 'circular', direction: 'sideways' },
      }),
    }),
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: json, body: '{"body": {"mass": "10 Msun"' }),
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: json, body: '' }),
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: json, body: '{"__proto__": {"polluted": 1}, "constructor": {"prototype": {"x": 1}}, "body": "sun", "point": {"r": "3 rg"}}' }),
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: { 'content-type': 'text/plain' }, body: '{"body":"sun"}' }),
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: { 'content-type': 'multipart/form-data; boundary=x' }, body: '--x--' }),
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: json, body: `{"pad":"${'x'.repeat(70_000)}"}` }),
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: json, body: deep(5_000) }),
    () => ({ kind: 'hostile', method: 'POST', path: pick(POSTS), headers: json, body: deepObject(2_000) }),
    () => ({
      kind: 'hostile',
      method: 'POST',
      path: '/v1/sweep',
      headers: json,
      body: JSON.stringify({ body: 'sun', point: { r: '10 rg' }, quantities: ['flowSpeed'], axes: [{ variable: 'r', from: '2 rg', to: '100 rg', count: pick([1e9, 2e6, -5, 0, 1.5]) }] }),
    }),
    () => ({
      kind: 'hostile',
      method: 'POST',
      path: '/v1/sweep',
      headers: json,
      body: JSON.stringify({
        body: 'sun',
        point: { r: '10 rg' },
        quantities: ['flowSpeed', 'noSuchQuantity'],
        axes: [
          { variable: 'r', from: '2 rg', to: '100 rg', count: 5000 },
          { variable: 'spin', from: 0, to: 1, count: 5000 },
        ],
      }),
    }),
    () => ({ kind: 'hostile', method: 'GET', path: `/v1/local?${rawQuery(fc.sample(fc.string({ unit: 'binary', maxLength: 60 }), 1)[0] ?? '')}` }),
    () => ({ kind: 'hostile', method: 'GET', path: `/v1/local?mass=${pick(['%ZZ', '%C0%80', '1e999%20kg', '-0', 'NaN', '%00'])}&r=${pick(['', '2%20rg', 'r'])}` }),
    () => ({ kind: 'hostile', method: 'GET', path: `/v1/local?body=earth&altitude=1&${'x=1&'.repeat(1_500)}` }),
    () => ({ kind: 'hostile', method: 'GET', path: `/v1/spacetime?mass=${'9'.repeat(8_000)}` }),
    () => ({ kind: 'hostile', method: 'GET', path: `/no/such/${Math.random().toString(36).slice(2)}` }),
    () => ({ kind: 'hostile', method: pick(['PUT', 'DELETE', 'PATCH']), path: pick(POSTS) }),
    () => ({ kind: 'hostile', method: 'GET', path: '/problems/%2e%2e%2fetc%2fpasswd' }),
    () => ({ kind: 'hostile', method: 'GET', path: '/v1/local?body=earth&altitude=1%20km', headers: { 'if-none-match': pick(['*', '"', 'W/"x", , ,', '"a"'.repeat(500)]), 'x-request-id': 'a\tb<script>' } }),
  ])();

const ALLOWED: Record<Req['kind'], Set<number>> = {
  valid: new Set([200, 304]),
  hostile: new Set([200, 304, 400, 404, 413, 415, 422]),
};

describe(`soak: valid and hostile requests for ${SECONDS} s`, () => {
  it('never answers 5xx nor drops a connection; refusals are problem details', { timeout: (SECONDS + 60) * 1000 }, async () => {
    const counts = new Map<string, number>();
    const failures: string[] = [];
    const end = Date.now() + SECONDS * 1000;
    const worker = async () => {
      while (Date.now() < end && failures.length < 20) {
        const req = Math.random() < 0.5 ? valid() : hostile();
        const where = `${req.method} ${req.path.slice(0, 120)} ${req.body?.slice(0, 120) ?? ''}`;
        try {
          const res = await pool.request({ method: req.method as 'GET', path: req.path, headers: req.headers ?? {}, body: req.body ?? null });
          const text = await res.body.text();
          const key = `${req.kind} ${res.statusCode}`;
          counts.set(key, (counts.get(key) ?? 0) + 1);
          if (!ALLOWED[req.kind].has(res.statusCode)) failures.push(`${res.statusCode} for ${where}: ${text.slice(0, 200)}`);
          else if (res.statusCode >= 400) {
            const ct = String(res.headers['content-type']);
            const problem = ct.startsWith('application/problem+json') ? (JSON.parse(text) as { status?: number; type?: string }) : undefined;
            if (problem?.status !== res.statusCode || !/^\/problems\/[a-z-]+$/.test(String(problem.type))) {
              failures.push(`${res.statusCode} not as problem details for ${where}: ${ct} ${text.slice(0, 200)}`);
            }
          }
        } catch (err) {
          failures.push(`connection error ${(err as NodeJS.ErrnoException).code ?? String(err)} for ${where}`);
        }
      }
    };
    await Promise.all(Array.from({ length: CONCURRENCY }, worker));
    const summary = JSON.stringify(Object.fromEntries([...counts].sort()));
    expect(failures, summary).toEqual([]);
    const total = [...counts.values()].reduce((a, b) => a + b, 0);
    expect(total, summary).toBeGreaterThan(200);
    expect(counts.get('valid 200') ?? 0, summary).toBeGreaterThan(50);

    const ready = await pool.request({ method: 'GET', path: '/readyz' });
    expect(ready.statusCode).toBe(200);
    await ready.body.dump();
    const metrics = await (await pool.request({ method: 'GET', path: '/metrics' })).body.text();
    expect(metrics).not.toMatch(/^spacetide_http_requests_total\{[^}]*status="5\d\d"\}/m);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});
