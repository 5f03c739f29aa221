/**
 * The catalogue of problem types (RFC 9457). Every error the service sends is one of these; routes
 * throw `ProblemError` with a code from here and the error handler renders it as
 * application/problem+json. The `type` of each problem is the relative URI `/problems/<code>`, which
 * the service itself serves with the title and description below.
 */

export interface ProblemType {
  status: number;
  title: string;
  description: string;
}

export const PROBLEMS = {
  'invalid-request': {
    status: 400,
    title: 'The request is not valid',
    description:
      'A field is missing, of the wrong type, unknown, or cannot be read as a quantity with a unit. The `errors` list names each field by its path.',
  },
  'malformed-json': {
    status: 400,
    title: 'The request body is not valid JSON',
    description: 'The body of a POST must be a single JSON object.',
  },
  'not-found': {
    status: 404,
    title: 'No such resource',
    description: 'The path (or the method on it) is not part of the API; see /openapi.json.',
  },
  'request-too-large': {
    status: 413,
    title: 'The request is over its size limit',
    description: 'The body, or a quantity in it, exceeds a documented limit; `detail` names the limit.',
  },
  'unsupported-media-type': {
    status: 415,
    title: 'Unsupported content type',
    description: 'POST bodies must be sent as application/json.',
  },
  'unphysical-input': {
    status: 422,
    title: 'The input is well-formed but not physical',
    description:
      'For example a negative mass, spin² + charge² > 1 for a body without a surface (a naked singularity), a point inside the body or at the singularity. `detail` and `errors` say which.',
  },
  'tolerance-not-met': {
    status: 422,
    title: 'The requested accuracy cannot be reached',
    description:
      'A numerical method (quadrature, integration) stopped at its documented limit before meeting the tolerance; no inaccurate number is returned. Loosen the tolerance or change the request.',
  },
  'too-many-requests': {
    status: 429,
    title: 'Too many requests',
    description: 'The client has sent more requests than RATE_LIMIT_MAX within RATE_LIMIT_WINDOW_MS; retry after the time given in Retry-After.',
  },
  'internal-error': {
    status: 500,
    title: 'Internal error',
    description:
      'The service failed in a way it should not. No internals are disclosed; the request id in the response and the logs identifies the case.',
  },
  'service-unavailable': {
    status: 503,
    title: 'Service unavailable',
    description: 'The service is shutting down; retry after the time given in Retry-After (another instance may answer at once).',
  },
  overloaded: {
    status: 503,
    title: 'The service is overloaded',
    description:
      'The service is shedding load because its event-loop delay or memory is over the configured limit (MAX_EVENT_LOOP_DELAY_MS, MAX_HEAP_USED_BYTES, MAX_RSS_BYTES); retry after the time given in Retry-After.',
  },
} as const satisfies Record<string, ProblemType>;

export type ProblemCode = keyof typeof PROBLEMS;

export interface FieldError {
  /** JSON-pointer-like path of the offending field, e.g. "/body/spin" or "query.mass". */
  path: string;
  message: string;
}

/** An error that the service reports to the client as problem details. */
export class ProblemError extends Error {
  readonly code: ProblemCode;
  readonly status: number;
  readonly errors: FieldError[] | undefined;

  constructor(code: ProblemCode, detail: string, errors?: FieldError[]) {
    super(detail);
    this.name = 'ProblemError';
    this.code = code;
    this.status = PROBLEMS[code].status;
    this.errors = errors;
  }
}

/** Shorthand for a 422 about one field. */
export function unphysical(path: string, message: string): ProblemError {
  return new ProblemError('unphysical-input', message, [{ path, message }]);
}

/** Shorthand for a 400 about one field. */
export function invalid(path: string, message: string): ProblemError {
  return new ProblemError('invalid-request', message, [{ path, message }]);
}

export function problemTypeUri(code: ProblemCode): string {
  return `/problems/${code}`;
}
