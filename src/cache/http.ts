/**
 * HTTP caching of compute responses: the ETag, Cache-Control and If-None-Match rules.
 */

/**
 * Cache-Control of a GET result: a result is a deterministic function of the request and the service
 * version, so shared caches may keep it for a day.
 */
export const GET_CACHE_CONTROL = 'public, max-age=86400';

/** Cache-Control of a POST result: stored only with revalidation (the ETag still lets clients send If-None-Match). */
export const POST_CACHE_CONTROL = 'no-cache';

/**
 * Response header telling how a 200 compute response was found: `hit` (from the result cache: this
 * process's memory or the shared Redis), `miss` (computed for this request), `coalesced` (shared with an
 * identical request in flight). Absent on 304 and on errors.
 */
export const CACHE_STATUS_HEADER = 'x-cache';

/** Content type of every cached compute response. */
export const JSON_CONTENT_TYPE = 'application/json; charset=utf-8';

/**
 * The strong ETag of a response: its quoted cache key. The key hashes the service version, the route
 * and the canonical input, and the response body is a deterministic function of exactly those, so
 * equal keys mean byte-identical bodies; and the tag is known before any computation, so a matching
 * If-None-Match is answered without computing or looking anything up.
 */
export function etagFor(key: string): string {
  return `"${key}"`;
}

/**
 * Whether an If-None-Match header matches the ETag. A match gets 304 on POST too: these POSTs are safe
 * computations (a query with a body), so revalidating them like a GET is what clients want, where
 * RFC 9110 would prescribe 412 for a state-changing method.
 *
 * Matches: "*", or any listed tag equal to it after
 * dropping a weak prefix (RFC 9110 §13.1.2 compares If-None-Match weakly).
 */
export function ifNoneMatchMatches(header: string | string[] | undefined, etag: string): boolean {
  if (header === undefined) return false;
  const value = Array.isArray(header) ? header.join(',') : header;
  if (value === etag) return true;
  for (const part of value.split(',')) {
    let tag = part.trim();
    if (tag === '*') return true;
    if (tag.startsWith('W/')) tag = tag.slice(2);
    if (tag === etag) return true;
  }
  return false;
}
