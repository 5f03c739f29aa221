/**
 * The parts of autocannon 8's programmatic API the load tests use beyond bench/autocannon.d.ts (the
 * package ships no types): a fixed overall rate and a list of requests, each possibly rewritten by
 * setupRequest. Shapes follow node_modules/autocannon/README.md, "autocannon(opts[, cb])".
 */
declare module 'autocannon' {
  export interface RequestSpec {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
    /** Rewrites the request before it is sent; returning a falsy value restarts the list. */
    setupRequest?: (request: RequestSpec, context: Record<string, unknown>) => RequestSpec;
  }

  export interface Options {
    /** Requests per second over all connections. */
    overallRate?: number;
    /** Requests sent in turn by each connection. */
    requests?: RequestSpec[];
  }
}
