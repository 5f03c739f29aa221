/**
 * Maps every error to RFC 9457 problem details. Internals never leak on 5xx: the client gets the
 * catalogue's title and the request id; the log gets the error.
 */
import type { FastifyError, FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import { PROBLEMS, ProblemError, problemTypeUri, type FieldError, type ProblemCode } from './errors.js';

export interface ProblemBody {
  type: string;
  title: string;
  status: number;
  detail: string;
  instance: string;
  requestId: string;
  errors?: FieldError[];
}

export function problemBody(request: FastifyRequest, code: ProblemCode, detail: string, errors?: FieldError[]): ProblemBody {
  const p = PROBLEMS[code];
  const body: ProblemBody = {
    type: problemTypeUri(code),
    title: p.title,
    status: p.status,
    detail,
    instance: request.url.length > 512 ? `${request.url.slice(0, 512)}…` : request.url,
    requestId: String(request.id),
  };
  if (errors && errors.length > 0) body.errors = errors;
  return body;
}

export function sendProblem(reply: FastifyReply, body: ProblemBody): FastifyReply {
  return reply.code(body.status).type('application/problem+json').send(body);
}

/** Classifies a framework error (body parsing, limits, content type) by its code and status. */
function classify(err: FastifyError, request: FastifyRequest): { code: ProblemCode; detail: string } {
  const status = err.statusCode ?? 500;
  switch (err.code) {
    case 'FST_ERR_CTP_BODY_TOO_LARGE': {
      const limit = request.routeOptions?.bodyLimit;
      return {
        code: 'request-too-large',
        detail: limit ? `the request body is larger than BODY_LIMIT_BYTES = ${limit} bytes (documented limit)` : err.message,
      };
    }
    case 'FST_ERR_CTP_INVALID_MEDIA_TYPE':
    case 'FST_ERR_CTP_INVALID_CONTENT_LENGTH':
      return status === 415
        ? { code: 'unsupported-media-type', detail: 'POST bodies must be application/json' }
        : { code: 'invalid-request', detail: err.message };
    case 'FST_ERR_CTP_EMPTY_JSON_BODY':
      return { code: 'malformed-json', detail: 'the request body is empty; send a JSON object' };
    case 'FST_ERR_CTP_INVALID_JSON_BODY':
      return { code: 'malformed-json', detail: err.message };
  }
  if (err instanceof SyntaxError || err.name === 'SyntaxError') return { code: 'malformed-json', detail: err.message };
  if (status === 413) return { code: 'request-too-large', detail: err.message };
  if (status === 415) return { code: 'unsupported-media-type', detail: 'POST bodies must be application/json' };
  if (status === 404) return { code: 'not-found', detail: err.message };
  if (status === 429) return { code: 'too-many-requests', detail: err.message };
  if (status === 503) return { code: 'service-unavailable', detail: err.message };
  if (status >= 400 && status < 500) return { code: 'invalid-request', detail: err.message };
  return { code: 'internal-error', detail: 'an internal error occurred; quote the requestId when reporting it' };
}

export interface ErrorHandlingOptions {
  /** Retry-After (seconds) on a 503 that does not set its own. */
  retryAfterSeconds?: number;
}

export function installErrorHandling(app: FastifyInstance, options: ErrorHandlingOptions = {}): void {
  const retryAfter = String(options.retryAfterSeconds ?? 5);
  app.setErrorHandler((err: FastifyError, request, reply) => {
    // Every 503 (shedding, shutting down) and 429 tells the client when to come back.
    const status = err instanceof ProblemError ? err.status : (err.statusCode ?? 500);
    if ((status === 503 || status === 429) && !reply.hasHeader('retry-after')) reply.header('retry-after', retryAfter);
    if (err instanceof ProblemError) {
      return sendProblem(reply, problemBody(request, err.code, err.message, err.errors));
    }
    const { code, detail } = classify(err, request);
    if (PROBLEMS[code].status >= 500) request.log.error({ err }, 'internal error');
    else request.log.info({ code: err.code, status: PROBLEMS[code].status }, 'request refused');
    return sendProblem(reply, problemBody(request, code, detail));
  });
  app.setNotFoundHandler((request, reply) =>
    sendProblem(reply, problemBody(request, 'not-found', `no route ${request.method} ${request.url.split('?')[0]?.slice(0, 200)}`)),
  );
}
