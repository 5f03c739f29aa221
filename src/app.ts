/**
 * buildApp: the fastify instance with every route and plugin wired; it never listens (server.ts
 * does). Tests use it with inject().
 */
import { randomUUID } from 'node:crypto';
import fastifySwagger from '@fastify/swagger';
import fastifySwaggerUi from '@fastify/swagger-ui';
import Fastify, { type FastifyInstance, type FastifyServerOptions } from 'fastify';
import { AccessLog } from './access-log.js';
import { readCommittedOpenApi } from './api/openapi-file.js';
import { registerQuantities } from './api/quantities.js';
import { COMPUTE_ROUTES } from './api/registry.js';
import { service } from './api/responses.js';
import { registerComputeRoute } from './api/route.js';
import { registerSweepRoute } from './api/sweep-route.js';
import { resultCachePlugin } from './cache/plugin.js';
import { MAX_ALIAS_BYTES, RequestAliases } from './cache/request-aliases.js';
import { defaultConfig, type Config } from './config.js';
import { installErrorHandling, problemBody, sendProblem } from './error-handler.js';
import { PROBLEMS, problemTypeUri, type ProblemCode } from './errors.js';
import { healthPlugin } from './plugins/health.js';
import { metricsPlugin } from './plugins/metrics.js';
import { protectionPlugin } from './plugins/protection.js';

declare module 'fastify' {
  interface FastifyRequest {
    /** The JSON body as received (before parsing); undefined for requests without one. */
    rawBody?: string;
  }
}

export interface AppOptions {
  /**
   * The configuration; server.ts always passes the environment's. Without it: the defaults, except
   * that shedding on event-loop delay is off — in-process tests block the loop for seconds (module
   * compilation on a shared machine, large sweeps) and would be shed at random. Tests of shedding
   * pass a config that turns it on.
   */
  config?: Config;
  /** fastify logger option; defaults to pino at the configured level. Tests pass false. */
  logger?: FastifyServerOptions['logger'];
  /** How often the overload figures are sampled, ms (default 1000; tests shorten it). */
  pressureSampleIntervalMs?: number;
}

const SAFE_REQUEST_ID = /^[A-Za-z0-9._:-]{1,64}$/;

export async function buildApp(options: AppOptions = {}): Promise<FastifyInstance> {
  const config = options.config ?? defaultConfig({ MAX_EVENT_LOOP_DELAY_MS: 0 });
  const app = Fastify({
    logger: options.logger ?? { level: config.LOG_LEVEL },
    logController: new AccessLog(),
    bodyLimit: config.BODY_LIMIT_BYTES,
    requestTimeout: config.REQUEST_TIMEOUT_MS,
    // A client's x-request-id is kept when it is short and plain; otherwise a fresh UUID.
    requestIdHeader: false,
    genReqId: (req) => {
      const given = req.headers['x-request-id'];
      return typeof given === 'string' && SAFE_REQUEST_ID.test(given) ? given : randomUUID();
    },
    // The protection plugin answers requests that arrive while closing with a 503 problem instead.
    return503OnClosing: false,
    // Behind TRUST_PROXY_HOPS proxies, request.ip is the client's address from X-Forwarded-For.
    ...(config.TRUST_PROXY_HOPS > 0 ? { trustProxy: (_address: string, hop: number) => hop < config.TRUST_PROXY_HOPS } : {}),
    routerOptions: { maxParamLength: 200 },
  });

  // JSON only: without this, fastify's text/plain parser would hand a string to the schemas.
  app.removeContentTypeParser('text/plain');
  // JSON bodies are read as text, kept on the request for request aliasing (cache/request-aliases.ts)
  // and parsed by fastify's own JSON parser (secure-json-parse; __proto__ and constructor refused).
  const parseJson = app.getDefaultJsonParser('error', 'error');
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', { parseAs: 'string' }, (request, body, done) => {
    request.rawBody = body as string;
    parseJson(request, body as string, done);
  });
  app.addHook('onRequest', (request, reply, done) => {
    reply.header('x-request-id', request.id);
    done();
  });
  installErrorHandling(app, { retryAfterSeconds: config.RETRY_AFTER_S });

  await app.register(resultCachePlugin, {
    maxBytes: config.CACHE_MAX_BYTES,
    ...(config.REDIS_URL === undefined
      ? {}
      : {
          redis: {
            url: config.REDIS_URL,
            keyPrefix: config.REDIS_KEY_PREFIX,
            ttlSeconds: config.CACHE_TTL_SECONDS,
            commandTimeoutMs: config.REDIS_COMMAND_TIMEOUT_MS,
            connectTimeoutMs: config.REDIS_CONNECT_TIMEOUT_MS,
            maxEntryBytes: config.REDIS_MAX_ENTRY_BYTES,
          },
        }),
  });
  // Before every route: the metrics hook, shedding, rate limits, CORS and headers cover them all.
  await app.register(metricsPlugin, { expose: config.METRICS_ENABLED });
  await app.register(protectionPlugin, {
    corsOrigins: config.CORS_ORIGINS,
    rateLimitMax: config.RATE_LIMIT_MAX,
    rateLimitWindowMs: config.RATE_LIMIT_WINDOW_MS,
    maxEventLoopDelayMs: config.MAX_EVENT_LOOP_DELAY_MS,
    maxHeapUsedBytes: config.MAX_HEAP_USED_BYTES,
    maxRssBytes: config.MAX_RSS_BYTES,
    retryAfterSeconds: config.RETRY_AFTER_S,
    ...(options.pressureSampleIntervalMs ? { sampleIntervalMs: options.pressureSampleIntervalMs } : {}),
  });
  await app.register(healthPlugin, { retryAfterSeconds: config.RETRY_AFTER_S });
  // One alias table for every compute route (request texts start with the path, so they never
  // collide), bounded by a quarter of the in-memory cache's bound, at most MAX_ALIAS_BYTES; none when
  // that cache is off (the routes alias only in front of the in-memory store).
  const aliasBytes = Math.min(MAX_ALIAS_BYTES, Math.floor(config.CACHE_MAX_BYTES / 4));
  const aliases = aliasBytes > 0 ? new RequestAliases(aliasBytes) : undefined;
  for (const route of COMPUTE_ROUTES) registerComputeRoute(app, route, app.resultCache, aliases);
  registerSweepRoute(app, config.SWEEP_MAX_POINTS, app.resultCache);
  registerQuantities(app);

  app.get('/problems/:code', async (request, reply) => {
    const { code } = request.params as { code: string };
    if (!Object.hasOwn(PROBLEMS, code)) {
      return sendProblem(reply, problemBody(request, 'not-found', `no problem type "${code.slice(0, 64)}"`));
    }
    const p = PROBLEMS[code as ProblemCode];
    return { type: problemTypeUri(code as ProblemCode), title: p.title, status: p.status, description: p.description };
  });

  const document = readCommittedOpenApi();
  if (document) {
    const body = JSON.stringify(document);
    app.get('/openapi.json', async (_req, reply) => {
      reply.type('application/json').header('cache-control', 'public, max-age=300');
      return body;
    });
    await app.register(fastifySwagger, { mode: 'static', specification: { document: document as never } });
    // swagger-ui sets its own Content-Security-Policy (its scripts and styles by hash) over helmet's.
    await app.register(fastifySwaggerUi, { routePrefix: '/docs', staticCSP: true });
  }

  app.get('/', async () => ({
    service,
    links: { openapi: '/openapi.json', docs: '/docs', quantities: '/v1/quantities', spacetime: '/v1/spacetime', local: '/v1/local', health: '/healthz', ready: '/readyz' },
  }));
  return app;
}
