/**
 * POST /v1/sweep and its parts: every grid value equal to the single-point /v1/local and
 * /v1/spacetime values (property over random sweeps), CSV that parses back to the same numbers,
 * content negotiation, the point limit (413), each kind of bad input, and the calculator request
 * (flow speed, clock rate and hover acceleration from 1 rg to 100 rg for spins 0 to 0.99).
 */
import Fastify, { type FastifyInstance } from 'fastify';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeLocal } from '../../src/api/local.js';
import { computeSpacetime } from '../../src/api/spacetime.js';
import { sweepResponse, SWEEPABLE_QUANTITIES, type PreparedSweep, type SweepResponse } from '../../src/api/sweep.js';
import { computeSweepColumns } from '../../src/api/sweep-columns.js';
import { prepareSweep } from '../../src/api/sweep-prepare.js';
import { sweepCsvChunks, sweepJson } from '../../src/api/sweep-output.js';
import { prefersCsv, registerSweepRoute } from '../../src/api/sweep-route.js';
import { ProblemError } from '../../src/errors.js';
import { installErrorHandling } from '../../src/error-handler.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = Fastify({ logger: false });
  installErrorHandling(app);
  registerSweepRoute(app, 1_000_000);
  await app.ready();
});
afterAll(async () => {
  await app.close();
});

const post = (payload: unknown, accept?: string) =>
  app.inject({ method: 'POST', url: '/v1/sweep', payload: payload as object, headers: accept ? { accept } : {} });

const at = (p: number | Float64Array, i: number) => (typeof p === 'number' ? p : p[i]!);

/** Parses CSV text into rows of numbers (null for an empty field), checking the header. */
function parseCsv(text: string): { header: string[]; rows: (number | null)[][] } {
  const lines = text.split('\r\n');
  expect(lines.pop()).toBe('');
  const header = lines.shift()!.split(',');
  return { header, rows: lines.map((l) => l.split(',').map((f) => (f === '' ? null : Number(f)))) };
}

/** The single-point request equivalent to grid point i (inputs that reproduce its exact values). */
function singleAt(p: PreparedSweep, body: Record<string, unknown>, i: number) {
  const g = p.grid;
  const b: Record<string, unknown> = { ...body, spin: at(g.a, i), charge: at(g.q, i) };
  const k = p.axes.findIndex((a) => a.variable === 'mass');
  if (k >= 0) b.mass = p.axes[k]!.values[k === 0 ? Math.floor(i / (p.shape[1] ?? 1)) : i % p.shape[1]!];
  return { body: b, point: { r: `${at(g.r, i)} rg`, theta: at(g.theta, i) } };
}

describe('sweep values equal the single-point endpoints', () => {
  const quantityArb = fc.subarray([...SWEEPABLE_QUANTITIES], { minLength: 1, maxLength: 5 });
  const axisArb = fc.oneof(
    fc.record({ variable: fc.constant('r'), from: fc.constantFrom('0.5 rg', '1 rg', '2 rg', '5 rg'), to: fc.constantFrom('3 rg', '20 rg', '100 rg'), spacing: fc.constantFrom('linear', 'log') }),
    fc.record({ variable: fc.constant('theta'), from: fc.constantFrom('0 deg', '10 deg', '-10 deg'), to: fc.constantFrom('90 deg', '180 deg', '200 deg'), spacing: fc.constant('linear') }),
    fc.record({ variable: fc.constant('spin'), from: fc.constantFrom(0, 0.3), to: fc.constantFrom(0.99, 1, 1.3), spacing: fc.constant('linear') }),
    fc.record({ variable: fc.constant('charge'), from: fc.constantFrom(-0.5, 0), to: fc.constantFrom(0.4, 0.9), spacing: fc.constant('linear') }),
    fc.record({ variable: fc.constant('mass'), from: fc.constantFrom('1 Msun', 1e25), to: fc.constantFrom('4e6 Msun', 1e31), spacing: fc.constant('log') }),
  );
  const requestArb = fc.record({
    spin: fc.constantFrom(0, 0.5, 0.9),
    charge: fc.constantFrom(0, 0.3),
    radius: fc.option(fc.constantFrom('6 rg', '3 rg'), { nil: undefined }),
    quantities: quantityArb,
    axes: fc.uniqueArray(axisArb, { minLength: 1, maxLength: 2, selector: (a) => a.variable }),
    counts: fc.tuple(fc.integer({ min: 1, max: 7 }), fc.integer({ min: 1, max: 7 })),
  });

  it('at every grid point: the same SI value and the same reason, or the same refusal', () => {
    fc.assert(
      fc.property(requestArb, (g) => {
        const body: Record<string, unknown> = { mass: '10 Msun', spin: g.spin, charge: g.charge };
        if (g.radius) body.radius = g.radius;
        const req = {
          body,
          point: { r: '7 rg', theta: '60 deg' },
          quantities: g.quantities,
          axes: g.axes.map((a, k) => ({ ...a, count: g.counts[k]! })),
        };
        let p: PreparedSweep;
        try {
          p = prepareSweep(req);
        } catch (err) {
          // Only a whole grid outside the domain is refused; then its first point is refused alone too.
          expect(err).toBeInstanceOf(ProblemError);
          expect((err as ProblemError).status).toBe(422);
          return;
        }
        const cols = computeSweepColumns(p);
        for (let i = 0; i < p.n; i++) {
          const single = singleAt(p, body, i);
          type Doc = { quantities: Record<string, { value: number | null; reason?: string }> };
          let doc: Doc | null = null;
          let spacetimeDoc: Doc | null = null;
          try {
            doc = computeLocal(single as never) as unknown as Doc;
          } catch (err) {
            expect((err as ProblemError).status).toBe(422);
          }
          try {
            spacetimeDoc = computeSpacetime({ body: single.body } as never) as unknown as Doc;
          } catch (err) {
            expect((err as ProblemError).status).toBe(422);
          }
          for (const c of cols.columns) {
            const source: Doc | null = c.info.endpoint === '/v1/local' ? doc : spacetimeDoc;
            const v = c.values[i]!;
            if (!source) {
              expect(Number.isNaN(v), `${c.info.name}[${i}] should be null`).toBe(true);
              expect(cols.reasons[c.codes[i]!]!.length).toBeGreaterThan(0);
              continue;
            }
            const q = source.quantities[c.info.name]!;
            if (q.value === null) {
              expect(Number.isNaN(v), `${c.info.name}[${i}]`).toBe(true);
              expect(cols.reasons[c.codes[i]!]).toBe(q.reason);
            } else {
              expect(Object.is(v, q.value), `${c.info.name}[${i}]: ${v} vs ${q.value}`).toBe(true);
            }
          }
        }
      }),
      { numRuns: 150 },
    );
  });
});

describe('POST /v1/sweep', () => {
  const calculator = {
    body: { mass: '10 Msun' },
    point: { theta: '90 deg' },
    quantities: ['flowSpeed', 'staticClockRate', 'zamoClockRate', 'hoverAcceleration'],
    axes: [
      { variable: 'spin', from: 0, to: 0.99, count: 12 },
      { variable: 'r', from: '1 rg', to: '100 rg', count: 199 },
    ],
  };

  it('answers the calculator request in JSON: flow speed c on each spin\'s horizon, nulls inside with reasons', async () => {
    const res = await post(calculator);
    expect(res.statusCode, res.body).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    const doc = res.json() as SweepResponse;
    expect(sweepResponse.safeParse(doc).success).toBe(true);
    expect(doc.shape).toEqual([12, 199]);
    expect(doc.columns.flowSpeed).toBeDefined();
    expect(doc.axes.map((a) => [a.variable, a.unit])).toEqual([['spin', '1'], ['r', 'm']]);
    const flow = doc.columns.flowSpeed!.values;
    expect(flow).toHaveLength(12 * 199);
    // spin 0: r = 2 rg is index 2 (step 0.5 rg); the flow speed there is c exactly.
    expect(flow[2]).toBe(299_792_458);
    const rate = doc.columns.staticClockRate!;
    expect(rate.values[0]).toBeNull();
    expect(rate.nullReasons[0]!.reason).toMatch(/inside the outer horizon/);
    expect(rate.nullReasons[0]!.firstIndex).toBe(0);
    // Far out (100 rg, last point) every clock runs.
    expect(rate.values[12 * 199 - 1]).toBeCloseTo(Math.sqrt(1 - 2 / 100), 12);
  });

  it('streams the same request as CSV that parses back to the same numbers', async () => {
    const json = (await post(calculator)).json() as SweepResponse;
    const res = await post(calculator, 'text/csv');
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    const { header, rows } = parseCsv(res.body);
    expect(header).toEqual(['spin [1]', 'r [m]', 'flowSpeed [m/s]', 'staticClockRate [1]', 'zamoClockRate [1]', 'hoverAcceleration [m/s^2]']);
    expect(rows).toHaveLength(12 * 199);
    rows.forEach((row, i) => {
      expect(row[0]).toBe(json.axes[0]!.values[Math.floor(i / 199)]);
      expect(row[1]).toBe(json.axes[1]!.values[i % 199]);
      calculator.quantities.forEach((n, k) => expect(row[2 + k]).toBe(json.columns[n]!.values[i]));
    });
  });

  it('writes JSON and CSV numbers that round-trip exactly to the typed arrays', () => {
    const p = prepareSweep({ body: 'sun', point: {}, quantities: ['staticClockOffset', 'escapeSpeed'], axes: [{ variable: 'altitude', from: '0 km', to: '1e9 km', count: 9000, spacing: 'linear' }] });
    const cols = computeSweepColumns(p);
    const doc = JSON.parse(sweepJson(p, cols)) as SweepResponse;
    const { rows } = parseCsv([...sweepCsvChunks(p, cols)].join(''));
    for (let i = 0; i < p.n; i++) {
      expect(doc.columns.staticClockOffset!.values[i]).toBe(cols.columns[0]!.values[i]);
      expect(rows[i]![1]).toBe(cols.columns[0]!.values[i]);
      expect(rows[i]![2]).toBe(cols.columns[1]!.values[i]);
      expect(rows[i]![0]).toBe(p.axes[0]!.values[i]);
    }
  });

  it('writes the JSON document in ASCII (\\u escapes), the same strings once parsed', async () => {
    const payload = { body: { mass: '10 Msun' }, point: { r: '10 rg' }, quantities: ['flowSpeed', 'staticClockRate'], axes: [{ variable: 'r', from: '1 rg', to: '5 rg', count: 9 }] };
    const p = prepareSweep(payload);
    const text = sweepJson(p, computeSweepColumns(p));
    expect(/^[\x20-\x7e]*$/.test(text)).toBe(true);
    const doc = JSON.parse(text) as SweepResponse;
    expect(doc.notes).toEqual(p.notes);
    expect(doc.notes.join(' ')).toMatch(/[²₁]/);
    expect(doc.columns.staticClockRate!.nullReasons[0]!.reason).toMatch(/inside the outer horizon/);
    const res = await post(payload);
    expect(res.body).toBe(text);
    expect(Number(res.headers['content-length'])).toBe(text.length);
  });

  it('prefers CSV only when the Accept header does', () => {
    expect(prefersCsv(undefined)).toBe(false);
    expect(prefersCsv('*/*')).toBe(false);
    expect(prefersCsv('text/csv')).toBe(true);
    expect(prefersCsv('application/json, text/csv;q=0.5')).toBe(false);
    expect(prefersCsv('application/json;q=0.4, text/csv')).toBe(true);
    expect(prefersCsv('text/*, application/json;q=0.9')).toBe(true);
  });

  it('refuses more points than the limit with 413 naming it', async () => {
    const res = await post({ ...calculator, axes: [{ variable: 'r', from: '3 rg', to: '9 rg', count: 1001 }, { variable: 'theta', from: 0, to: 1, count: 1000 }] });
    expect(res.statusCode).toBe(413);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.json().detail).toMatch(/1001000 points.*limit is 1000000/);
    expect(() => prepareSweep({ ...calculator, axes: [{ variable: 'r', from: '3 rg', to: '9 rg', count: 11 }] }, 10)).toThrow(/limit is 10 points/);
  });

  const base = { body: { mass: '10 Msun' }, point: { r: '10 rg' }, quantities: ['flowSpeed'] };
  const bad: [string, unknown, number, RegExp][] = [
    ['an unknown quantity (listing the sweepable ones)', { ...base, quantities: ['flowSpeeed'], axes: [{ variable: 'r', from: '3 rg', to: '9 rg', count: 3 }] }, 400, /unknown quantity "flowSpeeed".*flowSpeed, escapeSpeed/],
    ['a quantity that cannot be swept', { ...base, quantities: ['clockRate'], axes: [{ variable: 'r', from: '3 rg', to: '9 rg', count: 3 }] }, 400, /"clockRate" cannot be swept/],
    ['a zero count', { ...base, axes: [{ variable: 'r', from: '3 rg', to: '9 rg', count: 0 }] }, 400, /count|>=1|too small/i],
    ['a negative count', { ...base, axes: [{ variable: 'r', from: '3 rg', to: '9 rg', count: -4 }] }, 400, /too small|count/i],
    ['log spacing across zero', { ...base, axes: [{ variable: 'charge', from: -0.5, to: 0.5, count: 3, spacing: 'log' }] }, 400, /log spacing/],
    ['log spacing at zero', { ...base, axes: [{ variable: 'spin', from: 0, to: 0.5, count: 3, spacing: 'log' }] }, 400, /log spacing/],
    ['a spin axis wholly beyond 1 for a black hole', { ...base, axes: [{ variable: 'spin', from: 1.1, to: 2, count: 5 }] }, 422, /naked singularity/],
    ['an r axis wholly below the surface', { body: 'earth', point: {}, quantities: ['flowSpeed'], axes: [{ variable: 'r', from: '1000 km', to: '6000 km', count: 5 }] }, 422, /below the body's surface/],
    ['a theta axis wholly outside [0, π]', { ...base, axes: [{ variable: 'theta', from: '190 deg', to: '270 deg', count: 4 }] }, 422, /\[0, π\]/],
    ['two axes over one variable', { ...base, axes: [{ variable: 'r', from: '3 rg', to: '9 rg', count: 3 }, { variable: 'r', from: '3 rg', to: '9 rg', count: 3 }] }, 400, /two axes over r/],
    ['a negative spin', { ...base, axes: [{ variable: 'spin', from: -0.5, to: 0.5, count: 3 }] }, 400, /magnitude/],
    ['no radial coordinate for a point quantity', { body: { mass: '10 Msun' }, quantities: ['flowSpeed'], axes: [{ variable: 'spin', from: 0, to: 0.5, count: 3 }] }, 400, /give r or altitude/],
    ['an unreadable unit', { ...base, axes: [{ variable: 'r', from: '3 furlongz', to: '9 rg', count: 3 }] }, 400, /cannot read|furlongz/],
  ];
  for (const [what, payload, status, detail] of bad) {
    it(`refuses ${what} with ${status}`, async () => {
      const res = await post(payload);
      expect(res.statusCode, res.body).toBe(status);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
      const problem = res.json() as { detail: string; errors?: { message: string }[] };
      expect(`${problem.detail} ${JSON.stringify(problem.errors ?? [])}`).toMatch(detail);
    });
  }

  it('keeps the admissible points of a partly unphysical axis, with reasons for the rest', async () => {
    const res = await post({ ...base, axes: [{ variable: 'spin', from: 0.5, to: 1.5, count: 11 }] });
    expect(res.statusCode, res.body).toBe(200);
    const col = (res.json() as SweepResponse).columns.flowSpeed!;
    expect(col.values.slice(0, 6).every((v) => typeof v === 'number')).toBe(true); // spin ≤ 1
    expect(col.values.slice(6).every((v) => v === null)).toBe(true);
    expect(col.nullReasons).toEqual([{ reason: expect.stringMatching(/naked singularity/), count: 5, firstIndex: 6 }]);
    const theta = await post({ ...base, axes: [{ variable: 'theta', from: '90 deg', to: '270 deg', count: 3 }] });
    expect((theta.json() as SweepResponse).columns.flowSpeed!.values.map((v) => v === null)).toEqual([false, false, true]);
  });

  it('sweeps body-only quantities over spin once per body, equal to /v1/spacetime', async () => {
    const res = await post({ body: { mass: '1 Msun' }, quantities: ['outerHorizon', 'hawkingTemperature', 'iscoPrograde'], axes: [{ variable: 'spin', from: 0, to: 1, count: 5 }] });
    expect(res.statusCode, res.body).toBe(200);
    const doc = res.json() as SweepResponse;
    [0, 0.25, 0.5, 0.75, 1].forEach((spin, i) => {
      const single = computeSpacetime({ body: { mass: '1 Msun', spin } });
      for (const n of ['outerHorizon', 'hawkingTemperature', 'iscoPrograde'] as const) {
        expect(doc.columns[n]!.values[i]).toBe(single.quantities[n]!.value);
      }
    });
  });
});
