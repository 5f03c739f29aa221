/**
 * The shared store: results kept in Redis, so that replicas behind one load balancer compute each
 * result once between them. Chosen by REDIS_URL (plugin.ts); the in-memory LRU stays the default.
 *
 * Client: @redis/client, the core of node-redis (the client maintained by the Redis project; Node 20+,
 * typed, promise-based, per-command timeouts). The `redis` package adds only Redis Stack modules.
 *
 * Redis is an optimisation here, never a dependency of an answer:
 * - every command is bounded by commandTimeoutMs (our own timer: the client's timeout only covers a
 *   command not yet written), and the offline queue is off, so a Redis that is down or stalled costs a
 *   request at most that long, after which it is computed (the bound must also cover moving the
 *   largest entry, maxEntryBytes: 32 MiB take about 0.3 s at 1 Gbit/s);
 * - after FAILURES_BEFORE_DEGRADED failures in a row on an open connection (a stalled server), the
 *   store stops sending commands except one probe per PROBE_INTERVAL_MS, so requests do not each wait
 *   out the timeout and replies owed do not pile up; the first probe that succeeds restores it;
 * - a failed read counts as a miss and a failed write is dropped; both are counted in `errors` and
 *   neither throws;
 * - the client reconnects with capped exponential backoff for as long as the process runs; health()
 *   reports 'degraded' from the moment the connection is lost (or commands keep failing) until it is
 *   back, and each change of state is logged once (no line per failed request).
 *
 * Keys and values carry the service version: the key is `<prefix><version>:<cache key>` (the cache key
 * hashes the version too), and the value starts with a header naming the version, checked on every read,
 * so replicas of different versions sharing one Redis never serve each other's results.
 */
import { createClient, ErrorReply, type RedisClientType } from '@redis/client';
import { redactUrl } from '../config.js';
import type { CacheEntry, CacheHealth, CacheStats, ResultCache } from './types.js';

/** What the store logs through: the app's pino logger fits (object first, then the message). */
export interface CacheLogger {
  info(obj: object, msg: string): void;
  warn(obj: object, msg: string): void;
}

export interface RedisCacheOptions {
  /** redis:// or rediss:// URL. */
  url: string;
  /** Service version: part of every key and checked in every value read. */
  version: string;
  /** Prefix of every key, before the version (REDIS_KEY_PREFIX). */
  keyPrefix: string;
  /** Lifetime of an entry, seconds (CACHE_TTL_SECONDS). */
  ttlSeconds: number;
  /** Longest wait for one command, ms (REDIS_COMMAND_TIMEOUT_MS). */
  commandTimeoutMs: number;
  /** Longest wait for one connection attempt, ms (REDIS_CONNECT_TIMEOUT_MS). */
  connectTimeoutMs: number;
  /** Largest stored value in bytes, header included (REDIS_MAX_ENTRY_BYTES); larger entries are not stored. */
  maxEntryBytes: number;
  logger: CacheLogger;
}

/** Longest pause between reconnection attempts, ms. */
export const RECONNECT_MAX_DELAY_MS = 2_000;

/**
 * Delay before reconnection attempt `retries` (0, 1, …): 50·2^retries ms capped at
 * RECONNECT_MAX_DELAY_MS, plus up to 100 ms of jitter so that replicas do not reconnect in step
 * (capped exponential backoff with jitter: common practice).
 */
export function reconnectDelay(retries: number, random: () => number = Math.random): number {
  return Math.min(50 * 2 ** Math.min(retries, 16), RECONNECT_MAX_DELAY_MS) + Math.floor(random() * 100);
}

/** Consecutive failed commands on a connection that looks open after which the store reports 'degraded'. */
export const FAILURES_BEFORE_DEGRADED = 3;

/** While Redis does not answer on an open connection, one command per this many ms is let through as a probe. */
export const PROBE_INTERVAL_MS = 1_000;

/** Thrown when a command is skipped while Redis is not answering (only probes are sent). */
class SkippedError extends Error {}

/** Rejects when the promise has not settled within ms (the late result, if any, is dropped). */
function withTimeout<T>(promise: Promise<T>, ms: number): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const expired = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms);
  });
  promise.catch(() => undefined); // a rejection after the timeout is not unhandled
  return Promise.race([promise, expired]).finally(() => clearTimeout(timer));
}

/** The header before a stored body: version, content type and ETag. */
interface ValueHeader {
  v: string;
  ct: string;
  etag: string;
}

/**
 * The stored value: one line of JSON header (JSON escapes newlines, so the first "\n" ends it), then
 * the body as is (no escaping of a body that may be tens of megabytes).
 */
export function encodeValue(version: string, entry: CacheEntry): string {
  const header: ValueHeader = { v: version, ct: entry.contentType, etag: entry.etag };
  return `${JSON.stringify(header)}\n${entry.body}`;
}

/**
 * The entry in a stored value, or undefined when the value is not one of ours or was written by
 * another version (`mismatch`: true in that case, so it can be counted).
 */
export function decodeValue(version: string, value: string): { entry?: CacheEntry; mismatch: boolean } {
  const newline = value.indexOf('\n');
  if (newline < 0) return { mismatch: true };
  let header: Partial<ValueHeader>;
  try {
    header = JSON.parse(value.slice(0, newline)) as Partial<ValueHeader>;
  } catch {
    return { mismatch: true };
  }
  if (header === null || typeof header !== 'object' || header.v !== version || typeof header.ct !== 'string' || typeof header.etag !== 'string') {
    return { mismatch: true };
  }
  return { entry: { body: value.slice(newline + 1), contentType: header.ct, etag: header.etag }, mismatch: false };
}

/** Counters of the Redis store beyond CacheStats. */
export interface RedisCacheCounters {
  /** Commands that failed (timeout, connection down, server error) or were skipped while Redis did not answer. */
  errors: number;
  /** Values read that another version (or something else) wrote: served as misses. */
  mismatches: number;
  /** Entries not stored because they exceed maxEntryBytes. */
  oversize: number;
  /** Commands not sent because Redis was not answering (between probes); also counted in errors. */
  skipped: number;
}

type State = 'connecting' | 'ready' | 'degraded' | 'closed';

/** The Redis store (see the file comment). Call connect() once before use. */
export class RedisCache implements ResultCache {
  private readonly client: RedisClientType;
  private readonly where: string;
  private state: State = 'connecting';
  private reason = 'not connected yet';
  private consecutiveFailures = 0;
  /** Time before which commands are skipped (a stalled Redis gets one probe per PROBE_INTERVAL_MS). */
  private skipUntil = 0;
  private hits = 0;
  private misses = 0;
  private readonly counters: RedisCacheCounters = { errors: 0, mismatches: 0, oversize: 0, skipped: 0 };
  private readyWaiters: Array<() => void> = [];

  constructor(private readonly options: RedisCacheOptions) {
    this.where = redactUrl(options.url);
    this.client = createClient({
      url: options.url,
      // Commands fail at once while disconnected instead of piling up until Redis returns.
      disableOfflineQueue: true,
      commandOptions: { timeout: options.commandTimeoutMs },
      socket: {
        connectTimeout: options.connectTimeoutMs,
        // Never give up (the default stops on a socket timeout): the process outlives Redis outages.
        reconnectStrategy: (retries) => reconnectDelay(retries),
      },
    }) as RedisClientType;
    this.client.on('ready', () => this.onReady());
    // Emitted for every failed connection attempt and lost connection; a listener must exist or
    // node's EventEmitter would throw.
    this.client.on('error', (err: unknown) => this.onLost(err));
    this.client.on('reconnecting', () => this.onLost(undefined));
  }

  /**
   * Starts connecting and waits up to waitMs for the connection; resolves true when ready, false
   * otherwise (the store then starts 'degraded' and keeps trying in the background).
   */
  async connect(waitMs: number): Promise<boolean> {
    this.client.connect().catch(() => {
      // Only rejects when closed while connecting; failures in between arrive as 'error' events.
    });
    return this.waitReady(waitMs);
  }

  /** Resolves true once ready (at once if ready now), or false after waitMs. */
  waitReady(waitMs: number): Promise<boolean> {
    if (this.state === 'ready') return Promise.resolve(true);
    return new Promise((resolve) => {
      const done = (): void => {
        clearTimeout(timer);
        resolve(true);
      };
      const timer = setTimeout(() => {
        this.readyWaiters = this.readyWaiters.filter((w) => w !== done);
        resolve(false);
      }, waitMs);
      this.readyWaiters.push(done);
    });
  }

  private onReady(): void {
    const was = this.state;
    this.state = 'ready';
    this.consecutiveFailures = 0;
    this.skipUntil = 0;
    this.reason = '';
    if (was === 'connecting') this.options.logger.info({ redis: this.where }, 'result cache: connected to Redis');
    else this.options.logger.info({ redis: this.where }, 'result cache: reconnected to Redis; caching resumes');
    const waiters = this.readyWaiters;
    this.readyWaiters = [];
    for (const w of waiters) w();
  }

  private onLost(err: unknown): void {
    if (this.state === 'closed') return;
    if (err !== undefined) this.reason = errorText(err);
    if (this.state === 'ready' || (this.state === 'connecting' && err !== undefined)) {
      this.options.logger.warn(
        { redis: this.where, err: this.reason },
        'result cache: Redis unreachable; answering without it (computing) and reconnecting',
      );
      this.state = 'degraded';
    }
  }

  /**
   * Runs one command within the timeout, keeping the counters and the state. While Redis is not
   * answering on an open connection, commands between probes are skipped (SkippedError).
   */
  private async command<T>(run: () => Promise<T>): Promise<T> {
    if (this.consecutiveFailures >= FAILURES_BEFORE_DEGRADED && this.client.isReady) {
      const now = Date.now();
      if (now < this.skipUntil) {
        this.counters.errors += 1;
        this.counters.skipped += 1;
        throw new SkippedError('skipped: Redis not answering');
      }
      this.skipUntil = now + PROBE_INTERVAL_MS;
    }
    try {
      const result = await withTimeout(run(), this.options.commandTimeoutMs);
      this.onCommandSucceeded();
      return result;
    } catch (err) {
      this.onCommandFailed(err);
      throw err;
    }
  }

  /**
   * A command failed: a timeout or a lost connection (towards 'degraded'), or an error reply from a
   * Redis that answers (out of memory, say: counted, but Redis is there).
   */
  private onCommandFailed(err: unknown): void {
    this.counters.errors += 1;
    if (err instanceof ErrorReply) return;
    this.consecutiveFailures += 1;
    if (this.state === 'ready' && this.consecutiveFailures >= FAILURES_BEFORE_DEGRADED) {
      this.reason = `${this.consecutiveFailures} commands failed in a row (${errorText(err)})`;
      this.options.logger.warn({ redis: this.where, err: this.reason }, 'result cache: Redis not answering; answering without it');
      this.state = 'degraded';
    }
  }

  private onCommandSucceeded(): void {
    this.consecutiveFailures = 0;
    if (this.state === 'degraded' && this.client.isReady) {
      this.state = 'ready';
      this.reason = '';
      this.options.logger.info({ redis: this.where }, 'result cache: Redis answering again; caching resumes');
    }
  }

  private redisKey(key: string): string {
    return `${this.options.keyPrefix}${this.options.version}:${key}`;
  }

  /** The entry under key; a miss when absent, written by another version, or Redis fails. Never throws. */
  async get(key: string): Promise<CacheEntry | undefined> {
    if (this.state === 'closed') {
      this.misses += 1;
      return undefined;
    }
    let value: string | null;
    try {
      value = (await this.command(() => this.client.get(this.redisKey(key)))) as string | null;
    } catch {
      this.misses += 1;
      return undefined;
    }
    if (value === null) {
      this.misses += 1;
      return undefined;
    }
    const decoded = decodeValue(this.options.version, value);
    if (decoded.entry === undefined) {
      if (decoded.mismatch) this.counters.mismatches += 1;
      this.misses += 1;
      return undefined;
    }
    this.hits += 1;
    return decoded.entry;
  }

  /** Stores the entry with the TTL, unless it exceeds maxEntryBytes. Never throws. */
  async set(key: string, entry: CacheEntry): Promise<void> {
    if (this.state === 'closed') return;
    const value = encodeValue(this.options.version, entry);
    if (Buffer.byteLength(value, 'utf8') > this.options.maxEntryBytes) {
      this.counters.oversize += 1;
      return;
    }
    try {
      await this.command(() => this.client.set(this.redisKey(key), value, { expiration: { type: 'EX', value: this.options.ttlSeconds } }));
    } catch {
      // counted by command(); the next request for this key computes again
    }
  }

  /**
   * Hits and misses of this process. Redis holds the entries, shared by every replica, and evicts
   * them itself (its maxmemory policy; INFO stats evicted_keys): entries, bytes, maxBytes and
   * evictions are not known here and are reported as 0. errors counts failed commands.
   */
  stats(): CacheStats {
    return {
      hits: this.hits,
      misses: this.misses,
      evictions: 0,
      coalesced: 0,
      entries: 0,
      bytes: 0,
      maxBytes: 0,
      errors: this.counters.errors,
    };
  }

  /** Counters particular to this store. */
  redisCounters(): RedisCacheCounters {
    return { ...this.counters };
  }

  /** 'ready' while connected and answering; 'degraded' (with the reason) otherwise. */
  health(): CacheHealth {
    if (this.state === 'ready') return { backend: 'redis', state: 'ready' };
    const detail =
      this.state === 'closed'
        ? `closed (${this.where})`
        : this.state === 'connecting'
          ? `connecting to ${this.where}`
          : `${this.where}: ${this.reason || 'connection lost'}; reconnecting`;
    return { backend: 'redis', state: 'degraded', detail };
  }

  /** Closes the connection (waiting for replies in flight when connected) and stops reconnecting. */
  async close(): Promise<void> {
    if (this.state === 'closed') return;
    this.state = 'closed';
    try {
      if (this.client.isReady) await withTimeout(this.client.close(), this.options.commandTimeoutMs);
      else this.client.destroy();
    } catch {
      this.client.destroy();
    }
  }
}

/** A short text for an error, without a stack. */
function errorText(err: unknown): string {
  if (err instanceof AggregateError && err.errors.length > 0) return errorText(err.errors[0]);
  if (err instanceof Error) return err.message || err.name;
  return String(err);
}
