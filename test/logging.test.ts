/**
 * Structured logs: pino JSON lines, a request id on every line written while serving a request.
 */
import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { buildApp } from '../src/app.js';

describe('logging', () => {
  it('every request log line carries the request id, which the response echoes', async () => {
    const lines: Record<string, unknown>[] = [];
    const stream = new Writable({
      write(chunk, _enc, done) {
        for (const l of String(chunk).split('\n')) if (l.trim()) lines.push(JSON.parse(l) as Record<string, unknown>);
        done();
      },
    });
    const app = await buildApp({ logger: { level: 'info', stream } });
    const ok = await app.inject({ method: 'GET', url: '/v1/local?body=earth&altitude=0', headers: { 'x-request-id': 'lab-42' } });
    const bad = await app.inject({ method: 'GET', url: '/v1/local?body=earth&altitude=-5%20km' });
    await app.close();
    expect(ok.headers['x-request-id']).toBe('lab-42');
    expect(bad.statusCode).toBe(422);
    const requestLines = lines.filter((l) => l.req !== undefined || l.res !== undefined || l.msg === 'request refused');
    expect(requestLines.length).toBeGreaterThanOrEqual(4);
    for (const l of requestLines) expect(typeof l.reqId).toBe('string');
    expect(requestLines.some((l) => l.reqId === 'lab-42')).toBe(true);
    expect(requestLines.some((l) => l.reqId === bad.headers['x-request-id'])).toBe(true);
  });

  it('an unsafe incoming request id is replaced', async () => {
    const app = await buildApp({ logger: false });
    const res = await app.inject({ method: 'GET', url: '/', headers: { 'x-request-id': 'a b\u0000<script>' } });
    await app.close();
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });
});
