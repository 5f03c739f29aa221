/**
 * The part of autocannon 8's programmatic API that the benchmarks use (the package ships no types).
 * Shapes follow node_modules/autocannon/README.md, sections "autocannon(opts[, cb])" and "Results".
 */
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';

  export interface Histogram {
    average: number;
    mean: number;
    stddev: number;
    min: number;
    max: number;
    total: number;
    p50: number;
    p99: number;
  }

  export interface Result {
    url: string;
    requests: Histogram;
    latency: Histogram;
    throughput: Histogram;
    /** Seconds. */
    duration: number;
    errors: number;
    timeouts: number;
    mismatches: number;
    non2xx: number;
    connections: number;
    statusCodeStats: Record<string, { count: number }>;
  }

  export interface Options {
    url: string;
    connections?: number;
    /** Seconds. */
    duration?: number;
    method?: string;
    body?: string | Buffer;
    headers?: Record<string, string>;
    /** Seconds, per request. */
    timeout?: number;
    warmup?: { connections?: number; duration?: number };
  }

  /** Emits 'response' (client, statusCode, resBytes, responseTime in ms) for each response. */
  export interface Instance extends EventEmitter, PromiseLike<Result> {
    stop(): void;
  }

  export default function autocannon(options: Options): Instance;
}
