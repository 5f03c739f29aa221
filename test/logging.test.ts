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
    expect(requestLines.length).toBeGreaterThanOrEqual(2);
    for (const l of requestLines) expect(typeof l.reqId).toBe('string');
    expect(requestLines.some((l) => l.reqId === 'lab-42')).toBe(true);
    expect(requestLines.some((l) => l.reqId === bad.headers['x-request-id'])).toBe(true);
  });

  it('at info, one access-log line per answered request: method, URL, status, response time, request id', async () => {
    const capture = (level: string) => {
      const lines: Record<string, unknown>[] = [];
      const stream = new Writable({
        write(chunk, _enc, done) {
          for (const l of String(chunk).split('\n')) if (l.trim()) lines.push(JSON.parse(l) as Record<string, unknown>);
          done();
        },
      });
      return { lines, logger: { level, stream } };
    };
    const info = capture('info');
    let app = await buildApp({ logger: info.logger });
    await app.inject({ method: 'GET', url: '/v1/local?body=earth&altitude=0', headers: { 'x-request-id': 'lab-7' } });
    await app.inject({ method: 'GET', url: '/v1/local?body=earth&altitude=0', headers: { 'x-request-id': 'lab-8' } });
    await app.close();
    const mine = info.lines.filter((l) => l.reqId === 'lab-7');
    expect(mine).toHaveLength(1);
    expect(mine[0]).toMatchObject({ level: 30, msg: 'request completed', req: { method: 'GET', url: '/v1/local?body=earth&altitude=0' }, res: { statusCode: 200 } });
    expect(mine[0]!.responseTime).toBeGreaterThan(0);
    expect(info.lines.filter((l) => l.reqId === 'lab-8')).toHaveLength(1);
    // At debug the arrival is logged as well, before the answer.
    const debug = capture('debug');
    app = await buildApp({ logger: debug.logger });
    await app.inject({ method: 'GET', url: '/v1/local?body=earth&altitude=0', headers: { 'x-request-id': 'lab-9' } });
    await app.close();
    expect(debug.lines.filter((l) => l.reqId === 'lab-9').map((l) => l.msg)).toEqual(['incoming request', 'request completed']);
  });

  it('an unsafe incoming request id is replaced', async () => {
    const app = await buildApp({ logger: false });
    const res = await app.inject({ method: 'GET', url: '/', headers: { 'x-request-id': 'a b\u0000<script>' } });
    await app.close();
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });
});
