/**
 * Compute routes: one definition gives the POST (JSON body) route, the optional GET (query string)
 * route, request validation with zod, and the OpenAPI description. Handlers receive validated input
 * and return a plain object; errors are thrown as ProblemError and rendered by the error handler.
 */
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import { z } from 'zod';
import { ProblemError, type FieldError } from '../errors.js';

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
 * JSON Schema of the success response, handed to fastify so that fast-json-stringify serialises it
 * (about twice as fast as JSON.stringify for these documents); it also drops anything undeclared.
 */
function responseSchema(route: ComputeRoute<unknown, unknown>): Record<string, unknown> {
  return z.toJSONSchema(route.response, { target: 'draft-7', io: 'output', unrepresentable: 'any' }) as Record<string, unknown>;
}

export function registerComputeRoute<TIn, TQuery>(app: FastifyInstance, route: ComputeRoute<TIn, TQuery>): void {
  const schema = { response: { 200: responseSchema(route as ComputeRoute<unknown, unknown>) } };
  app.post(route.path, { schema }, async (request: FastifyRequest, reply: FastifyReply) => {
    const input = parseOr400(route.body, request.body);
    reply.type('application/json');
    return route.compute(input);
  });
  const get = route.get;
  if (get) {
    app.get(route.path, { schema }, async (request: FastifyRequest, reply: FastifyReply) => {
      try {
        const query = parseOr400(get.query, request.query ?? {});
        const input = get.toInput(query);
        const out = route.compute(input);
        reply.type('application/json');
        return out;
      } catch (err) {
        throw remapPaths(err, get.pathFor);
      }
    });
  }
}
