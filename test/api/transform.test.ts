/**
 * POST /v1/transform through HTTP: units at the edge, batches, targets, vectors and covectors, the
 * metric and Jacobian against each other, refusals and limits.
 */
import { describe, expect, it } from 'vitest';
import { transformResponse, TRANSFORM_LIMITS, type TransformResponse } from '../../src/api/transform.js';
import { expectRel, useApp } from '../helpers.js';

const app = useApp();
async function post(payload: unknown) {
  const res = await app().inject({ method: 'POST', url: '/v1/transform', payload: payload as object });
  return { status: res.statusCode, json: res.json() as Record<string, unknown>, headers: res.headers };
}
async function ok(payload: unknown): Promise<TransformResponse> {
  const { status, json } = await post(payload);
  expect(status, JSON.stringify(json).slice(0, 500)).toBe(200);
  return transformResponse.parse(json);
}

const HOLE = { mass: '10 Msun', spin: 0.9, charge: 0.3 };
type Matrix = number[][];
const mul = (a: Matrix, b: Matrix): Matrix => a.map((row) => b[0]!.map((_, j) => row.reduce((s, x, k) => s + x * b[k]![j]!, 0)));
const transpose = (a: Matrix): Matrix => a[0]!.map((_, j) => a.map((row) => row[j]!));

describe('POST /v1/transform', () => {
  it('Schwarzschild, Boyer–Lindquist → river: the Gullstrand–Painlevé time in seconds (common practice)', async () => {
    const r = await ok({ body: { mass: '10 Msun' }, from: 'boyerLindquist', to: ['river'], events: [{ coordinates: ['5 tg', '10 rg', '90 deg', 0] }] });
    const e = r.events[0]!;
    const rr = 10;
    const gp = 2 * Math.sqrt(2 * rr) + 2 * Math.log((Math.sqrt(rr) - Math.SQRT2) / (Math.sqrt(rr) + Math.SQRT2));
    expectRel(e.river!.coordinates!.T.geometric, 5 + gp, 1e-13);
    expectRel(e.river!.coordinates!.T.value, (5 + gp) * r.body.tg.value, 1e-13);
    expect(e.river!.coordinates!.r.geometric).toBe(10);
    expect(e.boyerLindquist).toBeUndefined();
    expect(r.to).toEqual(['river']);
    expect(e.region).toBe('outside');
  });

  it('the same event in SI and in units of the body reads the same', async () => {
    const base = await ok({ body: HOLE, from: 'boyerLindquist', events: [{ coordinates: ['3 tg', '7 rg', '30 deg', '10 deg'] }] });
    const { rg, tg } = base.body;
    const si = await ok({ body: HOLE, from: 'boyerLindquist', events: [{ coordinates: [3 * tg.value, 7 * rg.value, Math.PI / 6, (10 * Math.PI) / 180] }] });
    const a = base.events[0]!.kerrSchild!.coordinates!;
    const b = si.events[0]!.kerrSchild!.coordinates!;
    for (const k of ['t', 'x', 'y', 'z'] as const) expectRel(b[k].geometric, a[k].geometric, 1e-14);
    expect(base.events[0]!.boyerLindquist!.coordinates!.theta.degrees).toBeCloseTo(30, 12);
  });

  it('Boyer–Lindquist → Kerr–Schild → Boyer–Lindquist over HTTP, for a batch in order', async () => {
    const events = [
      ['0 s', '20 rg', '45 deg', 1],
      [12.5, '2.5 rg', '120 deg', -2],
      [-3, '0.6 rg', '10 deg', 0.3], // inside the inner horizon (r± = 1 ± √0.1: 0.68 and 1.32)
      [0, '1.2 rg', '80 deg', 3], // between the horizons
    ].map((coordinates) => ({ coordinates }));
    const there = await ok({ body: HOLE, from: 'boyerLindquist', to: ['kerrSchild'], events });
    const back = await ok({
      body: HOLE,
      from: 'kerrSchild',
      to: ['boyerLindquist'],
      events: there.events.map((e) => {
        const c = e.kerrSchild!.coordinates!;
        return { coordinates: [c.t.value, c.x.value, c.y.value, c.z.value] };
      }),
    });
    back.events.forEach((e, i) => {
      const c = e.boyerLindquist!.coordinates!;
      const orig = there.events[i]!;
      expectRel(c.r.geometric, orig.r.geometric, 1e-12);
    });
    // Azimuths come back from atan2, so they agree modulo 2π.
    const sameAngle = (x: number, y: number) => Math.abs(Math.atan2(Math.sin(x - y), Math.cos(x - y)));
    const original = [1, -2, 0.3, 3];
    back.events.forEach((e, i) => {
      const c = e.boyerLindquist!.coordinates!;
      expect(sameAngle(c.phi.value, original[i]!)).toBeLessThan(1e-9);
      expect(c.theta.value).toBeCloseTo(there.events[i]!.kerrSchild ? [45, 120, 10, 80][i]! * (Math.PI / 180) : 0, 9);
    });
    expect(back.events[3]!.region).toBe('betweenHorizons');
    expect(back.events[2]!.region).toBe('insideInnerHorizon');
  });

  it('the metric in each chart is carried by the returned Jacobian: g = Jᵀ g′ J', async () => {
    for (const from of ['boyerLindquist', 'river', 'kerrSchild'] as const) {
      const coordinates = from === 'kerrSchild' ? ['1 tg', '3 rg', '-2 rg', '4 rg'] : ['1 tg', '5 rg', '1.1 rad', '0.3 rad'];
      const r = await ok({ body: HOLE, from, events: [{ coordinates }], metric: true, jacobian: true });
      const e = r.events[0]!;
      const g = e[from]!.metric!;
      for (const to of ['boyerLindquist', 'river', 'kerrSchild'] as const) {
        const J = e[to]!.jacobian!;
        const pulled = mul(mul(transpose(J), e[to]!.metric!), J);
        for (let i = 0; i < 4; i++) {
          for (let j = 0; j < 4; j++) {
            // Closed forms on both sides, 16 products: 1e-12 of the largest component.
            expect(Math.abs(pulled[i]![j]! - g[i]![j]!), `${from}→${to} [${i}][${j}]`).toBeLessThan(1e-12 * Math.max(1, ...g.flat().map(Math.abs)));
          }
        }
      }
    }
  });

  it('a static observer\'s four-velocity stays unit and timelike, and u_μ u^μ is kept by vector and covector together', async () => {
    const r0 = await ok({ body: HOLE, from: 'boyerLindquist', to: ['boyerLindquist'], events: [{ coordinates: [0, '6 rg', '70 deg', 0] }], metric: true });
    const gtt = r0.events[0]!.boyerLindquist!.metric![0]![0]!;
    const u = [1 / Math.sqrt(-gtt), 0, 0, 0];
    const lowered = [gtt * u[0]!, 0, 0, r0.events[0]!.boyerLindquist!.metric![0]![3]! * u[0]!];
    const r = await ok({ body: HOLE, from: 'boyerLindquist', events: [{ coordinates: [0, '6 rg', '70 deg', 0], vectors: [u], covectors: [lowered] }], metric: true });
    for (const to of ['boyerLindquist', 'river', 'kerrSchild'] as const) {
      const t = r.events[0]![to]!;
      const v = t.vectors![0]!;
      const w = t.covectors![0]!;
      const g = t.metric!;
      const norm = v.reduce((s, vi, i) => s + vi * v.reduce((s2, vj, j) => s2 + g[i]![j]! * vj, 0), 0);
      expect(norm, to).toBeCloseTo(-1, 12);
      expect(w.reduce((s, wi, i) => s + wi * v[i]!, 0), to).toBeCloseTo(-1, 12);
    }
  });

  it('charts that do not reach an event give null with the reason; the others still answer', async () => {
    // a = 0.9, Q = 0.3: r+ = 1 + √0.1.
    const rPlus = 1 + Math.sqrt(1 - (0.81 + 0.09));
    const r = await ok({ body: HOLE, from: 'river', events: [{ coordinates: [0, `${rPlus} rg`, 1, 0], vectors: [[1, 0, 0, 0]] }], metric: true });
    const e = r.events[0]!;
    expect(e.region).toBe('outerHorizon');
    expect(e.boyerLindquist!.coordinates).toBeNull();
    expect(e.boyerLindquist!.reason).toMatch(/horizon/);
    expect(e.boyerLindquist!.vectors).toBeNull();
    expect(e.boyerLindquist!.derivativeReason).toMatch(/horizon/);
    expect(e.kerrSchild!.coordinates).not.toBeNull();
    expect(e.kerrSchild!.vectors).not.toBeNull();
    // Deep inside a charged hole (2r < Q²) there are no river coordinates.
    const charged = await ok({ body: { mass: '10 Msun', spin: 0.3, charge: 0.9 }, from: 'kerrSchild', events: [{ coordinates: [0, '0.2 rg', 0, '0.1 rg'] }] });
    expect(charged.events[0]!.river!.coordinates).toBeNull();
    expect(charged.events[0]!.river!.reason).toMatch(/Q²/);
    expect(charged.events[0]!.boyerLindquist!.coordinates).not.toBeNull();
  });

  it('the disk and the axis: the upper face, φ̄ = 0, no covectors into the angular charts', async () => {
    const disk = await ok({ body: HOLE, from: 'kerrSchild', to: ['boyerLindquist'], events: [{ coordinates: [0, '0.3 rg', '0.4 rg', 0] }] });
    const c = disk.events[0]!.boyerLindquist!.coordinates!;
    expect(c.r.geometric).toBe(0);
    expectRel(Math.sin(c.theta.value) * 0.9, 0.5, 1e-14);
    const axis = await ok({ body: HOLE, from: 'kerrSchild', to: ['river'], events: [{ coordinates: [0, 0, 0, '5 rg'], vectors: [[1, 0, 0, 1]], covectors: [[1, 0, 0, 0]] }] });
    const t = axis.events[0]!.river!;
    expect(t.coordinates!.theta.value).toBe(0);
    expect(t.vectors).toBeNull();
    expect(t.derivativeReason).toMatch(/axis/);
  });

  it('refusals: the source chart must reach the event (422 naming it), limits are 413, malformed input 400', async () => {
    const rPlus = 1 + Math.sqrt(1 - (0.81 + 0.09));
    const onHorizon = await post({ body: HOLE, from: 'boyerLindquist', events: [{ coordinates: [0, '5 rg', 1, 0] }, { coordinates: [0, `${rPlus} rg`, 1, 0] }] });
    expect(onHorizon.status).toBe(422);
    expect(JSON.stringify(onHorizon.json)).toContain('/events/1/coordinates');
    const noRiver = await post({ body: { mass: '10 Msun', charge: 0.9 }, from: 'river', events: [{ coordinates: [0, '0.3 rg', 1, 0] }] });
    expect(noRiver.status).toBe(422);
    const ring = await post({ body: HOLE, from: 'kerrSchild', events: [{ coordinates: [0, '0.9 rg', 0, 0] }] });
    expect(ring.status).toBe(422);
    expect(String(ring.json.detail)).toMatch(/singularity/);
    const below = await post({ body: 'earth', from: 'boyerLindquist', events: [{ coordinates: [0, '6000 km', 1, 0] }] });
    expect(below.status).toBe(422);
    const theta = await post({ body: HOLE, from: 'boyerLindquist', events: [{ coordinates: [0, '5 rg', '200 deg', 0] }] });
    expect(theta.status).toBe(422);
    const many = await post({ body: HOLE, from: 'boyerLindquist', events: Array.from({ length: TRANSFORM_LIMITS.maxEvents + 1 }, () => ({ coordinates: [0, 5, 1, 0] })) });
    expect(many.status).toBe(413);
    expect(String(many.json.detail)).toContain(String(TRANSFORM_LIMITS.maxEvents));
    const vectors = await post({ body: HOLE, from: 'boyerLindquist', events: [{ coordinates: [0, 5, 1, 0], vectors: Array.from({ length: 9 }, () => [1, 0, 0, 0]) }] });
    expect(vectors.status).toBe(413);
    expect((await post({ body: HOLE, from: 'polar', events: [{ coordinates: [0, 5, 1, 0] }] })).status).toBe(400);
    expect((await post({ body: HOLE, from: 'river', events: [{ coordinates: [0, '5 kg', 1, 0] }] })).status).toBe(400);
    expect((await post({ body: HOLE, from: 'river', events: [] })).status).toBe(400);
    expect((await post({ body: HOLE, from: 'river', events: [{ coordinates: [0, 5, 1] }] })).status).toBe(400);
  });

  it('the Earth: a ground station in Kerr–Schild Cartesian coordinates sits at z = r cosθ, with x² + y² = (r² + a²) sin²θ', async () => {
    // The fictional Marisol Array at latitude −30°: θ = 120°.
    const r = await ok({ body: 'earth', from: 'boyerLindquist', to: ['kerrSchild'], events: [{ coordinates: ['0 s', '6378137 m', '120 deg', '-70 deg'] }] });
    const c = r.events[0]!.kerrSchild!.coordinates!;
    const a = r.body.spin * r.body.rg.value; // a in metres (≈ 3.3 m)
    expectRel(c.z.value, 6378137 * Math.cos((2 * Math.PI) / 3), 1e-14);
    expectRel(c.x.value ** 2 + c.y.value ** 2, (6378137 ** 2 + a * a) * Math.sin((2 * Math.PI) / 3) ** 2, 1e-13);
  });
});
