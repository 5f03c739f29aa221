/**
 * What every response must satisfy, whatever the request: a documented status (never 5xx), problem
 * details for refusals, and for a 200 a document that matches the route's published schema with every
 * null quantity explained. Shared by the hostile-input property tests.
 */
import type { LightMyRequestResponse } from 'fastify';
import type { z } from 'zod';
import { expect } from 'vitest';
import { COMPUTE_ROUTES } from '../../src/api/registry.js';

const ALLOWED = new Set([200, 400, 404, 413, 415, 422]);
const SCHEMAS: Record<string, z.ZodType> = Object.fromEntries(COMPUTE_ROUTES.map((r) => [r.path, r.response]));

/**
 * fast-check settings: bounded run counts (HOSTILE_RUNS_SCALE=20 for a longer soak); a run that takes
 * over 5 s counts as a hang and fails.
 */
const SCALE = Math.max(1, Number(process.env.HOSTILE_RUNS_SCALE) || 1);
export const RUNS = (numRuns: number) => ({ numRuns: Math.round(numRuns * SCALE), timeout: 5_000 });

/**
 * Walks a response document: every { value, unit } object is a quantity; a null value must carry a
 * reason (a NaN or Infinity would have been serialised as null silently), a number must be finite and
 * then carry no reason, and a geometric value must be null exactly when the SI value is.
 */
export function checkQuantities(doc: unknown, where: string): void {
  if (Array.isArray(doc)) {
    doc.forEach((d, i) => checkQuantities(d, `${where}[${i}]`));
    return;
  }
  if (doc === null || typeof doc !== 'object') {
    if (typeof doc === 'number') expect(Number.isFinite(doc), where).toBe(true);
    return;
  }
  const o = doc as Record<string, unknown>;
  if ('unit' in o && 'value' in o) {
    if (o.value === null) {
      expect(typeof o.reason === 'string' && o.reason.trim().length > 0, `${where}: null without a reason`).toBe(true);
      if (o.geometric !== undefined) expect(o.geometric, `${where}: SI null but geometric not`).toBeNull();
    } else {
      expect(Number.isFinite(o.value), where).toBe(true);
      expect(o.reason, `${where}: a value with a reason`).toBeUndefined();
      if (o.geometric !== undefined) expect(o.geometric, `${where}: geometric null but SI not`).not.toBeNull();
    }
  }
  for (const [k, v] of Object.entries(o)) checkQuantities(v, `${where}.${k}`);
}

/** The properties every response must have, whatever the request. */
export function checkResponse(res: LightMyRequestResponse, path: string, request: string): void {
  const where = `${path} <- ${request.slice(0, 300)}`;
  expect(res.statusCode, `${where}\n${res.body.slice(0, 500)}`).toBeLessThan(500);
  expect(ALLOWED.has(res.statusCode), `${where}: status ${res.statusCode}\n${res.body.slice(0, 500)}`).toBe(true);
  if (res.statusCode === 200) {
    expect(res.headers['content-type'], where).toMatch(/^application\/json\b/);
    const json = res.json<Record<string, unknown>>();
    const schema = SCHEMAS[path];
    if (schema) {
      const parsed = schema.safeParse(json);
      expect(parsed.success, `${where}: ${parsed.success ? '' : JSON.stringify(parsed.error.issues).slice(0, 500)}`).toBe(true);
      checkQuantities(json, where);
    }
  } else {
    expect(res.headers['content-type'], where).toMatch(/^application\/problem\+json\b/);
    const p = res.json<{ type: unknown; title: unknown; status: unknown; detail: unknown; requestId: unknown }>();
    expect(p.status, where).toBe(res.statusCode);
    expect(p.type, where).toMatch(/^\/problems\/[a-z-]+$/);
    expect(typeof p.title, where).toBe('string');
    expect(typeof p.detail, where).toBe('string');
    expect(typeof p.requestId, where).toBe('string');
  }
}
