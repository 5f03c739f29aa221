/**
 * The OpenAPI 3.1 document, built from the routes' zod schemas and the problem catalogue.
 * `npm run openapi` writes it to openapi/openapi.json; a test fails when the committed file differs.
 */
import { z } from 'zod';
import { PROBLEMS, problemTypeUri } from '../errors.js';
import { VERSION } from '../version.js';
import { LIMITS } from './inputs.js';
import { quantitiesResponse } from './quantities.js';
import { COMPUTE_ROUTES } from './registry.js';
import { CAUTION } from './responses.js';
import { sweepRequest, sweepResponse } from './sweep.js';

type Json = Record<string, unknown>;

const REF = (id: string) => `#/components/schemas/${id}`;

/** JSON Schema of a zod schema; named sub-schemas become $refs into components, collected in `defs`. */
function schemaOf(schema: z.ZodType, io: 'input' | 'output', defs: Json): Json {
  const raw = JSON.stringify(z.toJSONSchema(schema, { target: 'draft-2020-12', io, unrepresentable: 'any' }));
  const out = JSON.parse(raw.replaceAll('"#/$defs/', `"${REF('')}`)) as Json;
  const inner = (out.$defs ?? {}) as Json;
  for (const [k, v] of Object.entries(inner)) defs[k] = v;
  delete out.$defs;
  delete out.$schema;
  const id = (z.globalRegistry.get(schema) as { id?: string } | undefined)?.id;
  if (id) {
    // A named top-level schema comes back as a $ref to its own entry in $defs, already merged.
    if (out.$ref !== REF(id)) defs[id] = out;
    return { $ref: REF(id) };
  }
  return out;
}

const problemSchema: Json = {
  type: 'object',
  description: 'RFC 9457 problem details.',
  required: ['type', 'title', 'status', 'detail'],
  properties: {
    type: { type: 'string', description: 'URI reference /problems/<code>.', enum: Object.keys(PROBLEMS).map((c) => problemTypeUri(c as keyof typeof PROBLEMS)) },
    title: { type: 'string' },
    status: { type: 'integer' },
    detail: { type: 'string' },
    instance: { type: 'string' },
    requestId: { type: 'string' },
    errors: {
      type: 'array',
      items: {
        type: 'object',
        required: ['path', 'message'],
        properties: { path: { type: 'string' }, message: { type: 'string' } },
      },
    },
  },
};

function problemResponses(codes: number[]): Json {
  const byStatus = new Map<number, string[]>();
  for (const [code, p] of Object.entries(PROBLEMS)) {
    if (!codes.includes(p.status)) continue;
    byStatus.set(p.status, [...(byStatus.get(p.status) ?? []), `${code}: ${p.title}`]);
  }
  return Object.fromEntries(
    [...byStatus].map(([status, titles]) => [
      String(status),
      {
        description: titles.join('; '),
        content: { 'application/problem+json': { schema: { $ref: REF('Problem') } } },
      },
    ]),
  );
}

function queryParameters(query: z.ZodType): Json[] {
  const holder: Json = {};
  const ref = schemaOf(query, 'input', holder);
  const s = (ref.$ref ? holder[String(ref.$ref).slice(REF('').length)] : ref) as Json;
  const props = (s.properties ?? {}) as Record<string, Json>;
  const required = new Set((s.required as string[] | undefined) ?? []);
  return Object.entries(props).map(([name, schema]) => ({
    name,
    in: 'query',
    required: required.has(name),
    ...(schema.description ? { description: schema.description } : {}),
    schema,
  }));
}

/** /healthz, /readyz and /metrics (src/plugins/health.ts, metrics.ts). */
function operationsPaths(): Json {
  const cache = {
    type: 'object',
    required: ['backend', 'state'],
    properties: {
      backend: { type: 'string', enum: ['memory', 'disabled', 'redis'] },
      state: { type: 'string', enum: ['ready', 'degraded'], description: 'degraded: the store is unreachable and every request is computed (answers stay correct).' },
      detail: { type: 'string' },
    },
  };
  const serviceRef = { type: 'object', required: ['name', 'version'], properties: { name: { type: 'string' }, version: { type: 'string' } } };
  return {
    '/healthz': {
      get: {
        operationId: 'healthz',
        summary: 'Liveness: the process runs and its event loop answers',
        description: 'Answers 200 whenever the process can answer at all, also while it sheds load.',
        tags: ['operations'],
        responses: {
          '200': {
            description: 'Alive.',
            content: { 'application/json': { schema: { type: 'object', required: ['status', 'service'], properties: { status: { const: 'alive' }, service: serviceRef } } } },
          },
          ...problemResponses([503]),
        },
      },
    },
    '/readyz': {
      get: {
        operationId: 'readyz',
        summary: 'Readiness: ready to serve, with the result-cache backend and its state',
        description: '503 (problem details with Retry-After, and the cache state) while the service sheds load or shuts down. A degraded cache leaves the service ready: requests are then computed.',
        tags: ['operations'],
        responses: {
          '200': {
            description: 'Ready.',
            content: { 'application/json': { schema: { type: 'object', required: ['status', 'cache', 'service'], properties: { status: { const: 'ready' }, cache, service: serviceRef } } } },
          },
          ...problemResponses([503]),
        },
      },
    },
    '/metrics': {
      get: {
        operationId: 'metrics',
        summary: 'Metrics in the Prometheus text format',
        description: 'Requests and latency by route pattern and status, result-cache hits, misses, evictions and sizes, load shedding, event-loop lag, heap and resident memory. Served when METRICS_ENABLED is true (the default).',
        tags: ['operations'],
        responses: { '200': { description: 'The metrics.', content: { 'text/plain': { schema: { type: 'string' } } } } },
      },
    },
  };
}

export function buildOpenApiDocument(): Json {
  const defs: Json = { Problem: problemSchema };
  const paths: Json = {};
  // Any route may shed load (503 overloaded), refuse while shutting down (503) or, with rate
  // limiting on, refuse a client over its rate (429); each with Retry-After.
  const errors = problemResponses([400, 413, 415, 422, 429, 500, 503]);
  for (const route of COMPUTE_ROUTES) {
    const ok = {
      description: 'The result.',
      content: { 'application/json': { schema: schemaOf(route.response, 'output', defs) } },
    };
    const item: Json = {
      post: {
        operationId: `${route.operationId}Post`,
        summary: route.summary,
        description: route.description,
        tags: [route.tag],
        requestBody: {
          required: true,
          content: { 'application/json': { schema: schemaOf(route.body, 'input', defs) } },
        },
        responses: { '200': ok, ...errors },
      },
    };
    if (route.get) {
      item.get = {
        operationId: `${route.operationId}Get`,
        summary: route.summary,
        description: `${route.description} The same as POST, with the body and point as flat query parameters.`,
        tags: [route.tag],
        parameters: queryParameters(route.get.query),
        responses: { '200': ok, ...problemResponses([400, 422, 429, 500, 503]) },
      };
    }
    paths[route.path] = item;
  }
  paths['/v1/sweep'] = {
    post: {
      operationId: 'sweep',
      summary: 'Sweep quantities over one or two axes',
      description:
        'Evaluates sweepable quantities (see /v1/quantities) over a grid of one or two axes — r, altitude, theta, latitude, spin, charge or mass, linear or logarithmic — around one body and a point template. Columnar JSON by default (null where a quantity does not exist, with the reasons counted per column); CSV, streamed, when the Accept header prefers text/csv. Limited to SWEEP_MAX_POINTS grid points (default 1,000,000; larger: 413).',
      tags: ['sweeps'],
      requestBody: { required: true, content: { 'application/json': { schema: schemaOf(sweepRequest, 'input', defs) } } },
      responses: {
        '200': {
          description: 'The sweep.',
          content: {
            'application/json': { schema: schemaOf(sweepResponse, 'output', defs) },
            'text/csv': { schema: { type: 'string', description: 'Header row naming each column with its unit, then one row per grid point; empty fields are nulls.' } },
          },
        },
        ...problemResponses([400, 413, 415, 422, 429, 500, 503]),
      },
    },
  };
  Object.assign(paths, operationsPaths());
  paths['/v1/quantities'] = {
    get: {
      operationId: 'quantities',
      summary: 'The quantity catalogue',
      description: 'Every quantity the service returns: name, SI unit, geometric unit, meaning, endpoint, and whether it can be swept.',
      tags: ['catalogue'],
      responses: { '200': { description: 'The catalogue.', content: { 'application/json': { schema: schemaOf(quantitiesResponse, 'output', defs) } } } },
    },
  };
  paths['/problems/{code}'] = {
    get: {
      operationId: 'problemType',
      summary: 'Describes a problem type',
      tags: ['catalogue'],
      parameters: [{ name: 'code', in: 'path', required: true, schema: { type: 'string', enum: Object.keys(PROBLEMS) } }],
      responses: {
        '200': {
          description: 'The problem type.',
          content: {
            'application/json': {
              schema: {
                type: 'object',
                required: ['type', 'title', 'status', 'description'],
                properties: { type: { type: 'string' }, title: { type: 'string' }, status: { type: 'integer' }, description: { type: 'string' } },
              },
            },
          },
        },
        ...problemResponses([404]),
      },
    },
  };
  return {
    openapi: '3.1.0',
    info: {
      title: 'spacetide',
      version: VERSION,
      description: [
        'General relativity for clocks, light and free-falling matter around a mass: black holes of any mass, spin and charge (the Kerr–Newman family) and ordinary bodies such as the Earth and the Sun.',
        'Quantities in requests are numbers in SI units or strings with a unit ("10 Msun", "6 rg", "35786 km", "60 deg"); every quantity in a response is { value (SI), unit, geometric (G = c = M = 1), reason (when null) }.',
        `Limits: request body ≤ the configured BODY_LIMIT_BYTES (default 65536); quantity strings ≤ 64 characters; mass ${LIMITS.massMinKg}–${LIMITS.massMaxKg} kg; r ≤ ${LIMITS.maxRadiusGeometric} GM/c²; |spin|, |charge| ≤ ${LIMITS.maxSpinOrCharge.toExponential()} for bodies with a surface.`,
        CAUTION,
      ].join('\n\n'),
    },
    tags: [
      { name: 'spacetime', description: 'The spacetime of one body, and quantities at a point.' },
      { name: 'clocks', description: 'Clocks and proper time: observers, clock comparisons, intervals.' },
      { name: 'orbits', description: 'Characteristic orbits, circular-orbit frequencies and weak-field precessions.' },
      { name: 'light', description: 'Light bending, signal delay and black-hole shadows.' },
      { name: 'tides', description: 'Curvature seen by observers: tidal stretching and squeezing, tidal disruption of stars.' },
      { name: 'sweeps', description: 'Grids of quantities for plots and tables.' },
      { name: 'catalogue', description: 'What the service computes and how it reports errors.' },
      { name: 'operations', description: 'Probes and metrics for orchestrators and monitoring; never rate-limited or shed.' },
    ],
    paths,
    components: { schemas: defs },
  };
}
