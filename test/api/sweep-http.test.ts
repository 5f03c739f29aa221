/**
 * POST /v1/sweep as the service wires it: listed in the OpenAPI document, cached with ETag and 304
 * for JSON, streamed CSV on request, and the configured point limit.
 */
import { describe, expect, it } from 'vitest';
import { buildApp } from '../../src/app.js';
import { defaultConfig } from '../../src/config.js';
import { useApp } from '../helpers.js';

const app = useApp();
const request = {
  body: { mass: '10 Msun' },
  point: { r: '10 rg' },
  quantities: ['flowSpeed', 'staticClockRate', 'hoverAcceleration'],
  axes: [
    { variable: 'r', from: '1 rg', to: '100 rg', count: 50, spacing: 'log' },
    { variable: 'spin', from: 0, to: 0.99, count: 12, spacing: 'linear' },
  ],
};

describe('POST /v1/sweep in the service', () => {
  it('answers JSON with an ETag; the repeat is byte-identical and If-None-Match gets 304', async () => {
    const cold = await app().inject({ method: 'POST', url: '/v1/sweep', payload: request });
    expect(cold.statusCode, cold.body.slice(0, 300)).toBe(200);
    const etag = cold.headers.etag as string;
    expect(etag).toMatch(/^"[0-9a-f]+"$/);
    // The same request with its keys in another order hits the same entry.
    const reordered = { axes: request.axes, quantities: request.quantities, point: request.point, body: request.body };
    const hitsBefore = app().resultCache.stats().hits;
    const warm = await app().inject({ method: 'POST', url: '/v1/sweep', payload: reordered });
    expect(warm.body).toBe(cold.body);
    expect(app().resultCache.stats().hits).toBe(hitsBefore + 1);
    const notModified = await app().inject({ method: 'POST', url: '/v1/sweep', payload: request, headers: { 'if-none-match': etag } });
    expect(notModified.statusCode).toBe(304);
    expect(notModified.body).toBe('');
  });

  it('keys the cache by the normalised request: equivalent spellings and defaults hit, other values miss', async () => {
    const post = (payload: unknown) => app().inject({ method: 'POST', url: '/v1/sweep', payload: payload as object });
    const hits = () => app().resultCache.stats().hits;
    const first = {
      body: { mass: '10 Msun' },
      point: { r: '35786 km' },
      quantities: ['staticClockRate', 'flowSpeed'],
      axes: [
        { variable: 'theta', from: '10 deg', to: '170 deg', count: 7 },
        { variable: 'spin', from: 0, to: 0.9, count: 4 },
      ],
    };
    const cold = await post(first);
    expect(cold.statusCode, cold.body.slice(0, 300)).toBe(200);
    const same = [
      // Other spellings of the same numbers, defaults written out, keys in another order.
      {
        quantities: ['staticClockRate', 'flowSpeed'],
        axes: [
          { count: 7, spacing: 'linear', to: '170 deg', from: '10 deg', variable: 'theta' },
          { variable: 'spin', from: '0', to: 0.9, count: 4, spacing: 'linear' },
        ],
        point: { theta: '90 deg', r: 35786000 },
        body: { spin: 0, mass: '1e1 Msun', charge: 0 },
      },
      { ...first, body: { mass: '10 Msun', spin: 0.5 }, point: { r: '35786000 m', latitude: 0 } },
    ];
    for (const payload of same) {
      const before = hits();
      const res = await post(payload);
      expect(res.body).toBe(cold.body);
      expect(res.headers.etag).toBe(cold.headers.etag);
      expect(hits()).toBe(before + 1);
    }
    const other = [
      { ...first, point: { r: '35787 km' } },
      { ...first, quantities: ['flowSpeed', 'staticClockRate'] },
      { ...first, body: { mass: '11 Msun' } },
      { ...first, axes: [first.axes[0]!, { ...first.axes[1]!, count: 5 }] },
      { ...first, axes: [first.axes[0]!, { ...first.axes[1]!, spacing: 'log', from: 0.1 }] },
    ];
    for (const payload of other) {
      const before = hits();
      const res = await post(payload);
      expect(res.statusCode).toBe(200);
      expect(res.headers.etag).not.toBe(cold.headers.etag);
      expect(hits()).toBe(before);
    }
  });

  it('streams CSV when asked, with units in the header', async () => {
    const res = await app().inject({ method: 'POST', url: '/v1/sweep', payload: request, headers: { accept: 'text/csv' } });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const [header, ...rows] = res.body.trim().split(/\r?\n/);
    expect(header).toContain('flowSpeed [m/s]');
    expect(rows).toHaveLength(50 * 12);
  });

  it('is in the OpenAPI document', async () => {
    const doc = (await app().inject({ method: 'GET', url: '/openapi.json' })).json<{ paths: Record<string, unknown> }>();
    expect(doc.paths['/v1/sweep']).toBeDefined();
  });

  it('refuses more points than SWEEP_MAX_POINTS with 413 naming the limit', async () => {
    const small = await buildApp({ logger: false, config: defaultConfig({ SWEEP_MAX_POINTS: 100 }) });
    const res = await small.inject({ method: 'POST', url: '/v1/sweep', payload: request });
    await small.close();
    expect(res.statusCode).toBe(413);
    expect(res.json<{ detail: string }>().detail).toMatch(/limit is 100 points/);
  });
});

describe('CSV sweeps are cached too', () => {
  it('the repeat is the same bytes from the cache, and If-None-Match gets 304', async () => {
    const csv = { accept: 'text/csv' };
    const cold = await app().inject({ method: 'POST', url: '/v1/sweep', payload: request, headers: csv });
    expect(cold.statusCode).toBe(200);
    const etag = cold.headers.etag as string;
    expect(etag).toMatch(/^"[0-9a-f]+"$/);
    const hitsBefore = app().resultCache.stats().hits;
    const warm = await app().inject({ method: 'POST', url: '/v1/sweep', payload: request, headers: csv });
    expect(warm.body).toBe(cold.body);
    expect(warm.headers['content-type']).toMatch(/^text\/csv/);
    expect(app().resultCache.stats().hits).toBe(hitsBefore + 1);
    const json = await app().inject({ method: 'POST', url: '/v1/sweep', payload: request });
    expect(json.headers.etag).not.toBe(etag);
    const notModified = await app().inject({ method: 'POST', url: '/v1/sweep', payload: request, headers: { ...csv, 'if-none-match': etag } });
    expect(notModified.statusCode).toBe(304);
  });
});
