/**
 * Request aliases: the exact text of a request the service has already answered (method, path and
 * query string; for POST also the raw JSON body), mapped to the canonical key its answer was stored
 * under. A repeated request whose text is byte-identical skips query and body validation, unit
 * parsing and the canonical key (cache/key.ts) and is answered straight from the in-memory store.
 *
 * Why this is safe: the canonical key is a pure function of the request text and the service version
 * (which is fixed for a process), so equal texts always have equal keys; an alias is recorded only
 * after a request was validated and its key computed, and a request whose alias has no entry in the
 * store (evicted) takes the full path. Problems (4xx) are never aliased. Headers do not enter the key
 * because no header changes a response body: If-None-Match is checked on the alias path too, and
 * x-request-id only names the request.
 *
 * Only the in-memory store is fronted (its lookup is synchronous): for a shared store (Redis) the
 * round trip dwarfs the validation saved. Aliases are bounded by bytes (app.ts: a quarter of
 * CACHE_MAX_BYTES, at most MAX_ALIAS_BYTES; texts of at most MAX_ALIAS_TEXT_BYTES each), least
 * recently used first out.
 */
import { LRUCache } from 'lru-cache';

/** Total bound of the alias table: request texts plus keys plus a per-entry allowance. */
export const MAX_ALIAS_BYTES = 8 * 1024 * 1024;
/** Longer request texts (large POST bodies) are not aliased: validating them is not the cost. */
export const MAX_ALIAS_TEXT_BYTES = 4096;
/** Allowance for the table's own bookkeeping per alias (map slot, list links), bytes. */
const ALIAS_OVERHEAD_BYTES = 96;

export class RequestAliases {
  private readonly table: LRUCache<string, string>;

  constructor(maxBytes = MAX_ALIAS_BYTES) {
    this.table = new LRUCache<string, string>({
      maxSize: maxBytes,
      sizeCalculation: (key, text) => 2 * (text.length + key.length) + ALIAS_OVERHEAD_BYTES,
    });
  }

  /** The canonical key recorded for this request text, if any. */
  keyFor(text: string): string | undefined {
    return this.table.get(text);
  }

  /** Records that `text` was answered under `key` (ignored for texts over MAX_ALIAS_TEXT_BYTES). */
  record(text: string, key: string): void {
    if (text.length <= MAX_ALIAS_TEXT_BYTES) this.table.set(text, key);
  }

  /** Aliases held now. */
  get size(): number {
    return this.table.size;
  }
}

/**
 * The text that identifies a request to `path` for aliasing: "GET <url>" with the query string as
 * sent, or "POST <url>" and the raw body. Undefined when there is nothing exact to go by (a POST whose
 * raw body was not kept) or the text is too long to alias.
 */
export function requestText(method: string, url: string, rawBody: string | undefined): string | undefined {
  if (method === 'GET' || method === 'HEAD') return url.length <= MAX_ALIAS_TEXT_BYTES ? `GET ${url}` : undefined;
  if (method !== 'POST' || rawBody === undefined || rawBody.length > MAX_ALIAS_TEXT_BYTES) return undefined;
  return `POST ${url}\n${rawBody}`;
}
