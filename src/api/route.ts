/**
 * Compute routes: one definition gives the POST (JSON body) route, the optional GET (query string)
 * route, request validation with zod, the OpenAPI description, and caching: each validated request
 * gets a canonical key (cache/key.ts), its serialised 200 response is kept in the result cache and
 * served byte-identical on repeats, carries a strong ETag, Cache-Control and x-cache (hit, miss or
 * coalesced), and a matching If-None-Match gets 304. Handlers receive validated input and return a plain object; errors are
 * thrown as ProblemError, rendered by the error handler, and never cached.
 */
import fastJson from 'fast-json-stringify';
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import { z } from 'zod';
import type { CacheStatus, CoalescingCache } from '../cache/coalesce.js';
import { CACHE_STATUS_HEADER, etagFor, GET_CACHE_CONTROL, ifNoneMatchMatches, JSON_CONTENT_TYPE, POST_CACHE_CONTROL } from '../cache/http.js';
import { cacheKey } from '../cache/key.js';
import { requestText, type RequestAliases } from '../cache/request-aliases.js';
import type { CacheEntry } from '../cache/types.js';
import { ProblemError, type FieldError } from '../errors.js';
import { VERSION } from '../version.js';

export interface GetBinding<TQuery, TIn> {
  /** Schema of the query string (all values arrive as strings). */
  query: z.ZodType<TQuery>;
  /** Builds the POST-shaped input from the query; may throw ProblemError with POST-style paths. */
  toInput: (query: TQuery) => TIn;
  /** Maps a POST-style error path ("/body/mass") to the query parameter the client sent ("mass"). */
  pathFor: (path: string) => string;
}

export interface ComputeRoute<TIn, TQuery = unknown> {
  path: string;
  operationId: string;
  summary: string;
  description: string;
  tag: string;
  body: z.ZodType<TIn>;
  get?: GetBinding<TQuery, TIn>;
  response: z.ZodType;
  /** Computes the response document from validated input. */
  compute: (input: TIn) => unknown;
  /**
   * The input in canonical form for the cache key: normalised, defaults applied, exact doubles.
   * Inputs with equal canonical forms must give byte-identical responses. It may throw the same
   * ProblemErrors as compute (they are rendered, not cached). Without it the validated input itself,
   * stably serialised, is the canonical form.
   */
  canonical?: (input: TIn) => unknown;
  /**
   * How the 200 body is written: 'compiled' (default) by fast-json-stringify from the response schema;
   * 'json' by JSON.stringify, for documents made mostly of long number arrays (geodesic samples,
   * batches of coordinate events), where it is 3–8× faster than the compiled serialiser. Such a route's
   * compute must build exactly the declared document with null, never NaN, for missing numbers; the
   * caching tests hold both serialisers byte-identical on a sample request of every route.
   */
  serializer?: 'compiled' | 'json';
}

/** Converts zod issues into problem-details field errors; `prefix` roots the paths. */
export function zodFieldErrors(error: z.ZodError, prefix = ''): FieldError[] {
  const pathOf = (segments: PropertyKey[]) => `${prefix}/${segments.map(String).join('/')}`.replace(/\/$/, '') || '/';
  return error.issues.flatMap((issue) => {
    if (issue.code === 'unrecognized_keys') {
      // One entry per unknown key, with the key in its path, so "spinn" is named where it stands.
      return issue.keys.map((k) => ({ path: pathOf([...issue.path, k]), message: `unknown field "${k}"` }));
    }
    return [{ path: pathOf(issue.path), message: issue.message }];
  });
}

function invalidFrom(errors: FieldError[]): ProblemError {
  const first = errors[0];
  const detail = first ? `${first.path}: ${first.message}` : 'the request is not valid';
  return new ProblemError('invalid-request', errors.length > 1 ? `${detail} (and ${errors.length - 1} more)` : detail, errors);
}

/** Parses the input with its schema, throwing a 400 problem that lists every bad field. */
export function parseOr400<T>(schema: z.ZodType<T>, value: unknown, prefix = ''): T {
  const result = schema.safeParse(value);
  if (!result.success) throw invalidFrom(zodFieldErrors(result.error, prefix));
  return result.data;
}

function remapPaths(err: unknown, pathFor: (p: string) => string): unknown {
  if (err instanceof ProblemError && err.errors) {
    const errors = err.errors.map((e) => ({ ...e, path: pathFor(e.path) }));
    const first = errors[0];
    const detail = err.message.startsWith('/') && first ? err.message.replace(/^\S+:/, `${first.path}:`) : err.message;
    return new ProblemError(err.code, detail, errors);
  }
  return err;
}

/**
 * JSON Schema of the success response, from which fast-json-stringify compiles the serialiser (about
 * twice as fast as JSON.stringify for these documents); it also drops anything undeclared. It is the
 * schema fastify compiled when it serialised these responses itself, so the bytes are the same.
 */
export function responseSchema(route: ComputeRoute<unknown, unknown>): Record<string, unknown> {
  return z.toJSONSchema(route.response, { target: 'draft-7', io: 'output', unrepresentable: 'any' }) as Record<string, unknown>;
}

/**
 * Registers the route's POST (and GET) handlers, answering through the result cache. Both methods
 * build the same POST-shaped input, hence the same key: they share cache entries and ETags. With
 * `aliases` and an in-memory store, a byte-identical repeat of an answered request is served from the
 * store before validation (cache/request-aliases.ts says why that is safe).
 */
export function registerComputeRoute<TIn, TQuery>(
  app: FastifyInstance,
  route: ComputeRoute<TIn, TQuery>,
  cache: CoalescingCache,
  aliases?: RequestAliases,
): void {
  const serialize: (doc: unknown) => string =
    route.serializer === 'json' ? (doc) => JSON.stringify(doc) : fastJson(responseSchema(route as ComputeRoute<unknown, unknown>));
  const canonical = route.canonical ?? ((input: TIn): unknown => input);
  const aliasTable = aliases !== undefined && cache.keepsEntriesHere ? aliases : undefined;

  const notModified = (reply: FastifyReply, etag: string, cacheControl: string): FastifyReply =>
    reply.code(304).header('etag', etag).header('cache-control', cacheControl).send();
  // Headers only on success: a problem response carries neither the ETag nor Cache-Control.
  const sendEntry = (reply: FastifyReply, entry: CacheEntry, status: CacheStatus, cacheControl: string): FastifyReply =>
    reply
      .header('etag', entry.etag)
      .header('cache-control', cacheControl)
      .header(CACHE_STATUS_HEADER, status)
      .header('content-type', entry.contentType)
      .send(entry.bytes ?? entry.body);

  /** The answer to a repeat of an answered request, straight from the store; undefined otherwise. */
  const fromAlias = (text: string | undefined, request: FastifyRequest, reply: FastifyReply, cacheControl: string): FastifyReply | undefined => {
    const key = text === undefined ? undefined : aliasTable?.keyFor(text);
    if (key === undefined) return undefined;
    const ifNoneMatch = request.headers['if-none-match'];
    if (ifNoneMatch !== undefined) {
      const etag = etagFor(key);
      if (ifNoneMatchMatches(ifNoneMatch, etag)) return notModified(reply, etag, cacheControl);
    }
    const entry = cache.peek(key);
    return entry === undefined ? undefined : sendEntry(reply, entry, 'hit', cacheControl);
  };

  /** Key, 304 if the client holds this result, else the cached or freshly computed body. */
  const respond = async (
    input: TIn,
    request: FastifyRequest,
    reply: FastifyReply,
    cacheControl: string,
    text: string | undefined,
  ): Promise<FastifyReply> => {
    const key = cacheKey(VERSION, route.path, canonical(input));
    const etag = etagFor(key);
    if (ifNoneMatchMatches(request.headers['if-none-match'], etag)) return notModified(reply, etag, cacheControl);
    const produce = (): CacheEntry => ({ body: serialize(route.compute(input)), contentType: JSON_CONTENT_TYPE, etag });
    const resolved = cache.resolveNow(key, produce);
    const { entry, status } = resolved instanceof Promise ? await resolved : resolved;
    if (text !== undefined) aliasTable?.record(text, key);
    return sendEntry(reply, entry, status, cacheControl);
  };

  app.post(route.path, async (request: FastifyRequest, reply: FastifyReply) => {
    const text = aliasTable ? requestText('POST', request.url, request.rawBody) : undefined;
    const repeat = fromAlias(text, request, reply, POST_CACHE_CONTROL);
    if (repeat) return repeat;
    const input = parseOr400(route.body, request.body);
    return respond(input, request, reply, POST_CACHE_CONTROL, text);
  });
  const get = route.get;
  if (get) {
    app.get(route.path, async (request: FastifyRequest, reply: FastifyReply) => {
      const text = aliasTable ? requestText(request.method, request.url, undefined) : undefined;
      const repeat = fromAlias(text, request, reply, GET_CACHE_CONTROL);
      if (repeat) return repeat;
      try {
        const query = parseOr400(get.query, request.query ?? {});
        return await respond(get.toInput(query), request, reply, GET_CACHE_CONTROL, text);
      } catch (err) {
        throw remapPaths(err, get.pathFor);
      }
    });
  }
}
