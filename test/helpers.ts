/**
 * Small helpers shared by the API tests.
 */
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, expect } from 'vitest';
import { buildApp } from '../src/app.js';

/** |actual/expected − 1|, with an absolute fallback at expected = 0. */
export function relErr(actual: number, expected: number): number {
  return expected === 0 ? Math.abs(actual) : Math.abs(actual / expected - 1);
}

export function expectRel(actual: number | null | undefined, expected: number, tol: number): void {
  expect(actual, `expected ≈ ${expected}`).toBeTypeOf('number');
  expect(relErr(actual as number, expected), `${actual} vs ${expected}`).toBeLessThanOrEqual(tol);
}

/** One app per test file, built before and closed after; call inside the file's top level. */
export function useApp(): () => FastifyInstance {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp({ logger: false });
  });
  afterAll(async () => {
    await app.close();
  });
  return () => app;
}
