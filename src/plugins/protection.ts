/**
 * Protection of the service and its clients: load shedding (@fastify/under-pressure), per-client
 * rate limiting (@fastify/rate-limit, off by default), CORS for calculator pages on other origins
 * (@fastify/cors, off unless CORS_ORIGINS is set), security headers (helmet's defaults, computed once),
 * and the 503 given to requests that arrive while the service shuts down.
 *
 * Which routes are spared, and why:
 * - /healthz and /metrics are never shed and never rate-limited. A liveness probe that failed under
 *   load would get a busy but healthy process restarted, which turns overload into an outage; and
 *   overload is exactly when the metrics must still be readable.
 * - /readyz is never shed or rate-limited either, but it answers 503 itself while the service is
 *   overloaded (or shutting down), so a load balancer takes the instance out of rotation until it
 *   recovers instead of piling more requests on it.
 * Every 503 and 429 is problem details with Retry-After.
 */
import fastifyCors from '@fastify/cors';
import fastifyRateLimit from '@fastify/rate-limit';
import fastifyUnderPressure from '@fastify/under-pressure';
import type { FastifyPluginAsync, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import helmet, { type HelmetOptions } from 'helmet';
import { ProblemError } from '../errors.js';

/**
 * The headers helmet sets for `options`, captured once by running its middleware against a recording
 * response. With static options (no per-request CSP nonces) they are the same for every request, so
 * each response gets a plain copy: @fastify/helmet instead rebuilds helmet's middleware (parsing the
 * CSP directives again) on every request, which cost ~20 µs a request here.
 */
export function securityHeaders(options: Readonly<HelmetOptions>): Readonly<Record<string, string>> {
  const headers: Record<string, string> = {};
  const recorder = {
    setHeader: (name: string, value: string | number | readonly string[]) => {
      headers[name.toLowerCase()] = Array.isArray(value) ? value.join(', ') : String(value);
    },
    removeHeader: (name: string) => {
      delete headers[name.toLowerCase()];
    },
  };
  helmet({ ...options })({} as never, recorder as never, (err?: unknown) => {
    if (err) throw err;
  });
  return Object.freeze(headers);
}

/** Where the service serves HTML (the API browser and its assets): helmet's full default set. */
const PAGES_PREFIX = '/docs';

/**
 * Helmet options for the JSON API: the headers the OWASP REST Security Cheat Sheet lists for API
 * responses (section "Security Headers"; from memory) — a CSP that lets nothing load or frame the
 * response, X-Frame-Options DENY, nosniff, HSTS — plus Referrer-Policy and Cross-Origin-Resource-Policy.
 * The headers that only concern HTML documents (opener and origin-agent isolation, DNS prefetch,
 * download options, cross-domain policies, the legacy XSS filter) are left to the pages, which keeps
 * about 400 bytes off every JSON response.
 */
function apiHeaderOptions(crossOriginResourcePolicy: { policy: 'same-origin' | 'cross-origin' }): HelmetOptions {
  return {
    contentSecurityPolicy: { useDefaults: false, directives: { defaultSrc: ["'none'"], frameAncestors: ["'none'"] } },
    crossOriginOpenerPolicy: false,
    crossOriginResourcePolicy,
    originAgentCluster: false,
    referrerPolicy: { policy: 'no-referrer' },
    xDnsPrefetchControl: false,
    xDownloadOptions: false,
    xFrameOptions: { action: 'deny' },
    xPermittedCrossDomainPolicies: false,
    xXssProtection: false,
  };
}

/** Routes for probes and scrapers: never rate-limited, never shed (see above). */
export const OPERATIONS_ROUTES: ReadonlySet<string> = new Set(['/healthz', '/readyz', '/metrics']);

const isOperations = (request: FastifyRequest) => OPERATIONS_ROUTES.has(request.routeOptions?.url ?? '');

export interface ProtectionOptions {
  /** Origins allowed by CORS; [] switches CORS off; ['*'] allows any origin. */
  corsOrigins: string[];
  /** Requests per client (IP) per window; 0 switches rate limiting off. */
  rateLimitMax: number;
  rateLimitWindowMs: number;
  /** Shedding thresholds; 0 switches a check off. */
  maxEventLoopDelayMs: number;
  maxHeapUsedBytes: number;
  maxRssBytes: number;
  /** Seconds a client is told to wait (Retry-After) on a 503. */
  retryAfterSeconds: number;
  /** How often the pressure figures are sampled, ms (1000 in service; tests shorten it). */
  sampleIntervalMs?: number;
}

const plugin: FastifyPluginAsync<ProtectionOptions> = async (app, options) => {
  // Shutdown: from preClose on, a request arriving on a kept-alive connection gets a 503 problem
  // (fastify's own 503 on closing is plain JSON, so it is switched off in app.ts in favour of this).
  let draining = false;
  app.addHook('preClose', async () => {
    draining = true;
  });
  // Security headers: the API set on JSON responses, helmet's defaults on the pages; /docs sets its own CSP
  // (swagger-ui's scripts and styles, by hash) through @fastify/swagger-ui's staticCSP. When CORS is
  // on, responses may be read by other origins, so Cross-Origin-Resource-Policy says so.
  const resourcePolicy = { policy: options.corsOrigins.length > 0 ? ('cross-origin' as const) : ('same-origin' as const) };
  const apiHeaders = securityHeaders(apiHeaderOptions(resourcePolicy));
  const pageHeaders = securityHeaders({ crossOriginResourcePolicy: resourcePolicy });
  // One hook for both (headers, then the shutdown check), in callback style: a hook on every request
  // should cost neither a promise nor a second pass through fastify's hook runner.
  app.addHook('onRequest', (request, reply, done) => {
    reply.headers(request.url.startsWith(PAGES_PREFIX) ? pageHeaders : apiHeaders);
    if (!draining) return done();
    reply.header('connection', 'close');
    done(new ProblemError('service-unavailable', 'the service is shutting down; retry on another instance or after the time given'));
  });

  if (options.corsOrigins.length > 0) {
    const any = options.corsOrigins.length === 1 && options.corsOrigins[0] === '*';
    await app.register(fastifyCors, {
      origin: any ? '*' : options.corsOrigins,
      methods: ['GET', 'HEAD', 'POST', 'OPTIONS'],
      allowedHeaders: ['content-type', 'accept', 'if-none-match', 'x-request-id'],
      exposedHeaders: ['etag', 'x-request-id', 'retry-after', 'x-ratelimit-limit', 'x-ratelimit-remaining', 'x-ratelimit-reset'],
      maxAge: 600,
    });
  }

  const pressureOn = options.maxEventLoopDelayMs > 0 || options.maxHeapUsedBytes > 0 || options.maxRssBytes > 0;
  await app.register(fastifyUnderPressure, {
    maxEventLoopDelay: options.maxEventLoopDelayMs,
    maxHeapUsedBytes: options.maxHeapUsedBytes,
    maxRssBytes: options.maxRssBytes,
    sampleInterval: options.sampleIntervalMs ?? 1000,
    retryAfter: options.retryAfterSeconds,
    ...(pressureOn
      ? {
          pressureHandler: (request: FastifyRequest, _reply: unknown, type: string, value: number | undefined) => {
            if (isOperations(request)) return undefined; // answered anyway (see the top of this file)
            const what = type === 'eventLoopDelay' ? `event-loop delay ${Math.round(value ?? 0)} ms` : type === 'heapUsedBytes' ? 'heap in use' : type === 'rssBytes' ? 'resident memory' : type;
            request.log.warn({ pressure: type, value }, 'shedding load');
            return Promise.reject(new ProblemError('overloaded', `the service is overloaded (${what} over its limit); retry after the time given`));
          },
        }
      : {}),
  });

  if (options.rateLimitMax > 0) {
    await app.register(fastifyRateLimit, {
      global: true,
      max: options.rateLimitMax,
      timeWindow: options.rateLimitWindowMs,
      allowList: (request) => isOperations(request),
      errorResponseBuilder: (_request, context) =>
        new ProblemError('too-many-requests', `more than ${context.max} requests in ${options.rateLimitWindowMs / 1000} s from this client; retry in ${context.after}`),
    });
  }
};

/** Named plugin (not encapsulated: its hooks cover every route registered after it). */
export const protectionPlugin = fp(plugin, { name: 'spacetide-protection', fastify: '5.x' });
