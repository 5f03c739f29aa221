/**
 * Service configuration, read from the environment once at start-up and validated. Nothing else in
 * the code reads process.env. Every variable is documented in README.md and .env.example.
 */
import { z } from 'zod';

/** The message for a value that is not a number at all; other issues keep their own messages. */
const notANumber = (issue: { code?: string }) => (issue.code === 'invalid_type' ? 'must be a number' : undefined);
const port = z.coerce
  .number({ error: notANumber })
  .int({ error: 'must be a whole number' })
  .min(0, { error: 'must be a port number from 0 to 65535' })
  .max(65_535, { error: 'must be a port number from 0 to 65535' });
const positiveInt = z.coerce
  .number({ error: notANumber })
  .int({ error: 'must be a whole number' })
  .positive({ error: 'must be positive' });
/** Largest result-cache bound accepted: 16 GiB, beyond any heap a Node process is given. */
const MAX_CACHE_BYTES = 16 * 1024 ** 3;

/** A whole number ≥ 0 whose errors name the variable. */
function nonNegativeInt(name: string) {
  return z.coerce
    .number({ error: `${name} must be a number` })
    .int({ error: `${name} must be a whole number` })
    .min(0, { error: `${name} must not be negative (0 switches the check off)` });
}

/** true/false (also 1/0, yes/no); z.coerce.boolean would read "false" as true. */
function flag(name: string) {
  return z
    .string()
    .trim()
    .toLowerCase()
    .pipe(z.enum(['true', 'false', '1', '0', 'yes', 'no'], { error: `${name} must be true or false` }))
    .transform((v) => v === 'true' || v === '1' || v === 'yes');
}

/**
 * CORS_ORIGINS: "" (off), "*" (any origin, said explicitly) or a comma-separated list of origins,
 * each scheme://host[:port] with no path — what a browser sends in the Origin header.
 */
function parseOrigins(value: string, ctx: z.RefinementCtx): string[] {
  const items = value
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '');
  if (items.length === 1 && items[0] === '*') return ['*'];
  for (const item of items) {
    let ok = false;
    try {
      const u = new URL(item);
      ok = (u.protocol === 'http:' || u.protocol === 'https:') && u.origin === item.replace(/\/$/, '');
    } catch {
      ok = false;
    }
    if (!ok) {
      ctx.addIssue({
        code: 'custom',
        message: `CORS_ORIGINS must be empty, "*" alone, or a comma-separated list of origins like https://calc.example.org (scheme, host and port, no path); "${item.slice(0, 100)}" is not one`,
      });
      return [];
    }
  }
  return items.map((s) => s.replace(/\/$/, ''));
}

const schema = z.object({
  PORT: port.default(8080),
  HOST: z.string().min(1).default('0.0.0.0'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Largest request body accepted, in bytes (larger: 413). */
  BODY_LIMIT_BYTES: positiveInt.max(64 * 1024 * 1024).default(65_536),
  /** Time allowed to receive and answer one request, ms. */
  REQUEST_TIMEOUT_MS: positiveInt.max(600_000).default(30_000),
  /** Time allowed for in-flight requests on shutdown, ms. */
  SHUTDOWN_GRACE_MS: positiveInt.max(600_000).default(10_000),
  /** Largest number of grid points in one sweep (larger: 413). */
  SWEEP_MAX_POINTS: positiveInt.max(20_000_000).default(1_000_000),
  /** Bound of the in-memory result cache, bytes (128 MiB); 0 switches the cache off. */
  CACHE_MAX_BYTES: z.coerce
    .number({ error: 'CACHE_MAX_BYTES must be a number of bytes (0 switches the cache off)' })
    .int({ error: 'CACHE_MAX_BYTES must be a whole number of bytes' })
    .min(0, { error: 'CACHE_MAX_BYTES must not be negative (0 switches the cache off)' })
    .max(MAX_CACHE_BYTES, { error: `CACHE_MAX_BYTES must not exceed ${MAX_CACHE_BYTES} (16 GiB)` })
    .default(134_217_728),

  // ---- Shared result cache (Redis). REDIS_URL set: Redis replaces the in-memory LRU. ----
  /** redis:// or rediss:// URL of a Redis shared by the replicas; unset keeps the in-memory LRU. */
  REDIS_URL: z
    .url({ protocol: /^rediss?$/, error: 'REDIS_URL must be a redis:// or rediss:// URL' })
    .optional(),
  /** Prefix of every Redis key (the service version follows it), so several services can share one Redis. */
  REDIS_KEY_PREFIX: z
    .string()
    .max(100)
    .regex(/^[A-Za-z0-9:._-]*$/, { error: 'REDIS_KEY_PREFIX may hold letters, digits and : . _ - only' })
    .default('spacetide:'),
  /** Longest wait for one Redis command, ms; then the request computes without the cache. */
  REDIS_COMMAND_TIMEOUT_MS: positiveInt.max(60_000).default(500),
  /** Longest wait for a Redis connection (at start-up and per reconnection attempt), ms. */
  REDIS_CONNECT_TIMEOUT_MS: positiveInt.max(60_000).default(2_000),
  /** Largest entry stored in Redis, bytes (32 MiB); larger results are computed each time. */
  REDIS_MAX_ENTRY_BYTES: positiveInt.max(512 * 1024 * 1024).default(33_554_432),
  /** Lifetime of a Redis entry, seconds (1 day). */
  CACHE_TTL_SECONDS: positiveInt.max(365 * 86_400).default(86_400),
  // ---- end of the shared result cache block ----
  // --- Operations: metrics, protection against overload, CORS (kept as one block) ---
  /** Serve GET /metrics in the Prometheus text format. */
  METRICS_ENABLED: flag('METRICS_ENABLED').default(true),
  /** Browser origins allowed by CORS, comma-separated; empty: CORS off; "*": any origin. */
  CORS_ORIGINS: z
    .string()
    .default('')
    .transform((v, ctx) => parseOrigins(v, ctx)),
  /** Requests per client (IP) per window; 0 switches rate limiting off (the default). */
  RATE_LIMIT_MAX: z.coerce
    .number({ error: 'RATE_LIMIT_MAX must be a number of requests (0 switches rate limiting off)' })
    .int({ error: 'RATE_LIMIT_MAX must be a whole number' })
    .min(0, { error: 'RATE_LIMIT_MAX must not be negative (0 switches rate limiting off)' })
    .max(1_000_000_000)
    .default(0),
  /** The rate-limit window, ms. */
  RATE_LIMIT_WINDOW_MS: positiveInt.max(86_400_000).default(60_000),
  /**
   * Reverse proxies in front of the service whose X-Forwarded-For is trusted, as a hop count: the
   * client (for rate limits and logs) is then the address that many hops back. 0: the peer address.
   */
  TRUST_PROXY_HOPS: nonNegativeInt('TRUST_PROXY_HOPS').max(10).default(0),
  /**
   * Overload: requests are answered 503 with Retry-After while the mean event-loop delay over the
   * last sample exceeds this (ms; 0: not checked). 1 s: a compute request takes well under 1 ms and
   * the largest sweep about a second, so a mean delay of a second means the queue is growing.
   */
  MAX_EVENT_LOOP_DELAY_MS: nonNegativeInt('MAX_EVENT_LOOP_DELAY_MS').max(600_000).default(1_000),
  /**
   * Overload: 503 while the V8 heap in use exceeds this (bytes; 0: not checked). 3 GiB: below the
   * ~4 GiB heap limit Node gives itself on a 24 GiB machine, so the process sheds load before it
   * would die of an out-of-memory error.
   */
  MAX_HEAP_USED_BYTES: nonNegativeInt('MAX_HEAP_USED_BYTES').max(MAX_CACHE_BYTES).default(3 * 1024 ** 3),
  /** Overload: 503 while the resident set exceeds this (bytes; 0: not checked). 6 GiB of 24. */
  MAX_RSS_BYTES: nonNegativeInt('MAX_RSS_BYTES').max(4 * MAX_CACHE_BYTES).default(6 * 1024 ** 3),
  /** Seconds a client is told to wait (Retry-After) when the service sheds load or shuts down. */
  RETRY_AFTER_S: positiveInt.max(3_600).default(5),
  // --- end of operations block ---
});

export type Config = z.infer<typeof schema>;

/** Thrown with a message that names each bad variable. */
export class ConfigError extends Error {}

/** Parses the given environment (process.env by default) into the typed configuration. */
export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const picked: Record<string, string> = {};
  for (const key of Object.keys(schema.shape)) {
    const v = env[key];
    if (v !== undefined && v !== '') picked[key] = v;
  }
  const result = schema.safeParse(picked);
  if (!result.success) {
    const lines = result.error.issues.map((i) => {
      const name = String(i.path[0]);
      const got = name === 'REDIS_URL' ? redactUrl(picked[name] ?? '') : picked[name];
      return `${i.path.join('.')}: ${i.message} (got "${got}")`;
    });
    throw new ConfigError(`invalid configuration:\n  ${lines.join('\n  ')}`);
  }
  return result.data;
}

/** A URL with its user information (user name, password) replaced by "***", for messages and logs. */
export function redactUrl(url: string): string {
  return url.replace(/^([a-z][a-z0-9+.-]*:\/\/)[^/?#]*@/i, '$1***@');
}

/** Defaults, for tests and for building the app without an environment. */
export function defaultConfig(overrides: Partial<Config> = {}): Config {
  return { ...loadConfig({}), ...overrides };
}
