/**
 * Probes: GET /healthz (the process is alive and its event loop answers) and GET /readyz (ready to
 * serve: not shutting down, not shedding load; with the result-cache backend and its state).
 * Both answer 503 while the service shuts down (protection.ts), like every route.
 *
 * A degraded cache (a shared store that is unreachable) leaves the service ready: every request is
 * then computed, answers stay correct, only slower; /readyz reports the state and the metrics count it.
 */
import type { FastifyPluginAsync } from 'fastify';
import fp from 'fastify-plugin';
import { service } from '../api/responses.js';
import { problemBody, sendProblem } from '../error-handler.js';

export interface HealthOptions {
  /** Seconds a client is told to wait (Retry-After) when not ready. */
  retryAfterSeconds: number;
}

const plugin: FastifyPluginAsync<HealthOptions> = async (app, options) => {
  app.get('/healthz', async (_request, reply) => {
    reply.header('cache-control', 'no-store');
    return { status: 'alive', service };
  });

  app.get('/readyz', async (request, reply) => {
    reply.header('cache-control', 'no-store');
    // While shutting down, the protection plugin answers every request (this one too) with a 503
    // before it gets here; what is left to check is overload.
    const cache = app.resultCache.health();
    if (app.hasDecorator('isUnderPressure') && app.isUnderPressure()) {
      reply.header('retry-after', String(options.retryAfterSeconds));
      const body = problemBody(request, 'overloaded', 'not ready: the service is shedding load');
      return sendProblem(reply, { ...body, cache } as typeof body);
    }
    return { status: 'ready', cache, service };
  });
};

export const healthPlugin = fp(plugin, { name: 'spacetide-health', fastify: '5.x', dependencies: ['spacetide-result-cache'] });
