/**
 * POST /v1/sweep over HTTP: content negotiation (JSON or CSV), the result cache (x-cache header), ETag
 * and 304.
 */
import { Readable } from 'node:stream';
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import type { CoalescingCache } from '../cache/coalesce.js';
import { CACHE_STATUS_HEADER, etagFor, ifNoneMatchMatches, JSON_CONTENT_TYPE, POST_CACHE_CONTROL } from '../cache/http.js';
import { cacheKey } from '../cache/key.js';
import type { CacheEntry } from '../cache/types.js';
import { VERSION } from '../version.js';
import { parseOr400 } from './route.js';
import { SWEEP_DEFAULT_MAX_POINTS, sweepRequest } from './sweep.js';
import { computeSweepColumns } from './sweep-columns.js';
import { sweepCacheInput } from './sweep-key.js';
import { prepareSweep } from './sweep-prepare.js';
import { sweepCsvChunks, sweepJson } from './sweep-output.js';

// ---------------------------------------------------------------------------------------------------
// Route

/** q-value of the most specific Accept range matching `type` ("text/csv"); 0 when none matches. */
function acceptQ(accept: string, type: string): { q: number; order: number } {
  const [major] = type.split('/');
  let best = { q: 0, order: Number.POSITIVE_INFINITY, specificity: -1 };
  accept.split(',').forEach((part, order) => {
    const [range, ...params] = part.trim().toLowerCase().split(';');
    const r = (range ?? '').trim();
    const specificity = r === type ? 2 : r === `${major}/*` ? 1 : r === '*/*' ? 0 : -1;
    if (specificity < 0 || specificity < best.specificity) return;
    let q = 1;
    for (const p of params) {
      const [k, v] = p.trim().split('=');
      if (k === 'q' && v !== undefined) q = Number(v);
    }
    if (!Number.isFinite(q)) q = 0;
    best = { q, order, specificity };
  });
  return { q: best.q, order: best.order };
}

/** Whether the Accept header prefers CSV (text/csv) to JSON. */
export function prefersCsv(accept: string | undefined): boolean {
  if (!accept) return false;
  const csv = acceptQ(accept, 'text/csv');
  const json = acceptQ(accept, 'application/json');
  return csv.q > json.q || (csv.q > 0 && csv.q === json.q && csv.order < json.order);
}

/**
 * The bytes of a JSON sweep document. It is pure ASCII (sweep-output.ts), so latin1 copies it byte for
 * byte, and those bytes are its UTF-8 too: a few ms for 1e6 points, where writing the string makes
 * Node encode it to UTF-8 at a fraction of the speed. A computed entry carries them, so the in-memory
 * store keeps the same bytes (no second encoding) and the response sends them.
 */
function bytesOf(entry: CacheEntry): Buffer {
  return entry.bytes ?? Buffer.from(entry.body, 'latin1');
}

/**
 * Registers POST /v1/sweep: JSON by default, streamed CSV when Accept prefers text/csv. JSON results
 * go through the result cache (with coalescing, a strong ETag and 304 on If-None-Match), keyed by the
 * canonical input (sweepCacheInput: key order, unit spellings and omitted defaults do not matter); CSV
 * is streamed as it is computed and not cached.
 */
const CSV_CONTENT_TYPE = 'text/csv; charset=utf-8';

export function registerSweepRoute(app: FastifyInstance, maxPoints: number = SWEEP_DEFAULT_MAX_POINTS, cache?: CoalescingCache): void {
  app.post('/v1/sweep', async (request: FastifyRequest, reply: FastifyReply) => {
    const validated = parseOr400(sweepRequest, request.body);
    if (prefersCsv(request.headers.accept)) {
      // CSV: ETag and 304 like JSON; a cached copy is sent whole, a cold one streams as it is
      // computed and is stored once complete (no coalescing: concurrent cold CSV requests each compute).
      const csvKey = cacheKey(VERSION, '/v1/sweep.csv', sweepCacheInput(validated, maxPoints));
      const csvEtag = etagFor(csvKey);
      if (ifNoneMatchMatches(request.headers['if-none-match'], csvEtag)) {
        return reply.code(304).header('etag', csvEtag).header('cache-control', POST_CACHE_CONTROL).send();
      }
      reply.header('etag', csvEtag).header('cache-control', POST_CACHE_CONTROL).type(CSV_CONTENT_TYPE);
      const hit = cache ? await cache.get(csvKey).catch(() => undefined) : undefined;
      if (hit) return reply.header(CACHE_STATUS_HEADER, 'hit').send(hit.bytes ?? hit.body);
      reply.header(CACHE_STATUS_HEADER, 'miss');
      const prepared = prepareSweep(validated, maxPoints);
      const columns = computeSweepColumns(prepared);
      const chunks: string[] = [];
      function* recording(): Generator<string> {
        for (const chunk of sweepCsvChunks(prepared, columns)) {
          chunks.push(chunk);
          yield chunk;
        }
        if (cache) void cache.set(csvKey, { body: chunks.join(''), contentType: CSV_CONTENT_TYPE, etag: csvEtag }).catch(() => undefined);
      }
      return reply.send(Readable.from(recording()));
    }
    const key = cacheKey(VERSION, '/v1/sweep', sweepCacheInput(validated, maxPoints));
    const etag = etagFor(key);
    if (ifNoneMatchMatches(request.headers['if-none-match'], etag)) {
      return reply.code(304).header('etag', etag).header('cache-control', POST_CACHE_CONTROL).send();
    }
    const produce = (): CacheEntry => {
      const prepared = prepareSweep(validated, maxPoints);
      const body = sweepJson(prepared, computeSweepColumns(prepared));
      return { body, bytes: Buffer.from(body, 'latin1'), contentType: JSON_CONTENT_TYPE, etag };
    };
    const { entry, status } = cache ? await cache.resolveNow(key, produce) : { entry: produce(), status: 'miss' as const };
    return reply
      .header('etag', entry.etag)
      .header(CACHE_STATUS_HEADER, status)
      .header('cache-control', POST_CACHE_CONTROL)
      .header('content-type', entry.contentType)
      .send(bytesOf(entry));
  });
}
